// Bundles the command line, the language server, the VS Code extension and the preview webview
// with esbuild. Type-checking is `npm run typecheck` (tsc --noEmit). `--release` minifies and
// leaves out source maps (the packaged extension).
import { chmod, copyFile, mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { build } from 'esbuild';

const release = process.argv.includes('--release');
// Outputs of earlier layouts of the command line would otherwise lie beside the current one.
await Promise.all(['dist/cli-chunks', 'dist/cli.js.map'].map((p) => rm(p, { recursive: true, force: true })));

// The command line loads the YAML parser when a block's metadata first needs it (see
// extension/cli/yamlModule.ts); the other bundles keep it inside.
const lazyYaml = {
  name: 'lazy-yaml',
  setup(b) {
    b.onResolve({ filter: /\/yamlModule\.js$/ }, (args) => (args.importer.endsWith(path.join('extension', 'core', 'parse', 'metadata.ts')) ? { path: path.resolve('extension/cli/yamlModule.ts') } : undefined));
  },
};

// The libraries that only `vitrine report` uses (charts, their SVG drawing, the markdown renderer)
// stay out of the command line's bundle, in dist/cli-report-libs.cjs, which this list makes (each
// package under its name in camel case, as its namespace or its default export): their imports in
// the report's code read that bundle, required the first time the report's code runs (esbuild runs
// a module reached by `import()` only then), so `check` and `analyze` neither read nor compile them.
const REPORT_LIBRARIES = { vega: 'namespace', 'vega-lite': 'namespace', unified: 'namespace', 'remark-parse': 'default', 'remark-rehype': 'default', 'rehype-sanitize': 'default', 'rehype-stringify': 'default' };
const memberOf = (pkg) => pkg.replace(/-(\w)/g, (_, c) => c.toUpperCase());
const reportLibrariesEntry = Object.entries(REPORT_LIBRARIES)
  .map(([pkg, taken]) => (taken === 'default' ? `export { default as ${memberOf(pkg)} } from '${pkg}';` : `export * as ${memberOf(pkg)} from '${pkg}';`))
  .join('\n');
const reportLibraries = {
  name: 'report-libraries',
  setup(b) {
    b.onResolve({ filter: /^[a-z-]+$/ }, (args) => (args.path in REPORT_LIBRARIES ? { path: args.path, namespace: 'report-libraries' } : undefined));
    b.onLoad({ filter: /.*/, namespace: 'report-libraries' }, (args) => {
      const member = `require('./cli-report-libs.cjs').${memberOf(args.path)}`;
      return REPORT_LIBRARIES[args.path] === 'default' ? { contents: `export default ${member};`, loader: 'js' } : { contents: `module.exports = ${member};`, loader: 'js' };
    });
  },
};

const common = { bundle: true, platform: 'node', target: 'node20', sourcemap: !release, minify: release, logLevel: 'warning' };
// vega-canvas's Node build loads the optional native canvas with a top-level await; nothing here
// draws on a canvas (SVG is drawn without one, PNG from the SVG), so its canvas-free build serves
// every bundle, and labels are measured the same way whether that package is installed or not.
const canvasFree = { 'vega-canvas': './node_modules/vega-canvas/build/vega-canvas.browser.js' };

const built = await Promise.all([
  // CommonJS: node loads and runs it faster than the same code as an ES module (measured: 10–20 ms
  // of a run, and 3 MB of memory, on a large notebook).
  build({
    ...common,
    entryPoints: ['extension/cli/bin.ts'],
    outfile: 'dist/cli.cjs',
    format: 'cjs',
    plugins: [lazyYaml, reportLibraries],
    external: ['@resvg/resvg-js', './cli-report-libs.cjs'],
    define: { 'import.meta.url': '__vitrineModuleUrl' },
    banner: { js: "#!/usr/bin/env node\n'use strict';\nconst __vitrineModuleUrl = require('node:url').pathToFileURL(__filename).href;" },
    metafile: true,
  }),
  build({
    ...common,
    stdin: { contents: reportLibrariesEntry, resolveDir: '.', sourcefile: 'report-libraries.js', loader: 'js' },
    outfile: 'dist/cli-report-libs.cjs',
    format: 'cjs',
    alias: canvasFree,
  }),
  // CommonJS, as editors start it with plain `node`; the chart library is loaded on first use.
  build({
    ...common,
    entryPoints: ['extension/server/main.ts'],
    outfile: 'dist/server.cjs',
    format: 'cjs',
    banner: { js: '#!/usr/bin/env node' },
    // The server compiles specs and never draws.
    alias: canvasFree,
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

// The command line's bundle must hold none of the report's libraries (a new import of one in the
// report's code needs its line in REPORT_LIBRARIES): every run would compile them.
const heavy = Object.keys(built[0].metafile.inputs).filter((p) => /node_modules\/(vega[a-z-]*|d3-[a-z-]+|remark-[a-z-]+|rehype-[a-z-]+|micromark[a-z-]*|mdast-[a-z-]+|hast-[a-z-]+|unified)\//.test(p));
if (heavy.length > 0) throw new Error(`dist/cli.cjs bundles report libraries: ${heavy.slice(0, 5).join(', ')}`);
await chmod('dist/cli.cjs', 0o755);
// The command line's earlier path (`node dist/cli.js`, and links that npm made to it) still runs it.
await writeFile('dist/cli.js', "#!/usr/bin/env node\n// The command line is dist/cli.cjs; this earlier path runs it.\nimport './cli.cjs';\n", { mode: 0o755 });
