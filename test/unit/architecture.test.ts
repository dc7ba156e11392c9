import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as path from 'node:path';
import * as esbuild from 'esbuild';
import * as charts from '../../extension/core/charts/index.js';
import * as engine from '../../extension/core/index.js';
import * as report from '../../extension/core/report/index.js';
import { REPO } from '../support/loadNotebook.js';

// The shape of the code: entry points with pinned names, no import cycle, and an engine that
// does not drag the chart library along.

function sourceFiles(dir: string, out: string[] = []): string[] {
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) sourceFiles(p, out);
    else if (e.name.endsWith('.ts')) out.push(p);
  }
  return out;
}

/** Relative imports of each file (type-only imports included: a cycle of types is a cycle of layers). */
function importGraph(files: readonly string[]): Map<string, string[]> {
  const graph = new Map<string, string[]>();
  for (const file of files) {
    const text = fs.readFileSync(file, 'utf8');
    const targets: string[] = [];
    for (const m of text.matchAll(/(?:^|\n)\s*(?:import|export)\s[^;]*?from\s+'(\.{1,2}\/[^']+)'/g)) {
      targets.push(path.resolve(path.dirname(file), m[1].replace(/\.js$/, '.ts')));
    }
    graph.set(file, targets);
  }
  return graph;
}

function findCycle(graph: ReadonlyMap<string, readonly string[]>): string[] | null {
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (node: string): string[] | null => {
    state.set(node, 'open');
    stack.push(node);
    for (const next of graph.get(node) ?? []) {
      if (state.get(next) === 'open') return [...stack.slice(stack.indexOf(next)), next];
      if (!state.has(next)) {
        const c = visit(next);
        if (c) return c;
      }
    }
    stack.pop();
    state.set(node, 'done');
    return null;
  };
  for (const node of graph.keys()) {
    if (!state.has(node)) {
      const c = visit(node);
      if (c) return c;
    }
  }
  return null;
}

describe('architecture', () => {
  it('has no import cycle between modules or between folders of extension/', () => {
    const files = sourceFiles(path.join(REPO, 'extension'));
    const graph = importGraph(files);
    const cycle = findCycle(graph);
    assert.equal(cycle, null, `module cycle: ${cycle?.map((f) => path.relative(REPO, f)).join(' → ')}`);
    const folderOf = (f: string) => path.relative(REPO, path.dirname(f));
    const folders = new Map<string, string[]>();
    for (const [file, targets] of graph) {
      const from = folderOf(file);
      const list = folders.get(from) ?? [];
      for (const t of targets) if (folderOf(t) !== from && !list.includes(folderOf(t))) list.push(folderOf(t));
      folders.set(from, list);
    }
    const folderCycle = findCycle(folders);
    assert.equal(folderCycle, null, `folder cycle: ${folderCycle?.join(' → ')}`);
  });

  it('pins the names of the three entry points', () => {
    assert.deepEqual(Object.keys(engine).sort(), ["BLOCK_KINDS","DIAGNOSTIC_CODES","ID_PATTERN","InMemoryHost","JsonList","LineIndex","MAX_DATA_FILE_BYTES","MAX_NOTEBOOK_FILE_BYTES","NO_FILES","Notebook","RESULT_CATALOGUE","RESULT_NAMES","SUMMARY_TABLE_COLUMNS","blockKeys","catalogueEntry","countDiagnostics","formatCsvNumber","formatDiagnosticLine","formatInterval","formatMeasurement","formatQuantity","formatUncertainty","formatValue","isNumeric","requiredAlternatives","resultIntervalText","resultText","resultUncertaintyText","resultValueText","scanFencedBlocks","stripBom","summarise","summaryCell","toJsonReport","toLazyJsonReport","toOneBased","toOneBasedPoint","unitText","visibleSpan"].map(String));
    assert.deepEqual(Object.keys(charts).sort(), ['blockChartSpec', 'blockChartTitle', 'chartTitle', 'figureSpec', 'notebookMaterials', 'relaxationMapSpec', 'stabilityMapSpecs', 'stabilityMaps', 'themeConfig', 'toVega', 'tsubSeriesSpec']);
    assert.deepEqual(Object.keys(report).sort(), ['buildHtmlReport', 'escapeHtml', 'longCsv', 'subjectText', 'subjectsOf', 'summaryCsv']);
  });

  it('bundles the engine without vega, vega-lite, d3 or the markdown parser', async () => {
    const result = await esbuild.build({ entryPoints: [path.join(REPO, 'extension/core/index.ts')], bundle: true, write: false, metafile: true, format: 'esm', platform: 'neutral', mainFields: ['module', 'main'], logLevel: 'silent' });
    const inputs = Object.keys(result.metafile.inputs);
    const heavy = inputs.filter((p) => /node_modules\/(vega|vega-lite|d3-[a-z-]+|remark-[a-z-]+|micromark[a-z-]*|unified)\//.test(p));
    assert.deepEqual(heavy, []);
  });
});

describe('diagnostic codes', () => {
  it('lists exactly the codes that the message builders use', () => {
    const source = fs.readFileSync(path.join(REPO, 'extension/core/model/messages.ts'), 'utf8');
    const used = new Set([...source.matchAll(/msg\(\s*'([a-z0-9.-]+)'/g)].map((m) => m[1]));
    assert.deepEqual([...engine.DIAGNOSTIC_CODES].sort(), [...used].sort());
  });
});

describe('README', () => {
  it('lists exactly the diagnostic codes under its Diagnostic codes heading', () => {
    const readme = fs.readFileSync(path.join(REPO, 'README.md'), 'utf8');
    const section = readme.split('### Diagnostic codes')[1]?.split(/\n## /)[0] ?? '';
    const listed = [...section.matchAll(/^\| `([a-z0-9.-]+)` \|/gm)].map((m) => m[1]);
    assert.deepEqual(listed.sort(), [...engine.DIAGNOSTIC_CODES].sort());
  });
});

describe('the extension manifest', () => {
  const manifest = JSON.parse(fs.readFileSync(path.join(REPO, 'package.json'), 'utf8'));

  it('offers exactly the diagnostic codes in the severity setting', () => {
    const setting = manifest.contributes.configuration.properties['vitrine.diagnostics.severity'];
    assert.deepEqual([...setting.propertyNames.enum].sort(), [...engine.DIAGNOSTIC_CODES].sort());
  });

  it('names every command and setting under vitrine. and activates on markdown only', () => {
    for (const c of manifest.contributes.commands) assert.match(c.command, /^vitrine\./);
    for (const key of Object.keys(manifest.contributes.configuration.properties)) assert.match(key, /^vitrine\./);
    assert.deepEqual(manifest.activationEvents, ['onLanguage:markdown', 'onWebviewPanel:vitrine.charts']);
    assert.equal(manifest.engines.vscode, '^1.100.0');
  });
});

describe('activation path', () => {
  it('bundles the VS Code client without the engine, the analyses or a chart library', async () => {
    const result = await esbuild.build({ entryPoints: [path.join(REPO, 'extension/vscode/extension.ts')], bundle: true, write: false, metafile: true, format: 'cjs', platform: 'node', external: ['vscode'], logLevel: 'silent' });
    const inputs = Object.keys(result.metafile.inputs);
    assert.deepEqual(inputs.filter((p) => /extension\/core\/|node_modules\/(vega|vega-lite|d3-[a-z-]+|mathjs|ajv|yaml)\//.test(p)), []);
  });
});
