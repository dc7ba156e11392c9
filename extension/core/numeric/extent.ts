/**
 * The smallest and the largest value of a sequence, in one loop (as d3-array's `extent`), so that
 * a data column of any length works where `Math.min(...xs)` would overflow the call stack.
 *
 * Policy: NaN is skipped, as d3-array skips missing values; an empty sequence, or one holding
 * only NaN, gives [NaN, NaN]. ±Infinity count like any other value. Never throws.
 */
export function extent(values: ArrayLike<number>): [number, number] {
  let lo = NaN;
  let hi = NaN;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    if (!(v >= lo)) lo = v;
    if (!(v <= hi)) hi = v;
  }
  return [lo, hi];
}
