import assert from 'node:assert/strict';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { InMemoryHost, NO_FILES, Notebook, toJsonReport, type CancellationToken } from '../../extension/core/index.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

// The engine as an editor drives it: pushed files, bounded caches, cancellation, queries.

// A garbage collection on demand, for the memory test (taken from a fresh context).
setFlagsFromString('--expose-gc');

const RAMP_META = 'film: D-1\nrate: 10 K/min\ndirection: cooling\n';
function coolingRows(n: number): number[][] {
  // A two-line cooling curve through Tg = 315 K (invented for the test).
  return Array.from({ length: n }, (_, i) => {
    const T = 360 - (i * 100) / (n - 1);
    const h = T > 315 ? 100 * (1 + 8e-4 * (T - 315)) : 100 * (1 + 2e-4 * (T - 315));
    return [T, h];
  });
}
const rampInline = (id: string, n = 60) => tableBlock('ramp', id, RAMP_META, 'T/K, h/nm', coolingRows(n));
const rampFile = (id: string, path: string) => `\`\`\`ramp ${id}\n${RAMP_META}\ndata: ${path}\n\`\`\`\n`;
const csv = (n = 60) => 'T/K, h/nm\n' + coolingRows(n).map((r) => r.join(', ')).join('\n') + '\n';

function fresh(files: ReadonlyMap<string, string>, data: ReadonlyMap<string, string>): Notebook {
  const nb = new Notebook(new InMemoryHost(data));
  for (const [p, t] of files) nb.setFile(p, t);
  return nb;
}

