/**
 * Figures as a reader of a lab record wants them: a temperature in K with °C beside it, a time in
 * the unit that fits its size (s, min, h, d, years), an exponent as a power of ten, a bracket as
 * its two ends. Every number still goes through the one formatter (model/formatResult.ts); this
 * module only chooses units and writes HTML. Returns HTML-escaped text.
 */
import { celsiusText } from '../engine/summaryColumns.js';
import { catalogueEntry, type NumberFormat } from '../model/catalogue.js';
import { formatMeasurement, formatValue, MISSING, unitText } from '../model/formatResult.js';
import type { ResultValue } from '../model/result.js';
import { escapeHtml } from './escape.js';

/** `3.13e+3` → `3.13 × 10<sup>3</sup>`; `(1.63 ± 0.01)e-4` likewise. Input is plain formatter text. */
export function powerOfTenHtml(text: string): string {
  const m = /^(.*)e([+-])(\d+)$/.exec(text);
  if (!m) return escapeHtml(text);
  const exponent = `${m[2] === '-' ? '−' : ''}${Number(m[3])}`;
  return `${escapeHtml(m[1])} × 10<sup>${exponent}</sup>`;
}

/** A unit as escaped display text (`J/(g·K)`; empty for a pure number). */
function unitHtml(unit: string): string {
  return escapeHtml(unitText(unit));
}

/** The Julian year (365.25 d), the astronomers' and the IAU's year; common practice for ages. */
const YEAR = 365.25 * 86400;

/** Time units from the smallest, each used from `from` seconds on (two of the next smaller unit). */
const TIME_UNITS: ReadonlyArray<{ readonly unit: string; readonly seconds: number; readonly from: number }> = [
  { unit: 's', seconds: 1, from: 0 },
  { unit: 'min', seconds: 60, from: 120 },
  { unit: 'h', seconds: 3600, from: 2 * 3600 },
  { unit: 'd', seconds: 86400, from: 2 * 86400 },
  { unit: 'years', seconds: YEAR, from: 2 * YEAR },
];

/** The unit of a time of this size (in s): seconds below 2 min, minutes below 2 h, and so on. */
export function timeUnitOf(seconds: number): { readonly unit: string; readonly seconds: number } {
  const size = Math.abs(seconds);
  let chosen = TIME_UNITS[0];
  for (const u of TIME_UNITS) if (size >= u.from) chosen = u;
  return chosen;
}

/**
 * A time in the unit that fits it, with its uncertainty scaled alike: 900.1 ± 10.0 s →
 * `15.00 ± 0.17 min`. Above 10⁴ years a power of ten. Significant digits from `format` when
 * there is no uncertainty.
 */
export function timeHtml(seconds: number, uncertainty: number | undefined, format: NumberFormat): string {
  if (!Number.isFinite(seconds)) return MISSING;
  const u = timeUnitOf(seconds);
  const scaled = seconds / u.seconds;
  const notation = Math.abs(scaled) >= 1e4 ? 'exponential' : 'fixed';
  const digits = notation === 'fixed' ? Math.max(format.digits, 2) : format.digits;
  const text = formatMeasurement(scaled, uncertainty === undefined ? undefined : uncertainty / u.seconds, { digits, notation });
  return `${powerOfTenHtml(text)} ${u.unit}`;
}

/** The two ends of a bracket of times, each in its own unit: `48 years – 5.2 × 10⁵ years`. */
export function timeBracketHtml(interval: readonly [number, number]): string {
  const end = (x: number): string => timeHtml(x, undefined, { digits: 2, notation: 'fixed' });
  return `${end(interval[0])} – ${end(interval[1])}`;
}

/** Is the result's interval a bracket between methods rather than a 95 % interval (the catalogue says)? */

export function isBracket(name: string): boolean {
  return catalogueEntry(name)?.bracket === true;
}

/** What a result cell shows: the main text, and a second line (°C, the time in s) or ''. */
export interface ReadableFigure {
  readonly main: string;
  readonly beside: string;
}

/**
 * A result for the report's tables. Absolute temperatures: K, °C beside. Times: the fitting unit, the
 * value in s beside. A bracket: its two ends instead of a central value. Others: value ± u unit,
 * exponents as powers of ten.
 */
export function readableFigure(name: string, r: ResultValue, format: NumberFormat): ReadableFigure {
  if (r.unit === 's' && isBracket(name) && r.interval) {
    return { main: timeBracketHtml(r.interval), beside: 'bracket of two extrapolations' };
  }
  const measurement = formatMeasurement(r.value, r.uncertainty, format);
  if (measurement === MISSING) return { main: MISSING, beside: '' };
  // °C only beside an absolute temperature (the catalogue says which), never beside a difference in K such as the VFT B.
  if (r.unit === 'K' && catalogueEntry(name)?.absolute === true) {
    const value = formatValue(r.value, r.uncertainty, format);
    const celsius = celsiusText(value, r.value);
    return { main: `${escapeHtml(measurement)} K`, beside: celsius ? `${escapeHtml(celsius)} °C` : '' };
  }
  if (r.unit === 's') {
    const main = timeHtml(r.value, r.uncertainty, format);
    return { main, beside: timeUnitOf(r.value).unit === 's' ? '' : `${powerOfTenHtml(measurement)} s` };
  }
  const unit = unitHtml(r.unit);
  return { main: `${powerOfTenHtml(measurement)}${unit ? ` ${unit}` : ''}`, beside: '' };
}
