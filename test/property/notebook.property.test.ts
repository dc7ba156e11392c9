import assert from 'node:assert/strict';
import fc from 'fast-check';
import { InMemoryHost, LineIndex, Notebook, toJsonReport } from '../../extension/core/index.js';
import { propertyOptions } from '../support/propertyOptions.js';

// Notebooks built from realistic pieces, then mutated character by character: the core must
// never throw, every diagnostic must lie inside its document, and every figure must be finite.
const kinds = ['material', 'deposition', 'ramp', 'isotherm', 'dsc', 'relaxation', 'results', 'python', ''];
const keys = ['name', 'tg', 'material', 'film', 'substrate_temperature', 'rate', 'duration', 'thickness', 'base_pressure', 'data', 'vft', 'columns', 'of', 'inputs', 'direction', 'windows', 'temperature', 'quantity', 'mass'];
const values = ['281 K', '8 °C', '0.2 nm/s', '10 K/min', '1e-8 Torr', '2000', 'M-1', 'D-1', '[1, 2', '{a: b}', '"x"', 'NaN', '-', 'data.csv', '../x.csv', '/etc/passwd', '', '  log10_tau0: -14', '  B: 700 K', '&anchor x', '*anchor', '!!binary AAAA', '-5 K', '0 K', '1e-320 K', '1e300 nm/s', '-1e400', '[[[[[[[[[['];
const rows = ['T/K, h/nm', '300, 100', '301,abc', 't/s\tT/K\th/nm', '1;2;3', '# c', 'NaN, inf', '', '1,5; 2,5', '-290, 1', '1e-320, 1e300'];

const block = fc
  .tuple(fc.constantFrom(...kinds), fc.constantFrom('M-1', 'D-1', 'R-1', '', 'x y', '<b>'), fc.array(fc.tuple(fc.constantFrom(...keys), fc.constantFrom(...values)), { maxLength: 6 }), fc.option(fc.array(fc.constantFrom(...rows), { maxLength: 5 })), fc.constantFrom('```', '~~~', '````'), fc.constantFrom('', '> ', '- ', '   '), fc.boolean())
  .map(([kind, id, kv, table, fence, prefix, close]) => {
    const lines = [`${fence}${kind} ${id}`, ...kv.map(([k, v]) => `${k}: ${v}`)];
    if (table) lines.push('---', ...table);
    if (close) lines.push(fence);
    return lines.map((l) => prefix + l).join('\n');
  });
const notebook = fc.array(fc.oneof(block, fc.constantFrom('prose', '', '# head', '\uFEFF', '\r\n', '> quote')), { maxLength: 8 }).map((parts) => parts.join('\n'));
const mutated = fc.tuple(notebook, fc.array(fc.tuple(fc.nat(), fc.constantFrom('', '`', '\n', ':', ' ', '-', '\t', '\r', '#', '\u00e9', '\uD83D')), { maxLength: 4 })).map(([text, edits]) => {
  let t = text;
  for (const [pos, ch] of edits) {
    const i = t.length === 0 ? 0 : pos % (t.length + 1);
    t = t.slice(0, i) + ch + t.slice(i + (ch === '' ? 1 : 0));
  }
  return t;
});

describe('the core on generated and mutated notebooks', () => {
  it('never throws and keeps every diagnostic inside its document', () => {
    const host = new InMemoryHost(new Map([['data.csv', 'T/K, h/nm\n300, 100\n'], ['x.csv', 'junk']]));
    fc.assert(
      fc.property(fc.array(mutated, { minLength: 1, maxLength: 3 }), (texts) => {
        const nb = new Notebook(host);
        texts.forEach((t, i) => nb.setFile(`f${i}.md`, t));
        const report = nb.analyze();
        const json = toJsonReport(report);
        for (const f of report.files) {
          const len = f.text.length;
          for (const b of f.blocks) {
            for (const d of b.diagnostics) {
              assert.ok(d.span.start >= 0 && d.span.end <= len && d.span.start <= d.span.end, `${d.code} at ${d.span.start}-${d.span.end} of ${len}`);
            }
          }
        }
        for (const f of json.files) {
          const lineCount = new LineIndex(report.files.find((r) => r.path === f.path)!.text).lineCount;
          for (const d of f.blocks.flatMap((b) => b.diagnostics)) {
            assert.ok(d.line >= 1 && d.endLine <= lineCount && d.column >= 1, `${d.code} line ${d.line}`);
            assert.notEqual(d.code, 'internal.error', d.message);
          }
          for (const b of f.blocks) {
            for (const [name, r] of Object.entries(b.results)) assert.ok(Number.isFinite(r.value), `${name} = ${r.value} is reported`);
          }
        }
      }),
      propertyOptions(2000, 7),
    );
  });
});
