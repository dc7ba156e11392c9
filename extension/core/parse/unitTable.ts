/**
 * The units Vitrine reads, with their SI prefixes: for each unit its factor to SI, its offset (the
 * degree Celsius, Fahrenheit) and its dimension vector over the SI base quantities (m, kg, s, A, K,
 * mol, cd) and the plane angle, which is kept apart from pure numbers so that `deg` (ellipsometric
 * angles in an export's units line) is not read as a pure number.
 *
 * Names, prefix sets and factors follow the unit table of math.js 15 (J. de Jong et al.), in its
 * order, because a written word is read as math.js reads it: a unit named exactly so first, else the
 * first unit of the table whose name ends the word after a prefix it accepts (`min` is the minute,
 * not a milli-inch; `Pa` the pascal; `mm` the millimetre; `cd` the candela; `d` no unit). Units no
 * lab notebook writes (bits and bytes, kitchen and barrel volumes, surveyors' lengths, acres, the
 * reactive volt-ampere) are left out. Factors are from NIST SP 811 (2008), appendix B.8, and
 * the SI Brochure (9th edition, 2019): the torr is 101 325/760 Pa exactly, the conventional
 * millimetre of mercury 133.322 387 415 Pa, the electronvolt 1.602 176 634 × 10⁻¹⁹ J exactly.
 *
 * Pure data and a lookup: the map of names is built when first used; nothing here throws.
 */

/** Exponents over m, kg, s, A, K, mol, cd and rad, in that order. */
export type DimensionVector = readonly [number, number, number, number, number, number, number, number];

/** The base quantities of a dimension vector, by their SI unit. */
export const BASE_QUANTITIES = ['m', 'kg', 's', 'A', 'K', 'mol', 'cd', 'rad'] as const;

function dim(m: number, kg: number, s: number, A = 0, K = 0, mol = 0, cd = 0, rad = 0): DimensionVector {
  return [m, kg, s, A, K, mol, cd, rad];
}

const LENGTH = dim(1, 0, 0);
const AREA = dim(2, 0, 0);
const VOLUME = dim(3, 0, 0);
const MASS = dim(0, 1, 0);
const TIME = dim(0, 0, 1);
const FREQUENCY = dim(0, 0, -1);
const ANGLE = dim(0, 0, 0, 0, 0, 0, 0, 1);
const CURRENT = dim(0, 0, 0, 1);
const TEMPERATURE = dim(0, 0, 0, 0, 1);
const AMOUNT = dim(0, 0, 0, 0, 0, 1);
const LUMINOUS_INTENSITY = dim(0, 0, 0, 0, 0, 0, 1);
const FORCE = dim(1, 1, -2);
const ENERGY = dim(2, 1, -2);
const POWER = dim(2, 1, -3);
const PRESSURE = dim(-1, 1, -2);
const CHARGE = dim(0, 0, 1, 1);
const CAPACITANCE = dim(-2, -1, 4, 2);
const POTENTIAL = dim(2, 1, -3, -1);
const RESISTANCE = dim(2, 1, -3, -2);
const INDUCTANCE = dim(2, 1, -2, -2);
const CONDUCTANCE = dim(-2, -1, 3, 2);
const MAGNETIC_FLUX = dim(2, 1, -2, -1);
const MAGNETIC_FLUX_DENSITY = dim(0, 1, -2, -1);

/** The SI prefixes, quecto to quetta: symbol, name, power of ten (SI Brochure, 3.1). `u` is micro. */
const SI_PREFIXES: readonly (readonly [string, string, number])[] = [
  ['da', 'deca', 1], ['h', 'hecto', 2], ['k', 'kilo', 3], ['M', 'mega', 6], ['G', 'giga', 9], ['T', 'tera', 12],
  ['P', 'peta', 15], ['E', 'exa', 18], ['Z', 'zetta', 21], ['Y', 'yotta', 24], ['R', 'ronna', 27], ['Q', 'quetta', 30],
  ['d', 'deci', -1], ['c', 'centi', -2], ['m', 'milli', -3], ['u', 'micro', -6], ['n', 'nano', -9], ['p', 'pico', -12],
  ['f', 'femto', -15], ['a', 'atto', -18], ['z', 'zepto', -21], ['y', 'yocto', -24], ['r', 'ronto', -27], ['q', 'quecto', -30],
];

