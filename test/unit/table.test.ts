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

// Invented exports written the way instruments write them. Unit conversions from the SI Brochure
// (BIPM, 9th ed. 2019): T/K = t/°C + 273.15, 1 kHz = 1000 Hz, 1 W = 1000 mW, 1 min = 60 s.
describe('parseTable: instrument exports', () => {
  it('finds the header below a preamble without "#" and keeps its key: value lines', () => {
    const lines = [
      'Sample: film K-3 (invented)',
      'Mass: 5.21 mg',
      'Pan\taluminium, hermetic',
      'Method: heat 10 K/min; cool 10 K/min',
      'Export date: 2026-03-14 10:22',
      'A line of free text',
      '',
      'Temperature, Heat Flow (Endo Up)',
      '°C, mW',
      '25.0, -0.112',
      '26.0, -0.113',
    ];
    const t = parseTable(lines);
    assert.deepEqual(t.problems, []);
    assert.equal(t.rowCount, 2);
    assert.equal(t.unitsLine, 8);
    assert.deepEqual([...t.rowLines], [9, 10]);
    assert.deepEqual(t.preamble, [
      { key: 'Sample', value: 'film K-3 (invented)', line: 0 },
      { key: 'Mass', value: '5.21 mg', line: 1 },
      { key: 'Pan', value: 'aluminium, hermetic', line: 2 },
      { key: 'Method', value: 'heat 10 K/min; cool 10 K/min', line: 3 },
      { key: 'Export date', value: '2026-03-14 10:22', line: 4 },
    ]);
    assert.ok(Math.abs(t.byRole.get('temperature')!.values[0] - 298.15) < 1e-9);
    const hf = t.byRole.get('heat_flow')!;
    assert.equal(hf.convention, 'endotherm-up');
    assert.equal(hf.unit, 'mW');
    assert.equal(hf.values[1], -0.113);
    assert.equal(t.columns[0].headerLine, 7);
  });

  it('keeps "# key: value" comment lines of the preamble too, and tab-separated values joined', () => {
    const t = parseTable(['# Operator: A. Nobody', 'Sample mass\t5.21\tmg', 'T/K\tPhi/mW', '300\t1.5']);
    assert.deepEqual(t.preamble.map((p) => [p.key, p.value]), [
      ['Operator', 'A. Nobody'],
      ['Sample mass', '5.21 mg'],
    ]);
    assert.equal(t.byRole.get('heat_flow')?.values[0], 1.5);
  });

  it('reads a units line with blank, "-", "1" and "a.u." cells as columns without unit', () => {
    const t = parseTable(['Wavelength, n(632.8 nm), k, MSE, Thickness, Temperature', 'nm, -, 1, a.u., nm, °C', '632.8, 1.62, 0, 3.1, 401.2, 25', '632.8, 1.62, 0, 3.2, 401.0, 26']);
    assert.deepEqual(t.problems, []);
    assert.deepEqual(t.columns.map((c) => c.writtenUnit), ['nm', '', '', '', 'nm', '°C']);
    assert.equal(t.byRole.get('thickness')?.values[1], 401.0);
    assert.equal(t.columns[1].values[0], 1.62);
    const blank = parseTable(['T, n, h', 'K, , nm', '300, 1.6, 100']);
    assert.deepEqual(blank.problems, []);
    assert.equal(blank.byRole.get('thickness')?.values[0], 100);
  });

  it('takes a units line that starts with "1" for units, not for data', () => {
    const t = parseTable(['n, T, h', '1, K, nm', '1.6, 300, 100']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.unitsLine, 1);
    assert.equal(t.rowCount, 1);
  });

  it('lets the units line win over brackets that hold no unit', () => {
    const t = parseTable(['Time, Temperature, Heat Flow (Endo Down)', 'min, °C, W/g', '1, 25, 0.5']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.byRole.get('time')?.values[0], 60);
    const hf = t.byRole.get('specific_heat_flow')!;
    assert.equal(hf.convention, 'endotherm-down');
    assert.equal(hf.values[0], 0.5);
  });

  it('reads the sign convention in any case and either way round', () => {
    const conv = (header: string): string | undefined => parseTable([`T/K, ${header}`, '300, 1']).byRole.get('heat_flow')?.convention;
    assert.equal(conv('Heat Flow (Endo Up) (mW)'), 'endotherm-up');
    assert.equal(conv('Heat Flow (endo down)/mW'), 'endotherm-down');
    assert.equal(conv('Heat Flow exo up (mW)'), 'endotherm-down');
    assert.equal(conv('HF (EXO DOWN) [mW]'), 'endotherm-up');
    assert.equal(conv('Heat Flow (mW)'), undefined);
  });

  it('says a heat-flow column with only the convention in brackets has no unit, naming heat-flow units', () => {
    const t = parseTable(['Temperature (°C), Heat Flow (Endo Up)', '25, 1']);
    assert.equal(t.problems.length, 1);
    const m = t.problems[0].message;
    assert.equal(m.code, 'table.no-unit');
    assert.match(m.message, /a heat flow/);
    assert.match(m.message, /"Heat Flow \(mW\)"/);
  });

  it('maps multi-word headers to their roles', () => {
    const t = parseTable(['Elapsed Time (s), Sample Temperature (°C), Film Thickness (nm), Relaxation Time (s)', '1, 25, 100, 5']);
    assert.deepEqual(t.problems, []);
    assert.deepEqual(t.columns.map((c) => c.role), ['time', 'temperature', 'thickness', 'tau']);
  });

  it('ignores a delimiter at the end of every row, or of the rows only', () => {
    const t = parseTable(['T/K,h/nm,', '300,100,', '301,101,']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.columns.length, 2);
    assert.equal(t.byRole.get('thickness')?.values[1], 101);
    const rowsOnly = parseTable(['T/K;h/nm', '300;100;', '301;101;']);
    assert.deepEqual(rowsOnly.problems, []);
    assert.equal(rowsOnly.rowCount, 2);
    // A filled cell past the header is still a ragged row.
    assert.equal(parseTable(['T/K,h/nm', '300,100,5']).problems[0].message.code, 'table.ragged-row');
  });

  it('skips rows made of delimiters alone', () => {
    const t = parseTable(['T/K,h/nm', '300,100', ',,', '301,101']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.rowCount, 2);
  });

  // Clock times as ISO 8601 writes the time of day (hh:mm:ss, with a decimal fraction of the second).
  it('reads hh:mm:ss, h:mm:ss.s and mm:ss time columns as seconds', () => {
    const t = parseTable(['Time, Thickness (nm)', '00:00:00, 100', '0:01:30.5, 99', '1:00:00, 98']);
    assert.deepEqual(t.problems, []);
    assert.deepEqual([...t.byRole.get('time')!.values], [0, 90.5, 3600]);
    const mmss = parseTable(['t (mm:ss), h/nm', '05:30, 100', '125:00, 99']);
    assert.deepEqual(mmss.problems, []);
    assert.deepEqual([...mmss.byRole.get('time')!.values], [330, 7500]);
    const hms = parseTable(['Time (hh:mm:ss)\th (nm)', '0\t100', '00:10:00\t99']);
    assert.deepEqual([...hms.byRole.get('time')!.values], [0, 600]);
  });

  it('refuses a clock time out of range, and a clock time in a column that is not a time', () => {
    const t = parseTable(['Time, h/nm', '00:00:00, 100', '00:61:00, 99']);
    assert.equal(t.problems[0].message.code, 'table.bad-cell');
    assert.equal(t.problems[0].line, 2);
    assert.equal(parseTable(['T/K, h/nm', '10:00, 100']).problems[0].message.code, 'table.bad-cell');
  });

  it('reads loss-peak frequencies: f_max in any frequency unit and log10(f_max) forms', () => {
    const f = parseTable(['T/K, f_max/kHz', '250, 1.5']);
    assert.equal(f.byRole.get('f_max')?.values[0], 1500);
    assert.equal(f.byRole.get('f_max')?.unit, 'Hz');
    const log = parseTable(['T (K), log10(f_max/kHz)', '250, 0.5']);
    assert.deepEqual(log.problems, []);
    assert.ok(Math.abs(log.byRole.get('log10_fmax')!.values[0] - 3.5) < 1e-12);
    const bare = parseTable(['T/K\tlog_f', '250\t2.25']);
    assert.equal(bare.byRole.get('log10_fmax')?.values[0], 2.25);
    const unitInBrackets = parseTable(['T/K, log_f (Hz)', '250, 2.25']);
    assert.equal(unitInBrackets.byRole.get('log10_fmax')?.values[0], 2.25);
    const tau = parseTable(['T/K, log10(tau/ms)', '250, 1']);
    assert.ok(Math.abs(tau.byRole.get('log10_tau')!.values[0] - -2) < 1e-12);
  });
});

