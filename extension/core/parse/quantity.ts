/**
 * A quantity written in metadata, as practitioners write it, returned in the canonical unit of
 * its dimension (units.ts):
 *
 * - a number: `281`, `-3.15`, `1e-8`, `2×10⁻⁷`, `2x10^-7`, `2·10^-7`, `10^-7`; the minus sign
 *   U+2212 as well as the hyphen; a decimal comma (`12,5`), except where it could be a thousands
 *   separator (`1,250`: refused as ambiguous);
 * - then a unit (`281 K`, `8 °C`, `0.2 nm/s`, `1e-8 Torr`), or none (the canonical unit is
 *   assumed and the caller warns);
 * - a standard uncertainty after `±`, `+/-` or `+-`, sharing the unit (`315 ± 1 K`,
 *   `(315 ± 1) K`) or with its own (`12 °C ± 0.5 °C`, `285 K ± 0.5 °C`), converted as an
 *   interval (no offset);
 * - a bound: `< 3e-7 Torr`, `<=`, `≤` (upper), `>`, `>=`, `≥` (lower), kept as such;
 * - for times, durations: `1 h 10 min`, `1h10m`, `2 min 30 s`, or on a clock: `00:29:10`
 *   (h:mm:ss, also `00:29:10 h`), and two parts with a unit that names the first: `1:10 h`
 *   (h:mm), `29:10 min` (min:ss). A bare `1:10` is refused as ambiguous: 1 h 10 min on a
 *   wall clock, 1 min 10 s on a stopwatch, a factor of 60 apart.
 *
 * A multiple of the glass transition temperature (`0.85 Tg`, `0.85Tg`, `0.85 × Tg`) is read by
 * `parseTgMultiple`; `parseQuantity` refuses it with its own reason, since only an analysis that
 * knows the material can resolve it.
 *
 * Policy: never throws; returns a reason when the text is not a quantity of the dimension, or
 * when its value (or uncertainty) is not finite, as written or once converted. A few linear
 * passes over the text, and nothing longer than MAX_QUANTITY_LENGTH is read.
 */
import type { Quantity } from '../model/quantity.js';
import type { Span } from '../text/positions.js';
import { CANONICAL, hasDimension, lookupUnit, superscriptToCaret, toCanonical, type Dimension } from './units.js';

export type { Quantity };

export type QuantityFailure = 'not-a-number' | 'unknown-unit' | 'wrong-dimension' | 'not-finite' | 'ambiguous-comma' | 'ambiguous-clock' | 'tg-multiple';

export type QuantityParse =
  | { readonly ok: true; readonly quantity: Quantity; readonly assumedUnit: boolean }
  | {
      readonly ok: false;
      readonly reason: QuantityFailure;
      /** The unit that failed, as written. */
      readonly unitText: string;
      /**
       * Where that unit is written in the input (offsets into the text as given, end-exclusive):
       * once, or twice when the value and its uncertainty carry the same unit (`12 C ± 0.5 C`).
       * Empty when no unit failed.
       */
      readonly unitSpans: readonly Span[];
      /** Of an ambiguous clock `a:b`: its two parts. */
      readonly clock?: { readonly first: number; readonly second: number };
    };

/** No quantity is longer; longer text is refused before any pattern runs over it. */
export const MAX_QUANTITY_LENGTH = 256;

const PLUS_MINUS = /\s*(?:±|\+\/-|\+-)\s*/;
const BOUND = /^(<=|>=|≤|≥|⩽|⩾|<|>)\s*/;
const TG_UNIT = /^(?:[×x·*⋅]\s*)?T_?g$/;

interface NumberRead {
  readonly value: number;
  /** Offset just after the number. */
  readonly end: number;
  readonly ambiguousComma: boolean;
}

function isDigit(c: string | undefined): boolean {
  return c !== undefined && c >= '0' && c <= '9';
}

function digitsFrom(s: string, i: number): number {
  while (isDigit(s[i])) i++;
  return i;
}

/**
 * Reads a number at `i`: sign, digits with a decimal point or comma, then an exponent written
 * `e-7`, `×10⁻⁷`, `x10^-7`, `·10^(-7)`. Null when no number starts there.
 */