/**
 * Which prefixes a unit takes: none; the symbols (`km`); the names (`kilometer`); both (`mbar`,
 * `millibar`); the symbols of a squared or cubed unit, whose factor is the prefix's squared or
 * cubed (`cm3` is 10⁻⁶ m³).
 */
type PrefixSet = 'none' | 'short' | 'long' | 'both' | 'squared' | 'cubic';

/** Prefix → factor, for each set; the powers of ten are read from decimal text, so exact to the last digit. */
function prefixMap(set: PrefixSet): ReadonlyMap<string, number> {
  const map = new Map<string, number>([['', 1]]);
  const power = set === 'squared' ? 2 : set === 'cubic' ? 3 : 1;
  if (set === 'none') return map;
  for (const [symbol, name, exponent] of SI_PREFIXES) {
    const factor = Number(`1e${exponent * power}`);
    if (set !== 'long') map.set(symbol, factor);
    if (set === 'long' || set === 'both') map.set(name, factor);
  }
  return map;
}

/** One unit of the table. */
export interface UnitDefinition {
  readonly name: string;
  /** SI units per unit (the kelvin per degree Fahrenheit is 5/9). */
  readonly factor: number;
  /** Offset in the unit's own scale: T/K = factor × (t + offset); 273.15 for the degree Celsius. */
  readonly offset: number;
  readonly dimensions: DimensionVector;
  readonly prefixes: ReadonlyMap<string, number>;
  /** Place in the table: the first place wins when a word ends in two unit names. */
  readonly index: number;
}

/** Exactly 101 325/760 Pa (NIST SP 811, B.8: 1 torr = 1.333 224 E+02 Pa). */
const TORR = 101325 / 760;
/** The conventional millimetre of mercury, 13.5951 g/cm³ × 9.806 65 m/s² × 1 mm (NIST SP 811, B.8). */
const MMHG = 133.322387415;
/** The electronvolt, e × 1 V, exact since the 2019 SI (SI Brochure, table 8). */
const EV = 1.602176634e-19;
/** 1 ft = 0.3048 m, 1 lb = 0.453 592 37 kg, standard gravity 9.806 65 m/s² (NIST SP 811, B.8). */
const POUND = 0.45359237;
const GRAVITY = 9.80665;
const DEGREE = Math.PI / 180;

type Row = readonly [name: string, factor: number, dimensions: DimensionVector, prefixes: PrefixSet, offset?: number];