describe('parseTable: messages name the dimension a column needs', () => {
  it('never suggests kelvin for a time column', () => {
    const t = parseTable(['t/K, h/nm', '1, 100']);
    const m = t.problems[0].message;
    assert.equal(m.code, 'table.wrong-dimension');
    assert.match(m.message, /needs a time, such as "t\/s" or "t \(min\)"/);
    const none = parseTable(['Time, h/nm', '1, 100']).problems[0].message;
    assert.equal(none.code, 'table.no-unit');
    assert.match(none.message, /a time, such as "Time\/s" or "Time \(min\)"/);
    assert.doesNotMatch(none.message, /\bK\b/);
  });

  it('never suggests kelvin for a thickness column', () => {
    const t = parseTable(['T/K, h/s', '300, 100']);
    assert.match(t.problems[0].message.message, /needs a length, such as "h\/nm" or "h \(Å\)"/);
    const none = parseTable(['T/K, Thickness', '300, 100']).problems[0].message;
    assert.match(none.message, /a length, such as "Thickness\/nm" or "Thickness \(Å\)"/);
    assert.doesNotMatch(none.message, /\bK\b/);
  });

  it('reports a unit of the units line on the units line', () => {
    const t = parseTable(['Time, Thickness', 'min, K', '1, 100']);
    assert.deepEqual(t.problems.map((p) => [p.message.code, p.line, p.start, p.end]), [['table.wrong-dimension', 1, 5, 6]]);
  });
});