function readNumber(s: string, start: number): NumberRead | null {
  let i = start;
  let text = '';
  if (s[i] === '+' || s[i] === '-') text += s[i++];
  const intStart = i;
  i = digitsFrom(s, i);
  const intPart = s.slice(intStart, i);
  text += intPart;
  let ambiguousComma = false;
  if (s[i] === ',' && intPart.length > 0 && isDigit(s[i + 1])) {
    const fracStart = i + 1;
    i = digitsFrom(s, fracStart);
    const frac = s.slice(fracStart, i);
    // "1,250" is 1.25 to some and 1250 to others; "0,125" and "12,5" are not in doubt.
    ambiguousComma = frac.length === 3 && !/^0+$/.test(intPart);
    text += '.' + frac;
  } else if (s[i] === '.' && (intPart.length > 0 || isDigit(s[i + 1]))) {
    const fracStart = i + 1;
    i = digitsFrom(s, fracStart);
    text += '.' + s.slice(fracStart, i);
  }
  if (!/\d/.test(text)) return null;
  // Exponent after e or E.
  if ((s[i] === 'e' || s[i] === 'E') && (isDigit(s[i + 1]) || ((s[i + 1] === '+' || s[i + 1] === '-') && isDigit(s[i + 2])))) {
    const expStart = i + 1;
    let j = expStart;
    if (s[j] === '+' || s[j] === '-') j++;
    j = digitsFrom(s, j);
    text += 'e' + s.slice(expStart, j);
    i = j;
  } else {
    const power = readPowerOfTen(s, i, true);
    if (power) {
      text += 'e' + power.exponent;
      i = power.end;
    } else if (text.replace(/^[+-]/, '') === '10') {
      // "10^-7" or "10⁻⁷" alone: a power of ten with no mantissa.
      const alone = readExponent(s, i);
      if (alone) {
        text = (text.startsWith('-') ? '-' : '') + '1e' + alone.exponent;
        i = alone.end;
      }
    }
  }
  const value = Number(text);
  return { value, end: i, ambiguousComma };
}

/** `×10^-7`, `x10⁻⁷`, `· 10^(-7)`, `*10^-7` at `i` (with optional spaces), or null. */
function readPowerOfTen(s: string, i: number, needTimes: boolean): { exponent: string; end: number } | null {
  let j = i;
  while (s[j] === ' ' || s[j] === '\t') j++;
  if (needTimes) {
    if (s[j] === undefined || !'×xX·*⋅'.includes(s[j])) return null;
    j++;
    while (s[j] === ' ' || s[j] === '\t') j++;
  }
  if (s[j] !== '1' || s[j + 1] !== '0') return null;
  return readExponent(s, j + 2);
}

/** `^-7`, `^(-7)`, `^−7` (already a hyphen here) or superscript `⁻⁷` at `i`, or null. */
function readExponent(s: string, i: number): { exponent: string; end: number } | null {
  let j = i;
  if (s[j] === '^') {
    j++;
    const paren = s[j] === '(';
    if (paren) j++;
    let sign = '';
    if (s[j] === '+' || s[j] === '-') sign = s[j++] === '-' ? '-' : '';
    const d = digitsFrom(s, j);
    if (d === j) return null;
    const exponent = sign + s.slice(j, d);
    j = d;
    if (paren) {
      if (s[j] !== ')') return null;
      j++;
    }
    return { exponent, end: j };
  }
  let k = j;
  if (s[k] === '⁺' || s[k] === '⁻') k++;
  while (k < s.length && '⁰¹²³⁴⁵⁶⁷⁸⁹'.includes(s[k])) k++;
  if (k === j || (k === j + 1 && (s[j] === '⁺' || s[j] === '⁻'))) return null;
  const caret = superscriptToCaret(s.slice(j, k));
  return { exponent: caret.slice(1), end: k };
}

/** The text with U+2212 MINUS SIGN as a hyphen-minus, trimmed. */
function prepare(input: string): string {
  return input.replace(/\u2212/g, '-').trim();
}

interface Written {
  readonly bound?: 'upper' | 'lower';
  readonly value: number;
  readonly valueUnit: string;
  /** Where the value's unit is written (in the prepared text); null when it is not written apart. */
  readonly valueUnitSpan: Span | null;
  readonly uncertainty?: number;
  readonly uncertaintyUnit: string;
  /** Where the uncertainty's own unit is written; null when it shares the value's. */
  readonly uncertaintyUnitSpan: Span | null;
}

