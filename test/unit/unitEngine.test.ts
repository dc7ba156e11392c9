import assert from 'node:assert/strict';
import { createUnit, Unit as MathUnit, unit as mathUnit, type Unit as MathUnitValue } from 'mathjs';
import { BASE_QUANTITIES, findUnit, unitDefinitions } from '../../extension/core/parse/unitTable.js';
import { CANONICAL, hasDimension, lookupUnit, normaliseUnitText, toCanonical, type Dimension, type ResolvedUnit } from '../../extension/core/parse/units.js';
import { uniform } from '../support/random.js';

// Parity of Vitrine's unit engine with math.js 15 (J. de Jong et al., https://mathjs.org), the
// independent library it replaces at run time: for every unit string below, both agree on whether
// it is a unit, on its dimension vector, its factor to SI and its offset, and on what it converts
// to in each of Vitrine's dimensions. The reference is math.js driven exactly as Vitrine drove it
// (same text normalisation, same refusal of long or strange text, `mtorr` and `utorr` added).

// ---------------------------------------------------------------------------------------------
// The reference: math.js.

for (const [name, definition] of [['mtorr', '0.001 torr'], ['utorr', '0.000001 torr']] as const) {
  try {
    mathUnit(name);
  } catch {
    createUnit(name, definition);
  }
}

interface MathDefinition {
  readonly name: string;
  readonly prefixes: Record<string, { readonly value: number }>;
}
const MATH_UNITS = (MathUnit as unknown as { UNITS: Record<string, MathDefinition> }).UNITS;
const MATH_BASES: readonly string[] = MathUnit.BASE_DIMENSIONS;
/** math.js's base dimension for each of Vitrine's base quantities (m, kg, s, A, K, mol, cd, rad). */
const BASE_OF: Record<(typeof BASE_QUANTITIES)[number], string> = {
  m: 'LENGTH', kg: 'MASS', s: 'TIME', A: 'CURRENT', K: 'TEMPERATURE', mol: 'AMOUNT_OF_SUBSTANCE', cd: 'LUMINOUS_INTENSITY', rad: 'ANGLE',
};

interface Reference {
  readonly text: string;
  readonly unit: MathUnitValue;
  readonly absolute: boolean;
}

function reference(written: string): Reference | null {
  const text = normaliseUnitText(written);
  if (written.length > 256 || text.length === 0 || text.length > 64 || !/^[A-Za-z0-9_()*/^.\- ]+$/.test(text)) return null;
  try {
    const u = mathUnit(text);
    if (u.value !== null && u.value !== undefined) return null;
    const single = u.units.length === 1 && u.units[0].power === 1;
    return { text, unit: u, absolute: single && u.units[0].unit.offset !== 0 };
  } catch {
    return null;
  }
}

const DIMENSIONS = Object.keys(CANONICAL) as Dimension[];

function referenceHas(ref: Reference, dimension: Dimension): boolean {
  if (dimension === 'dimensionless') return ref.unit.dimensions.every((d) => d === 0);
  return ref.unit.equalBase(mathUnit(CANONICAL[dimension].unit));
}

function referenceToCanonical(value: number, ref: Reference, dimension: Dimension): number {
  if (dimension === 'dimensionless') return value * mathUnit(1, ref.text).toSI().toNumber();
  const target = CANONICAL[dimension].unit;
  if (ref.absolute && dimension === 'temperature') return mathUnit(value, ref.text).toNumber(target);
  if (ref.absolute) return value * (mathUnit(1, ref.text).toNumber(target) - mathUnit(0, ref.text).toNumber(target));
  return value * mathUnit(1, ref.text).toNumber(target);
}

/** SI units per written unit, the offset aside: the value math.js stores for 1 of the unit. */
function referenceFactor(ref: Reference): number {
  return mathUnit(1, ref.text).value;
}

// ---------------------------------------------------------------------------------------------
// Where Vitrine differs from math.js on purpose.

/**
 * Units math.js knows that no lab notebook of this field writes, left out of Vitrine's table;
 * written, they are unknown units (a diagnostic names the quantity expected).
 */
