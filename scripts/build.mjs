// Bundles the command line and the language server with esbuild. Type-checking is
// `npm run typecheck` (tsc --noEmit).
import { build } from 'esbuild';

const common = { bundle: true, platform: 'node', target: 'node20', sourcemap: true, logLevel: 'warning' };

await Promise.all([
  build({
    ...common,
    entryPoints: ['extension/cli/bin.ts'],
    outfile: 'dist/cli.js',
    format: 'esm',
    external: ['@resvg/resvg-js'],
    banner: {
      js: "#!/usr/bin/env node\nimport { createRequire as __vitrineRequire } from 'node:module';\nconst require = __vitrineRequire(import.meta.url);",
    },
  }),
  // CommonJS, as editors start it with plain `node`; the chart library is loaded on first use.
  build({
    ...common,
    entryPoints: ['extension/server/main.ts'],
    outfile: 'dist/server.cjs',
    format: 'cjs',
    banner: { js: '#!/usr/bin/env node' },
    // The server compiles specs and never draws: the canvas-free build of vega-canvas suffices
    // (its Node build loads the optional native canvas with a top-level await).
    alias: { 'vega-canvas': './node_modules/vega-canvas/build/vega-canvas.browser.js' },
  }),
]);
