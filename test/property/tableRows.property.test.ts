import assert from 'node:assert/strict';
import fc from 'fast-check';
import { parseTable, plainNumber } from '../../extension/core/parse/table.js';
import { linesOfText } from '../../extension/core/parse/tableLines.js';
import { propertyOptions } from '../support/propertyOptions.js';

// Rows of a data table, as instruments and people write them: plain numbers, numbers with spaces,
// tabs and trailing delimiters, and rows the reader must refuse (words, empty cells, a temperature
// at or below 0 K, too many or too few cells). The table reader keeps exactly the rows a plain
// reference reader written here keeps — split at the delimiter, trimmed, each cell a decimal
// number in the grammar of ECMAScript's StringToNumber restricted to plain decimals — with the same
// values, converted from °C (T/K = t/°C + 273.15, ISO 80000-5; common practice, no source).

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

const cell = fc.oneof(
  { weight: 8, arbitrary: fc.double({ min: -400, max: 1e4, noNaN: true, noDefaultInfinity: true }).map((v) => String(v)) },
  { weight: 2, arbitrary: fc.integer({ min: -300, max: 900 }).map((v) => String(v)) },
  { weight: 1, arbitrary: fc.constant('') },
  { weight: 1, arbitrary: fc.constantFrom('n/a', 'abc', '1e999', '.5', '+3', '-0', '1.', 'e5', '1e', '--1', '5-', '1.2.3') },
);
const pad = fc.constantFrom('', ' ', '  ', '\t');
const delimiter = fc.constantFrom(',', ';', '\t', ' ');

const row = (sep: string) =>
  fc.tuple(fc.array(fc.tuple(pad, cell, pad), { minLength: 1, maxLength: 3 }), fc.boolean()).map(([cells, trailing]) => {
    const text = cells.map(([a, c, b]) => (sep === ' ' || sep === '\t' ? c : a + c + b)).join(sep);
    return trailing && sep !== ' ' ? text + sep : text;
  });

/** The rows the plain reference keeps: [T in K, h]. */
function reference(lines: readonly string[], sep: string): Array<[number, number]> {
  const kept: Array<[number, number]> = [];
  for (const line of lines) {
    if (line.trim() === '') continue;
    let cells = sep === ' ' ? line.trim().split(/\s+/) : line.split(sep).map((c) => c.replace(/^[ \t]+|[ \t\r]+$/g, ''));
    if (sep !== ' ' && cells.length === 3 && cells[2] === '') cells = cells.slice(0, 2);
    if (cells.length !== 2 || !cells.every((c) => DECIMAL.test(c))) continue;
    const t = Number(cells[0]) + 273.15;
    const h = Number(cells[1]);
    if (!Number.isFinite(t) || !Number.isFinite(h) || !(t > 0)) continue;
    kept.push([t, h]);
  }
  return kept;
}

describe('data table rows against a plain reference reader', () => {
  it('keeps the same rows with the same values', () => {
    fc.assert(
      fc.property(
        delimiter.chain((sep) => fc.tuple(fc.constant(sep), fc.array(row(sep), { minLength: 0, maxLength: 30 }))),
        ([sep, lines]) => {
          const header = sep === ' ' ? 'T/°C h/nm' : ['T/°C', 'h/nm'].join(sep);
          const table = parseTable([header, ...lines]);
          // Read in place from the joined text, the same table.
          const inPlace = parseTable(linesOfText([header, ...lines].join('\n')));
          assert.equal(inPlace.rowCount, table.rowCount);
          table.columns.forEach((c, j) => assert.deepEqual(inPlace.columns[j].values, c.values));
          assert.deepEqual(inPlace.rowLines, table.rowLines);
          const expected = reference(lines, sep);
          const T = table.byRole.get('temperature');
          const h = table.byRole.get('thickness');
          assert.ok(T && h, 'both columns');
          assert.equal(table.rowCount, expected.length, JSON.stringify({ lines, problems: table.problems.map((p) => p.message.code) }));
          expected.forEach(([t, hv], r) => {
            assert.ok(Math.abs(T.values[r] - t) <= 1e-9 * Math.abs(t), `T row ${r}`);
            assert.equal(h.values[r], hv, `h row ${r}`);
          });
        },
      ),
      propertyOptions(400, 20261202),
    );
  });
});

// A cell's number is read from its characters, without a string, when its digits and power of ten
// allow one exact division or multiplication (Clinger, "How to read floating point numbers
// accurately", PLDI 1990); the value must then be exactly the one ECMAScript's Number reads.
describe('a plain number read from its characters', () => {
  const digits = (min: number, max: number) => fc.array(fc.constantFrom(...'0123456789'), { minLength: min, maxLength: max }).map((d) => d.join(''));
  const decimal = fc
    .tuple(fc.constantFrom('', '+', '-'), digits(0, 18), fc.boolean(), digits(0, 18), fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '+', '-'), digits(1, 3))))
    .map(([sign, whole, point, fraction, exp]) => `${sign}${whole}${point ? '.' : ''}${point ? fraction : ''}${exp ? exp.join('') : ''}`);

  it('is the value Number reads, or NaN when it leaves the cell to Number', () => {
    fc.assert(
      fc.property(decimal, (text) => {
        const v = plainNumber(text, 0, text.length);
        if (Number.isNaN(v)) return;
        assert.ok(DECIMAL.test(text), text);
        assert.ok(Object.is(v, Number(text)), `${text}: ${v} against ${Number(text)}`);
      }),
      propertyOptions(20000, 20261203),
    );
  });

  it('reads the numbers instruments write without falling back', () => {
    for (const text of ['312.4567', '-0.0001', '1.234e-7', '400.0123', '6.02E+3', '0', '-0', '.5', '12.']) {
      assert.ok(Object.is(plainNumber(text, 0, text.length), Number(text)), text);
    }
  });
});

// A table's lines are found once and read in place; as strings they must be the lines of
// `split(/\r\n|\r|\n/)` (LF, CR LF and CR breaks, common practice, no source).
describe('table lines read in place', () => {
  it('are the lines a split at LF, CR LF and CR gives, with their bounds in the text', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom('a', '1', ',', ' ', '\n', '\r', '\r\n', '\t', '-'), { maxLength: 40 }), (parts) => {
        const text = parts.join('');
        const expected = text.split(/\r\n|\r|\n/);
        const lines = linesOfText(text);
        assert.equal(lines.length, expected.length, JSON.stringify(text));
        expected.forEach((line, i) => {
          assert.equal(lines.line(i), line);
          assert.equal(lines.text(i).slice(lines.start(i), lines.end(i)), line);
        });
      }),
      propertyOptions(2000, 20261205),
    );
  });
});
