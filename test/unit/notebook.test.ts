import assert from 'node:assert/strict';
import { messages } from '../../extension/core/model/messages.js';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';

const MATERIAL = '```material M-1\nname: test glass\ntg: 300 K\ntg_source: invented for the test\nvft:\n  log10_tau0: -14\n  B: 1008 K\n  T0: 237 K\n```\n';
const deposition = (id: string, tsub = '255 K') =>
  `\`\`\`deposition ${id}\nmaterial: M-1\nsubstrate_temperature: ${tsub}\nrate: 0.2 nm/s\nduration: 1000 s\nthickness: 200 nm\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n\`\`\`\n`;

function codes(nb: Notebook, file: string): string[] {
  const f = toJsonReport(nb.analyze([file])).files[0];
  return [...f.diagnostics, ...f.blocks.flatMap((b) => b.diagnostics)].map((d) => d.code);
}

describe('Notebook', () => {
  it('resolves references across files and computes first results', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('materials.md', MATERIAL);
    nb.setFile('days/a.md', '# day\n\n' + deposition('D-1'));
    const r = toJsonReport(nb.analyze());
    const dep = r.files.find((f) => f.path === 'days/a.md')!.blocks[0];
    assert.equal(dep.line, 3);
    assert.deepEqual(dep.diagnostics, []);
    assert.equal(dep.results.tsub_over_tg.value, 0.85);
    assert.equal(dep.results.expected_thickness.value, 200);
    const mat = r.files.find((f) => f.path === 'materials.md')!.blocks[0];
    // Tg = T0 + B/(2 − A) = 237 + 1008/16 = 300 K; m = B·Tg/(Tg − T0)² = 1008·300/63² [computed].
    assert.equal(mat.results.tg_vft.value, 300);
    assert.ok(Math.abs(mat.results.fragility.value - 76.1904761905) < 1e-9);
  });

  it('reports duplicate ids at the later block, naming the first', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('a.md', MATERIAL + deposition('D-1'));
    nb.setFile('b.md', deposition('D-1'));
    const f = toJsonReport(nb.analyze(['b.md'])).files[0];
    const d = f.blocks[0].diagnostics.find((x) => x.code === 'block.duplicate-id');
    assert.ok(d);
    assert.match(d.message, /a\.md:10/);
    assert.equal(d.line, 1);
    assert.equal(d.column, 15);
    assert.deepEqual(codes(nb, 'a.md'), []);
  });

  it('re-parses only the edited block and re-analyses only what depends on it', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL);
    const blocks = Array.from({ length: 20 }, (_, i) => deposition(`D-${i}`)).join('\nprose\n');
    nb.setFile('d.md', blocks);
    nb.analyze();
    nb.stats.parsed = 0;
    nb.stats.analysed = 0;
    nb.setFile('d.md', 'A new first line moves every block.\n' + blocks.replace('D-7', 'D-7b'));
    nb.analyze();
    assert.equal(nb.stats.parsed, 1, 'one block re-parsed');
    assert.equal(nb.stats.analysed, 2, 'the edited block and the material that gathers its films');
    nb.stats.analysed = 0;
    nb.setFile('m.md', MATERIAL.replace('tg: 300 K', 'tg: 301 K'));
    nb.analyze();
    assert.equal(nb.stats.analysed, 21, 'the material and its 20 films');
  });

  it('keeps positions right with CRLF, a BOM, tabs and emoji', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL);
    const text = '\uFEFF# 🧪 notes\r\n\r\n> ```deposition D-9\r\n> material: M-1\r\n> substrate_temperature:\t250\r\n> rate: 0.2 nm/s\r\n> duration: 100 s\r\n> base_pressure: 1e-6 Pa\r\n> substrate: Si\r\n> ```\r\n';
    nb.setFile('n.md', text);
    const d = toJsonReport(nb.analyze(['n.md'])).files[0].blocks[0].diagnostics.find((x) => x.code === 'quantity.bare-number');
    assert.ok(d);
    assert.deepEqual([d.line, d.column, d.endLine, d.endColumn], [5, 26, 5, 29]);
    // The quick fix replaces exactly the bare number with the number and its unit.
    assert.deepEqual(d.fix, { title: 'Write the unit: 250 K', newText: '250 K', line: 5, column: 26, endLine: 5, endColumn: 29 });
  });

  it('applies severity overrides and can turn a code off', () => {
    const nb = new Notebook(new InMemoryHost(), { severity: { 'quantity.bare-number': 'error', 'deposition.tsub-ratio': 'off' } });
    nb.setFile('m.md', MATERIAL);
    nb.setFile('d.md', deposition('D-1', '100'));
    const all = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[0].diagnostics;
    assert.equal(all.find((d) => d.code === 'quantity.bare-number')?.severity, 'error');
    assert.equal(all.find((d) => d.code === 'deposition.tsub-ratio'), undefined);
  });

  it('flags a results block whose inputs changed', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL);
    nb.setFile('d.md', deposition('D-1'));
    const frozen = (hash: string) => `\`\`\`results\nof: D-1\ninputs: "${hash}"\ntsub_over_tg: 0.85\n\`\`\`\n`;
    nb.setFile('r.md', frozen('stale0'));
    assert.deepEqual(codes(nb, 'r.md'), ['results.stale']);
    const current = nb.inputsHashOf('D-1');
    assert.ok(current);
    nb.setFile('r.md', frozen(current));
    assert.deepEqual(codes(nb, 'r.md'), []);
    nb.setFile('m.md', MATERIAL.replace('tg: 300 K', 'tg: 302 K'));
    assert.deepEqual(codes(nb, 'r.md'), ['results.stale'], 'a change in a referenced block makes it stale');
  });

  it('reads data files through the host and reports their cells with a related location', () => {
    const host = new InMemoryHost(new Map([['data/r.csv', 'T/K, h/nm\n300, 100\n301, x\n']]));
    const nb = new Notebook(host);
    nb.setFile('m.md', MATERIAL);
    nb.setFile('d.md', deposition('D-1') + '\n```ramp R-1\nfilm: D-1\nrate: 1 K/min\ndata: data/r.csv\n```\n');
    const ramp = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
    const d = ramp.diagnostics.find((x) => x.code === 'table.bad-cell');
    assert.ok(d);
    assert.equal(d.line, 14);
    assert.deepEqual(d.related?.[0], { path: 'data/r.csv', line: 3, column: 6, message: messages.tableBadCell('x', 'h/nm').message });
  });

  it('leaves ordinary code fences alone', () => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('a.md', '```python\nprint(1)\n```\n\n```\nno info\n```\n');
    assert.deepEqual(toJsonReport(nb.analyze()).files[0].blocks, []);
  });
});
