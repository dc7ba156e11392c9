/**
 * Levenberg–Marquardt least squares (Moré, "The Levenberg–Marquardt algorithm: implementation
 * and theory", Numerical Analysis, Springer LNM 630 (1978)) for problems written with arrays of
 * rows: the iteration of columnLevenbergMarquardt.ts, with the Jacobian by forward differences
 * when the problem gives none. Checked against NIST StRD nonlinear problems in the tests.
 *
 * Policy: returns the best point found; `converged` says whether the relative reduction fell
 * below the tolerance. Non-finite residuals reject a step. Never throws.
 */
import { columnLevenbergMarquardt, type LmResult } from './columnLevenbergMarquardt.js';

export interface LmProblem {
  /** Residuals r(p) = model − data, length m. */
  residuals(p: readonly number[]): number[];
  /** Jacobian ∂r/∂p, m × n; forward differences when absent. */
  jacobian?(p: readonly number[]): number[][];
}

export type { LmResult };

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
  const m = problem.residuals(start).length;
  return columnLevenbergMarquardt(
    {
      rows: m,
      residuals(p, out) {
        const r = problem.residuals(p);
        if (r.length !== m) return false;
        for (let i = 0; i < m; i++) out[i] = r[i];
        return true;
      },
      jacobian(p, out) {
        const J = problem.jacobian ? problem.jacobian(p) : numericJacobian(problem, p, problem.residuals(p));
        for (let i = 0; i < m; i++) for (let j = 0; j < p.length; j++) out[j * m + i] = J[i][j];
      },
    },
    start,
    options,
  );
}
