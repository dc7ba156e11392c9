/**
 * Householder QR least squares for small dense problems (Golub & Van Loan, Matrix
 * Computations, 4th ed., §5.2 and §5.3). Used for nonlinear steps and covariances; matrices are
 * row-major arrays of rows.
 *
 * Policy: a rank-deficient design returns null.
 */
import { QrWorkspace, type QrSolution } from './qrWorkspace.js';

export type { QrSolution };

/** Minimises ‖A x − b‖₂ for A of m × p (rows) with m ≥ p. */
export function solveLeastSquares(a: readonly (readonly number[])[], b: readonly number[]): QrSolution | null {
  const m = a.length;
  const p = m > 0 ? a[0].length : 0;
  if (m < p || p === 0) return null;
  const work = new QrWorkspace(m, p);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < p; j++) work.design[j * m + i] = a[i][j];
    work.rhs[i] = b[i];
  }
  return work.solve(m, p);
}

/** (RᵀR)⁻¹ = R⁻¹R⁻ᵀ, the unscaled covariance of a least-squares fit. */
export function inverseNormalMatrix(r: readonly (readonly number[])[]): number[][] {
  const p = r.length;
  // Inverse of the upper-triangular R.
  const inv: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let j = 0; j < p; j++) {
    inv[j][j] = 1 / r[j][j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += r[i][k] * inv[k][j];
      inv[i][j] = -s / r[i][i];
    }
  }
  const out: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let k = Math.max(i, j); k < p; k++) s += inv[i][k] * inv[j][k];
      out[i][j] = s;
    }
  }
  return out;
}
