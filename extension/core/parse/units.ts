/**
 * Units by Vitrine's own small unit engine (the table in unitTable.ts): unit strings as people
 * write them in a lab notebook are normalised (°C, `deg C`, Å and `Angstrom`/`ångström`, µ, Torr
 * and mTorr, ·, products by a space, the minus sign U+2212, superscript exponents), parsed once
 * into a dimension vector over the SI base quantities with a scale and an offset, and cached,
 * checked against a named dimension and converted to the canonical unit of that dimension.
 * `suggestUnit` names the unit a near miss probably meant (`C` → `°C`, `A` → `Å`), for metadata
 * and table headers alike.
 *
 * The unit grammar, the table and the order of arithmetic are those of math.js 15 (J. de Jong et
 * al.), which Vitrine used before; test/unit/unitEngine.test.ts holds the two to the same
 * readings, so nothing a notebook wrote changes meaning, and start-up does not pay for math.js.
 *
 * Temperatures in °C or °F are converted with their offset; inside a compound unit (K/min,
 * °C/min) a temperature unit is a difference and only its scale applies.
 * `temperature_interval` (a VFT B parameter, a window width) also takes the scale only.
 *
 * Policy: `lookupUnit` never throws; an unknown unit string gives null, and so does one longer
 * than 256 characters, before any pattern runs over it. Normalising and parsing are linear in
 * the length.
 */
import { BASE_QUANTITIES, findUnit, type UnitDefinition } from './unitTable.js';

export type Dimension =
  | 'temperature'
  | 'temperature_interval'
  | 'length'
  | 'time'
  | 'rate'
  | 'pressure'
  | 'heating_rate'
  | 'heat_capacity'
  | 'mass'
  | 'molar_mass'
  | 'specific_volume'
  | 'heat_flow'
  | 'specific_heat_flow'
  | 'specific_enthalpy'
  | 'frequency'
  | 'dimensionless';

/**
 * The unit every value of a dimension is stored in, its name in words for messages, and two
 * examples as people write them (messages show both).
 */
export const CANONICAL: Readonly<Record<Dimension, { unit: string; words: string; example: string; examples: readonly [string, string] }>> = {
  temperature: { unit: 'K', words: 'a temperature', example: '281 K', examples: ['281 K', '8 °C'] },
  temperature_interval: { unit: 'K', words: 'a temperature difference', example: '1000 K', examples: ['1000 K', '5 °C'] },
  length: { unit: 'nm', words: 'a length', example: '400 nm', examples: ['400 nm', '4000 Å'] },
  time: { unit: 's', words: 'a time', example: '2000 s', examples: ['2000 s', '1 h 10 min'] },
  rate: { unit: 'nm/s', words: 'a deposition rate (length per time)', example: '0.2 nm/s', examples: ['0.2 nm/s', '2 Å/s'] },
  pressure: { unit: 'Pa', words: 'a pressure', example: '3e-6 Pa', examples: ['3e-6 Pa', '2e-8 Torr'] },
  heating_rate: { unit: 'K/min', words: 'a heating or cooling rate (temperature per time)', example: '10 K/min', examples: ['10 K/min', '0.5 °C/s'] },
  heat_capacity: { unit: 'J/(g*K)', words: 'a specific heat capacity', example: '0.4 J/(g*K)', examples: ['0.4 J/(g*K)', '0.4 J g^-1 K^-1'] },
  mass: { unit: 'mg', words: 'a mass', example: '5 mg', examples: ['5 mg', '0.005 g'] },
  molar_mass: { unit: 'g/mol', words: 'a molar mass', example: '357.8 g/mol', examples: ['357.8 g/mol', '0.3578 kg/mol'] },
  specific_volume: { unit: 'cm^3/g', words: 'a specific volume', example: '0.77 cm^3/g', examples: ['0.77 cm^3/g', '0.77 cm³/g'] },
  heat_flow: { unit: 'mW', words: 'a heat flow (power)', example: '1.2 mW', examples: ['1.2 mW', '0.0012 W'] },
  specific_heat_flow: { unit: 'W/g', words: 'a heat flow per mass', example: '0.02 W/g', examples: ['0.02 W/g', '20 mW/g'] },
  specific_enthalpy: { unit: 'J/g', words: 'an enthalpy per mass', example: '8 J/g', examples: ['8 J/g', '8000 J/kg'] },
  frequency: { unit: 'Hz', words: 'a frequency', example: '1 kHz', examples: ['1 kHz', '250 Hz'] },
  dimensionless: { unit: '1', words: 'a pure number', example: '0.5', examples: ['0.5', '1.2'] },
};