const LEFT_OUT: Readonly<Record<string, string>> = {
  ...group('information, not a physical quantity', 'b bits B bytes bit byte'),
  ...group('cooking, apothecary and barrel volumes', 'cuin cuft cuyd teaspoon tablespoon drop gtt minim fluiddram fluidounce gill cup pint quart gallon beerbarrel oilbarrel hogshead teaspoons tablespoons minims fldr fluiddrams floz fluidounces gi gills cp cups pt pints qt quarts gal gallons bbl beerbarrels obl oilbarrels hogsheads gtts'),
  ...group("surveyors' lengths and land areas", 'link rod chain li rd ch links rods chains sqin sqft sqyd sqmi sqrd sqch sqmil acre hectare acres hectares sqfeet sqyard sqmile sqmiles'),
  ...group('trade weights (the pound lb, lbs, lbm is kept)', 'ton tons grain dram ounce poundmass hundredweight stick stone gr dr oz cwt grains drams ounces poundmasses hundredweights sticks kip kips'),
  ...group('times longer than any ageing', 'decade century millennium decades centuries millennia'),
  ...group('the gon and the turn', 'grad gradian cycle gradians cycles'),
  ...group('engineering energy and power units (math.js reads VAR as a complex number)', 'BTU BTUs hp VAR VA'),
};

function group(reason: string, names: string): Record<string, string> {
  return Object.fromEntries(names.split(' ').map((n) => [n, reason]));
}

/**
 * Factors Vitrine takes from their definitions where math.js rounds them, and the largest
 * relative difference that leaves: 1 Torr = 101 325/760 Pa exactly and the conventional mmHg is
 * 133.322 387 415 Pa (NIST SP 811, 2008, B.8; math.js has 133.322 for both); 1 eV =
 * 1.602 176 634 × 10⁻¹⁹ J exactly (SI Brochure, 9th ed., 2019; math.js has the 2010 CODATA value);
 * 1 psi = 0.453 592 37 kg × 9.806 65 m/s² / (0.0254 m)² exactly (NIST SP 811, B.8; math.js
 * rounds at the eleventh digit).
 */
const REDEFINED: Readonly<Record<string, number>> = { psi: 1e-10, torr: 3e-6, mtorr: 3e-6, utorr: 3e-6, mmHg: 3e-6, mmhg: 3e-6, eV: 5e-8, electronvolt: 5e-8, electronvolts: 5e-8 };

/** Relative tolerance for a resolved unit: floating point, or the redefinition of one of its units. */
function tolerance(resolved: ResolvedUnit): number {
  let tol = 1e-12;
  for (const f of resolved.unit.factors) tol = Math.max(tol, (REDEFINED[f.unit.name] ?? 0) * Math.max(1, Math.abs(f.power)));
  return tol;
}

function near(a: number, b: number, rel: number): boolean {
  return Object.is(a, b) || Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b));
}

/** Asserts that Vitrine and math.js read `written` alike. */
function assertSameReading(written: string): void {
  const ref = reference(written);
  const mine = lookupUnit(written);
  const leftOut = ref !== null && ref.unit.units.some((u) => u.unit.name in LEFT_OUT);
  if (leftOut) {
    assert.equal(mine, null, `${written}: left out on purpose, so unknown`);
    return;
  }
  assert.equal(mine !== null, ref !== null, `${written}: ${ref ? 'math.js reads it' : 'math.js refuses it'}`);
  if (!mine || !ref) return;
  const tol = tolerance(mine);
  BASE_QUANTITIES.forEach((q, i) => {
    const expected = ref.unit.dimensions[MATH_BASES.indexOf(BASE_OF[q])];
    assert.ok(near(mine.unit.dimensions[i], expected, 1e-12), `${written}: exponent of ${q} ${mine.unit.dimensions[i]}, math.js ${expected}`);
  });
  // No unit of the table is information (bits); NaN only where an infinite power met a zero.
  const bit = ref.unit.dimensions[MATH_BASES.indexOf('BIT')];
  assert.ok(bit === 0 || Number.isNaN(bit), `${written}: bits ${bit}`);
  assert.ok(near(mine.unit.factor, referenceFactor(ref), tol), `${written}: factor ${mine.unit.factor}, math.js ${referenceFactor(ref)}`);
  assert.equal(mine.absoluteTemperature, ref.absolute, `${written}: offset applies`);
  for (const d of DIMENSIONS) {
    assert.equal(hasDimension(mine, d), referenceHas(ref, d), `${written}: is ${d}`);
    if (!hasDimension(mine, d)) continue;
    for (const v of [1, 0, -40, 300.5]) {
      const a = toCanonical(v, mine, d);
      const b = referenceToCanonical(v, ref, d);
      assert.ok(near(a, b, tol), `${written} as ${d}: ${v} → ${a}, math.js ${b}`);
    }
  }
}

