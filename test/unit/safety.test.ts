import assert from 'node:assert/strict';
import fc from 'fast-check';
import { InMemoryHost, JsonList, MAX_NOTEBOOK_FILE_BYTES, Notebook, toJsonReport, toLazyJsonReport, type FilmSummary, type JsonReport } from '../../extension/core/index.js';
import { finiteFigure, finiteResults } from '../../extension/core/analysis/finiteResults.js';
import { messages } from '../../extension/core/model/messages.js';
import { MAX_METADATA_DEPTH } from '../../extension/core/parse/metadata.js';
import { parseQuantity } from '../../extension/core/parse/quantity.js';
import { csvField, csvNumberField } from '../../extension/core/report/escape.js';
import { summaryCsv } from '../../extension/core/report/summaryCsv.js';
import { resolveNotebookPath } from '../../extension/core/text/notebookPath.js';
import { terminalJson, terminalText, writeTerminalJson } from '../../extension/cli/terminalText.js';
import { decodeNotebookBytes } from '../../extension/node/notebookText.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';
import { propertyOptions } from '../support/propertyOptions.js';

/** The JSON report of one in-memory notebook file (with optional data files). */
function analyse(text: string, data: Record<string, string> = {}): JsonReport['files'][number] {
  const nb = new Notebook(new InMemoryHost(new Map(Object.entries(data))));
  nb.setFile('nb.md', text);
  return toJsonReport(nb.analyze()).files[0];
}

function block(file: JsonReport['files'][number], id: string): JsonReport['files'][number]['blocks'][number] {
  const b = file.blocks.find((x) => x.id === id);
  assert.ok(b, `block ${id}`);
  return b;
}

const codesOf = (b: { diagnostics: ReadonlyArray<{ code: string }> }): string[] => b.diagnostics.map((d) => d.code);