/** The span of `s.slice(start, end)` without its surrounding white space (as `trim` removes it). */
function trimmedSpan(s: string, start: number, end: number): Span {
  const part = s.slice(start, end);
  const from = start + part.length - part.trimStart().length;
  return { start: from, end: from + part.trim().length };
}

type Read = { readonly ok: true; readonly written: Written } | { readonly ok: false; readonly reason: 'not-a-number' | 'ambiguous-comma' };

/** Splits the text into bound, value, unit, uncertainty and its unit, without reading any unit. */
function readWritten(s: string): Read {
  let i = 0;
  let bound: Written['bound'];
  const b = BOUND.exec(s);
  if (b) {
    bound = b[1] === '<' || b[1] === '<=' || b[1] === '≤' || b[1] === '⩽' ? 'upper' : 'lower';
    i = b[0].length;
  }
  // "(315 ± 1) K": value and uncertainty share the unit after the parenthesis.
  if (s[i] === '(') {
    let j = i + 1;
    while (s[j] === ' ') j++;
    const v = readNumber(s, j);
    if (!v) return { ok: false, reason: 'not-a-number' };
    const pm = PLUS_MINUS.exec(s.slice(v.end));
    if (!pm || pm.index !== 0) return { ok: false, reason: 'not-a-number' };
    const u = readNumber(s, v.end + pm[0].length);
    if (!u) return { ok: false, reason: 'not-a-number' };
    let k = u.end;
    while (s[k] === ' ') k++;
    if (s[k] !== ')') return { ok: false, reason: 'not-a-number' };
    if (v.ambiguousComma || u.ambiguousComma) return { ok: false, reason: 'ambiguous-comma' };
    const unitSpan = trimmedSpan(s, k + 1, s.length);
    const unit = s.slice(unitSpan.start, unitSpan.end);
    if (bound) return { ok: false, reason: 'not-a-number' };
    return { ok: true, written: { value: v.value, valueUnit: unit, valueUnitSpan: unitSpan, uncertainty: u.value, uncertaintyUnit: unit, uncertaintyUnitSpan: null } };
  }
  const v = readNumber(s, i);
  if (!v) return { ok: false, reason: 'not-a-number' };
  if (v.ambiguousComma) return { ok: false, reason: 'ambiguous-comma' };
  const rest = s.slice(v.end);
  const pm = PLUS_MINUS.exec(rest);
  if (!pm) {
    const span = trimmedSpan(s, v.end, s.length);
    return { ok: true, written: { bound, value: v.value, valueUnit: s.slice(span.start, span.end), valueUnitSpan: span, uncertaintyUnit: '', uncertaintyUnitSpan: null } };
  }
  if (bound) return { ok: false, reason: 'not-a-number' };
  const valueSpan = trimmedSpan(s, v.end, v.end + pm.index);
  const valueUnit = s.slice(valueSpan.start, valueSpan.end);
  const afterPm = v.end + pm.index + pm[0].length;
  const u = readNumber(s, afterPm);
  if (!u) return { ok: false, reason: 'not-a-number' };
  if (u.ambiguousComma) return { ok: false, reason: 'ambiguous-comma' };
  const uncertaintySpan = trimmedSpan(s, u.end, s.length);
  const uncertaintyUnit = s.slice(uncertaintySpan.start, uncertaintySpan.end);
  // "12 ± 0.5 °C": one unit for both, written once; "315 K ± 1": the uncertainty in the value's unit.
  if (valueUnit === '') return { ok: true, written: { value: v.value, valueUnit: uncertaintyUnit, valueUnitSpan: uncertaintySpan, uncertainty: u.value, uncertaintyUnit, uncertaintyUnitSpan: null } };
  if (uncertaintyUnit === '') return { ok: true, written: { value: v.value, valueUnit, valueUnitSpan: valueSpan, uncertainty: u.value, uncertaintyUnit: valueUnit, uncertaintyUnitSpan: null } };
  return { ok: true, written: { value: v.value, valueUnit, valueUnitSpan: valueSpan, uncertainty: u.value, uncertaintyUnit, uncertaintyUnitSpan: uncertaintySpan } };
}

