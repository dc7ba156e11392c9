/**
 * The one number formatter of every presenter (CLI table, HTML report, CSV, editor lenses and
 * hovers). All functions return plain strings.
 *
 * - With a standard uncertainty u: u is rounded to two significant digits and the value to the
 *   same decimal place (JCGM 100:2008, GUM §7.2.6: "at most two significant digits"):
 *   313.82909975 ± 0.0692508 → `313.829 ± 0.069`.
 * - Without one: the value to the catalogue's significant digits (trailing zeros kept: `270.0`).
 * - Exponential notation where the catalogue says so: `3.13e+3`; with u the value and u share
 *   the exponent, `(3.1263 ± 0.0045)e+3`. Fixed notation falls back to it for magnitudes it
 *   cannot show sensibly (below 1e-4 or from 1e12 on, or an uncertainty below 1e-20).
 * - Digits come from the decimal rounding of `toFixed` / `toExponential` and are then placed by
 *   string arithmetic, so binary noise (`0.19999999999999998`) never reaches the text.
 * - A non-finite value prints as an em dash (CSV: an empty field); a non-finite, zero or missing
 *   uncertainty counts as none, and so does one below 1e-13 of the value (beyond a double's
 *   resolution). ASCII hyphen-minus for negative numbers, so every cell reads back
 *   as a number.
 */
import { catalogueEntry, type NumberFormat } from './catalogue.js';
import type { ResultValue } from './result.js';

/** What a value with no catalogue entry is printed with. */
export const DEFAULT_FORMAT: NumberFormat = { digits: 4, notation: 'fixed' };

/** Printed for a missing or non-finite value. */
export const MISSING = '—';

/** The display format of a result name: its catalogue entry's, else the default. */
export function formatOf(name: string): NumberFormat {
  const e = catalogueEntry(name);
  return e ? { digits: e.digits, notation: e.notation } : DEFAULT_FORMAT;
}

// ---- decimal digits -----------------------------------------------------------------------

interface Decimal {
  readonly negative: boolean;
  /** The significant digits, no leading zeros (or "0"). */
  readonly digits: string;
  /** Decimal exponent of the first digit: value = d₁.d₂d₃… × 10^exponent. */
  readonly exponent: number;
}

/** Parses the output of `toExponential`. */
function parseExponential(text: string): Decimal {
  const m = /^(-?)(\d)(?:\.(\d+))?e([+-]\d+)$/.exec(text)!;
  return { negative: m[1] === '-', digits: m[2] + (m[3] ?? ''), exponent: Number(m[4]) };
}

/** Exponent of the first significant digit of x ≠ 0 (decimal, so 999.96 → 2). */
function exponentOf(x: number): number {
  return parseExponential(Math.abs(x).toExponential()).exponent;
}

/** `digits` × 10^place as fixed text; all zeros lose their sign. */
function placeDigits(negative: boolean, digits: string, place: number): string {
  let body: string;
  if (place >= 0) body = digits === '0' ? '0' : digits + '0'.repeat(place);
  else {
    const padded = digits.padStart(-place + 1, '0');
    body = `${padded.slice(0, padded.length + place)}.${padded.slice(padded.length + place)}`;
  }
  return negative && /[1-9]/.test(body) ? `-${body}` : body;
}

/** x rounded to a multiple of 10^place, in fixed notation. */
function fixedAt(x: number, place: number): string {
  if (place <= 0) {
    const s = x.toFixed(Math.min(100, -place));
    return /[1-9]/.test(s) ? s : s.replace('-', '');
  }
  if (x === 0) return '0';
  const e = exponentOf(x);
  // Below 10^place the value rounds to 0 or to ±10^place.
  if (e < place) return Math.abs(x) >= 0.5 * 10 ** place ? placeDigits(x < 0, '1', place) : '0';
  const d = parseExponential(x.toExponential(e - place));
  return placeDigits(d.negative, d.digits, d.exponent - (d.digits.length - 1));
}

/** `1.63e-4` style: mantissa with `decimals` decimals. */
function exponential(x: number, decimals: number): string {
  const s = x.toExponential(Math.max(0, Math.min(100, decimals)));
  return s.startsWith('-') && !/[1-9]/.test(s.slice(0, s.indexOf('e'))) ? s.slice(1) : s;
}

