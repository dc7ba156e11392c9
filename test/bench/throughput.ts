/**
 * `npm run bench`, second part: whole-notebook throughput of `vitrine analyze --json` against a
 * markdown parse (remark, in its own process) and against a plain split into lines and numbers;
 * how time and memory grow with the notebook; the exact hinge fit against a plain O(n²) search;
 * the language server's time to first diagnostics on the demo. Prints a table and writes
 * test/bench/results.json. Ratios, never absolute times alone: the machine is shared (the commands
 * compared take turns, and a time is the fastest of their runs).
 */
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fitHinge } from '../../extension/core/numeric/hingeFit.js';
import { REPO } from '../support/loadNotebook.js';
import { startServer, uriOf } from '../support/lspClient.js';

const CLI = path.join(REPO, 'dist', 'cli.cjs');
const MATERIAL = '```material M-1\nname: bench glass\ntg: 315 K\ntg_source: bench\n```\n';

function cooling(i: number, rows: number): string {
  const tg = 310 + (i % 17);
  const lines: string[] = [];
  for (let k = 0; k < rows; k++) {
    const T = tg + 40 - (80 * k) / (rows - 1);
    const h = T > tg ? 400 * (1 + 8e-4 * (T - tg)) : 400 * (1 + 2e-4 * (T - tg));
    lines.push(`${T.toFixed(4)}, ${(h + 0.01 * Math.sin(k * 7.3 + i)).toFixed(4)}`);
  }
  return lines.join('\n');
}

const films = Array.from({ length: 20 }, (_, i) => `\`\`\`deposition D-${i}\nmaterial: M-1\nsubstrate_temperature: ${260 + i} K\nrate: 0.2 nm/s\nduration: 2000 s\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n\`\`\`\n`).join('\n');

function inlineNotebook(blocks: number): string {
  const ramps = Array.from({ length: blocks }, (_, i) => `Scan ${i}.\n\n\`\`\`ramp R-${i}\nfilm: D-${i % 20}\nrate: 10 K/min\ndirection: cooling\n---\nT/K, h/nm\n${cooling(i, 600)}\n\`\`\`\n`);
  return `# Notebook\n\n${MATERIAL}\n${films}\n${ramps.join('\n')}`;
}

/** A folder holding one notebook file (and data files); removed at the end. */
const made: string[] = [];
function folder(files: Record<string, string>): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'vitrine-bench-'));
  made.push(dir);
  for (const [rel, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(dir, rel)), { recursive: true });
    fs.writeFileSync(path.join(dir, rel), text);
  }
  return dir;
}

const RSS_HOOK = path.join(os.tmpdir(), `vitrine-bench-rss-${process.pid}.cjs`);
fs.writeFileSync(RSS_HOOK, "process.on('exit', () => require('node:fs').writeSync(2, `\\nmaxrss ${process.resourceUsage().maxRSS}\\n`));\n");

interface Measured {
  /** Median wall time of the runs, ms. */
  readonly ms: number;
  /** The fastest run, ms: the load of a shared machine only ever adds time, so the fastest run is the best estimate of the cost. */
  readonly minMs: number;
  /** Peak resident memory (KiB): the median of the runs, and the least and the most. */
  readonly rssKiB: number;
  readonly rssRange: readonly [number, number];
}

const median = (v: readonly number[]): number => [...v].sort((a, b) => a - b)[v.length >> 1];

/**
 * Node processes run `runs` times each, taking turns (a burst of load on the machine then falls
 * on all of them alike): wall time and peak resident memory of each.
 */
function measureTogether(commands: readonly string[][], runs: number): Measured[] {
  const times = commands.map(() => [] as number[]);
  const rss = commands.map(() => [] as number[]);
  for (let r = 0; r < runs; r++) {
    commands.forEach((args, c) => {
      const t0 = performance.now();
      const out = spawnSync(process.execPath, ['--require', RSS_HOOK, ...args], { cwd: REPO, encoding: 'utf8', maxBuffer: 1 << 30, stdio: ['ignore', 'ignore', 'pipe'] });
      times[c].push(performance.now() - t0);
      rss[c].push(Number(/maxrss (\d+)/.exec(out.stderr)?.[1] ?? 0));
    });
  }
  return commands.map((_, c) => ({ ms: median(times[c]), minMs: Math.min(...times[c]), rssKiB: median(rss[c]), rssRange: [Math.min(...rss[c]), Math.max(...rss[c])] }));
}