describe('csvField and summaryCsv: formulas never reach a spreadsheet', () => {
  // OWASP, "CSV Injection": prefix a single quote to any cell that begins with =, +, -, @, tab or carriage return.
  it('guards every text cell that starts with = + - @ tab or carriage return, after OWASP\'s CSV injection advice', () => {
    assert.equal(csvField('=SUM(A1)'), "'=SUM(A1)");
    assert.equal(csvField('+1+1'), "'+1+1");
    assert.equal(csvField('@SUM(A1)'), "'@SUM(A1)");
    assert.equal(csvField('\t=1'), "'\t=1");
    assert.equal(csvField('\r=1'), `"'\r=1"`);
    assert.equal(csvField("-1+1+cmd|' /C calc'!A0"), "'-1+1+cmd|' /C calc'!A0");
    assert.equal(csvField('-2+3+HYPERLINK("http://example.invalid","x")'), `"'-2+3+HYPERLINK(""http://example.invalid"",""x"")"`);
    assert.equal(csvField('-1'), "'-1", 'a text cell is text, even when it reads as a number');
    assert.equal(csvField('  =1+1'), "'  =1+1", 'leading white space does not hide a formula');
    assert.equal(csvField('\uFF1D1+1'), "'\uFF1D1+1", 'nor does the full-width equals sign');
    assert.equal(csvField('D-02'), 'D-02');
  });

  it('keeps numbers that Vitrine writes as numbers', () => {
    assert.equal(csvField(-3.5), '-3.5');
    assert.equal(csvNumberField('-13.96'), '-13.96');
    assert.equal(csvNumberField('3.13e+3'), '3.13e+3');
    assert.equal(csvNumberField('-1+1'), "'-1+1", 'anything that is not plainly a number is guarded');
    assert.equal(csvNumberField(''), '');
  });

  it('guards the text columns of the summary and leaves its numbers alone', () => {
    const row: FilmSummary = {
      film: 'D-9',
      file: '-2+3+HYPERLINK("http://example.invalid")/day.md',
      material: '@cmd',
      tsub: 270,
      densityGain: { value: -1.5, unit: '%', uncertainty: 0.05, method: 'test' },
    };
    const [header, line] = summaryCsv([row]).trim().split('\n');
    const cells = new Map(header.split(',').map((h, i) => [h, i]));
    assert.match(line, /^D-9,'@cmd,"'-2\+3\+HYPERLINK\(""http:\/\/example\.invalid""\)\/day\.md",270\.0,/);
    assert.equal(line.split(',')[cells.get('density_gain/%')!], '-1.500');
  });
});

describe('terminalText and terminalJson: control characters are shown, not obeyed', () => {
  it('escapes ESC, CR, NUL, BEL, DEL, the C1 controls and bidirectional overrides, and keeps line feeds', () => {
    assert.equal(terminalText('a\x1b[31mred\x1b[0m'), 'a\\x1b[31mred\\x1b[0m');
    assert.equal(terminalText('over\rwrite'), 'over\\rwrite');
    assert.equal(terminalText('nul\0 bell\x07 del\x7f csi\x9b tab\t'), 'nul\\x00 bell\\x07 del\\x7f csi\\x9b tab\\t');
    assert.equal(terminalText('evil\u202Etxt.md'), 'evil\\u202etxt.md');
    assert.equal(terminalText('one\ntwo: 281 K, τ = 10 s, 8 °C'), 'one\ntwo: 281 K, τ = 10 s, 8 °C');
  });

  it('writes JSON with no raw control character that reads back to the same strings', () => {
    const value = { message: 'key \x1b]0;title\x07 csi\x9b del\x7f rlo\u202E\r\n' };
    const text = terminalJson(value);
    // eslint-disable-next-line no-control-regex -- these are the characters that must not appear
    assert.doesNotMatch(text, /[\0-\x09\x0b-\x1f\x7f-\x9f\u202e]/);
    assert.deepEqual(JSON.parse(text), value);
  });

  it('writes the same JSON in pieces as whole, whatever the value', () => {
    const unsafe = fc.constantFrom('\x1b[2J', '\r', '\u202e', '\x9b', 'τ', '\n', '"', '\\');
    // Values JSON.stringify treats in its own ways: toJSON (given the key; giving undefined; giving
    // an object with a toJSON of its own, not called), Number, String and Boolean objects.
    const special = fc.constantFrom<unknown>(
      new Date(0),
      { toJSON: (key: string) => `key ${key}` },
      { toJSON: () => undefined },
      { toJSON: () => ({ toJSON: () => 'second', x: 1 }) },
      new String('ab'),
      new Number(3),
      new Boolean(false),
    );
    const leaf = fc.oneof(fc.jsonValue({ maxDepth: 2 }), unsafe, fc.constant(undefined), fc.constant(Number.NaN), special);
    const value = fc.letrec((tie) => ({
      node: fc.oneof(
        { depthSize: 'small' },
        leaf,
        fc.array(tie('node'), { maxLength: 4 }),
        // Holes are written as JSON.stringify writes them: null.
        fc.sparseArray(tie('node'), { maxLength: 4 }),
        fc.array(tie('node'), { maxLength: 4 }).map((items) => new JsonList(items.length, (i) => items[i])),
        fc.dictionary(fc.oneof(fc.string(), unsafe), tie('node'), { maxKeys: 4 }),
      ),
    })).node;
    fc.assert(
      fc.property(fc.oneof(fc.dictionary(fc.string(), value), fc.array(value)), fc.integer({ min: 0, max: 5 }), (v, depth) => {
        const pieces: string[] = [];
        writeTerminalJson(v, (p) => pieces.push(p), depth);
        assert.equal(pieces.join(''), terminalJson(v));
      }),
      propertyOptions(500, 7),
    );
  });
});

describe('the JSON report written block by block', () => {
  it('makes the items of a list one at a time, as it writes them', () => {
    let made = 0;
    const list = new JsonList(2000, (i) => {
      made++;
      return { index: i, text: 'x'.repeat(100) };
    });
    let madeAtFirstWrite = -1;
    const pieces: string[] = [];
    writeTerminalJson({ files: [{ blocks: list }] }, (p) => {
      if (madeAtFirstWrite < 0) madeAtFirstWrite = made;
      pieces.push(p);
    });
    assert.ok(madeAtFirstWrite > 0 && madeAtFirstWrite < 500, `items made before the first write: ${madeAtFirstWrite}`);
    assert.equal(made, 2000);
    assert.deepEqual(JSON.parse(pieces.join('')).files[0].blocks[1999], { index: 1999, text: 'x'.repeat(100) });
  });

  it('is the same report as the one made at once', () => {
    const nb = new Notebook(new InMemoryHost(new Map([['ramp.csv', 'T/K, h/nm\n' + Array.from({ length: 40 }, (_, i) => `${340 - i}, ${100 + (i < 20 ? 0.1 : 0.02) * (20 - i)}`).join('\n')]])));
    nb.setFile('nb.md', `${MATERIAL_BLOCK()}\n${DEPOSITION_BLOCK('D-1', 280)}\n\`\`\`ramp R-1\nfilm: D-1\nrate: 10 K/min\ndata: ramp.csv\n\`\`\`\n\`\`\`ramp R-2\nfilm: D-9\n\`\`\`\n`);
    const report = nb.analyze();
    const pieces: string[] = [];
    writeTerminalJson(toLazyJsonReport(report), (p) => pieces.push(p));
    assert.equal(pieces.join(''), terminalJson(toJsonReport(report)));
    assert.ok(toJsonReport(report).files[0].blocks.length >= 4);
  });
});

describe('finite figures only', () => {
  it('finiteResults drops values that are not finite and says which, keeping finite results as they are', () => {
    const good = { value: 1, unit: 'K', method: 'm' };
    const kept = finiteResults({ good }, { start: 0, end: 1 });
    assert.equal(kept.results.good, good);
    assert.deepEqual(kept.diagnostics, []);
    const r = finiteResults({ good, inf: { value: Infinity, unit: 'nm', method: 'm' }, nan: { value: NaN, unit: '1', method: 'm' }, u: { value: 2, unit: 'K', uncertainty: Infinity, interval: [1, Infinity], method: 'm' } }, { start: 0, end: 1 });
    assert.deepEqual(Object.keys(r.results).sort(), ['good', 'u']);
    assert.deepEqual(r.results.u, { value: 2, unit: 'K', method: 'm' });
    assert.deepEqual(r.diagnostics.map((d) => d.code), ['result.not-finite', 'result.not-finite']);
    assert.equal(r.diagnostics[0].message, messages.resultNotFinite('inf', Infinity).message);
  });

  it('finiteFigure leaves out points and markers that are not finite', () => {
    const f = finiteFigure({ xTitle: 'x', yTitle: 'y', series: [{ name: 'd', role: 'data', points: [[1, 2], [Infinity, 3], [4, NaN]] }], markers: [{ label: 'm', x: -Infinity }] });
    assert.deepEqual(f.series[0].points, [[1, 2]]);
    assert.deepEqual(f.markers, []);
  });

  it('does not report rate × duration when it overflows (1e300 × 1e300), and says why on the block', () => {
    const text = MATERIAL_BLOCK(315) + '```deposition D-1\nmaterial: M-1\nsubstrate_temperature: 260 K\nrate: 1e300 nm/s\nduration: 1e300 s\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n```\n';
    const d = block(analyse(text), 'D-1');
    assert.equal(d.results.expected_thickness, undefined);
    assert.ok(d.results.tsub_over_tg, 'the other figures are still reported');
    assert.ok(codesOf(d).includes('result.not-finite'));
    assert.doesNotMatch(JSON.stringify(d.results), /null|Infinity/);
  });

  it('does not report Tsub/Tg against a subnormal Tg of 1e-320 K', () => {
    const text = '```material M-1\nname: g\ntg: 1e-320 K\ntg_source: invented\n```\n' + DEPOSITION_BLOCK('D-1', 260);
    const d = block(analyse(text), 'D-1');
    assert.equal(d.results.tsub_over_tg, undefined);
    assert.ok(codesOf(d).includes('result.not-finite'));
  });

  it('refuses log10_tau0: -1e400 as not finite, and computes nothing from it', () => {
    const text = MATERIAL_BLOCK(315, 'vft:\n  log10_tau0: -1e400\n  B: 1000 K\n  T0: 250 K\n');
    const m = block(analyse(text), 'M-1');
    assert.deepEqual(m.results, {});
    assert.ok(codesOf(m).includes('quantity.not-finite'));
  });

  it('refuses a quantity that overflows when converted to its canonical unit', () => {
    assert.deepEqual(parseQuantity('1e308 GPa', 'pressure'), { ok: false, reason: 'not-finite', unitText: 'GPa', unitSpans: [] });
    assert.equal(parseQuantity('1e308 Pa', 'pressure').ok, true);
  });
});

describe('values out of range', () => {
  it('refuses absolute temperatures at or below 0 K (0 K, −5 K, −300 °C) with an error on the value', () => {
    for (const t of ['0 K', '-5 K', '-300 °C']) {
      const text = MATERIAL_BLOCK(315) + '```deposition D-1\nmaterial: M-1\nsubstrate_temperature: ' + t + '\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n```\n';
      const d = block(analyse(text), 'D-1');
      const e = d.diagnostics.find((x) => x.code === 'meta.out-of-range');
      assert.ok(e, t);
      assert.equal(e.severity, 'error');
      assert.equal(e.line, 8, 'on the value');
      assert.equal(d.results.tsub_over_tg, undefined, t);
    }
  });

  it('refuses a negative rate or duration instead of reporting a positive thickness', () => {
    for (const [rate, duration] of [['-0.2 nm/s', '2000 s'], ['0.2 nm/s', '-2000 s']]) {
      const text = MATERIAL_BLOCK(315) + `\`\`\`deposition D-1\nmaterial: M-1\nsubstrate_temperature: 260 K\nrate: ${rate}\nduration: ${duration}\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n\`\`\`\n`;
      const d = block(analyse(text), 'D-1');
      assert.equal(d.results.expected_thickness, undefined, `${rate} × ${duration}`);
      assert.ok(d.diagnostics.some((x) => x.code === 'meta.out-of-range' && x.severity === 'error'));
    }
  });

  it('refuses a sample mass of zero and a negative heating rate', () => {
    const dsc = analyse(MATERIAL_BLOCK(315) + '```dsc C-1\nmaterial: M-1\nrate: -10 K/min\nquantity: heat flow\nmass: 0 mg\n---\nT/K, Phi/mW\n300, 1\n```\n');
    const lines = block(dsc, 'C-1').diagnostics.filter((x) => x.code === 'meta.out-of-range').map((x) => x.line);
    assert.deepEqual(lines, [8, 10]);
  });

  it('leaves out table rows at or below 0 K, with one error on the first such row', () => {
    const rows = Array.from({ length: 12 }, (_, i) => [-290 - 10 * i, 1 + 0.1 * i]);
    const c = block(analyse(MATERIAL_BLOCK(315) + tableBlock('dsc', 'C-1', 'material: M-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))', rows)), 'C-1');
    const errors = c.diagnostics.filter((d) => d.code === 'table.temperature-not-positive');
    assert.equal(errors.length, 1);
    assert.equal(errors[0].line, 11, 'the first data row');
    assert.match(errors[0].message, /and so are 11 more rows/);
    assert.deepEqual(c.results, {});
  });
});

describe('VFT fits that are refused', () => {
  it('refuses a fit through one temperature and says so', () => {
    const x = block(analyse(MATERIAL_BLOCK(315) + tableBlock('relaxation', 'X-1', 'material: M-1\nmethod: invented\n', 'T/K, tau/s', [[300, 1], [300, 2], [300, 3], [300, 4], [300, 5]])), 'X-1');
    assert.deepEqual(x.results, {});
    const d = x.diagnostics.find((e) => e.code === 'relaxation.vft-invalid');
    assert.equal(d?.message, messages.relaxFewTemperatures(1).message);
  });

  it('refuses a fit that gives B ≤ 0 (τ rising with temperature) and reports no VFT parameters', () => {
    const rows = [300, 310, 320, 330, 340, 350].map((T, i) => [T, 10 ** (-6 + i)]);
    const x = block(analyse(MATERIAL_BLOCK(315) + tableBlock('relaxation', 'X-1', 'material: M-1\nmethod: invented\n', 'T/K, tau/s', rows)), 'X-1');
    assert.deepEqual(x.results, {});
    const d = x.diagnostics.find((e) => e.code === 'relaxation.vft-invalid');
    assert.ok(d);
    assert.match(d.message, /B = -\d/);
  });

  it('still reports a sound fit', () => {
    // log10 τ = −14 + 1008/(T − 237) (the parameters of the notebook tests' material).
    const rows = [300, 305, 310, 315, 320, 330, 340].map((T) => [T, 10 ** (-14 + 1008 / (T - 237))]);
    const x = block(analyse(MATERIAL_BLOCK(315) + tableBlock('relaxation', 'X-1', 'material: M-1\nmethod: invented\n', 'T/K, tau/s', rows, 12)), 'X-1');
    assert.ok(Math.abs(x.results.vft_B.value - 1008) < 1);
    assert.ok(!codesOf(x).includes('relaxation.vft-invalid'));
  });
});

describe('tables too short to analyse', () => {
  it('says how many rows a ramp needs, for 1 to 4 rows', () => {
    for (let n = 1; n <= 4; n++) {
      const rows = Array.from({ length: n }, (_, i) => [300 + i, 100 + 0.1 * i]);
      const r = block(analyse(MATERIAL_BLOCK(315) + DEPOSITION_BLOCK('D-1', 260) + tableBlock('ramp', 'R-1', 'film: D-1\nrate: 10 K/min\n', 'T/K, h/nm', rows)), 'R-1');
      const d = r.diagnostics.find((e) => e.code === 'table.too-few-rows');
      assert.equal(d?.message, messages.tableTooFewRows('ramp', n, 10, 'for any figure (a first heating needs 10, and Tg 8 on each side of the transition while cooling)').message);
    }
  });

  it('says how many rows a dsc scan needs', () => {
    const rows = Array.from({ length: 4 }, (_, i) => [300 + i, 1 + 0.1 * i]);
    const c = block(analyse(MATERIAL_BLOCK(315) + tableBlock('dsc', 'C-1', 'material: M-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))', rows)), 'C-1');
    assert.match(c.diagnostics.find((e) => e.code === 'table.too-few-rows')?.message ?? '', /has 4 rows; at least 10/);
  });

  it('refuses a dsc scan named as its own reference (an enthalpy gap of 0 by construction)', () => {
    // A Cp step of 0.5 J/(g·K) at 330 K (a smooth synthetic scan).
    const rows = Array.from({ length: 61 }, (_, i) => {
      const T = 300 + i;
      return [T, 1 + 0.002 * (T - 300) + 0.5 / (1 + Math.exp(-(T - 330) / 1.5))];
    });
    const c = block(analyse(MATERIAL_BLOCK(315) + tableBlock('dsc', 'C-1', 'material: M-1\nrate: 10 K/min\nreference: C-1\n', 'T/K, Cp/(J/(g*K))', rows)), 'C-1');
    assert.equal(c.results.enthalpy_gap, undefined);
    const d = c.diagnostics.find((e) => e.code === 'dsc.reference-self');
    assert.equal(d?.severity, 'error');
    assert.equal(d?.line, 9);
  });
});

describe('messages that say what is wrong', () => {
  it('says that data: "." names a folder, not that it leads outside', () => {
    for (const written of ['.', 'sub/..', './']) {
      const r = block(analyse(MATERIAL_BLOCK(315) + DEPOSITION_BLOCK('D-1', 260) + `\`\`\`ramp R-1\nfilm: D-1\nrate: 10 K/min\ndata: "${written}"\n\`\`\`\n`), 'R-1');
      const d = r.diagnostics.find((e) => e.code === 'data.unreadable');
      assert.equal(d?.message, messages.dataIsFolder(written).message, written);
      assert.ok(!codesOf(r).includes('data.outside-root'));
    }
  });

  it('reads a data file named ..x.csv at the root: only a whole .. segment leads outside', () => {
    assert.deepEqual(resolveNotebookPath('nb.md', '..x.csv'), { ok: true, path: '..x.csv' });
    assert.deepEqual(resolveNotebookPath('nb.md', '../x.csv'), { ok: false, reason: 'outside' });
    const rows = Array.from({ length: 12 }, (_, i) => `${300 + i}, ${100 + 0.1 * i}`).join('\n');
    const r = block(analyse(MATERIAL_BLOCK(315) + DEPOSITION_BLOCK('D-1', 260) + '```ramp R-1\nfilm: D-1\nrate: 10 K/min\ndata: ..x.csv\n```\n', { '..x.csv': `T/K, h/nm\n${rows}\n` }), 'R-1');
    assert.ok(!codesOf(r).some((c) => c.startsWith('data.')), codesOf(r).join(', '));
  });

  it('says that deeply nested metadata is nested too deeply, with the limit', () => {
    const deep = '['.repeat(5000) + ']'.repeat(5000);
    const m = block(analyse(`\`\`\`material M-1\nname: deep\ntg: 300 K\nnotes: ${deep}\n\`\`\`\n`), 'M-1');
    assert.deepEqual(codesOf(m), ['yaml.too-deep']);
    assert.equal(m.diagnostics[0].message, messages.yamlTooDeep(MAX_METADATA_DEPTH).message);
    assert.doesNotMatch(m.diagnostics[0].message, /call stack/);
    const shallow = block(analyse(`\`\`\`material M-1\nname: fine\ntg: 300 K\ntg_source: x\nnotes: ${'['.repeat(10)}${']'.repeat(10)}\n\`\`\`\n`), 'M-1');
    assert.ok(!codesOf(shallow).includes('yaml.too-deep'));
  });

  it('refuses notebook text longer than the limit with file.too-large', () => {
    const f = analyse('x'.repeat(MAX_NOTEBOOK_FILE_BYTES + 1));
    assert.deepEqual(f.blocks, []);
    assert.deepEqual(f.diagnostics.map((d) => d.code), ['file.too-large']);
    assert.match(f.diagnostics[0].message, /16 MiB/);
  });
});

describe('decodeNotebookBytes', () => {
  const text = '```material M-1\nname: é τ\n```\n';
  const utf16be = (s: string): Uint8Array => {
    const le = Buffer.from(s, 'utf16le');
    for (let i = 0; i + 1 < le.length; i += 2) [le[i], le[i + 1]] = [le[i + 1], le[i]];
    return le;
  };

  it('decodes UTF-8 with and without a BOM, and a BOM written twice', () => {
    assert.deepEqual(decodeNotebookBytes(Buffer.from(text)), { ok: true, text });
    assert.deepEqual(decodeNotebookBytes(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)])), { ok: true, text });
    assert.deepEqual(decodeNotebookBytes(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf, 0xef, 0xbb, 0xbf]), Buffer.from(text)])), { ok: true, text });
  });

  it('decodes UTF-16 little- and big-endian with their BOM', () => {
    assert.deepEqual(decodeNotebookBytes(Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')])), { ok: true, text });
    assert.deepEqual(decodeNotebookBytes(Buffer.concat([Buffer.from([0xfe, 0xff]), utf16be(text)])), { ok: true, text });
  });

  it('refuses UTF-32 by name', () => {
    const r = decodeNotebookBytes(Buffer.from([0xff, 0xfe, 0, 0, 0x41, 0, 0, 0]));
    assert.equal(r.ok, false);
    assert.match(!r.ok ? r.detail : '', /UTF-32/);
  });
});
