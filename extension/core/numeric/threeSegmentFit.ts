/**
 * Continuous three-segment piecewise-linear fit (plateau, linear transformation, plateau),
 * h(t) = a + b₁·t + b₂·max(t − t₁, 0) + b₃·max(t − t₂, 0), t₁ < t₂.
 *
 * Method: for fixed breakpoints the model is linear in (a, b₁, b₂, b₃), solved by Householder
 * QR; the breakpoints are found globally, on every pair of candidate times (at most 300, from the
 * data; breakpointGrid.ts, suffix sums so each pair costs O(1)), refined by alternating Brent
 * searches on the full data between the neighbouring candidates, and polished by
 * Levenberg–Marquardt on all six parameters. The covariance of all six
 * parameters is σ²(JᵀJ)⁻¹ with the Jacobian of the nonlinear model at the optimum
 * (∂h/∂t₁ = −b₂ for t > t₁, ∂h/∂t₂ = −b₃ for t > t₂).
 *
 * Cost: linear in the number of points, with a bounded number of evaluations (O(n) sums and at
 * most 300²/2 pairs of O(1) each, Brent searches, at most 100 Levenberg–Marquardt iterations). Every
 * evaluation writes the design into one typed-array workspace (qrWorkspace.ts), so it allocates
 * nothing per point, and gives the numbers that qr.ts and levenbergMarquardt.ts give.
 *
 * Policy: fewer than 8 points, or a time span of zero, gives null.
 */
import { minimiseBrent } from './brent.js';
import { columnLevenbergMarquardt } from './columnLevenbergMarquardt.js';
import { inverseNormalMatrix } from './qr.js';
import { QrWorkspace } from './qrWorkspace.js';
import { searchBreakpoints } from './breakpointGrid.js';

export interface ThreeSegmentFit {
  readonly a: number;
  readonly b1: number;
  readonly b2: number;
  readonly b3: number;
  readonly t1: number;
  readonly t2: number;
  readonly sse: number;
  readonly sigma: number;
  /** Covariance of (a, b1, b2, b3, t1, t2), or null. */
  readonly covariance: number[][] | null;
  /** Points after t2 (the final plateau). */
  readonly pointsAfter: number;
}

/**
 * The linear fit for fixed breakpoints over the first m points, in a workspace the whole fit
 * shares: each of the many evaluations costs O(m) and allocates nothing per point.
 */
function linearFit(work: QrWorkspace, t: Float64Array, h: Float64Array, m: number, t1: number, t2: number): { sse: number; beta: number[] } | null {
  const A = work.design;
  const c = work.capacity;
  for (let i = 0; i < m; i++) {
    A[i] = 1;
    A[c + i] = t[i];
    A[2 * c + i] = Math.max(t[i] - t1, 0);
    A[3 * c + i] = Math.max(t[i] - t2, 0);
    work.rhs[i] = h[i];
  }
  const s = work.solve(m, 4);
  if (!s) return null;
  let sse = 0;
  for (let i = 0; i < m; i++) {
    const e = h[i] - (s.x[0] + s.x[1] * t[i] + s.x[2] * Math.max(t[i] - t1, 0) + s.x[3] * Math.max(t[i] - t2, 0));
    sse += e * e;
  }
  return { sse, beta: s.x };
}

/** The model's Jacobian at (a, b1, b2, b3, t1, t2), column-major, n rows. */
function writeJacobian(p: readonly number[], t: Float64Array, n: number, out: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    out[i] = 1;
    out[n + i] = ti;
    out[2 * n + i] = Math.max(ti - p[4], 0);
    out[3 * n + i] = Math.max(ti - p[5], 0);
    out[4 * n + i] = ti > p[4] ? -p[2] : 0;
    out[5 * n + i] = ti > p[5] ? -p[3] : 0;
  }
}