function exponentSuffix(e: number): string {
  return `e${e < 0 ? '-' : '+'}${Math.abs(e)}`;
}

// ---- the rule -------------------------------------------------------------------------------

/**
 * A usable standard uncertainty, or undefined. One below 1e-13 of the value lies beyond what a
 * double resolves (its place would show binary noise) and counts as none.
 */
function usable(value: number, u: number | undefined): number | undefined {
  if (u === undefined || !Number.isFinite(u) || u === 0) return undefined;
  return Math.abs(u) < Math.abs(value) * 1e-13 ? undefined : Math.abs(u);
}

interface Parts {
  /** The value cell. */
  readonly value: string;
  /** The uncertainty cell ('' when there is none). */
  readonly uncertainty: string;
  /** `value ± u` without a unit. */
  readonly measurement: string;
  /** Decimal place of the last digit shown, when an uncertainty set it. */
  readonly place?: number;
}

function useExponential(value: number, u: number | undefined, format: NumberFormat): boolean {
  if (format.notation === 'exponential') return true;
  const size = Math.max(Math.abs(value), u ?? 0);
  // An uncertainty below 1e-20 would need more decimals than fixed text can sensibly carry.
  return size >= 1e12 || (size !== 0 && size < 1e-4) || (u !== undefined && u < 1e-20);
}

function parts(value: number, uncertainty: number | undefined, format: NumberFormat): Parts {
  if (!Number.isFinite(value)) return { value: MISSING, uncertainty: '', measurement: MISSING };
  const u = usable(value, uncertainty);
  const exp = useExponential(value, u, format);
  if (u === undefined) {
    const digits = Math.max(1, Math.min(21, Math.round(format.digits)));
    if (exp) {
      const text = exponential(value, digits - 1);
      return { value: text, uncertainty: '', measurement: text };
    }
    const d = parseExponential(value.toExponential(digits - 1));
    const text = placeDigits(d.negative, d.digits, d.exponent - (digits - 1));
    return { value: text, uncertainty: '', measurement: text };
  }
  // u to two significant digits; its last digit sets the place of the value's last digit.
  const u2 = parseExponential(u.toExponential(1));
  const place = u2.exponent - 1;
  if (!exp) {
    const v = fixedAt(value, place);
    const ut = placeDigits(false, u2.digits, place);
    return { value: v, uncertainty: ut, measurement: `${v} ± ${ut}`, place };
  }
  // Exponential: the value's own exponent, or u's when the value is smaller than u.
  let shared = value === 0 ? u2.exponent : Math.max(exponentOf(value), u2.exponent);
  let v = exponential(value, shared - place);
  const vExp = parseExponential(v).exponent;
  if (vExp > shared) {
    // Rounding carried into a new digit (9.996e+2 → 1.000e+3): one more decimal keeps the place.
    shared = vExp;
    v = exponential(value, shared - place);
  }
  const mantissa = v.slice(0, v.indexOf('e'));
  const sharedValue = parseExponential(v).exponent === shared ? mantissa : fixedAt(value / 10 ** shared, place - shared);
  const um = placeDigits(false, u2.digits, place - shared);
  const ut = exponential(u, 1);
  // A shared exponent of 0 is no exponent: `1.63 ± 0.37`, not `(1.63 ± 0.37)e+0`.
  if (shared === 0) return { value: sharedValue, uncertainty: ut, measurement: `${sharedValue} ± ${um}`, place };
  return { value: `${sharedValue}${exponentSuffix(shared)}`, uncertainty: ut, measurement: `(${sharedValue} ± ${um})${exponentSuffix(shared)}`, place };
}

// ---- public functions ----------------------------------------------------------------------

/** The value as a table cell: `313.829`, `3.13e+3`, `—`. */
export function formatValue(value: number, uncertainty?: number, format: NumberFormat = DEFAULT_FORMAT): string {
  return parts(value, uncertainty, format).value;
}

