// Bundles the command line, the language server, the VS Code extension and the preview webview
// with esbuild. Type-checking is `npm run typecheck` (tsc --noEmit). `--release` minifies and
// leaves out source maps (the packaged extension).
import { copyFile, mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { build } from 'esbuild';

const release = process.argv.includes('--release');
// Chunks of earlier builds would otherwise pile up beside the current ones.
await rm('dist/cli-chunks', { recursive: true, force: true });

// The command line loads the YAML parser when a block's metadata first needs it (see
// extension/cli/yamlModule.ts); the other bundles keep it inside.
const lazyYaml = {
  name: 'lazy-yaml',
  setup(b) {
    b.onResolve({ filter: /\/yamlModule\.js$/ }, (args) => (args.importer.endsWith(path.join('extension', 'core', 'parse', 'metadata.ts')) ? { path: path.resolve('extension/cli/yamlModule.ts') } : undefined));
  },
};

// The command line takes node:fs through `require`: imported as a module, node builds a namespace
// of it, which reads every export (and so loads the streams behind fs.ReadStream) at start.
const fsByRequire = {
  name: 'fs-by-require',
  setup(b) {
    b.onResolve({ filter: /^node:fs$/ }, (args) => (args.namespace === 'fs-by-require' ? { path: 'node:fs', external: true } : { path: 'node:fs', namespace: 'fs-by-require' }));
    b.onLoad({ filter: /.*/, namespace: 'fs-by-require' }, () => ({ contents: "module.exports = require('node:fs');", loader: 'js' }));
  },
};

const common = { bundle: true, platform: 'node', target: 'node20', sourcemap: !release, minify: release, logLevel: 'warning' };

await Promise.all([
  build({
    ...common,
    // Split, so that `check` and `analyze` never load what only `report` needs.
    entryPoints: { cli: 'extension/cli/bin.ts' },
    outdir: 'dist',
    splitting: true,
    chunkNames: 'cli-chunks/[name]-[hash]',
    plugins: [lazyYaml, fsByRequire],
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
  // The extension host loads the client with `require`; `vscode` is provided by the editor.
  build({
    ...common,
    entryPoints: ['extension/vscode/extension.ts'],
    outfile: 'dist/extension.cjs',
    format: 'cjs',
    external: ['vscode'],
  }),
  // The chart preview's page script: one classic script for the webview, no eval (vega-interpreter).
  // Its own folder, the only one the webview may read.
  build({
    bundle: true,
    entryPoints: ['extension/webview/main.ts'],
    outfile: 'dist/webview/webview.js',
    format: 'iife',
    platform: 'browser',
    target: 'es2022',
    minify: true,
    sourcemap: false,
    logLevel: 'warning',
  }),
  // Its stylesheet, served as a file of the extension (the page's CSP allows no inline styles).
  mkdir('dist/webview', { recursive: true }).then(() => copyFile('extension/webview/preview.css', 'dist/webview/webview.css')),
]);