const HOURS = /^(?:hours?|hrs?|h)$/;
const MINUTES = /^(?:minutes?|mins?|m)$/;
const SECONDS = /^(?:seconds?|secs?|s)$/;
const DURATION_PART = /^\s*(\d+(?:[.,]\d+)?)\s*([A-Za-z]+)/;
/** `h:mm:ss`, with a fraction of a second, optionally followed by an hour unit (the first part's). */
const CLOCK_HMS = /^(\d+):([0-5]\d):([0-5]\d(?:[.,]\d+)?)(?:\s*(?:hours?|hrs?|h))?$/;
/** `a:bb`, with a fraction of the second part, and the unit of the first part when written. */
const CLOCK_TWO = /^(\d+):([0-5]\d(?:[.,]\d+)?)(?:\s*([A-Za-z]+))?$/;
/** Minutes as the first part of a clock: `m` alone is the metre, so not here. */
const CLOCK_MINUTES = /^(?:minutes?|mins?)$/;

const clockNumber = (x: string): number => Number(x.replace(',', '.'));

/**
 * A duration in seconds written as hours, minutes and seconds: `1 h 10 min`, `1h10m`,
 * `2 min 30 s` (two parts or more, largest first; `m` is a minute only inside such a sum), or on
 * a clock: `00:29:10` (h:mm:ss), and `1:10 h` (h:mm) or `29:10 min` (min:ss), where the unit
 * names the first part. Null for anything else, a bare `29:10` included (see `ambiguousClock`).
 */
export function parseDuration(text: string): { seconds: number; written: string } | null {
  const s = text.trim();
  if (s.length > MAX_QUANTITY_LENGTH) return null;
  const num = clockNumber;
  const hms = CLOCK_HMS.exec(s);
  if (hms) return { seconds: 3600 * num(hms[1]) + 60 * num(hms[2]) + num(hms[3]), written: 'h:min:s' };
  const two = CLOCK_TWO.exec(s);
  if (two && two[3] !== undefined && HOURS.test(two[3])) return { seconds: 3600 * num(two[1]) + 60 * num(two[2]), written: 'h:min' };
  if (two && two[3] !== undefined && CLOCK_MINUTES.test(two[3])) return { seconds: 60 * num(two[1]) + num(two[2]), written: 'min:s' };
  let rest = s;
  let seconds = 0;
  let rank = 3;
  const units: string[] = [];
  while (rest.length > 0) {
    const m = DURATION_PART.exec(rest);
    if (!m) return null;
    const r = HOURS.test(m[2]) ? 2 : MINUTES.test(m[2]) ? 1 : SECONDS.test(m[2]) ? 0 : -1;
    if (r < 0 || r >= rank) return null;
    rank = r;
    seconds += num(m[1]) * (r === 2 ? 3600 : r === 1 ? 60 : 1);
    units.push(r === 2 ? 'h' : r === 1 ? 'min' : 's');
    rest = rest.slice(m[0].length);
  }
  return units.length >= 2 && Number.isFinite(seconds) ? { seconds, written: units.join(' ') } : null;
}

/**
 * The two parts of a clock `a:bb` that does not say what its parts are: bare (`1:10`, read as
 * 1 h 10 min on a wall clock and as 1 min 10 s on a stopwatch, 60 times apart) or with a unit that
 * names neither hours nor minutes (`1:10 s`, `1:10 m`). Null for anything else.
 */
export function ambiguousClock(text: string): { first: number; second: number } | null {
  const s = text.trim();
  if (s.length > MAX_QUANTITY_LENGTH) return null;
  const two = CLOCK_TWO.exec(s);
  if (!two || (two[3] !== undefined && (HOURS.test(two[3]) || CLOCK_MINUTES.test(two[3])))) return null;
  return { first: clockNumber(two[1]), second: clockNumber(two[2]) };
}

/**
 * A temperature written as a multiple of the material's glass transition temperature:
 * `0.85 Tg`, `0.85Tg`, `0.85 × Tg`, `0.85 T_g`, with an optional uncertainty on the factor
 * (`0.85 ± 0.01 Tg`). Null for anything else.
 */
export function parseTgMultiple(input: string | number): { factor: number; uncertainty?: number } | null {
  if (typeof input !== 'string' || input.length > MAX_QUANTITY_LENGTH) return null;
  const read = readWritten(prepare(input));
  if (!read.ok || read.written.bound) return null;
  const w = read.written;
  if (!TG_UNIT.test(w.valueUnit) || (w.uncertainty !== undefined && !TG_UNIT.test(w.uncertaintyUnit))) return null;
  if (!Number.isFinite(w.value) || (w.uncertainty !== undefined && !Number.isFinite(w.uncertainty))) return null;
  return w.uncertainty === undefined ? { factor: w.value } : { factor: w.value, uncertainty: Math.abs(w.uncertainty) };
}

