import assert from 'node:assert/strict';
import { parseQuantity, parseTgMultiple } from '../../extension/core/parse/quantity.js';
import { dimensionWords, hasDimension, lookupUnit, normaliseUnitText, suggestUnit, toCanonical } from '../../extension/core/parse/units.js';

function value(text: string, dim: Parameters<typeof parseQuantity>[1]): number {
  const q = parseQuantity(text, dim);
  assert.ok(q.ok, `${text} should parse as ${dim}`);
  return q.quantity.value;
}

describe('units', () => {
  it('converts degrees Celsius to kelvin with the 273.15 K offset', () => {
    // Source: SI Brochure, 9th edition (2019), 2.3.4: t/°C = T/K − 273.15 (exact by definition).
    assert.equal(value('8 °C', 'temperature'), 281.15);
    assert.equal(value('-3.15 °C', 'temperature'), 270);
    assert.equal(value('25 degC', 'temperature'), 298.15);
  });

  it('treats °C inside a rate as a difference', () => {
    // A kelvin and a degree Celsius are equal as intervals (SI Brochure, 2.3.4).
    assert.equal(value('10 °C/min', 'heating_rate'), 10);
    assert.equal(value('10 K/min', 'heating_rate'), 10);
    assert.ok(Math.abs(value('0.1667 K/s', 'heating_rate') - 10.002) < 1e-9);
  });

  it('converts pressures from Torr and mbar', () => {
    // Source: NIST SP 811 (2008), appendix B.8: 1 torr = 133.3224 Pa; 1 mbar = 100 Pa.
    assert.ok(Math.abs(value('1 Torr', 'pressure') - 133.3224) < 1e-3);
    assert.ok(Math.abs(value('1e-6 mbar', 'pressure') - 1e-4) < 1e-15);
    assert.equal(value('3e-6 Pa', 'pressure'), 3e-6);
  });

  it('reads Å, µm and compound rates', () => {
    // 1 Å = 0.1 nm (NIST SP 811, B.8).
    assert.ok(Math.abs(value('2 Å/s', 'rate') - 0.2) < 1e-12);
    assert.ok(Math.abs(value('1 µm', 'length') - 1000) < 1e-9);
    assert.ok(Math.abs(value('1.2 nm/min', 'rate') - 0.02) < 1e-12);
  });

  it('reads heat-capacity units written with /, * and spaces', () => {
    for (const u of ['J/(g*K)', 'J g^-1 K^-1', 'J/(g K)', 'J·g⁻¹·K⁻¹']) {
      const r = lookupUnit(u);
      assert.ok(r, u);
      assert.ok(hasDimension(r, 'heat_capacity'), u);
      assert.ok(Math.abs(toCanonical(1, r, 'heat_capacity') - 1) < 1e-12, u);
    }
    assert.ok(Math.abs(value('1 J/(kg*K)', 'heat_capacity') - 1e-3) < 1e-15);
  });

  it('rejects a unit of the wrong dimension and unknown units', () => {
    const wrong = parseQuantity('10 K', 'rate');
    assert.equal(wrong.ok, false);
    assert.equal(!wrong.ok && wrong.reason, 'wrong-dimension');
    const unknown = parseQuantity('400 blorps', 'length');
    assert.equal(!unknown.ok && unknown.reason, 'unknown-unit');
    assert.equal(lookupUnit('K; rm -rf'), null);
  });

  it('marks a bare number as an assumed unit', () => {
    const q = parseQuantity(250, 'temperature');
    assert.ok(q.ok && q.assumedUnit && q.quantity.value === 250);
  });

  it('reads a standard uncertainty after ± or +/-', () => {
    const q = parseQuantity('315 ± 1.5 K', 'temperature');
    assert.ok(q.ok && q.quantity.uncertainty === 1.5);
    const c = parseQuantity('42 +/- 0.5 °C', 'temperature');
    assert.ok(c.ok && c.quantity.value === 315.15 && c.quantity.uncertainty === 0.5);
  });

  it('normalises notations', () => {
    assert.equal(normaliseUnitText('J g^-1 K^-1'), 'J*g^-1*K^-1');
    assert.equal(normaliseUnitText('°C/min'), 'degC/min');
  });
});