function measure(args: string[], runs = 3): Measured {
  return measureTogether([args], runs)[0];
}

const REMARK = "import { readFileSync } from 'node:fs'; import { unified } from 'unified'; import remarkParse from 'remark-parse'; unified().use(remarkParse).parse(readFileSync(process.argv[1], 'utf8'));";
const SPLIT = "import { readFileSync } from 'node:fs'; let n = 0; for (const line of readFileSync(process.argv[1], 'utf8').split(/\\r?\\n/)) for (const cell of line.split(',')) if (Number.isFinite(Number(cell))) n++; if (n < 0) console.log(n);";

const results: Record<string, unknown> = { machine: { cpus: os.cpus().length, model: os.cpus()[0]?.model, memoryGiB: Math.round(os.totalmem() / 2 ** 30), node: process.version } };
const rows: Array<[string, string]> = [];

// Whole notebooks: analyze against remark and against a plain split.
const sizes = [10, 100, 500];
const emptyFile = path.join(folder({ 'n.md': '# empty\n' }), 'n.md');
const [empty, splitEmpty] = measureTogether([[CLI, 'analyze', '--json', emptyFile], ['--input-type=module', '-e', SPLIT, emptyFile]], 5);
const scaling: Array<{ blocks: number; mb: number; analyze: number; remark: number; split: number; analyzeMedian: number; remarkMedian: number; rssKiB: number; rssRangeKiB: readonly [number, number]; splitRssKiB: number }> = [];
for (const blocks of sizes) {
  const text = inlineNotebook(blocks);
  const file = path.join(folder({ 'n.md': text }), 'n.md');
  const [a, remark, split] = measureTogether([[CLI, 'analyze', '--json', file], ['--input-type=module', '-e', REMARK, file], ['--input-type=module', '-e', SPLIT, file]], 5);
  const mb = text.length / 2 ** 20;
  scaling.push({ blocks, mb, analyze: a.minMs, remark: remark.minMs, split: split.minMs, analyzeMedian: a.ms, remarkMedian: remark.ms, rssKiB: a.rssKiB, rssRangeKiB: a.rssRange, splitRssKiB: split.rssKiB });
  rows.push([`${blocks} ramps of 600 rows inline (${mb.toFixed(1)} MB): analyze / remark parse`, `${(a.minMs / remark.minMs).toFixed(3)}× (goal < 0.10×; fastest of 5 runs each; medians ${(a.ms / remark.ms).toFixed(3)}×)`]);
  rows.push([`${blocks} ramps: analyze / line-and-number split`, `${(a.minMs / split.minMs).toFixed(2)}× (goal < 3×)`]);
  const times = (kib: number): string => (((kib - empty.rssKiB) * 1024) / text.length).toFixed(1);
  rows.push([`${blocks} ramps: peak memory above an empty notebook / notebook size`, `${times(a.rssKiB)}× (goal < 10×; median of 5 runs, range ${times(a.rssRange[0])}–${times(a.rssRange[1])}×)`]);
  // For reference: the same measure of the plain split itself (its lines and cells as strings).
  rows.push([`${blocks} ramps: the same for the line-and-number split`, `${(((split.rssKiB - splitEmpty.rssKiB) * 1024) / text.length).toFixed(1)}×`]);
}
// Time against size, the fixed cost of starting a process taken off: the exponent of a log-log fit.
{
  const xs = scaling.map((s) => Math.log(s.mb));
  const ys = scaling.map((s) => Math.log(Math.max(1, s.analyze - empty.minMs)));
  const mx = xs.reduce((a, b) => a + b) / xs.length;
  const my = ys.reduce((a, b) => a + b) / ys.length;
  const slope = xs.reduce((s, x, i) => s + (x - mx) * (ys[i] - my), 0) / xs.reduce((s, x) => s + (x - mx) ** 2, 0);
  rows.push(['analyze time against notebook size: log-log exponent', `${slope.toFixed(2)} (linear: 1)`]);
  // Beyond the first blocks (start-up and the first compilation of the analysis code taken off with
  // the 10-ramp time): the growth from 100 to 500 ramps against the growth in size.
  const [s10, s100, s500] = scaling;
  const marginal = Math.log((s500.analyze - s10.analyze) / (s100.analyze - s10.analyze)) / Math.log((s500.mb - s10.mb) / (s100.mb - s10.mb));
  rows.push(['analyze time beyond the first 10 ramps, 100 → 500 ramps: log-log exponent', `${marginal.toFixed(2)} (linear: 1)`]);
  results.scaling = { sizes: scaling, emptyMs: empty.minMs, exponent: slope, marginalExponent: marginal };
}

