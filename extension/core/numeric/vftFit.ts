/**
 * Decadic VFT fit log10 τ = A + B/(T − T0) by variable projection: for a fixed
 * T0 the model is a straight line in z = 1/(T − T0), so A and B follow by linear least squares
 * and only the profile SSE(T0) is searched — on a grid of T0 from just below T_min down to 0 K
 * (log-spaced distances), then by Brent's method — with no starting values from the user.
 * Levenberg–Marquardt on (A, B, T0) then polishes the optimum and gives the covariance
 * σ²(JᵀJ)⁻¹ (Golub & Pereyra, SIAM J. Numer. Anal. 10, 413 (1973) for the projection).
 *
 * Policy: fewer than 4 points or non-finite input gives null. Residuals are in log10 τ.
 */
import { minimiseBrent } from './brent.js';
import { columnLevenbergMarquardt } from './columnLevenbergMarquardt.js';
import { extent } from './extent.js';
import { fitLine } from './lineFit.js';

export interface VftFit {
  readonly A: number;
  readonly B: number;
  readonly T0: number;
  /** Covariance of (A, B, T0). */
  readonly covariance: number[][] | null;
  readonly sse: number;
  readonly n: number;
  /** T0 ended at the lower bound of the search (0 K): the data look Arrhenius-like. */
  readonly t0AtBound: boolean;
}

/** The line fit in z = 1/(T − T0), with z written into a buffer the whole search shares. */
function profile(T: readonly number[], y: readonly number[], T0: number, z: Float64Array): { sse: number; A: number; B: number } {
  for (let i = 0; i < T.length; i++) z[i] = 1 / (T[i] - T0);
  const f = fitLine(z, y);
  if (!f) return { sse: Infinity, A: NaN, B: NaN };
  return { sse: f.sse, A: f.c - f.slope * f.xc, B: f.slope };
}

export function fitVft(T: readonly number[], log10Tau: readonly number[]): VftFit | null {
  const n = T.length;
  if (n < 4 || T.some((t) => !Number.isFinite(t)) || log10Tau.some((v) => !Number.isFinite(v))) return null;
  const [tmin] = extent(T);
  if (!(tmin > 0)) return null;
  // Distances d = T_min − T0 from 1e-3·T_min to T_min (T0 = 0), log-spaced.
  const grid = 240;
  let best = { sse: Infinity, d: NaN, k: -1 };
  const z = new Float64Array(n);
  const ds: number[] = [];
  for (let k = 0; k < grid; k++) {
    const d = tmin * Math.pow(10, -3 + (3 * k) / (grid - 1));
    ds.push(d);
    const p = profile(T, log10Tau, tmin - d, z);
    if (p.sse < best.sse) best = { sse: p.sse, d, k };
  }
  if (best.k < 0) return null;
  const lo = ds[Math.max(0, best.k - 1)];
  const hi = ds[Math.min(grid - 1, best.k + 1)];
  const refined = minimiseBrent((u) => profile(T, log10Tau, tmin - Math.exp(u), z).sse, Math.log(lo), Math.log(hi), 1e-12);
  const T0start = tmin - Math.exp(refined.x);
  const start = profile(T, log10Tau, T0start, z);
  const lm = columnLevenbergMarquardt(
    {
      rows: n,
      residuals: ([A, B, T0], out) => {
        for (let i = 0; i < n; i++) {
          const t = T[i];
          if (!(t > T0)) return false;
          out[i] = A + B / (t - T0) - log10Tau[i];
        }
        return true;
      },
      jacobian: ([, B, T0], out) => {
        for (let i = 0; i < n; i++) {
          const t = T[i];
          out[i] = 1;
          out[n + i] = 1 / (t - T0);
          out[2 * n + i] = B / ((t - T0) * (t - T0));
        }
      },
    },
    [start.A, start.B, T0start],
  );
  const [A, B, T0] = lm.sse <= start.sse ? lm.parameters : [start.A, start.B, T0start];
  return { A, B, T0, covariance: lm.covariance, sse: Math.min(lm.sse, start.sse), n, t0AtBound: best.k === grid - 1 };
}