describe('parseTable: where the header is', () => {
  it('takes a units line that stops before the last columns', () => {
    const t = parseTable(['Time, Temperature, Thickness, Comment', 's, K, nm', '0, 300, 100, 7', '60, 301, 100.1, 8']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.unitsLine, 1);
    assert.equal(t.byRole.get('thickness')?.values[1], 100.1);
  });

  it('keeps the first text line as the header when no row starts with a number, so its cells are reported', () => {
    const t = parseTable(['T/K, h/nm', 'abc, def']);
    assert.equal(t.columns[0].headerLine, 0);
    assert.equal(t.problems[0].message.code, 'table.bad-cell');
  });

  it('keeps a preamble line that starts with a number in the preamble', () => {
    const t = parseTable(['Sample: V-1', '5.21 mg', '10 K/min heating, then cooling', 'Method: heat', 'T/K, h/nm', '300, 100', '301, 101']);
    assert.equal(t.columns[0].headerLine, 4);
    assert.deepEqual(t.problems, []);
    assert.equal(t.rowCount, 2);
  });

  it('reports a bad cell in a row that starts with a number, even in the first row', () => {
    const t = parseTable(['Sample: A', 'T/K, h/nm', '300, abc', '301, 101']);
    assert.equal(t.columns[0].headerLine, 1);
    assert.deepEqual(t.problems.map((p) => [p.message.code, p.line]), [['table.bad-cell', 2]]);
    assert.equal(t.rowCount, 1);
  });
});

describe('parseTable: the columns map', () => {
  it('leaves a key that names no role to the schema, and never throws on it', () => {
    const t = parseTable(['T/K, h/nm', '300, 100'], { foo: 'T/K', constructor: 'h/nm' });
    assert.deepEqual(t.problems, []);
    assert.equal(t.byRole.get('temperature')?.values[0], 300);
  });
});

describe('parseTable: a first row that is not a number stays a row', () => {
  // Common practice, no source: a header names quantities; a row under it that does not start with
  // a number is a bad row, not a new header.
  const codes = (t: ReturnType<typeof parseTable>): Array<[string, number]> => t.problems.map((p) => [p.message.code, p.line]);

  it('reports "3OO" (letters O for zeros) in the first row of an inline table and of a file', () => {
    for (const inline of [true, false]) {
      const t = parseTable(['T/K, h/nm', '3OO, 400', '301, 401'], {}, { inline });
      assert.equal(t.columns[0].headerLine, 0);
      assert.deepEqual(codes(t), [['table.bad-cell', 1]]);
      assert.equal(t.byRole.get('temperature')?.values[0], 301);
    }
  });

  it('reports an empty first cell, "n/a" and a stray text line under the header', () => {
    assert.deepEqual(codes(parseTable(['T/K, h/nm', ', 400', '301, 401'])), [['table.empty-cell', 1]]);
    assert.deepEqual(codes(parseTable(['T/K, h/nm', 'n/a, 400', '301, 401'])), [['table.bad-cell', 1]]);
    assert.deepEqual(codes(parseTable(['Sample: B', 'T/K, h/nm', 'annealed first', '300, 100'])), [['table.ragged-row', 2]]);
  });

  it('takes the inline header from the first line even when a later text line names columns', () => {
    const t = parseTable(['T/K, h/nm', 'Temperature, Thickness', '300, 100'], {}, { inline: true });
    assert.equal(t.columns[0].headerLine, 0);
    assert.equal(t.preamble.length, 0);
    assert.equal(t.problems[0].message.code, 'table.bad-cell');
    const commented = parseTable(['# Sample Mass: 5.0 mg', 'T/K, h/nm', '300, 100'], {}, { inline: true });
    assert.equal(commented.columns[0].headerLine, 1);
    assert.deepEqual(commented.preamble, [{ key: 'Sample Mass', value: '5.0 mg', line: 0 }]);
  });

  it('reads U+2212 MINUS SIGN as a minus, in the first row too', () => {
    // −5 °C = 268.15 K (ITS-90: T/K = t/°C + 273.15).
    const t = parseTable(['T/°C, h/nm', '\u22125, 400', '\u22124, 399']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.columns[0].headerLine, 0);
    assert.ok(Math.abs(t.byRole.get('temperature')!.values[0] - 268.15) < 1e-9);
  });

  it('keeps an instrument preamble whose lines name one quantity out of the header', () => {
    const t = parseTable(['Temperature program: 10 K/min', 'Method: heat from 16.85 °C', 'Time, Temperature, Heat Flow', 'min, °C, mW', '0, 16.85, 1.0', '0.05, 17.35, 1.0']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.columns[0].headerLine, 2);
    assert.equal(t.unitsLine, 3);
    assert.equal(t.preamble[0].key, 'Temperature program');
  });

  it('takes a units line whose unit is also a symbol (h for hours) as units, not as the header', () => {
    const t = parseTable(['Note: hold', 'Time, Thickness', 'h, nm', '1, 100', '2, 99']);
    assert.equal(t.columns[0].headerLine, 1);
    assert.equal(t.unitsLine, 2);
    assert.equal(t.byRole.get('time')?.values[1], 7200);
  });
});