// Ramps that read 100 000-row data files.
{
  const data: Record<string, string> = {};
  const blocks: string[] = [];
  for (let i = 0; i < 4; i++) {
    data[`data/r${i}.csv`] = `T/K, h/nm\n${cooling(i, 100000)}\n`;
    blocks.push(`\`\`\`ramp R-${i}\nfilm: D-${i}\nrate: 10 K/min\ndirection: cooling\ndata: data/r${i}.csv\n\`\`\`\n`);
  }
  const dir = folder({ 'n.md': `${MATERIAL}\n${films}\n${blocks.join('\n')}`, ...data });
  const a = measure([CLI, 'analyze', '--json', path.join(dir, 'n.md')], 1);
  const all = Object.keys(data).map((k) => path.join(dir, k));
  const split = all.reduce((s, f) => s + measure(['--input-type=module', '-e', SPLIT, f], 1).ms, 0);
  rows.push(['4 ramps reading 100 000-row files: analyze / split of the files', `${(a.ms / split).toFixed(2)}×`]);
  results.largeFiles = { analyzeMs: a.ms, splitMs: split };
}

// The exact hinge fit against a plain search over every breakpoint (O(n²)) on the same data.
function plainHingeSearch(x: readonly number[], y: readonly number[]): number {
  let best = Infinity;
  let bestX = NaN;
  for (let k = 2; k < x.length - 2; k++) {
    const b = x[k];
    // Least squares of y = a + c·x + d·max(0, x − b) by the 3×3 normal equations.
    let n = 0, sx = 0, sh = 0, sxx = 0, sxh = 0, shh = 0, sy = 0, sxy = 0, shy = 0;
    for (let i = 0; i < x.length; i++) {
      const h = Math.max(0, x[i] - b);
      n++; sx += x[i]; sh += h; sxx += x[i] * x[i]; sxh += x[i] * h; shh += h * h; sy += y[i]; sxy += x[i] * y[i]; shy += h * y[i];
    }
    const m = [[n, sx, sh], [sx, sxx, sxh], [sh, sxh, shh]];
    const v = [sy, sxy, shy];
    const det = (q: number[][]) => q[0][0] * (q[1][1] * q[2][2] - q[1][2] * q[2][1]) - q[0][1] * (q[1][0] * q[2][2] - q[1][2] * q[2][0]) + q[0][2] * (q[1][0] * q[2][1] - q[1][1] * q[2][0]);
    const d = det(m);
    const p = [0, 1, 2].map((j) => det(m.map((row, r) => row.map((c, col) => (col === j ? v[r] : c)))) / d);
    let sse = 0;
    for (let i = 0; i < x.length; i++) sse += (y[i] - p[0] - p[1] * x[i] - p[2] * Math.max(0, x[i] - b)) ** 2;
    if (sse < best) {
      best = sse;
      bestX = b;
    }
  }
  return bestX;
}
{
  const ratios: Array<{ n: number; ratio: number }> = [];
  for (const n of [1000, 2000, 4000]) {
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < n; i++) {
      const t = 280 + (70 * i) / (n - 1);
      x.push(t);
      y.push((t < 315 ? 100 + 0.02 * (t - 315) : 100 + 0.07 * (t - 315)) + 0.02 * Math.sin(i * 12.9898));
    }
    const t0 = performance.now();
    for (let r = 0; r < 5; r++) fitHinge(x, y);
    const exact = (performance.now() - t0) / 5;
    const t1 = performance.now();
    plainHingeSearch(x, y);
    const plain = performance.now() - t1;
    ratios.push({ n, ratio: plain / exact });
    rows.push([`plain O(n²) breakpoint search / exact hinge fit, n = ${n}`, `${(plain / exact).toFixed(0)}×`]);
  }
  results.hinge = ratios;
}

