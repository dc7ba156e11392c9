/**
 * Levenberg–Marquardt least squares with Marquardt's diagonal scaling (Moré, "The
 * Levenberg–Marquardt algorithm: implementation and theory", Numerical Analysis, Springer LNM 630
 * (1978)). Each step solves the damped problem [J; √λ·D] δ = [−r; 0] by Householder QR, so JᵀJ
 * is never formed. Checked against NIST StRD nonlinear problems in the tests.
 *
 * Policy: returns the best point found; `converged` says whether the relative reduction fell
 * below the tolerance. Non-finite residuals reject a step. Never throws.
 */
import { inverseNormalMatrix, solveLeastSquares } from './qr.js';

export interface LmProblem {
  /** Residuals r(p) = model − data, length m. */
  residuals(p: readonly number[]): number[];
  /** Jacobian ∂r/∂p, m × n; forward differences when absent. */
  jacobian?(p: readonly number[]): number[][];
}

export interface LmResult {
  readonly parameters: number[];
  readonly sse: number;
  readonly converged: boolean;
  readonly iterations: number;
  /** σ²(JᵀJ)⁻¹ with σ² = SSE/(m − n), or null when J is rank-deficient. */
  readonly covariance: number[][] | null;
}

function sumSquares(r: readonly number[]): number {
  let s = 0;
  for (const v of r) s += v * v;
  return s;
}

function numericJacobian(problem: LmProblem, p: readonly number[], r0: readonly number[]): number[][] {
  const m = r0.length;
  const J: number[][] = Array.from({ length: m }, () => new Array<number>(p.length).fill(0));
  for (let j = 0; j < p.length; j++) {
    const h = 1e-7 * Math.max(Math.abs(p[j]), 1e-8);
    const q = p.slice();
    q[j] += h;
    const r1 = problem.residuals(q);
    for (let i = 0; i < m; i++) J[i][j] = (r1[i] - r0[i]) / h;
  }
  return J;
}

export function levenbergMarquardt(problem: LmProblem, start: readonly number[], options: { maxIterations?: number; tolerance?: number } = {}): LmResult {
  const maxIterations = options.maxIterations ?? 500;
  const tol = options.tolerance ?? 1e-15;
  let p = start.slice();
  let r = problem.residuals(p);
  let sse = sumSquares(r);
  if (!Number.isFinite(sse)) return { parameters: p, sse, converged: false, iterations: 0, covariance: null };
  let lambda = 1e-3;
  const n = p.length;
  const m = r.length;
  const scale = new Array<number>(n).fill(0);
  let converged = false;
  let it = 0;
  let J = problem.jacobian ? problem.jacobian(p) : numericJacobian(problem, p, r);
  for (; it < maxIterations; it++) {
    for (let j = 0; j < n; j++) {
      let c = 0;
      for (let i = 0; i < m; i++) c += J[i][j] * J[i][j];
      scale[j] = Math.max(scale[j], Math.sqrt(c));
    }
    let improved = false;
    for (let attempt = 0; attempt < 30; attempt++) {
      const rows = J.map((row) => row.slice());
      const rhs = r.map((v) => -v);
      for (let j = 0; j < n; j++) {
        const row = new Array<number>(n).fill(0);
        row[j] = Math.sqrt(lambda) * (scale[j] || 1);
        rows.push(row);
        rhs.push(0);
      }
      const step = solveLeastSquares(rows, rhs);
      if (!step) {
        lambda *= 10;
        continue;
      }
      const q = p.map((v, j) => v + step.x[j]);
      const rq = problem.residuals(q);
      const sq = sumSquares(rq);
      if (Number.isFinite(sq) && sq <= sse) {
        const reduction = (sse - sq) / Math.max(sse, 1e-300);
        const stepSize = Math.max(...step.x.map((d, j) => Math.abs(d) / Math.max(Math.abs(q[j]), 1e-12)));
        p = q;
        r = rq;
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
    J = problem.jacobian ? problem.jacobian(p) : numericJacobian(problem, p, r);
    if (converged) break;
  }
  const qr = solveLeastSquares(J, new Array<number>(m).fill(0));
  const sigma2 = m > n ? sse / (m - n) : 0;
  const covariance = qr ? inverseNormalMatrix(qr.r).map((row) => row.map((v) => v * sigma2)) : null;
  return { parameters: p, sse, converged, iterations: it, covariance };
}
