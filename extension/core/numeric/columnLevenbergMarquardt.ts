/**
 * Levenberg–Marquardt least squares with Marquardt's diagonal scaling (Moré, "The
 * Levenberg–Marquardt algorithm: implementation and theory", Numerical Analysis, Springer LNM 630
 * (1978)) for problems with many rows: residuals and Jacobian are written into typed arrays that
 * live for the whole fit, and each damped step [J; √λ·D] δ = [−r; 0] is solved in one reusable
 * QR workspace (qrWorkspace.ts).
 *
 * `levenbergMarquardt` (levenbergMarquardt.ts) is this iteration for problems written with arrays
 * of rows.
 *
 * Policy: returns the best point found; `converged` says whether the relative reduction fell
 * below the tolerance. A point outside the model's domain, or non-finite residuals, rejects a
 * step. Never throws. Allocates nothing per row after the start.
 */
import { inverseNormalMatrix } from './qr.js';
import { QrWorkspace } from './qrWorkspace.js';

export interface LmResult {
  readonly parameters: number[];
  readonly sse: number;
  readonly converged: boolean;
  readonly iterations: number;
  /** σ²(JᵀJ)⁻¹ with σ² = SSE/(m − n), or null when J is rank-deficient. */
  readonly covariance: number[][] | null;
}

export interface ColumnLmProblem {
  /** Number of residuals m. */
  readonly rows: number;
  /** Writes r(p) = model − data into out[0, m); false when p is outside the model's domain. */
  residuals(p: readonly number[], out: Float64Array): boolean;
  /** Writes ∂r/∂p column-major into out: ∂rᵢ/∂pⱼ at out[j·m + i]. */
  jacobian(p: readonly number[], out: Float64Array): void;
}

export interface ColumnLmOptions {
  readonly maxIterations?: number;
  readonly tolerance?: number;
  /** Compute σ²(JᵀJ)⁻¹ at the end (one more QR of J); default true. */
  readonly covariance?: boolean;
}

function sumSquares(r: Float64Array, m: number): number {
  let s = 0;
  for (let i = 0; i < m; i++) s += r[i] * r[i];
  return s;
}

export function columnLevenbergMarquardt(problem: ColumnLmProblem, start: readonly number[], options: ColumnLmOptions = {}): LmResult {
  const maxIterations = options.maxIterations ?? 500;
  const tol = options.tolerance ?? 1e-15;
  const m = problem.rows;
  const n = start.length;
  let p = start.slice();
  let r = new Float64Array(m);
  let rq = new Float64Array(m);
  let sse = problem.residuals(p, r) ? sumSquares(r, m) : Infinity;
  if (!Number.isFinite(sse)) return { parameters: p, sse, converged: false, iterations: 0, covariance: null };
  const J = new Float64Array(m * n);
  const work = new QrWorkspace(m + n, n);
  let lambda = 1e-3;
  const scale = new Array<number>(n).fill(0);
  let converged = false;
  let it = 0;
  problem.jacobian(p, J);
  for (; it < maxIterations; it++) {
    for (let j = 0; j < n; j++) {
      let c = 0;
      for (let i = 0; i < m; i++) c += J[j * m + i] * J[j * m + i];
      scale[j] = Math.max(scale[j], Math.sqrt(c));
    }
    let improved = false;
    for (let attempt = 0; attempt < 30; attempt++) {
      // [J; √λ·D] and [−r; 0].
      const A = work.design;
      const c = work.capacity;
      for (let j = 0; j < n; j++) {
        A.set(J.subarray(j * m, (j + 1) * m), j * c);
        for (let k = 0; k < n; k++) A[j * c + m + k] = k === j ? Math.sqrt(lambda) * (scale[j] || 1) : 0;
      }
      for (let i = 0; i < m; i++) work.rhs[i] = -r[i];
      for (let k = 0; k < n; k++) work.rhs[m + k] = 0;
      const step = work.solve(m + n, n);
      if (!step) {
        lambda *= 10;
        continue;
      }
      const q = p.map((v, j) => v + step.x[j]);
      const sq = problem.residuals(q, rq) ? sumSquares(rq, m) : Infinity;
      if (Number.isFinite(sq) && sq <= sse) {
        const reduction = (sse - sq) / Math.max(sse, 1e-300);
        const stepSize = Math.max(...step.x.map((d, j) => Math.abs(d) / Math.max(Math.abs(q[j]), 1e-12)));
        p = q;
        [r, rq] = [rq, r];
        sse = sq;
        lambda = Math.max(lambda / 10, 1e-12);
        improved = true;
        if (reduction < tol || stepSize < 1e-12) converged = true;
        break;
      }
      lambda *= 10;
      if (lambda > 1e16) break;
    }
    if (!improved) {
      converged = true;
      break;
    }
    problem.jacobian(p, J);
    if (converged) break;
  }
  let covariance: number[][] | null = null;
  if (options.covariance ?? true) {
    for (let j = 0; j < n; j++) work.design.set(J.subarray(j * m, (j + 1) * m), j * work.capacity);
    work.rhs.fill(0, 0, m);
    const qr = work.solve(m, n);
    const sigma2 = m > n ? sse / (m - n) : 0;
    covariance = qr ? inverseNormalMatrix(qr.r).map((row) => row.map((v) => v * sigma2)) : null;
  }
  return { parameters: p, sse, converged, iterations: it, covariance };
}