describe('parseTable: clock times and the column unit', () => {
  // ISO 8601 writes durations on a clock as hh:mm:ss; "1:30" under t/h is ambiguous (an hour and a
  // half, or a minute and a half), so it is reported, not guessed. Common practice, no source.
  it('reads clock cells in a column in seconds, and refuses them in a column in hours or minutes', () => {
    assert.deepEqual([...parseTable(['t/s, h/nm', '1:30, 100']).byRole.get('time')!.values], [90]);
    for (const unit of ['h', 'min']) {
      const t = parseTable([`t/${unit}, h/nm`, '1:30, 100', '2, 99']);
      assert.equal(t.problems.length, 1);
      assert.equal(t.problems[0].message.code, 'table.bad-cell');
      assert.deepEqual([t.problems[0].line, t.problems[0].start, t.problems[0].end], [1, 0, 4]);
      assert.match(t.problems[0].message.message, /t \(hh:mm:ss\)/);
      assert.equal(t.rowCount, 1);
    }
  });
});

describe('parseTable: columns without a role', () => {
  it('keeps rows whose comment column holds words, the comments as NaN', () => {
    const t = parseTable(['T/K, h/nm, Comment', '300, 100, film looks hazy', '301, 101, ', '302, 102, 7']);
    assert.deepEqual(t.problems, []);
    assert.equal(t.rowCount, 3);
    assert.ok(Number.isNaN(t.columns[2].values[0]));
    assert.equal(t.columns[2].values[2], 7);
  });

  it('gives an unrecognised logarithm column no unit', () => {
    const t = parseTable(['T/K, h/nm, log10(eta/(Pa s))', '300, 100, 12']);
    assert.equal(t.columns[2].role, null);
    assert.equal(t.columns[2].unit, '');
  });

  it('recognises log10(τ/s) as the decadic logarithm of the relaxation time', () => {
    const t = parseTable(['T/K, log10(τ/ms)', '250, 1']);
    assert.deepEqual(t.problems, []);
    assert.ok(Math.abs(t.byRole.get('log10_tau')!.values[0] - -2) < 1e-12);
  });
});

describe('parseTable: two columns of one role', () => {
  it('keeps the column whose unit is good when the other has a typo', () => {
    // 26.85 °C = 300 K (ITS-90).
    const t = parseTable(['T/Kelvn, Temperature/°C, h/nm', '1, 26.85, 100']);
    assert.deepEqual(t.problems.map((p) => p.message.code), ['table.unknown-unit']);
    assert.equal(t.byRole.get('temperature')?.header, 'Temperature/°C');
    assert.ok(Math.abs(t.byRole.get('temperature')!.values[0] - 300) < 1e-9);
  });

  it('still reports two good columns of one role, at the second', () => {
    const t = parseTable(['T/K, Temperature/°C, h/nm', '300, 26.85, 100']);
    assert.deepEqual(t.problems.map((p) => [p.message.code, p.start]), [['table.duplicate-column', 5]]);
    assert.equal(t.byRole.get('temperature')?.values[0], 300);
    assert.equal(t.columns[1].unit, '°C');
  });
});