// ---------------------------------------------------------------------------------------------

/** Units as practitioners write them in notebooks, instrument exports and table headers. */
const WRITTEN: readonly string[] = [
  // Temperatures and their spellings.
  'K', 'kelvin', 'mK', 'kK', '°C', '° C', 'degC', 'deg C', 'degrees C', 'celsius', 'Celsius', '℃', '°F', 'degF', 'fahrenheit',
  'degR', 'rankine', 'mdegC', 'degC^1', '(degC)', 'degC^2', 'kelvins', '°K',
  // Times.
  's', 'sec', 'secs', 'second', 'seconds', 'ms', 'msec', 'us', 'µs', 'μs', 'ns', 'ps', 'fs', 'ks', 'min', 'mins', 'minute',
  'minutes', 'h', 'hr', 'hrs', 'hour', 'hours', 'd', 'day', 'days', 'week', 'weeks', 'month', 'months', 'year', 'years', 'yr',
  // Lengths.
  'm', 'km', 'cm', 'mm', 'um', 'µm', 'μm', 'nm', 'pm', 'dam', 'hm', 'Å', 'Angstrom', 'angstrom', 'angstroms', 'Ångström', 'ångström',
  'in', 'inch', 'inches', 'mil', 'ft', 'meter', 'meters', 'nanometer', 'micrometer', 'nanometre',
  // Areas and volumes.
  'cm^2', 'cm2', 'mm²', 'm2', 'L', 'l', 'mL', 'ml', 'uL', 'µL', 'dL', 'liter', 'litre', 'milliliter', 'millilitre', 'liters', 'lt', 'cc',
  'cm^3', 'cm3', 'cm³', 'mm^3', 'm^3', 'nm^3', 'pt', 'qt', 'gal',
  // Masses.
  'g', 'mg', 'ug', 'µg', 'ng', 'kg', 'gram', 'grams', 'milligram', 'lb', 'lbs', 'lbm', 't', 'tonne', 'Pt', 'oz',
  // Pressures.
  'Pa', 'kPa', 'MPa', 'GPa', 'hPa', 'mPa', 'uPa', 'Torr', 'torr', 'mTorr', 'mtorr', 'uTorr', 'µTorr', 'kTorr', 'mmHg', 'mmhg', 'bar',
  'mbar', 'ubar', 'millibar', 'mb', 'atm', 'psi', 'mmH2O', 'N/m^2', 'N/m2', 'N m^-2',
  // Energies and powers.
  'J', 'kJ', 'mJ', 'uJ', 'joule', 'joules', 'eV', 'meV', 'keV', 'erg', 'Wh', 'kWh', 'cal', 'kcal', 'BTU',
  'W', 'mW', 'uW', 'µW', 'nW', 'kW', 'watt', 'watts', 'milliwatt', 'hp',
  // Amount, frequency, electric and other units.
  'mol', 'mmol', 'umol', 'kmol', 'mole', 'moles', 'Hz', 'kHz', 'MHz', 'mHz', 'hertz', 'kilohertz', 's^-1', 'min^-1', '1/s',
  'A', 'mA', 'nA', 'V', 'mV', 'uV', 'µV', 'kV', 'C', 'mC', 'ohm', 'kohm', 'Mohm', 'ohms', 'Ω', 'F', 'pF', 'uF', 'S', 'H', 'T', 'mT',
  'Wb', 'Ah', 'mAh', 'N', 'mN', 'kN', 'dyn', 'lbf', 'kgf', 'cd', 'candela',
  'deg', 'degree', 'degrees', 'rad', 'mrad', 'mdeg', 'arcsec', 'arcmin', 'b', 'kB',
  // Heating and deposition rates.
  'K/min', 'K min^-1', 'K min-1', 'K min⁻¹', 'K·min⁻¹', 'K min\u22121', 'K/s', 'K s^-1', 'K/h', 'K/hr', 'mK/s', '°C/min', '°C/s', '°C min^-1',
  'degC/min', 'C/min', '°F/min', 'K/min/s', 'K / min', ' K  /  min ', 'nm/s', 'nm/min', 'Å/s', 'A/s', 'um/h', 'nm s^-1', 'nm·s⁻¹',
  'Å s−1', 'Angstrom/s', 'nm/sec',
  // Heat capacities, enthalpies, heat flows.
  'J/(g*K)', 'J/(g K)', 'J/(g·K)', 'J g^-1 K^-1', 'J g-1 K-1', 'J·g⁻¹·K⁻¹', 'J/g/K', 'J/g*K', 'J/(kg*K)', 'J/(kg K)', 'kJ/(kg*K)',
  'J/(mol*K)', 'J/(mol K)', 'J K^-1 mol^-1', 'J/g', 'J g^-1', 'kJ/mol', 'J/mol', 'kJ/kg', 'mJ/mg', 'W/g', 'mW/mg', 'mW/g', 'W/kg',
  'uW/mg', 'mW/(mg*K)', '(J/(g*K))', 'J/((g*K))',
  // Molar masses, specific volumes, densities, and more.
  'g/mol', 'kg/mol', 'g mol^-1', 'cm^3/g', 'cm3/g', 'cm³/g', 'cm³ g⁻¹', 'mL/g', 'm^3/kg', 'g/cm^3', 'g/cm3', 'g cm^-3', 'kg/m^3',
  'g/mL', 'mol/L', 'mmol/g', 'Pa*s', 'Pa s', 'mPa s', 'N*m', 'W/(m*K)', 'W/(m K)', 'W m^-1 K^-1', 'K^-1', '1/K', 'm^2/s', 'cm^2/s',
  'nm^2/s', 'm2/s', 'Hz^-1', 'K^2', 'K^-1.5', 'K^0.5', 'K^.5', 'K ^ 2', 'K^+2', 'K^2e1', 'K^0', 'Torr*L/s', 'mbar L/s', 'Pa m^3/s',
  'mTorr/s', 'eV/K', 'K/K', 'm/m', 'nm/um', 'mm/m', '(K)/min', 'K/(min)', 'K/(min*s)', '(K*s)/(min*s)', 'K(s)', '(K)(s)', 'K^2m',
  // Wrong case and look-alikes.
  'k', 'KPA', 'kpa', 'pa', 'Kpa', 'MIN', 'Sec', 'HZ', 'hz', 'mw', 'MW', 'Mw', 'NM', 'KG', 'Kg', 'MG', 'ML', 'KJ', 'C°', 'ºC', 'oC',
  // Junk that is no unit.
  'zorks', 'blorps', 'K/', '**', '((K)', '10', 'K^', '1/', '', ' ', 'K K', 'K*', '*K', '/K', 'K//min', 'K**2', 'K^^2', 'K^-', 'K^.',
  'K)', '()', '(K', 'K(', 'K^2.5.3', '2K', 'K2', 'cm-3', '-K', 'K-1', '10^-3 K', '1e-3 K', 'e', 'E', 'K; rm -rf', 'K_1', 'k_B',
  'nm/s;', 'a.u.', 'au', 'arb', '%', 'percent', 'ppm', 'wt%', 'x', 'NaN', 'Infinity', 'constructor', 'toString', '__proto__',
  'hasOwnProperty', 'mmin', 'Gy', 'M', 'nM', 'K^(1/2)', 'K^1e400', '.5 K', '.K', 'K.', 'K*(s', '(((((K)))))', 'K/min'.repeat(13),
];