/** The uncertainty as a table cell (and a CSV field), two significant digits: `0.069`, `4.5e+0`; '' when there is none. */
export function formatUncertainty(value: number, uncertainty?: number, format: NumberFormat = DEFAULT_FORMAT): string {
  return parts(value, uncertainty, format).uncertainty;
}

/** `313.829 ± 0.069`, `(3.1263 ± 0.0045)e+3`, or the value alone; no unit. */
export function formatMeasurement(value: number, uncertainty?: number, format: NumberFormat = DEFAULT_FORMAT): string {
  return parts(value, uncertainty, format).measurement;
}

/** A unit for display: `1` (dimensionless) is empty, `*` becomes `·`. */
export function unitText(unit: string): string {
  return unit === '1' ? '' : unit.replace(/\*/g, '·');
}

/** `313.829 ± 0.069 K`, `1.0921 ± 0.0022 %`, `0.849`; `—` for a non-finite value. */
export function formatQuantity(value: number, uncertainty: number | undefined, unit: string, format: NumberFormat = DEFAULT_FORMAT): string {
  const m = formatMeasurement(value, uncertainty, format);
  const u = unitText(unit);
  return m === MISSING || u === '' ? m : `${m} ${u}`;
}

/** The value as a CSV field's text: the table cell, but empty for a non-finite value. */
export function formatCsvNumber(value: number, uncertainty?: number, format: NumberFormat = DEFAULT_FORMAT): string {
  return Number.isFinite(value) ? formatValue(value, uncertainty, format) : '';
}

/** The two ends of an interval, each at the value's decimal place when an uncertainty set one: `[313.692, 313.966]`. */
export function formatInterval(interval: readonly [number, number], value: number, uncertainty?: number, format: NumberFormat = DEFAULT_FORMAT): string {
  const [low, high] = formatIntervalEnds(interval, value, uncertainty, format);
  return `[${low}, ${high}]`;
}

/** The two ends of an interval as `formatInterval` prints them, each on its own (`—` for a non-finite end). */
export function formatIntervalEnds(interval: readonly [number, number], value: number, uncertainty?: number, format: NumberFormat = DEFAULT_FORMAT): [string, string] {
  const p = parts(value, uncertainty, format);
  const end = (x: number): string => {
    if (!Number.isFinite(x)) return MISSING;
    // Without a place, or where it would ask for more digits than a double holds: the catalogue digits.
    if (p.place === undefined || (x !== 0 && exponentOf(x) - p.place >= 15)) return formatValue(x, undefined, format);
    if (!useExponential(x, usable(value, uncertainty), format)) return fixedAt(x, p.place);
    return x === 0 ? '0' : exponential(x, Math.max(0, exponentOf(x) - p.place));
  };
  return [end(interval[0]), end(interval[1])];
}

// ---- results by name -------------------------------------------------------------------------

/** The value cell of a named result. */
export function resultValueText(name: string, r: ResultValue): string {
  return formatValue(r.value, r.uncertainty, formatOf(name));
}

/** The uncertainty cell of a named result ('' when it has none). */
export function resultUncertaintyText(name: string, r: ResultValue): string {
  return formatUncertainty(r.value, r.uncertainty, formatOf(name));
}

/**
 * `value ± u unit` of a named result; a bracket between methods (catalogue `bracket`) shows its
 * interval first: `[2.6e+7, 2.8e+9] s (bracket; geometric mean 2.7e+8 s)`.
 */
export function resultText(name: string, r: ResultValue): string {
  if (catalogueEntry(name)?.bracket && r.interval) {
    const u = unitText(r.unit);
    const unit = u === '' ? '' : ` ${u}`;
    return `${formatInterval(r.interval, r.value, r.uncertainty, formatOf(name))}${unit} (bracket; geometric mean ${formatQuantity(r.value, r.uncertainty, r.unit, formatOf(name))})`;
  }
  return formatQuantity(r.value, r.uncertainty, r.unit, formatOf(name));
}

/** The interval of a named result, or '' when it has none. */
export function resultIntervalText(name: string, r: ResultValue): string {
  return r.interval ? formatInterval(r.interval, r.value, r.uncertainty, formatOf(name)) : '';
}
