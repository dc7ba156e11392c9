/**
 * Continuous three-segment piecewise-linear fit (plateau, linear transformation, plateau),
 * METHODS.md §4: h(t) = a + b₁·t + b₂·max(t − t₁, 0) + b₃·max(t − t₂, 0), t₁ < t₂.
 *
 * Method: for fixed breakpoints the model is linear in (a, b₁, b₂, b₃), solved by Householder
 * QR; the breakpoints are found on a 2-D grid over a thinned copy of the data (at most 400
 * points), refined by alternating Brent searches on the full data, and polished by
 * Levenberg–Marquardt on all six parameters. The covariance of all six
 * parameters is σ²(JᵀJ)⁻¹ with the Jacobian of the nonlinear model at the optimum
 * (∂h/∂t₁ = −b₂ for t > t₁, ∂h/∂t₂ = −b₃ for t > t₂).
 *
 * Policy: fewer than 8 points, or a time span of zero, gives null.
 */
import { minimiseBrent } from './brent.js';
import { levenbergMarquardt } from './levenbergMarquardt.js';
import { inverseNormalMatrix, solveLeastSquares } from './qr.js';

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

function linearFit(t: ArrayLike<number>, h: ArrayLike<number>, t1: number, t2: number): { sse: number; beta: number[] } | null {
  const rows: number[][] = [];
  const y: number[] = [];
  for (let i = 0; i < t.length; i++) {
    rows.push([1, t[i], Math.max(t[i] - t1, 0), Math.max(t[i] - t2, 0)]);
    y.push(h[i]);
  }
  const s = solveLeastSquares(rows, y);
  if (!s) return null;
  let sse = 0;
  for (let i = 0; i < t.length; i++) {
    const r = rows[i];
    const e = y[i] - (s.x[0] + s.x[1] * r[1] + s.x[2] * r[2] + s.x[3] * r[3]);
    sse += e * e;
  }
  return { sse, beta: s.x };
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
  const stride = Math.max(1, Math.ceil(n / 400));
  const ts: number[] = [];
  const hs: number[] = [];
  for (let i = 0; i < n; i += stride) {
    ts.push(t[i]);
    hs.push(h[i]);
  }
  const grid = 40;
  const span = tmax - tmin;
  let best = { sse: Infinity, t1: NaN, t2: NaN };
  for (let i = 1; i < grid; i++) {
    for (let j = i + 1; j <= grid; j++) {
      const t1 = tmin + (span * i) / (grid + 1);
      const t2 = tmin + (span * j) / (grid + 1);
      const f = linearFit(ts, hs, t1, t2);
      if (f && f.sse < best.sse) best = { sse: f.sse, t1, t2 };
    }
  }
  if (!Number.isFinite(best.t1)) return null;
  let { t1, t2 } = best;
  const cell = span / (grid + 1);
  const sseAt = (a: number, b: number): number => (a < b ? (linearFit(t, h, a, b)?.sse ?? Infinity) : Infinity);
  for (let round = 0; round < 2; round++) {
    t1 = minimiseBrent((x) => sseAt(x, t2), Math.max(tmin, t1 - cell), Math.min(t2, t1 + cell), 1e-9).x;
    t2 = minimiseBrent((x) => sseAt(t1, x), Math.max(t1, t2 - cell), Math.min(tmax, t2 + cell), 1e-9).x;
  }
  const start = linearFit(t, h, t1, t2);
  if (!start) return null;
  const model = (p: readonly number[], ti: number): number => p[0] + p[1] * ti + p[2] * Math.max(ti - p[4], 0) + p[3] * Math.max(ti - p[5], 0);
  const lm = levenbergMarquardt(
    {
      residuals: (p) => (p[4] < p[5] ? Array.from(t, (ti, i) => model(p, ti) - h[i]) : [Infinity]),
      jacobian: (p) => Array.from(t, (ti) => [1, ti, Math.max(ti - p[4], 0), Math.max(ti - p[5], 0), ti > p[4] ? -p[2] : 0, ti > p[5] ? -p[3] : 0]),
    },
    [...start.beta, t1, t2],
    { maxIterations: 100 },
  );
  if (lm.sse < start.sse && lm.parameters[4] < lm.parameters[5]) {
    t1 = lm.parameters[4];
    t2 = lm.parameters[5];
  }
  const f = linearFit(t, h, t1, t2);
  if (!f) return null;
  const [a, b1, b2, b3] = f.beta;
  const dof = n - 6;
  const sigma2 = dof > 0 ? f.sse / dof : 0;
  const J = Array.from(t, (ti) => [1, ti, Math.max(ti - t1, 0), Math.max(ti - t2, 0), ti > t1 ? -b2 : 0, ti > t2 ? -b3 : 0]);
  const qr = solveLeastSquares(J, new Array<number>(n).fill(0));
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