export interface ResolvedUnit {
  /** The unit as written. */
  readonly written: string;
  /** The parsed unit, valueless. */
  readonly unit: UnitExpression;
  /** Has an offset (°C, °F) and stands alone, so values convert with the offset. */
  readonly absoluteTemperature: boolean;
}

const cache = new Map<string, ResolvedUnit | null>();

/** Longer text is no unit; refused before normalising, so it costs nothing and is not cached. */
const MAX_WRITTEN_LENGTH = 256;
const WHITE = /\s/;

/** Removes the white space on both sides of every `*` and `/`, in one pass over the text. */
function tightenOperators(s: string): string {
  let out = '';
  let i = 0;
  while (i < s.length) {
    if (!WHITE.test(s[i])) {
      out += s[i++];
      continue;
    }
    let j = i;
    while (j < s.length && WHITE.test(s[j])) j++;
    const before = s[i - 1];
    const after = s[j];
    if (!(before === '*' || before === '/' || after === '*' || after === '/')) out += s.slice(i, j);
    i = j;
  }
  return out;
}

const SUPERSCRIPT_DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

/** `⁻¹²` → `^-12`: superscript signs and digits written as a caret exponent. */
export function superscriptToCaret(text: string): string {
  return text.replace(/([⁺⁻]?)([⁰¹²³⁴⁵⁶⁷⁸⁹]+)/g, (_, sign: string, digits: string) => {
    let out = sign === '⁻' ? '^-' : '^';
    for (const d of digits) out += String(SUPERSCRIPT_DIGITS.indexOf(d));
    return out;
  });
}

/** Rewrites the notations the unit grammar does not read into ones it does. */
export function normaliseUnitText(text: string): string {
  let s = text.trim();
  // U+2212 MINUS SIGN, as typeset exponents are written ("K min−1").
  s = s.replace(/\u2212/g, '-');
  s = s.replace(/°\s*C\b/g, 'degC').replace(/°\s*F\b/g, 'degF').replace(/℃/g, 'degC');
  s = s.replace(/\bdeg(?:rees?)?\s*C\b/g, 'degC').replace(/\bcelsius\b/gi, 'degC');
  // The word in any case, singular or plural, with or without its diacritics.
  s = s.replace(/(?<![A-Za-z])[AaÅåÅ]ngstr[oö]ms?(?![A-Za-z])/g, 'angstrom');
  s = s.replace(/Å|Å|Å/g, 'angstrom');
  s = s.replace(/[µμ]/g, 'u');
  s = s.replace(/\bTorr\b/g, 'torr').replace(/\bmTorr\b/g, 'mtorr').replace(/\buTorr\b/g, 'utorr');
  s = s.replace(/\bsec\b/g, 's');
  s = s.replace(/[·⋅×]/g, '*');
  s = superscriptToCaret(s);
  s = tightenOperators(s);
  // Exponents written without a caret: "K min-1", "J g-1 K-1".
  s = s.replace(/([A-Za-z])(-\d+)(?![\d.])/g, '$1^$2');
  // A space between two unit factors is a product: "J g^-1 K^-1".
  s = s.replace(/([A-Za-z0-9)])\s+(?=[A-Za-z(])/g, '$1*');
  return s;
}

/** One factor of a unit expression: a unit of the table, the factor of its prefix, its power. */
export interface UnitFactor {
  readonly unit: UnitDefinition;
  readonly prefix: number;
  readonly power: number;
}

