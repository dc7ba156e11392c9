/**
 * The first abrupt fall in a series: a point-to-point drop of more than 10 times the median
 * step that does not come straight back (common practice, no source; used for crystallisation
 * and dewetting flags).
 *
 * Policy: fewer than 20 points, or a median step of zero with `floor` zero, gives -1.
 */
export function firstAbruptDrop(h: ArrayLike<number>, floor = 0): { index: number; drop: number } {
  const n = h.length;
  if (n < 20) return { index: -1, drop: 0 };
  const steps = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) steps[i] = Math.abs(h[i + 1] - h[i]);
  steps.sort();
  const typical = Math.max(steps[Math.floor(steps.length / 2)], floor);
  if (!(typical > 0)) return { index: -1, drop: 0 };
  for (let i = 1; i < n; i++) {
    const drop = h[i - 1] - h[i];
    if (drop > 10 * typical && drop > 3 * Math.abs(h[Math.min(n - 1, i + 1)] - h[i])) return { index: i, drop };
  }
  return { index: -1, drop: 0 };
}