export function parseQuantity(input: string | number, dimension: Dimension): QuantityParse {
  const canonical = CANONICAL[dimension].unit;
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) return { ok: false, reason: 'not-finite', unitText: '', unitSpans: [] };
    return { ok: true, assumedUnit: dimension !== 'dimensionless', quantity: { value: input, unit: canonical, dimension, writtenUnit: '', offsetTemperature: false } };
  }
  if (input.length > MAX_QUANTITY_LENGTH) return { ok: false, reason: 'not-a-number', unitText: '', unitSpans: [] };
  const s = prepare(input);
  if (dimension === 'time') {
    const d = parseDuration(s);
    if (d) return { ok: true, assumedUnit: false, quantity: { value: d.seconds, unit: canonical, dimension, writtenUnit: d.written, offsetTemperature: false } };
    const clock = ambiguousClock(s);
    if (clock) return { ok: false, reason: 'ambiguous-clock', unitText: '', unitSpans: [], clock };
  }
  const read = readWritten(s);
  if (!read.ok) return { ok: false, reason: read.reason, unitText: '', unitSpans: [] };
  const w = read.written;
  const unitText = w.valueUnit;
  // Spans in the input as given: `prepare` keeps every character's length and trims the start.
  const lead = input.length - input.trimStart().length;
  const inInput = (span: Span | null): Span[] => (span ? [{ start: span.start + lead, end: span.end + lead }] : []);
  // The value's unit, and the uncertainty's too when it is written again the same (`12 C ± 0.5 C`).
  const valueUnitSpans = [...inInput(w.valueUnitSpan), ...(w.uncertaintyUnit === unitText ? inInput(w.uncertaintyUnitSpan) : [])];
  const fail = (reason: QuantityFailure, text: string, spans: Span[]): QuantityParse => ({ ok: false, reason, unitText: text, unitSpans: spans });
  if (!Number.isFinite(w.value) || (w.uncertainty !== undefined && !Number.isFinite(w.uncertainty))) return fail('not-finite', unitText, []);
  const bound = w.bound ? { bound: w.bound } : {};
  if (unitText === '') {
    return { ok: true, assumedUnit: dimension !== 'dimensionless', quantity: { value: w.value, ...(w.uncertainty === undefined ? {} : { uncertainty: Math.abs(w.uncertainty) }), unit: canonical, dimension, writtenUnit: '', offsetTemperature: false, ...bound } };
  }
  if ((dimension === 'temperature' || dimension === 'temperature_interval') && TG_UNIT.test(unitText)) return fail('tg-multiple', unitText, valueUnitSpans);
  const resolved = lookupUnit(unitText);
  if (!resolved) return fail('unknown-unit', unitText, valueUnitSpans);
  if (!hasDimension(resolved, dimension)) return fail('wrong-dimension', unitText, valueUnitSpans);
  const converted = toCanonical(w.value, resolved, dimension);
  let uncertainty: number | undefined;
  if (w.uncertainty !== undefined) {
    const uResolved = w.uncertaintyUnit === unitText ? resolved : lookupUnit(w.uncertaintyUnit);
    if (!uResolved) return fail('unknown-unit', w.uncertaintyUnit, inInput(w.uncertaintyUnitSpan));
    if (!hasDimension(uResolved, dimension)) return fail('wrong-dimension', w.uncertaintyUnit, inInput(w.uncertaintyUnitSpan));
    // An uncertainty is a difference: converted by scale only, whatever the unit's offset.
    uncertainty = Math.abs(toCanonical(w.uncertainty, uResolved, dimension === 'temperature' ? 'temperature_interval' : dimension));
  }
  // A finite number can overflow on conversion (1e308 GPa in Pa).
  if (!Number.isFinite(converted) || (uncertainty !== undefined && !Number.isFinite(uncertainty))) return fail('not-finite', unitText, []);
  return {
    ok: true,
    assumedUnit: false,
    quantity: { value: converted, ...(uncertainty === undefined ? {} : { uncertainty }), unit: canonical, dimension, writtenUnit: unitText, offsetTemperature: resolved.absoluteTemperature, ...bound },
  };
}