/** A unit expression without a value: its factors in the order written, and its dimension vector. */
export class UnitExpression {
  constructor(
    readonly factors: readonly UnitFactor[],
    /** Exponents over m, kg, s, A, K, mol, cd and rad (`BASE_QUANTITIES`). */
    readonly dimensions: readonly number[],
  ) {}

  /** Measures the same quantity: equal dimension vectors, to 1e-12 in each exponent. */
  equalBase(other: UnitExpression): boolean {
    for (let i = 0; i < this.dimensions.length; i++) {
      if (Math.abs(this.dimensions[i] - other.dimensions[i]) > 1e-12) return false;
    }
    return true;
  }

  /** SI units per unit, any offset aside: 1e-9 for `nm`, 1/60 for `K/min`, 5/9 for `degF`. */
  get factor(): number {
    return normalise(1, this);
  }
}

/** No unit at all: the target of a pure number. */
const NO_UNIT = new UnitExpression([], BASE_QUANTITIES.map(() => 0));

/** A value in `unit`, in SI units, offset aside; the factors are applied one by one in writing order. */
function normalise(value: number, unit: UnitExpression): number {
  let v = value;
  for (const f of unit.factors) v = v * Math.pow(f.unit.factor * f.prefix, f.power);
  return v;
}

function denormalise(value: number, unit: UnitExpression): number {
  let v = value;
  for (const f of unit.factors) v = v / Math.pow(f.unit.factor * f.prefix, f.power);
  return v;
}

/** More than one factor, or one with a power other than 1: any offset is then a difference. */
function isCompound(unit: UnitExpression): boolean {
  return unit.factors.length > 1 || (unit.factors.length === 1 && Math.abs(unit.factors[0].power - 1) > 1e-15);
}

/**
 * Converts a value from one unit to another of the same dimension. An offset (°C, °F) applies
 * only between two units that each stand alone with power 1 (8 °C → 281.15 K); in a compound unit
 * (°C/min) a temperature is a difference. The operations come in math.js's order, so results
 * agree with it to rounding, and conversions that were exact stay exact (8 °C → 281.15 K,
 * 10 °C/min → 10 K/min).
 */
function convert(value: number, from: UnitExpression, to: UnitExpression): number {
  let v = normalise(value, from);
  if (!isCompound(from) && from.factors.length > 0 && to.factors.length > 0) {
    const a = from.factors[0].unit;
    const b = to.factors[0].unit;
    if (a.offset !== b.offset) v = v + (a.factor * a.offset - b.factor * b.offset);
  }
  return denormalise(v, to);
}

/**
 * Reads a unit expression (normalised text): units with prefixes, each with an optional power
 * `^2`, `^-1`, `^-1.5`; products by `*` or by juxtaposition after a power or a bracket; quotients by
 * `/`, which applies to the next unit or bracketed group (`J/(g*K)`; `J/g*K` is J·K/g). The grammar
 * is math.js's unit grammar. A leading number makes it a quantity, not a unit: null. Null for
 * anything else that is no unit: an unknown word, `K/`, `((K)`, `K^`. One pass; never throws.
 */
