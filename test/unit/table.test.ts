import assert from 'node:assert/strict';
import { parseTable, readHeader } from '../../extension/core/parse/table.js';
import { messages } from '../../extension/core/model/messages.js';

describe('parseTable', () => {
  it('reads the three header forms', () => {
    assert.deepEqual(readHeader('T/K'), { symbol: 'T', unit: 'K' });
    assert.deepEqual(readHeader('T (K)'), { symbol: 'T', unit: 'K' });
    assert.deepEqual(readHeader('T [K]'), { symbol: 'T', unit: 'K' });
    assert.deepEqual(readHeader('Cp/(J g^-1 K^-1)'), { symbol: 'Cp', unit: 'J g^-1 K^-1' });
  });

  it('detects comma, tab, semicolon and whitespace delimiters', () => {
    for (const [lines, delim] of [
      [['T/K, h/nm', '300, 100'], 'comma'],
      [['T/K\th/nm', '300\t100'], 'tab'],
      [['T/K; h/nm', '300; 100'], 'semicolon'],
      [['T (K)  h (nm)', '300  100'], 'whitespace'],
    ] as const) {
      const t = parseTable(lines);
      assert.equal(t.delimiter, delim);
      assert.equal(t.rowCount, 1);
      assert.equal(t.byRole.get('temperature')?.values[0], 300);
      assert.equal(t.byRole.get('thickness')?.values[0], 100);
    }
  });

  it('reads a decimal comma where the delimiter is not a comma', () => {
    const t = parseTable(['T/K; h/nm', '300,5; 100,25']);
    assert.equal(t.byRole.get('temperature')?.values[0], 300.5);
    assert.equal(t.byRole.get('thickness')?.values[0], 100.25);
  });

  it('converts °C columns to kelvin and Å to nm', () => {
    const t = parseTable(['T/°C, h/Å', '25, 4000']);
    assert.equal(t.byRole.get('temperature')?.values[0], 298.15);
    assert.ok(Math.abs((t.byRole.get('thickness')?.values[0] ?? 0) - 400) < 1e-9);
  });

  it('skips comments and blank lines', () => {
    const t = parseTable(['# instrument export', '', 'T/K, h/nm', '# a note', '300, 100', '', '301, 101']);
    assert.equal(t.rowCount, 2);
    assert.deepEqual([...t.rowLines], [4, 6]);
  });

  it('reports each bad cell on its line and column and keeps the good rows', () => {
    const t = parseTable(['T/K, h/nm', '300, 100', '301, abc', '302, NaN', '303, 1e999', '304, 104']);
    assert.equal(t.rowCount, 2);
    assert.deepEqual(
      t.problems.map((p) => [p.message.code, p.line, p.start, p.end]),
      [
        [messages.tableBadCell('abc', 'h/nm').code, 2, 5, 8],
        ['table.non-finite', 3, 5, 8],
        ['table.non-finite', 4, 5, 10],
      ],
    );
  });

  it('uses the columns map to pick roles', () => {
    const t = parseTable(['Temp/K, d_ell/nm, d_qcm/nm', '300, 100, 99'], { thickness: 'd_ell' });
    assert.equal(t.byRole.get('thickness')?.values[0], 100);
  });

  it('says so when there is no header or no rows', () => {
    assert.equal(parseTable([]).problems[0].message.code, 'table.no-header');
    assert.equal(parseTable(['T/K, h/nm']).problems[0].message.code, 'table.no-rows');
  });
});

describe('parseTable header forms from instruments', () => {
  it('reads units from a second header line', () => {
    const t = parseTable(['Temperature, Thickness', 'K, nm', '300, 100', '301, 101']);
    assert.equal(t.rowCount, 2);
    assert.equal(t.byRole.get('temperature')?.values[1], 301);
    assert.equal(t.byRole.get('thickness')?.values[0], 100);
    assert.deepEqual(t.problems, []);
  });

  it('recognises spelled-out column names in any case, but keeps t and T apart', () => {
    const t = parseTable(['time (min), TEMPERATURE (°C), thickness (nm)', '1, 25, 100']);
    assert.equal(t.byRole.get('time')?.values[0], 60);
    assert.equal(t.byRole.get('temperature')?.values[0], 298.15);
    const u = parseTable(['t/s, T/K', '1, 300']);
    assert.equal(u.byRole.get('time')?.values[0], 1);
    assert.equal(u.byRole.get('temperature')?.values[0], 300);
  });

  it('reads exponents written without a caret', () => {
    const t = parseTable(['T/K, Cp/(J g-1 K-1)', '300, 1.5']);
    assert.equal(t.byRole.get('heat_capacity')?.values[0], 1.5);
  });
});