export function fitThreeSegments(tIn: ArrayLike<number>, hIn: ArrayLike<number>): ThreeSegmentFit | null {
  const n = tIn.length;
  if (n < 8) return null;
  // Centre time for conditioning.
  let tmean = 0;
  for (let i = 0; i < n; i++) tmean += tIn[i];
  tmean /= n;
  const t = Float64Array.from(tIn, (v) => v - tmean);
  const h = Float64Array.from(hIn);
  let tmin = Infinity;
  let tmax = -Infinity;
  for (const v of t) {
    tmin = Math.min(tmin, v);
    tmax = Math.max(tmax, v);
  }
  if (!(tmax > tmin)) return null;
  // Sorted by time (a log written out of order fits the same).
  let sorted = true;
  for (let i = 1; i < n; i++) if (t[i] < t[i - 1]) sorted = false;
  if (!sorted) {
    const order = Array.from(t, (_, i) => i).sort((p, q) => t[p] - t[q]);
    const ts = Float64Array.from(order, (i) => t[i]);
    const hs = Float64Array.from(order, (i) => h[i]);
    t.set(ts);
    h.set(hs);
  }
  const work = new QrWorkspace(n, 6);
  // Global search: every pair of candidate breakpoints, with the linear parameters solved inside.
  const grid = searchBreakpoints(t, h);
  if (!grid) return null;
  let { t1, t2 } = grid;
  const sseAt = (a: number, b: number): number => (a < b ? (linearFit(work, t, h, n, a, b)?.sse ?? Infinity) : Infinity);
  for (let round = 0; round < 2; round++) {
    t1 = minimiseBrent((x) => sseAt(x, t2), Math.max(tmin, grid.t1Range[0]), Math.min(t2, grid.t1Range[1]), 1e-9).x;
    t2 = minimiseBrent((x) => sseAt(t1, x), Math.max(t1, grid.t2Range[0]), Math.min(tmax, grid.t2Range[1]), 1e-9).x;
  }
  const start = linearFit(work, t, h, n, t1, t2);
  if (!start) return null;
  const lm = columnLevenbergMarquardt(
    {
      rows: n,
      residuals: (p, out) => {
        if (!(p[4] < p[5])) return false;
        for (let i = 0; i < n; i++) out[i] = p[0] + p[1] * t[i] + p[2] * Math.max(t[i] - p[4], 0) + p[3] * Math.max(t[i] - p[5], 0) - h[i];
        return true;
      },
      jacobian: (p, out) => writeJacobian(p, t, n, out),
    },
    [...start.beta, t1, t2],
    { maxIterations: 100, covariance: false },
  );
  if (lm.sse < start.sse && lm.parameters[4] < lm.parameters[5]) {
    t1 = lm.parameters[4];
    t2 = lm.parameters[5];
  }
  const f = linearFit(work, t, h, n, t1, t2);
  if (!f) return null;
  const [a, b1, b2, b3] = f.beta;
  const dof = n - 6;
  const sigma2 = dof > 0 ? f.sse / dof : 0;
  writeJacobian([a, b1, b2, b3, t1, t2], t, work.capacity, work.design);
  work.rhs.fill(0);
  const qr = work.solve(n, 6);
  const covariance = qr ? inverseNormalMatrix(qr.r).map((row) => row.map((v) => v * sigma2)) : null;
  let pointsAfter = 0;
  for (const v of t) if (v > t2) pointsAfter++;
  // Undo the centring: h = a + b1·(t − tm) + … ⇒ intercept at t = 0 of the original clock.
  return { a: a - b1 * tmean, b1, b2, b3, t1: t1 + tmean, t2: t2 + tmean, sse: f.sse, sigma: Math.sqrt(sigma2), covariance, pointsAfter };
}

/** The fitted model at time t. */
export function threeSegmentValue(f: ThreeSegmentFit, t: number): number {
  return f.a + f.b1 * t + f.b2 * Math.max(t - f.t1, 0) + f.b3 * Math.max(t - f.t2, 0);
}
