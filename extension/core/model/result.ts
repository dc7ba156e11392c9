/**
 * One term of a combined standard uncertainty (GUM, JCGM 100:2008, §5.1): what it comes from and
 * its standard uncertainty in the figure's unit. Terms are independent and add in quadrature.
 */
export interface UncertaintyTerm {
  /** `statistical`, `window`, `model`, `calibration`, `replicates`, `baseline`, … */
  readonly source: string;
  readonly value: number;
  /** One line on how the term was found: "Tg over five window choices, half range / √3". */
  readonly note?: string;
}

/** A computed figure: value in the unit DESIGN.md names, its method and, where the method yields one, its standard uncertainty. */
export interface ResultValue {
  readonly value: number;
  readonly unit: string;
  /** The combined standard uncertainty; with a budget, the root sum of squares of its terms. */
  readonly uncertainty?: number;
  readonly method: string;
  /** A 95 % interval or, for a bracket, the range between the methods' values. */
  readonly interval?: readonly [number, number];
  /** The terms the uncertainty combines, largest first. */
  readonly budget?: readonly UncertaintyTerm[];
}

export type Results = Readonly<Record<string, ResultValue>>;

export function result(value: number, unit: string, method: string, uncertainty?: number, interval?: readonly [number, number]): ResultValue {
  // A standard uncertainty is a magnitude; propagated formulas may carry the sign of the value.
  const base: ResultValue = uncertainty !== undefined && Number.isFinite(uncertainty) ? { value, unit, uncertainty: Math.abs(uncertainty), method } : { value, unit, method };
  return interval && interval.every(Number.isFinite) ? { ...base, interval } : base;
}

/**
 * A figure whose uncertainty is the quadrature sum of its budget's finite terms (GUM §5.1.2 with
 * unit sensitivity coefficients, the terms already in the figure's unit). Zero and non-finite
 * terms are left out; an empty budget gives a figure without uncertainty.
 */
export function budgeted(value: number, unit: string, method: string, terms: readonly UncertaintyTerm[], interval?: readonly [number, number]): ResultValue {
  const kept = terms.filter((t) => Number.isFinite(t.value) && t.value !== 0).map((t) => ({ ...t, value: Math.abs(t.value) }));
  kept.sort((a, b) => b.value - a.value);
  const base = result(value, unit, method, kept.length ? Math.hypot(...kept.map((t) => t.value)) : undefined, interval);
  return kept.length ? { ...base, budget: kept } : base;
}
