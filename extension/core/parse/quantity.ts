/**
 * A quantity written in metadata: a number, an optional standard uncertainty after `±` or
 * `+/-`, and a unit (`281 K`, `8 °C`, `0.2 nm/s`, `1e-8 Torr`, `315 ± 1 K`). Values are returned
 * in the canonical unit of their dimension (units.ts).
 *
 * Policy: never throws; returns a reason when the text is not a quantity of the dimension, or
 * when its value (or uncertainty) is not finite, as written or once converted.
 */
import type { Quantity } from '../model/quantity.js';
import { CANONICAL, hasDimension, lookupUnit, toCanonical, type Dimension } from './units.js';

export type { Quantity };

export type QuantityParse =
  | { readonly ok: true; readonly quantity: Quantity; readonly assumedUnit: boolean }
  | { readonly ok: false; readonly reason: 'not-a-number' | 'unknown-unit' | 'wrong-dimension' | 'not-finite'; readonly unitText: string };

const NUMBER = '[+-]?(?:\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][+-]?\\d+)?';
const QUANTITY = new RegExp(`^(${NUMBER})(?:\\s*(?:±|\\+/-|\\+-)\\s*(${NUMBER}))?\\s*(.*)$`);

export function parseQuantity(input: string | number, dimension: Dimension): QuantityParse {
  const canonical = CANONICAL[dimension].unit;
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) return { ok: false, reason: 'not-finite', unitText: '' };
    return { ok: true, assumedUnit: dimension !== 'dimensionless', quantity: { value: input, unit: canonical, dimension, writtenUnit: '', offsetTemperature: false } };
  }
  const m = QUANTITY.exec(input.trim());
  if (!m) return { ok: false, reason: 'not-a-number', unitText: '' };
  const value = Number(m[1]);
  const u = m[2] !== undefined ? Number(m[2]) : undefined;
  const unitText = m[3].trim();
  if (!Number.isFinite(value) || (u !== undefined && !Number.isFinite(u))) return { ok: false, reason: 'not-finite', unitText };
  if (unitText === '') {
    return { ok: true, assumedUnit: dimension !== 'dimensionless', quantity: { value, ...(u === undefined ? {} : { uncertainty: u }), unit: canonical, dimension, writtenUnit: '', offsetTemperature: false } };
  }
  const resolved = lookupUnit(unitText);
  if (!resolved) return { ok: false, reason: 'unknown-unit', unitText };
  if (!hasDimension(resolved, dimension)) return { ok: false, reason: 'wrong-dimension', unitText };
  const converted = toCanonical(value, resolved, dimension);
  const uncertainty = u === undefined ? undefined : Math.abs(toCanonical(u, resolved, dimension === 'temperature' ? 'temperature_interval' : dimension));
  // A finite number can overflow on conversion (1e308 GPa in Pa).
  if (!Number.isFinite(converted) || (uncertainty !== undefined && !Number.isFinite(uncertainty))) return { ok: false, reason: 'not-finite', unitText };
  return {
    ok: true,
    assumedUnit: false,
    quantity: { value: converted, ...(uncertainty === undefined ? {} : { uncertainty }), unit: canonical, dimension, writtenUnit: unitText, offsetTemperature: resolved.absoluteTemperature },
  };
}
