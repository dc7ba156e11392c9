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
  return figure(value, unit, method, uncertainty, interval, undefined);
}

/**
 * A figure with its keys always in one order (value, unit, uncertainty, method, interval, budget),
 * the optional ones present only when given: a standard uncertainty is a magnitude (propagated
 * formulas may carry the sign of the value), an interval only when both ends are finite. Built
 * directly, not spread: a figure is made for every result of every block.
 */
function figure(value: number, unit: string, method: string, uncertainty: number | undefined, interval: readonly [number, number] | undefined, budget: readonly UncertaintyTerm[] | undefined): ResultValue {
  const u = uncertainty !== undefined && Number.isFinite(uncertainty) ? Math.abs(uncertainty) : undefined;
  const i = interval && interval.every(Number.isFinite) ? interval : undefined;
  if (u === undefined) {
    if (i === undefined) return budget ? { value, unit, method, budget } : { value, unit, method };
    return budget ? { value, unit, method, interval: i, budget } : { value, unit, method, interval: i };
  }
  if (i === undefined) return budget ? { value, unit, uncertainty: u, method, budget } : { value, unit, uncertainty: u, method };
  return budget ? { value, unit, uncertainty: u, method, interval: i, budget } : { value, unit, uncertainty: u, method, interval: i };
}

/**
 * A figure whose uncertainty is the quadrature sum of its budget's finite terms (GUM §5.1.2 with
 * unit sensitivity coefficients, the terms already in the figure's unit). Zero and non-finite
 * terms are left out; an empty budget gives a figure without uncertainty.
 */
export function budgeted(value: number, unit: string, method: string, terms: readonly UncertaintyTerm[], interval?: readonly [number, number]): ResultValue {
  const kept: UncertaintyTerm[] = [];
  for (let i = 0; i < terms.length; i++) {
    const t = terms[i];
    if (!(Number.isFinite(t.value) && t.value !== 0)) continue;
    // A term is kept as it was given (terms are read-only; most are positive already), or copied with its magnitude.
    if (t.value > 0) kept.push(t);
    else kept.push('note' in t ? { source: t.source, value: -t.value, note: t.note } : { source: t.source, value: -t.value });
  }
  if (kept.length === 0) return figure(value, unit, method, undefined, interval, undefined);
  largestFirst(kept);
  return figure(value, unit, method, rootSumOfSquares(kept), interval, kept);
}

/** Sorts terms largest first, equal ones in their order (a stable insertion sort: a budget has a few terms). */
function largestFirst(terms: UncertaintyTerm[]): void {
  for (let i = 1; i < terms.length; i++) {
    const t = terms[i];
    let j = i - 1;
    while (j >= 0 && terms[j].value < t.value) {
      terms[j + 1] = terms[j];
      j--;
    }
    terms[j + 1] = t;
  }
}

/** Math.hypot of the terms' values (the usual few passed as they are: a budget is made for every figure). */
function rootSumOfSquares(t: readonly UncertaintyTerm[]): number {
  switch (t.length) {
    case 1:
      return Math.hypot(t[0].value);
    case 2:
      return Math.hypot(t[0].value, t[1].value);
    case 3:
      return Math.hypot(t[0].value, t[1].value, t[2].value);
    case 4:
      return Math.hypot(t[0].value, t[1].value, t[2].value, t[3].value);
    default:
      return Math.hypot(...t.map((x) => x.value));
  }
}
