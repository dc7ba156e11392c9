import assert from 'node:assert/strict';
import { parseQuantity } from '../../extension/core/parse/quantity.js';
import { hasDimension, lookupUnit, normaliseUnitText, toCanonical } from '../../extension/core/parse/units.js';

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