describe('unit engine, parity with math.js', () => {
  it('reads every unit string as practitioners write it as math.js does', () => {
    assert.ok(WRITTEN.length >= 200, `${WRITTEN.length} strings`);
    for (const w of WRITTEN) assertSameReading(w);
  });

  it('reads every word its table accepts (each unit with each prefix) as math.js does', () => {
    // Exhaustive: the words the engine knows are finite, a unit name with a prefix it takes.
    let words = 0;
    for (const u of unitDefinitions()) {
      for (const p of u.prefixes.keys()) {
        const word = p + u.name;
        const found = findUnit(word);
        const math = MathUnit.parse(word).units;
        if (!found) {
          // `pt` and `qt`: math.js's pint and quart, left out, not a pico- and a quectotonne.
          assert.ok(math[0].unit.name in LEFT_OUT, `${word} is ${math[0].unit.name} in math.js`);
          continue;
        }
        assert.equal(math.length, 1, word);
        assert.equal(found.unit.name, math[0].unit.name, `${word} is ${math[0].unit.name} in math.js`);
        assert.equal(found.prefix, (math[0].prefix as unknown as { value: number }).value, `${word}: prefix`);
        assertSameReading(word);
        words++;
      }
    }
    assert.ok(words > 2000, `${words} words`);
  });

  it('refuses exactly the units it leaves out, and every word math.js builds on them', () => {
    const mine = new Set(unitDefinitions().map((u) => u.name));
    const missing = Object.keys(MATH_UNITS).filter((n) => !mine.has(n));
    assert.deepEqual(missing.sort(), Object.keys(LEFT_OUT).sort());
    for (const name of missing) {
      for (const p of Object.keys(MATH_UNITS[name].prefixes)) {
        const word = p + name;
        if (MathUnit.parse(word).units[0].unit.name !== name) continue;
        assert.equal(findUnit(word), null, `${word} (${LEFT_OUT[name]})`);
        assert.equal(lookupUnit(word), null, word);
      }
    }
  });

  it('parses products, quotients, brackets and powers as math.js does (seeded random strings)', () => {
    // Random strings over the pieces of the unit grammar, the most of them well formed enough to
    // reach deep into the parser; the same seed every run.
    const PIECES = ['K', 'min', 's', 'm', 'nm', 'g', 'J', 'degC', 'degF', 'Pa', 'torr', 'h', 'cd', '(', ')', '*', '/', '/', '^', '^-1', '^2', '^-1.5', '^0', ' ', '2', '.', '-', 'x', 'e3'];
    const u = uniform(7);
    let resolved = 0;
    for (let n = 0; n < 3000; n++) {
      const length = 1 + Math.floor(u() * 8);
      let w = '';
      for (let k = 0; k < length; k++) w += PIECES[Math.floor(u() * PIECES.length)];
      assertSameReading(w);
      if (lookupUnit(w)) resolved++;
    }
    assert.ok(resolved >= 250, `${resolved} of the random strings are units`);
  });

  it('converts as the published definitions say', () => {
    // NIST SP 811 (2008), appendix B.8; SI Brochure (9th ed., 2019), 2.3.4 and table 8.
    const si = (w: string): number => lookupUnit(w)!.unit.factor;
    assert.equal(si('torr'), 101325 / 760);
    assert.ok(near(si('mTorr'), 0.1333224, 1e-6));
    assert.ok(near(si('mmHg'), 133.3224, 1e-6));
    assert.equal(si('atm'), 101325);
    assert.ok(near(si('psi'), 6894.757, 1e-6));
    assert.equal(si('eV'), 1.602176634e-19);
    assert.equal(si('inch'), 0.0254);
    assert.equal(si('lb'), 0.45359237);
    assert.ok(near(si('J/(g*K)'), 1000, 1e-15));
    assert.ok(near(si('cm^3/g'), 1e-3, 1e-15));
    assert.ok(near(si('cm3'), 1e-6, 1e-15));
    assert.ok(near(si('K/min'), 1 / 60, 1e-15));
    assert.ok(near(toCanonical(-40, lookupUnit('°F')!, 'temperature'), 233.15, 1e-12));
    assert.equal(toCanonical(0, lookupUnit('°C')!, 'temperature'), 273.15);
    assert.ok(near(toCanonical(1, lookupUnit('°F/min')!, 'heating_rate'), 5 / 9, 1e-12));
  });

  it('lists as left out only units math.js knows, each with its reason', () => {
    for (const [name, reason] of Object.entries(LEFT_OUT)) {
      assert.ok(name in MATH_UNITS, name);
      assert.ok(reason.length > 0);
      assert.ok(reference(name), `math.js reads ${name}`);
    }
    for (const name of Object.keys(REDEFINED)) assert.ok(findUnit(name) && reference(name), name);
  });
});