/** In the order of math.js's table (then its plurals and spellings, then the vacuum gauges' mtorr and utorr). */
const ROWS: readonly Row[] = [
  ['meter', 1, LENGTH, 'long'], ['inch', 0.0254, LENGTH, 'none'], ['foot', 0.3048, LENGTH, 'none'],
  ['yard', 0.9144, LENGTH, 'none'], ['mile', 1609.344, LENGTH, 'none'], ['angstrom', 1e-10, LENGTH, 'none'],
  ['m', 1, LENGTH, 'short'], ['in', 0.0254, LENGTH, 'none'], ['ft', 0.3048, LENGTH, 'none'], ['yd', 0.9144, LENGTH, 'none'],
  ['mi', 1609.344, LENGTH, 'none'], ['mil', 0.0000254, LENGTH, 'none'],
  ['m2', 1, AREA, 'squared'], ['m3', 1, VOLUME, 'cubic'],
  ['L', 0.001, VOLUME, 'short'], ['l', 0.001, VOLUME, 'short'], ['litre', 0.001, VOLUME, 'long'], ['cc', 0.000001, VOLUME, 'none'],
  ['g', 0.001, MASS, 'short'], ['gram', 0.001, MASS, 'long'], ['t', 1000, MASS, 'short'], ['tonne', 1000, MASS, 'long'],
  ['lbm', POUND, MASS, 'none'],
  ['s', 1, TIME, 'short'], ['min', 60, TIME, 'none'], ['h', 3600, TIME, 'none'], ['second', 1, TIME, 'long'],
  ['sec', 1, TIME, 'long'], ['minute', 60, TIME, 'none'], ['hour', 3600, TIME, 'none'], ['day', 86400, TIME, 'none'],
  ['week', 604800, TIME, 'none'], ['month', 2629800, TIME, 'none'], ['year', 31557600, TIME, 'none'],
  ['hertz', 1, FREQUENCY, 'long'], ['Hz', 1, FREQUENCY, 'short'],
  ['rad', 1, ANGLE, 'short'], ['radian', 1, ANGLE, 'long'], ['deg', DEGREE, ANGLE, 'short'], ['degree', DEGREE, ANGLE, 'long'],
  ['arcsec', DEGREE / 3600, ANGLE, 'none'], ['arcmin', DEGREE / 60, ANGLE, 'none'],
  ['A', 1, CURRENT, 'short'], ['ampere', 1, CURRENT, 'long'],
  ['K', 1, TEMPERATURE, 'short'], ['degC', 1, TEMPERATURE, 'short', 273.15], ['degF', 5 / 9, TEMPERATURE, 'short', 459.67],
  ['degR', 5 / 9, TEMPERATURE, 'short'], ['kelvin', 1, TEMPERATURE, 'long'], ['celsius', 1, TEMPERATURE, 'long', 273.15],
  ['fahrenheit', 5 / 9, TEMPERATURE, 'long', 459.67], ['rankine', 5 / 9, TEMPERATURE, 'long'],
  ['mol', 1, AMOUNT, 'short'], ['mole', 1, AMOUNT, 'long'], ['cd', 1, LUMINOUS_INTENSITY, 'short'], ['candela', 1, LUMINOUS_INTENSITY, 'long'],
  ['N', 1, FORCE, 'short'], ['newton', 1, FORCE, 'long'], ['dyn', 1e-5, FORCE, 'short'], ['dyne', 1e-5, FORCE, 'long'],
  ['lbf', POUND * GRAVITY, FORCE, 'none'], ['poundforce', POUND * GRAVITY, FORCE, 'none'], ['kilogramforce', GRAVITY, FORCE, 'none'],
  ['J', 1, ENERGY, 'short'], ['joule', 1, ENERGY, 'long'], ['erg', 1e-7, ENERGY, 'both'], ['Wh', 3600, ENERGY, 'short'],
  ['eV', EV, ENERGY, 'short'], ['electronvolt', EV, ENERGY, 'long'],
  ['W', 1, POWER, 'short'], ['watt', 1, POWER, 'long'],
  ['Pa', 1, PRESSURE, 'short'], ['psi', (POUND * GRAVITY) / (0.0254 * 0.0254), PRESSURE, 'none'], ['atm', 101325, PRESSURE, 'none'],
  ['bar', 100000, PRESSURE, 'both'], ['torr', TORR, PRESSURE, 'none'], ['mmHg', MMHG, PRESSURE, 'none'],
  ['mmH2O', GRAVITY, PRESSURE, 'none'], ['cmH2O', 10 * GRAVITY, PRESSURE, 'none'],
  ['coulomb', 1, CHARGE, 'long'], ['C', 1, CHARGE, 'short'], ['Ah', 3600, CHARGE, 'short'],
  ['farad', 1, CAPACITANCE, 'long'], ['F', 1, CAPACITANCE, 'short'], ['volt', 1, POTENTIAL, 'long'], ['V', 1, POTENTIAL, 'short'],
  ['ohm', 1, RESISTANCE, 'both'], ['henry', 1, INDUCTANCE, 'long'], ['H', 1, INDUCTANCE, 'short'],
  ['siemens', 1, CONDUCTANCE, 'long'], ['S', 1, CONDUCTANCE, 'short'], ['weber', 1, MAGNETIC_FLUX, 'long'], ['Wb', 1, MAGNETIC_FLUX, 'short'],
  ['tesla', 1, MAGNETIC_FLUX_DENSITY, 'long'], ['T', 1, MAGNETIC_FLUX_DENSITY, 'short'],
  // Plurals and other spellings.
  ['meters', 1, LENGTH, 'long'], ['inches', 0.0254, LENGTH, 'none'], ['feet', 0.3048, LENGTH, 'none'], ['yards', 0.9144, LENGTH, 'none'],
  ['miles', 1609.344, LENGTH, 'none'], ['angstroms', 1e-10, LENGTH, 'none'],
  ['lt', 0.001, VOLUME, 'short'], ['litres', 0.001, VOLUME, 'long'], ['liter', 0.001, VOLUME, 'long'], ['liters', 0.001, VOLUME, 'long'],
  ['grams', 0.001, MASS, 'long'], ['tonnes', 1000, MASS, 'long'], ['lb', POUND, MASS, 'none'], ['lbs', POUND, MASS, 'none'],
  ['kgf', GRAVITY, FORCE, 'none'], ['mmhg', MMHG, PRESSURE, 'none'], ['mmh2o', GRAVITY, PRESSURE, 'none'], ['cmh2o', 10 * GRAVITY, PRESSURE, 'none'],
  ['seconds', 1, TIME, 'long'], ['secs', 1, TIME, 'long'], ['minutes', 60, TIME, 'none'], ['mins', 60, TIME, 'none'],
  ['hours', 3600, TIME, 'none'], ['hr', 3600, TIME, 'none'], ['hrs', 3600, TIME, 'none'], ['days', 86400, TIME, 'none'],
  ['weeks', 604800, TIME, 'none'], ['months', 2629800, TIME, 'none'], ['years', 31557600, TIME, 'none'],
  ['radians', 1, ANGLE, 'long'], ['degrees', DEGREE, ANGLE, 'long'],
  ['arcsecond', DEGREE / 3600, ANGLE, 'none'], ['arcseconds', DEGREE / 3600, ANGLE, 'none'],
  ['arcminute', DEGREE / 60, ANGLE, 'none'], ['arcminutes', DEGREE / 60, ANGLE, 'none'],
  ['watts', 1, POWER, 'long'], ['joules', 1, ENERGY, 'long'], ['amperes', 1, CURRENT, 'long'], ['amps', 1, CURRENT, 'long'],
  ['amp', 1, CURRENT, 'long'], ['coulombs', 1, CHARGE, 'long'], ['volts', 1, POTENTIAL, 'long'], ['ohms', 1, RESISTANCE, 'both'],
  ['farads', 1, CAPACITANCE, 'long'], ['webers', 1, MAGNETIC_FLUX, 'long'], ['teslas', 1, MAGNETIC_FLUX_DENSITY, 'long'],
  ['electronvolts', EV, ENERGY, 'long'], ['moles', 1, AMOUNT, 'long'],
  // The millitorr and microtorr of vacuum gauges, written as one word.
  ['mtorr', TORR / 1000, PRESSURE, 'none'], ['utorr', TORR / 1e6, PRESSURE, 'none'],
];