export function parseUnitExpression(text: string): UnitExpression | null {
  const n = text.length;
  let i = 0;
  const skipSpaces = (): void => {
    while (text[i] === ' ' || text[i] === '\t') i++;
  };
  const isDigit = (c: string | undefined): boolean => c !== undefined && c >= '0' && c <= '9';
  const isLetter = (c: string | undefined): boolean => c !== undefined && ((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'));
  /** A decimal number as text (`-1.5`, `.5`, `2e3`), or null with nothing consumed. */
  const readNumber = (): string | null => {
    const start = i;
    let s = '';
    if (text[i] === '+') i++;
    else if (text[i] === '-') s += text[i++];
    if (!(isDigit(text[i]) || text[i] === '.')) {
      i = start;
      return null;
    }
    if (text[i] === '.') {
      s += text[i++];
      if (!isDigit(text[i])) {
        i = start;
        return null;
      }
    } else {
      while (isDigit(text[i])) s += text[i++];
      if (text[i] === '.') s += text[i++];
    }
    while (isDigit(text[i])) s += text[i++];
    if (text[i] === 'e' || text[i] === 'E') {
      const mark = i;
      let e = text[i++];
      if (text[i] === '+' || text[i] === '-') e += text[i++];
      if (!isDigit(text[i])) {
        i = mark;
        return s;
      }
      s += e;
      while (isDigit(text[i])) s += text[i++];
    }
    return s;
  };

  skipSpaces();
  if (readNumber() !== null) return null;
  const factors: UnitFactor[] = [];
  const dimensions = BASE_QUANTITIES.map(() => 0);
  let sign = 1;
  const signs: number[] = [];
  let signOfGroups = 1;
  let expectingUnit = false;
  for (;;) {
    skipSpaces();
    while (text[i] === '(') {
      signs.push(sign);
      signOfGroups *= sign;
      sign = 1;
      i++;
      skipSpaces();
    }
    if (i >= n) break;
    const start = i;
    while (isDigit(text[i]) || isLetter(text[i])) i++;
    if (!isLetter(text[start])) return null;
    const found = findUnit(text.slice(start, i));
    if (!found) return null;
    let p = sign * signOfGroups;
    skipSpaces();
    if (text[i] === '^') {
      i++;
      skipSpaces();
      const exponent = readNumber();
      if (exponent === null) return null;
      p *= Number(exponent);
    }
    factors.push({ unit: found.unit, prefix: found.prefix, power: p });
    for (let d = 0; d < dimensions.length; d++) dimensions[d] += found.unit.dimensions[d] * p;
    skipSpaces();
    while (text[i] === ')') {
      if (signs.length === 0) return null;
      signOfGroups /= signs.pop()!;
      i++;
      skipSpaces();
    }
    expectingUnit = text[i] === '*' || text[i] === '/';
    sign = text[i] === '/' ? -1 : 1;
    if (expectingUnit) i++;
  }
  if (expectingUnit || signs.length > 0 || factors.length === 0) return null;
  return new UnitExpression(factors, dimensions);
}

/** Parses a unit string, or returns null when it names no unit. Cached. */
export function lookupUnit(written: string): ResolvedUnit | null {
  if (written.length > MAX_WRITTEN_LENGTH) return null;
  const hit = cache.get(written);
  if (hit !== undefined) return hit;
  let resolved: ResolvedUnit | null = null;
  const text = normaliseUnitText(written);
  if (text.length > 0 && text.length <= 64 && /^[A-Za-z0-9_()*/^.\- ]+$/.test(text)) {
    const u = parseUnitExpression(text);
    if (u) {
      const single = u.factors.length === 1 && u.factors[0].power === 1;
      resolved = { written, unit: u, absoluteTemperature: single && u.factors[0].unit.offset !== 0 };
    }
  }
  if (cache.size > 2000) cache.clear();
  cache.set(written, resolved);
  return resolved;
}

const dimensionUnits = new Map<Dimension, UnitExpression>();

function canonicalUnit(dimension: Dimension): UnitExpression | null {
  if (dimension === 'dimensionless') return null;
  let u = dimensionUnits.get(dimension);
  if (!u) {
    u = parseUnitExpression(CANONICAL[dimension].unit) ?? NO_UNIT;
    dimensionUnits.set(dimension, u);
  }
  return u;
}

/** Does the unit measure this dimension? */
export function hasDimension(resolved: ResolvedUnit, dimension: Dimension): boolean {
  const target = canonicalUnit(dimension);
  if (!target) return resolved.unit.dimensions.every((d) => d === 0);
  return resolved.unit.equalBase(target);
}

/**
 * Converts a value in a resolved unit to the canonical unit of the dimension: with the offset for
 * a temperature written in °C or °F alone, by the scale alone otherwise (a temperature difference,
 * a rate).
 */
export function toCanonical(value: number, resolved: ResolvedUnit, dimension: Dimension): number {
  const target = canonicalUnit(dimension) ?? NO_UNIT;
  if (dimension === 'dimensionless') return value * convert(1, resolved.unit, NO_UNIT);
  if (resolved.absoluteTemperature && dimension === 'temperature') return convert(value, resolved.unit, target);
  if (resolved.absoluteTemperature) return value * (convert(1, resolved.unit, target) - convert(0, resolved.unit, target));
  return value * convert(1, resolved.unit, target);
}

/** The dimension a unit measures, in words ("a temperature"), or null when it is none of Vitrine's. */
export function dimensionWords(resolved: ResolvedUnit): string | null {
  for (const d of Object.keys(CANONICAL) as Dimension[]) {
    if (d === 'temperature_interval' || d === 'dimensionless') continue;
    if (hasDimension(resolved, d)) return CANONICAL[d].words;
  }
  return null;
}

const TEMPERATURES: ReadonlySet<Dimension> = new Set(['temperature', 'temperature_interval', 'heating_rate']);
const LENGTHS: ReadonlySet<Dimension> = new Set(['length', 'rate']);
const TIMES: ReadonlySet<Dimension> = new Set(['time', 'rate', 'heating_rate']);

interface NearMiss {
  readonly dimensions: ReadonlySet<Dimension> | null;
  readonly pattern: RegExp;
  readonly replacement: string;
  readonly why: string;
}

/** Look-alikes and near misses of unit symbols, each with why the written one is not meant. */
const NEAR_MISSES: readonly NearMiss[] = [
  { dimensions: null, pattern: /º\s*([CF])(?![A-Za-z])/g, replacement: '°$1', why: '"º" is the masculine ordinal indicator, not the degree sign "°"' },
  { dimensions: null, pattern: /˚\s*([CF])(?![A-Za-z])/g, replacement: '°$1', why: '"˚" is a ring accent, not the degree sign "°"' },
  { dimensions: null, pattern: /(?<![A-Za-z])o([CF])(?![A-Za-z])/g, replacement: '°$1', why: 'the degree sign is "°", not a letter o' },
  { dimensions: null, pattern: /°\s*K(?![A-Za-z])/g, replacement: 'K', why: 'the kelvin takes no degree sign' },
  { dimensions: TEMPERATURES, pattern: /(?<![°A-Za-z])C(?![A-Za-z])/g, replacement: '°C', why: '"C" is the coulomb, a unit of electric charge' },
  { dimensions: TEMPERATURES, pattern: /(?<![A-Za-z])k(?![A-Za-z])/g, replacement: 'K', why: 'the kelvin is a capital "K"' },
  { dimensions: LENGTHS, pattern: /(?<![A-Za-z])A(?![A-Za-z])/g, replacement: 'Å', why: '"A" is the ampere, a unit of electric current' },
  { dimensions: TIMES, pattern: /(?<![A-Za-z])m(?![A-Za-z])/g, replacement: 'min', why: '"m" is the metre' },
];

/**
 * A unit the writer probably meant, when `written` is unknown or of the wrong dimension and one
 * near miss (a look-alike character, a symbol of another quantity) turns it into a unit of the
 * dimension: `C` → `°C` (C is the coulomb), `ºC` or `oC` → `°C`, `A` → `Å` (A is the ampere) for
 * lengths and rates, `m` → `min` for times. Null when `written` is already right, or nothing near
 * is. Shared by metadata quantities and table headers.
 */
export function suggestUnit(written: string, dimension: Dimension): { unit: string; why: string } | null {
  if (written.length === 0 || written.length > MAX_WRITTEN_LENGTH) return null;
  const as = lookupUnit(written);
  if (as && hasDimension(as, dimension)) return null;
  for (const miss of NEAR_MISSES) {
    if (miss.dimensions && !miss.dimensions.has(dimension)) continue;
    const candidate = written.replace(miss.pattern, miss.replacement);
    if (candidate === written) continue;
    const resolved = lookupUnit(candidate);
    if (resolved && hasDimension(resolved, dimension)) return { unit: candidate, why: miss.why };
  }
  return null;
}
