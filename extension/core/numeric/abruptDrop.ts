/** The steps of a series of up to 20 000 points, reused. */
let scratch = new Float64Array(1024);

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
  // Up to 20 000 steps in a reused array (the selection reorders them; nothing keeps them).
  if (n - 1 > 20000) return dropIn(h, new Float64Array(n - 1), floor);
  if (scratch.length < n - 1) scratch = new Float64Array(Math.min(20000, Math.max(n - 1, 2 * scratch.length)));
  return dropIn(h, scratch.subarray(0, n - 1), floor);
}

function dropIn(h: ArrayLike<number>, steps: Float64Array, floor: number): { index: number; drop: number } {
  const n = h.length;
  for (let i = 0; i < n - 1; i++) steps[i] = Math.abs(h[i + 1] - h[i]);
  const typical = Math.max(kthSmallest(steps, Math.floor(steps.length / 2)), floor);
  if (!(typical > 0)) return { index: -1, drop: 0 };
  for (let i = 1; i < n; i++) {
    const drop = h[i - 1] - h[i];
    if (drop > 10 * typical && drop > 3 * Math.abs(h[Math.min(n - 1, i + 1)] - h[i])) return { index: i, drop };
  }
  return { index: -1, drop: 0 };
}

/**
 * The k-th smallest value (0-based) of the array, which it reorders: Hoare's selection
 * (Commun. ACM 4, 321 (1961), "FIND"), with the median of three as pivot; the value a sort
 * would put at k, in linear time on average.
 */
export function kthSmallest(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    // Median of three as the pivot.
    if (a[mid] < a[lo]) swap(a, mid, lo);
    if (a[hi] < a[lo]) swap(a, hi, lo);
    if (a[hi] < a[mid]) swap(a, hi, mid);
    const pivot = a[mid];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) swap(a, i++, j--);
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}