describe('Notebook as an editor drives it', () => {
  it('holds only what the current files use, however many edits came before', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280));
    let text = rampInline('R-1');
    for (let i = 0; i < 50; i++) {
      text = text.replace('rate: 10 K/min', `rate: ${10 + (i % 7)} K/min`);
      nb.setFile('r.md', text + `\nnote ${i}\n`);
      nb.analyze();
    }
    assert.deepEqual(nb.holdings(), { blocks: 3, analyses: 3, dataFiles: 0 });
    nb.deleteFile('r.md');
    assert.deepEqual(nb.holdings(), { blocks: 2, analyses: 2, dataFiles: 0 });
  });

  it('keeps no earlier version of the text alive, whichever blocks are edited', () => {
    // Each block edited in turn, then also prose (a full scan) between the edits. A block read
    // during an edit once kept the whole text of that edit alive: the heap grew by one text per
    // edited block. Allowed: the text as first read (the unedited blocks come from it), the
    // current one, the parses and the analyses, none of which grows with the number of edits.
    const gc = runInNewContext('gc') as () => void;
    // The heap only: a text is a string there (typed arrays are freed in the background, later).
    const used = (): number => {
      gc();
      gc();
      return process.memoryUsage().heapUsed;
    };
    const ramps = Array.from({ length: 80 }, (_, i) => `Scan ${i}.\n\n${rampInline(`R-${i}`, 1500)}`);
    let text = MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280) + ramps.join('\n');
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('n.md', text);
    const editBlock = (k: number): void => {
      const block = text.indexOf(`\`\`\`ramp R-${k}\n`);
      const cell = text.indexOf('\n', text.indexOf('T/K, h/nm', block)) + 3;
      text = text.slice(0, cell) + (text[cell] === '1' ? '2' : '1') + text.slice(cell + 1);
      nb.setFile('n.md', text);
      nb.analyze();
    };
    const editProse = (k: number): void => {
      const prose = text.indexOf(`Scan ${k}.`);
      text = `${text.slice(0, prose)}A line of prose.\n\n${text.slice(prose)}`;
      nb.setFile('n.md', text);
      nb.analyze();
    };
    // (The first edits also compile code, which takes memory once.)
    for (let k = 0; k < 10; k++) editBlock(k);
    let before = used();
    for (let k = 10; k < 40; k++) editBlock(k);
    const inBlocks = used() - before;
    for (let k = 40; k < 50; k++) {
      editBlock(k);
      editProse(k + 1);
    }
    // (Each edited block's own copy of its text adds to the heap until the first text is released.)
    before = used();
    for (let k = 50; k < 79; k++) {
      editBlock(k);
      editProse(k + 1);
    }
    const withProse = used() - before;
    const mb = (n: number): string => `${(n / 2 ** 20).toFixed(1)} MB`;
    assert.ok(inBlocks < 3 * text.length, `30 edits in blocks grew the heap by ${mb(inBlocks)}, with a ${mb(text.length)} text`);
    assert.ok(withProse < 3 * text.length, `30 edits in blocks and prose grew the heap by ${mb(withProse)}, with a ${mb(text.length)} text`);
  });

  it('keeps track of whether a block sits in a list, when the same block text moves in or out of one', () => {
    // The same text key in a list item and directly in the document: a later edit that unindents
    // a body line ends the list item (and so the fence) only in the list.
    const sequences = [
      ['a\n\n  ```material M-1\n  name: x\n  ```\n', '- a\n\n  ```material M-1\n  name: x\n  ```\n', '- a\n\n  ```material M-1\nname: x\n  ```\n'],
      // Two blocks of the same text, one in a list item, one after a paragraph.
      ['1. a\n\n   ```material M-1\n   name: x\n   ```\n\ntext\n\n   ```material M-1\n   name: x\n   ```\n'],
    ];
    sequences[1].push(sequences[1][0].replace('text', 'text\n\nmore'), sequences[1][0].replace('text', 'text\n\nmore').replace('   name: x', 'name: x'));
    for (const texts of sequences) {
      const warm = new Notebook(new InMemoryHost());
      for (const t of texts) {
        warm.setFile('n.md', t);
        warm.analyze();
      }
      const cold = new Notebook(new InMemoryHost());
      cold.setFile('n.md', texts[texts.length - 1]);
      assert.deepEqual(warm.analyze(), cold.analyze());
    }
  });

  it('reads no data file while prose is typed, and re-parses only the readers of a saved data file', () => {
    const host = new InMemoryHost(new Map([['data/a.csv', csv()], ['data/b.csv', csv()]]));
    const nb = new Notebook(host);
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280));
    nb.setFile('a.md', rampFile('R-a', 'data/a.csv'));
    nb.setFile('b.md', rampFile('R-b', 'data/b.csv'));
    nb.analyze();
    assert.deepEqual(host.reads.sort(), ['data/a.csv', 'data/b.csv']);
    host.reads.length = 0;
    for (const ch of 'Some prose typed above the block.') nb.setFile('a.md', ch + '\n' + rampFile('R-a', 'data/a.csv'));
    nb.analyze();
    assert.deepEqual(host.reads, [], 'typing prose reads no data file');
    assert.deepEqual(nb.readersOf('data/a.csv'), ['a.md']);

    nb.stats.parsed = 0;
    nb.stats.analysed = 0;
    nb.setDataFile('data/a.csv', csv(80));
    const report = nb.analyze();
    assert.equal(nb.stats.parsed, 1, 'only the block that reads the file');
    assert.equal(nb.stats.analysed, 2, 'the ramp, and the material that gathers the Tg of its films');
    assert.deepEqual(host.reads, []);
    const a = report.files.find((f) => f.path === 'a.md')!.blocks[0];
    assert.ok(a.results.tg);
  });

  it('reports a pushed data file that disappears, and recovers when it returns', () => {
    const nb = new Notebook(NO_FILES);
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280));
    nb.setFile('a.md', rampFile('R-a', 'data/a.csv'));
    const codes = () => toJsonReport(nb.analyze(['a.md'])).files[0].blocks[0].diagnostics.map((d) => d.code);
    assert.ok(codes().includes('data.missing-file'));
    nb.setDataFile('data/a.csv', csv());
    assert.ok(!codes().includes('data.missing-file'));
    nb.setDataFile('data/a.csv', { ok: false, reason: 'unreadable', detail: 'permission denied' });
    assert.ok(codes().includes('data.unreadable'));
    nb.deleteDataFile('data/a.csv');
    assert.ok(codes().includes('data.missing-file'));
  });

  it('parses a data file once for every block that reads it with the same columns', () => {
    const nb = new Notebook(new InMemoryHost(new Map([['data/a.csv', csv()]])));
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280));
    nb.setFile('a.md', rampFile('R-a', 'data/a.csv') + '\n' + rampFile('R-b', 'data/a.csv'));
    const report = nb.analyze(['a.md']);
    const [a, b] = report.files[0].blocks;
    assert.deepEqual(a.results.tg, b.results.tg);
  });

  it('returns nothing when cancelled, and the next run gives the full report', () => {
    const files = new Map([['m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280)], ['r.md', rampInline('R-1') + '\n' + rampInline('R-2')]]);
    const nb = fresh(files, new Map());
    let checks = 0;
    const token: CancellationToken = {
      get isCancellationRequested() {
        return ++checks > 3;
      },
    };
    assert.equal(nb.analyze({ token }), undefined);
    assert.equal(nb.analyze({ token: { isCancellationRequested: true } }), undefined);
    assert.deepEqual(nb.analyze(), fresh(files, new Map()).analyze());
  });

  it('keeps its caches when the options change', () => {
    const nb = fresh(new Map([['m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', '100' as unknown as number)]]), new Map());
    nb.analyze();
    nb.stats.analysed = 0;
    nb.setOptions({ severity: { 'quantity.bare-number': 'off' } });
    const report = nb.analyze();
    assert.equal(nb.stats.analysed, 0);
    assert.ok(report.files[0].blocks[1].diagnostics.every((d) => d.code !== 'quantity.bare-number'));
  });

  it('reads again, under a raised limit, a pushed data file it refused as too large', () => {
    const csv = 'T/K, h/nm\n' + Array.from({ length: 40 }, (_, i) => `${280 + i}, ${100 + 0.02 * i}`).join('\n') + '\n';
    const ramp = '```ramp R-1\nfilm: D-1\nrate: 1 K/min\ndata: r.csv\n```\n';
    const nb = new Notebook(new InMemoryHost(new Map([['r.csv', csv]])), { maxDataFileBytes: 100 });
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 270) + ramp);
    nb.setDataFile('r.csv', csv);
    const codes = (): string[] => nb.analyze().files[0].blocks.flatMap((b) => b.diagnostics.map((d) => d.code));
    assert.ok(codes().includes('data.too-large'));
    nb.setOptions({ maxDataFileBytes: 1_000_000 });
    assert.ok(!codes().includes('data.too-large'), codes().join(' '));
  });

  it('gives two identical blocks indented differently their own parse', () => {
    const block = '```deposition D-1\nmaterial: M-1\nsubstrate_temperature: 280 K\nrate: 0.2 nm/s\nduration: 10 s\nbase_pressure: 1e-6 Pa\nsubstrate: Si\n```\n';
    const indented = block.split('\n').map((l) => (l ? '  ' + l : l)).join('\n');
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK());
    nb.setFile('a.md', block);
    nb.setFile('b.md', block);
    nb.analyze();
    nb.setFile('b.md', indented);
    const warm = toJsonReport(nb.analyze(['b.md']));
    const cold = toJsonReport(fresh(new Map([['m.md', MATERIAL_BLOCK()], ['a.md', block], ['b.md', indented]]), new Map()).analyze(['b.md']));
    assert.deepEqual(warm, cold);
  });

  it('answers definition, references, ids and block queries with 0-based spans', () => {
    const nb = new Notebook(new InMemoryHost());
    const m = MATERIAL_BLOCK();
    nb.setFile('m.md', m);
    const d = '# day\n\n' + DEPOSITION_BLOCK('D-1', 280);
    nb.setFile('d.md', d);
    const def = nb.definitionOf('M-1');
    assert.ok(def);
    assert.equal(def.path, 'm.md');
    assert.equal(def.kind, 'material');
    assert.equal(m.slice(def.idSpan!.start, def.idSpan!.end), 'M-1');
    const refs = nb.referencesTo('M-1');
    assert.equal(refs.length, 1);
    assert.equal(refs[0].path, 'd.md');
    assert.equal(refs[0].key, 'material');
    assert.equal(d.slice(refs[0].span.start, refs[0].span.end), 'M-1');
    assert.deepEqual(nb.ids('deposition').map((l) => l.id), ['D-1']);
    assert.deepEqual(nb.ids().map((l) => l.id), ['D-1', 'M-1']);
    assert.equal(nb.blockAt('d.md', d.indexOf('rate'))?.id, 'D-1');
    assert.equal(nb.blockAt('d.md', 2), undefined);
    assert.equal(nb.definitionOf('nope'), undefined);
  });

  it('hands out plain data that survives a JSON round trip', () => {
    const nb = fresh(new Map([['m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280)], ['r.md', rampInline('R-1')]]), new Map());
    const report = nb.analyze();
    assert.deepEqual(JSON.parse(JSON.stringify(report)), report);
  });
});

describe('chart data only when a chart is asked for', () => {
  it('gives a ramp its figure on first reading, once, and as plain data to JSON', () => {
    const rows: number[][] = [];
    for (let T = 340; T >= 280 - 1e-9; T -= 0.5) rows.push([T, T >= 310 ? 100 + 0.07 * (T - 310) : 100 + 0.02 * (T - 310)]);
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('n.md', MATERIAL_BLOCK(315) + DEPOSITION_BLOCK('D-1', 270) + tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cooling\n', 'T/K, h/nm', rows));
    const ramp = nb.analyze().files[0].blocks.find((b) => b.kind === 'ramp')!;
    // Not built by the analysis: a getter until read.
    assert.equal(typeof Object.getOwnPropertyDescriptor(ramp, 'figure')?.get, 'function');
    assert.ok(ramp.results.tg, 'the figures of merit are there without it');
    const first = ramp.figure;
    assert.ok(first && first.series.length > 0);
    assert.equal(ramp.figure, first, 'made once');
    const copy = JSON.parse(JSON.stringify(ramp)) as { figure?: { series: unknown[] } };
    assert.equal(copy.figure?.series.length, first.series.length);
  });
});
