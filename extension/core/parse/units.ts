/**
 * Units through math.js: unit strings as people write them in a lab notebook are normalised
 * (°C, Å, µ, Torr, ·, products by a space), parsed once and cached, checked against a named
 * dimension and converted to the canonical unit of that dimension.
 *
 * Temperatures in °C or °F are converted with their offset; inside a compound unit (K/min,
 * °C/min) a temperature unit is a difference and only its scale applies, as math.js does.
 * `temperature_interval` (a VFT B parameter, a window width) also takes the scale only.
 *
 * Policy: `lookupUnit` never throws; an unknown unit string gives null, and so does one longer
 * than 256 characters, before any pattern runs over it. Normalising is linear in the length.
 */
import { unit as mathUnit, type Unit } from 'mathjs';

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
  | 'dimensionless';

/** The unit every value of a dimension is stored in, and its name in words for messages. */
export const CANONICAL: Readonly<Record<Dimension, { unit: string; mathjs: string; words: string; example: string }>> = {
  temperature: { unit: 'K', mathjs: 'K', words: 'a temperature', example: '281 K' },
  temperature_interval: { unit: 'K', mathjs: 'K', words: 'a temperature difference', example: '1000 K' },
  length: { unit: 'nm', mathjs: 'nm', words: 'a length', example: '400 nm' },
  time: { unit: 's', mathjs: 's', words: 'a time', example: '2000 s' },
  rate: { unit: 'nm/s', mathjs: 'nm/s', words: 'a deposition rate (length per time)', example: '0.2 nm/s' },
  pressure: { unit: 'Pa', mathjs: 'Pa', words: 'a pressure', example: '3e-6 Pa' },
  heating_rate: { unit: 'K/min', mathjs: 'K/min', words: 'a heating or cooling rate (temperature per time)', example: '10 K/min' },
  heat_capacity: { unit: 'J/(g*K)', mathjs: 'J/(g*K)', words: 'a specific heat capacity', example: '0.4 J/(g*K)' },
  mass: { unit: 'mg', mathjs: 'mg', words: 'a mass', example: '5 mg' },
  molar_mass: { unit: 'g/mol', mathjs: 'g/mol', words: 'a molar mass', example: '357.8 g/mol' },
  specific_volume: { unit: 'cm^3/g', mathjs: 'cm^3/g', words: 'a specific volume', example: '0.77 cm^3/g' },
  heat_flow: { unit: 'mW', mathjs: 'mW', words: 'a heat flow (power)', example: '1.2 mW' },
  specific_heat_flow: { unit: 'W/g', mathjs: 'W/g', words: 'a heat flow per mass', example: '0.02 W/g' },
  specific_enthalpy: { unit: 'J/g', mathjs: 'J/g', words: 'an enthalpy per mass', example: '8 J/g' },
  dimensionless: { unit: '1', mathjs: '', words: 'a pure number', example: '0.5' },
};

export interface ResolvedUnit {
  /** The unit as written. */
  readonly written: string;
  /** math.js unit, valueless. */
  readonly unit: Unit;
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

/** Rewrites the notations math.js does not read into ones it does. */
export function normaliseUnitText(text: string): string {
  let s = text.trim();
  s = s.replace(/°\s*C\b/g, 'degC').replace(/°\s*F\b/g, 'degF').replace(/℃/g, 'degC');
  s = s.replace(/\bdeg\s*C\b/g, 'degC').replace(/\bcelsius\b/gi, 'degC');
  s = s.replace(/Å|Å/g, 'angstrom');
  s = s.replace(/[µμ]/g, 'u');
  s = s.replace(/\bTorr\b/g, 'torr').replace(/\bmTorr\b/g, 'mtorr');
  s = s.replace(/\bsec\b/g, 's');
  s = s.replace(/[·⋅×]/g, '*');
  s = s.replace(/²/g, '^2').replace(/³/g, '^3').replace(/⁻¹/g, '^-1').replace(/⁻²/g, '^-2');
  s = tightenOperators(s);
  // Exponents written without a caret: "K min-1", "J g-1 K-1".
  s = s.replace(/([A-Za-z])(-\d+)(?![\d.])/g, '$1^$2');
  // A space between two unit factors is a product: "J g^-1 K^-1".
  s = s.replace(/([A-Za-z0-9)])\s+(?=[A-Za-z(])/g, '$1*');
  return s;
}

/** Parses a unit string, or returns null when math.js does not know it. Cached. */
export function lookupUnit(written: string): ResolvedUnit | null {
  if (written.length > MAX_WRITTEN_LENGTH) return null;
  const hit = cache.get(written);
  if (hit !== undefined) return hit;
  let resolved: ResolvedUnit | null = null;
  const text = normaliseUnitText(written);
  if (text.length > 0 && text.length <= 64 && /^[A-Za-z0-9_()*/^.\- ]+$/.test(text)) {
    try {
      const u = mathUnit(text);
      if (u.value === null || u.value === undefined) {
        const single = u.units.length === 1 && u.units[0].power === 1;
        const offset = single && u.units[0].unit.offset !== 0;
        resolved = { written, unit: u, absoluteTemperature: offset };
      }
    } catch {
      resolved = null;
    }
  }
  if (cache.size > 2000) cache.clear();
  cache.set(written, resolved);
  return resolved;
}

const dimensionUnits = new Map<Dimension, Unit>();

function canonicalUnit(dimension: Dimension): Unit | null {
  if (dimension === 'dimensionless') return null;
  let u = dimensionUnits.get(dimension);
  if (!u) {
    u = mathUnit(CANONICAL[dimension].mathjs);
    dimensionUnits.set(dimension, u);
  }
  return u;
}

/** Does the unit measure this dimension? */
export function hasDimension(resolved: ResolvedUnit, dimension: Dimension): boolean {
  const target = canonicalUnit(dimension);
  if (!target) return resolved.unit.dimensions.every((d: number) => d === 0);
  return resolved.unit.equalBase(target);
}

/** Converts a value in a resolved unit to the canonical unit of the dimension. */
export function toCanonical(value: number, resolved: ResolvedUnit, dimension: Dimension): number {
  const target = CANONICAL[dimension].mathjs;
  if (dimension === 'dimensionless') return value * mathUnit(1, normaliseUnitText(resolved.written)).toSI().toNumber();
  if (resolved.absoluteTemperature && dimension === 'temperature') {
    return mathUnit(value, normaliseUnitText(resolved.written)).toNumber(target);
  }
  return value * scaleFactor(resolved, target);
}

const scaleCache = new Map<string, number>();

/** How many canonical units one written unit is, ignoring any offset. */
function scaleFactor(resolved: ResolvedUnit, target: string): number {
  const key = `${resolved.written}\u0000${target}`;
  let f = scaleCache.get(key);
  if (f === undefined) {
    const text = normaliseUnitText(resolved.written);
    if (resolved.absoluteTemperature) {
      f = mathUnit(1, text).toNumber(target) - mathUnit(0, text).toNumber(target);
    } else {
      f = mathUnit(1, text).toNumber(target);
    }
    if (scaleCache.size > 2000) scaleCache.clear();
    scaleCache.set(key, f);
  }
  return f;
}