describe('metadata notation as practitioners write it', () => {
  // The value of each notation is computed by hand from its definition; conversions from NIST
  // SP 811 (2008), appendix B.8 (1 Torr = 101 325/760 Pa, 1 Å = 0.1 nm, 1 h = 3600 s).
  const near = (a: number, b: number, rel = 1e-12) => Math.abs(a - b) <= rel * Math.abs(b);
  const TORR = 133.3224;

  it('reads powers of ten written with ×, x, · or * and a caret or superscripts', () => {
    // 2×10⁻⁷ Torr = 2e-7 × 133.3224 Pa (NIST SP 811, B.8); math.js rounds the torr to 133.322 Pa.
    for (const t of ['2×10⁻⁷ Torr', '2x10^-7 Torr', '2·10^-7 Torr', '2 × 10^(-7) Torr', '2*10^-7 Torr', '2e-7 Torr']) {
      assert.ok(near(value(t, 'pressure'), 2e-7 * TORR, 1e-5), t);
    }
    assert.ok(near(value('10⁻⁷ Torr', 'pressure'), 1e-7 * TORR, 1e-5));
    assert.ok(near(value('10^-7 Torr', 'pressure'), 1e-7 * TORR, 1e-5));
  });

  it('reads the minus sign U+2212 in numbers and exponents', () => {
    // SI Brochure (9th ed., 2019), 5.4.3: the minus sign; t/°C = T/K − 273.15.
    assert.equal(value('\u22123.15 °C', 'temperature'), 270);
    assert.ok(near(value('2e\u22127 Torr', 'pressure'), 2e-7 * TORR, 1e-5));
    assert.ok(near(value('2×10^\u22127 Torr', 'pressure'), 2e-7 * TORR, 1e-5));
    assert.ok(near(value('10 K min\u22121', 'heating_rate'), 10));
  });

  it('keeps an upper or lower bound as such', () => {
    for (const [t, bound] of [['< 3e-7 Torr', 'upper'], ['≤ 3e-7 Torr', 'upper'], ['<= 3e-7 Torr', 'upper'], ['> 3e-7 Torr', 'lower'], ['≥3e-7 Torr', 'lower']] as const) {
      const q = parseQuantity(t, 'pressure');
      assert.ok(q.ok, t);
      assert.equal(q.quantity.bound, bound, t);
      assert.ok(near(q.quantity.value, 3e-7 * TORR, 1e-5), t);
    }
    const plain = parseQuantity('3e-7 Torr', 'pressure');
    assert.ok(plain.ok && plain.quantity.bound === undefined);
  });

  it('reads durations as hours, minutes and seconds, and on a clock', () => {
    // 1 h 10 min = 3600 + 600 s; 00:29:10 = 29 × 60 + 10 s (common practice, no source).
    assert.equal(value('1 h 10 min', 'time'), 4200);
    assert.equal(value('1h10m', 'time'), 4200);
    assert.equal(value('2 min 30 s', 'time'), 150);
    assert.equal(value('00:29:10', 'time'), 1750);
    assert.equal(value('1:02:03', 'time'), 3723);
    assert.equal(value('1:10:00 h', 'time'), 4200);
    // "m" alone is the metre, not a minute.
    const metre = parseQuantity('10 m', 'time');
    assert.equal(!metre.ok && metre.reason, 'wrong-dimension');
    // A clock is read only for times.
    assert.equal(parseQuantity('29:10', 'temperature').ok, false);
  });

  it('refuses a two-part clock as ambiguous unless a unit names its first part', () => {
    // "1:10" is 1 h 10 min on a wall clock and 1 min 10 s on a stopwatch (common practice, no
    // source); "1:10 h" and "29:10 min" say which, as "1:30 h" and "3:45 min" do in print.
    for (const t of ['1:10', '29:10', '29:10.5', ' 1:10 ']) {
      const q = parseQuantity(t, 'time');
      assert.equal(!q.ok && q.reason, 'ambiguous-clock', t);
    }
    const q = parseQuantity('29:10,5', 'time');
    assert.deepEqual(!q.ok && q.clock, { first: 29, second: 10.5 });
    assert.equal(value('1:10 h', 'time'), 4200);
    assert.equal(value('1:10 hours', 'time'), 4200);
    assert.equal(value('29:10 min', 'time'), 1750);
    assert.equal(value('29:10.5 min', 'time'), 1750.5);
    assert.equal(value('1:10 min', 'time'), 70);
    // "m" is the metre; "s" would name no first part of a clock.
    for (const t of ['1:10 m', '1:10 s']) assert.equal(parseQuantity(t, 'time').ok, false, t);
  });

  it('gives the place of a wrong unit in the text, in the value and in the uncertainty', () => {
    const at = (text: string): string[] => {
      const q = parseQuantity(text, 'temperature');
      assert.ok(!q.ok, text);
      return q.unitSpans.map((s) => `${s.start}-${s.end}:${text.slice(s.start, s.end)}`);
    };
    assert.deepEqual(at('12 C ± 0.5 °C'), ['3-4:C']);
    assert.deepEqual(at(' 12 C ± 0.5 C '), ['4-5:C', '12-13:C']);
    assert.deepEqual(at('285 K ± 0.5 C'), ['12-13:C']);
    assert.deepEqual(at('(12 ± 0.5)  C'), ['12-13:C']);
    assert.deepEqual(at('12 ± 0.5 C'), ['9-10:C']);
    assert.deepEqual(at('12 ºC'), ['3-5:ºC']);
    assert.deepEqual(at('\u221212 C'), ['4-5:C']);
    assert.deepEqual(at('1,250 K'), []);
  });

  it('reads a decimal comma, and refuses one that could separate thousands', () => {
    // SI Brochure (9th ed., 2019), 5.4.2: the decimal marker is a point or a comma.
    assert.ok(near(value('12,5 °C', 'temperature'), 285.65));
    assert.ok(near(value('0,125 nm/s', 'rate'), 0.125));
    assert.ok(near(value('(12,5 ± 0,5) °C', 'temperature'), 285.65));
    const ambiguous = parseQuantity('1,250 K', 'temperature');
    assert.equal(!ambiguous.ok && ambiguous.reason, 'ambiguous-comma');
  });

  it('converts an uncertainty written with its own unit as an interval', () => {
    // A kelvin and a degree Celsius are equal as intervals (SI Brochure, 2.3.4).
    const a = parseQuantity('12 °C ± 0.5 °C', 'temperature');
    assert.ok(a.ok && near(a.quantity.value, 285.15) && a.quantity.uncertainty === 0.5);
    const b = parseQuantity('285 K ± 0.5 °C', 'temperature');
    assert.ok(b.ok && b.quantity.value === 285 && b.quantity.uncertainty === 0.5);
    const c = parseQuantity('(12.0 ± 0.5) °C', 'temperature');
    assert.ok(c.ok && near(c.quantity.value, 285.15) && c.quantity.uncertainty === 0.5);
    // 1 Å/s = 0.1 nm/s.
    const d = parseQuantity('2 Å/s ± 0.01 nm/s', 'rate');
    assert.ok(d.ok && near(d.quantity.value, 0.2) && near(d.quantity.uncertainty!, 0.01));
    const wrong = parseQuantity('12 °C ± 0.5 nm', 'temperature');
    assert.equal(!wrong.ok && wrong.reason, 'wrong-dimension');
  });

  it('reads a multiple of Tg apart, and refuses it as a plain temperature', () => {
    for (const t of ['0.85 Tg', '0.85Tg', '0.85 × Tg', '0.85 x Tg', '0.85 T_g']) assert.deepEqual(parseTgMultiple(t), { factor: 0.85 }, t);
    assert.deepEqual(parseTgMultiple('0.85 ± 0.01 Tg'), { factor: 0.85, uncertainty: 0.01 });
    assert.equal(parseTgMultiple('268 K'), null);
    const q = parseQuantity('0.85 Tg', 'temperature');
    assert.equal(!q.ok && q.reason, 'tg-multiple');
  });

  it('accepts the spellings of units people write', () => {
    // 1 Å = 0.1 nm; 1 min = 60 s; 1 h = 3600 s (NIST SP 811, B.8).
    for (const t of ['4000 Angstrom', '4000 angstroms', '4000 Ångström', '4000 Å']) assert.ok(near(value(t, 'length'), 400), t);
    assert.equal(value('25 deg C', 'temperature'), 298.15);
    assert.equal(value('25 degC', 'temperature'), 298.15);
    assert.equal(value('10 sec', 'time'), 10);
    assert.equal(value('10 mins', 'time'), 600);
    assert.equal(value('2 hrs', 'time'), 7200);
    // 1 mTorr = 1e-3 Torr.
    assert.ok(near(value('5 mTorr', 'pressure'), 5e-3 * TORR, 1e-5));
  });
});