// The language server on the demo: from initialize to the first diagnostics of a day file.
{
  const dir = folder({});
  fs.cpSync(path.join(REPO, 'fixtures', 'demo'), dir, { recursive: true });
  const t0 = performance.now();
  const client = await startServer(dir);
  const uri = uriOf(path.join(dir, 'days', '2026-03-02.md'));
  await client.waitForDiagnostics(uri, () => true, 60000);
  const first = performance.now() - t0;
  await client.stop();
  const idle = measure(['-e', '0'], 3).ms;
  rows.push(['language server: first diagnostics on the demo / starting an empty node', `${(first / idle).toFixed(1)}× (${first.toFixed(0)} ms)`]);
  results.server = { firstDiagnosticsMs: first, nodeStartMs: idle };
}

// Hostile input: the time for n and for 4n of the same shape (linear ≈ 4, quadratic ≈ 16).
{
  const { scanFencedBlocks } = await import('../../extension/core/scan/fenceScanner.js');
  const { normaliseUnitText } = await import('../../extension/core/parse/units.js');
  const { parseTable } = await import('../../extension/core/parse/table.js');
  const { segmentScan } = await import('../../extension/core/analysis/segments.js');
  const { fitThreeSegments } = await import('../../extension/core/numeric/threeSegmentFit.js');
  const best = (run: () => unknown): number => {
    let t = Infinity;
    for (let r = 0; r < 3; r++) {
      const t0 = performance.now();
      run();
      t = Math.min(t, performance.now() - t0);
    }
    return t;
  };
  const noisy = (n: number) => Float64Array.from({ length: n }, (_, i) => 300 + 0.1 * Math.sin(i * 12.9898));
  const cases: Array<[string, (k: number) => () => unknown]> = [
    ['one line of 80 000 list markers', (k) => { const t = '- '.repeat(80000 * k) + 'a\n'; return () => scanFencedBlocks(t); }],
    ['one line of 40 000 block-quote markers', (k) => { const t = '> '.repeat(40000 * k) + 'a\n'; return () => scanFencedBlocks(t); }],
    ['a list nested 1000 deep', (k) => { const d = 1000 * (k === 4 ? 2 : 1); const t = Array.from({ length: d }, (_, i) => '  '.repeat(i) + '* a\n').join(''); return () => scanFencedBlocks(t); }],
    ['a unit padded with 400 000 spaces', (k) => { const t = 'K' + ' '.repeat(400000 * k) + 'x'; return () => normaliseUnitText(t); }],
    ['a header of 1 000 000 parentheses', (k) => { const l = ['('.repeat(1000000 * k), '1']; return () => parseTable(l); }],
    ['a 1 000 000-digit cell', (k) => { const l = ['T/K, h/nm', `300, ${'9'.repeat(1000000 * k)}`]; return () => parseTable(l); }],
    ['segments of an 80 000-row noisy hold', (k) => { const T = noisy(80000 * k); return () => segmentScan(T, null, null); }],
    ['three-segment fit of a 20 000-row hold', (k) => { const n = 20000 * k; const t = Float64Array.from({ length: n }, (_, i) => i); const h = noisy(n); return () => fitThreeSegments(t, h); }],
  ];
  const hostile: Record<string, number> = {};
  for (const [name, make] of cases) {
    const ratio = best(make(4)) / best(make(1));
    hostile[name] = ratio;
    rows.push([`hostile input, 4n against n: ${name}`, `${ratio.toFixed(1)}× (linear ≈ 4)`]);
  }
  results.hostile = hostile;
}

results.rows = rows;
fs.writeFileSync(path.join(REPO, 'test', 'bench', 'results.json'), JSON.stringify(results, null, 2) + '\n');
const width = Math.max(...rows.map((r) => r[0].length));
console.log('\nthroughput and scaling');
for (const [k, v] of rows) console.log(`  ${k.padEnd(width)}  ${v}`);
for (const dir of made) fs.rmSync(dir, { recursive: true, force: true });
fs.rmSync(RSS_HOOK, { force: true });