/**
 * Words math.js reads as units Vitrine leaves out, where the word would otherwise read as a
 * prefixed unit of the table: `pt` and `qt` are math.js's pint and quart, not a pico- and a
 * quectotonne.
 */
const REFUSED: ReadonlySet<string> = new Set(['pt', 'qt']);

let byName: Map<string, UnitDefinition> | null = null;

function table(): Map<string, UnitDefinition> {
  if (byName) return byName;
  const sets = new Map<PrefixSet, ReadonlyMap<string, number>>();
  byName = new Map();
  ROWS.forEach(([name, factor, dimensions, set, offset], index) => {
    let prefixes = sets.get(set);
    if (!prefixes) sets.set(set, (prefixes = prefixMap(set)));
    byName!.set(name, { name, factor, offset: offset ?? 0, dimensions, prefixes, index });
  });
  return byName;
}

/** The longest prefix name (`quecto`, `quetta`). */
const LONGEST_PREFIX = 6;

/** Every unit of the table, in its order. */
export function unitDefinitions(): readonly UnitDefinition[] {
  return [...table().values()];
}

/**
 * The unit a word names and the factor of its prefix: the unit of that exact name, else the first
 * unit of the table the word ends with after a prefix that unit takes. Null for any other word.
 */
export function findUnit(word: string): { readonly unit: UnitDefinition; readonly prefix: number } | null {
  const units = table();
  if (REFUSED.has(word)) return null;
  const exact = units.get(word);
  if (exact) return { unit: exact, prefix: 1 };
  let best: { unit: UnitDefinition; prefix: number } | null = null;
  for (let k = 1; k <= LONGEST_PREFIX && k < word.length; k++) {
    const unit = units.get(word.slice(k));
    const prefix = unit?.prefixes.get(word.slice(0, k));
    if (unit && prefix !== undefined && (!best || unit.index < best.unit.index)) best = { unit, prefix };
  }
  return best;
}
