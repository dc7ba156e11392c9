// Bundles the CLI with esbuild. Type-checking is `npm run typecheck` (tsc --noEmit).
import { build } from 'esbuild';

await build({
  entryPoints: ['extension/cli/bin.ts'],
  outfile: 'dist/cli.js',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  external: ['@resvg/resvg-js'],
  banner: {
    js: "#!/usr/bin/env node\nimport { createRequire as __vitrineRequire } from 'node:module';\nconst require = __vitrineRequire(import.meta.url);",
  },
});