describe('suggestUnit', () => {
  it('offers °C for C (the coulomb), ºC and oC, and Å for A (the ampere)', () => {
    assert.equal(suggestUnit('C', 'temperature')?.unit, '°C');
    assert.match(suggestUnit('C', 'temperature')!.why, /coulomb/);
    assert.equal(suggestUnit('ºC', 'temperature')?.unit, '°C');
    assert.match(suggestUnit('ºC', 'temperature')!.why, /ordinal/);
    assert.equal(suggestUnit('oC', 'temperature')?.unit, '°C');
    assert.equal(suggestUnit('C/min', 'heating_rate')?.unit, '°C/min');
    assert.equal(suggestUnit('A', 'length')?.unit, 'Å');
    assert.match(suggestUnit('A', 'length')!.why, /ampere/);
    assert.equal(suggestUnit('A/s', 'rate')?.unit, 'Å/s');
    assert.equal(suggestUnit('m', 'time')?.unit, 'min');
  });

  it('offers nothing for a right unit, or where no near miss fits the dimension', () => {
    assert.equal(suggestUnit('K', 'temperature'), null);
    assert.equal(suggestUnit('A', 'temperature'), null);
    assert.equal(suggestUnit('C', 'length'), null);
    assert.equal(suggestUnit('K', 'rate'), null);
    assert.equal(suggestUnit('blorps', 'length'), null);
  });

  it('names what a unit measures', () => {
    assert.equal(dimensionWords(lookupUnit('K')!), 'a temperature');
    assert.equal(dimensionWords(lookupUnit('nm')!), 'a length');
    assert.equal(dimensionWords(lookupUnit('C')!), null);
  });
});
