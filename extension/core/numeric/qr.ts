/**
 * Householder QR least squares for small dense problems (Golub & Van Loan, Matrix
 * Computations, 4th ed., §5.2 and §5.3). Used for nonlinear steps and covariances; matrices are
 * row-major arrays of rows.
 *
 * Policy: a rank-deficient design returns null.
 */

export interface QrSolution {
  readonly x: number[];
  /** Upper-triangular R (p × p). */
  readonly r: number[][];
}

/** Minimises ‖A x − b‖₂ for A of m × p with m ≥ p. */
export function solveLeastSquares(a: readonly (readonly number[])[], b: readonly number[]): QrSolution | null {
  const m = a.length;
  const p = m > 0 ? a[0].length : 0;
  if (m < p || p === 0) return null;
  const A = a.map((row) => row.slice());
  const y = b.slice();
  for (let k = 0; k < p; k++) {
    let norm = 0;
    for (let i = k; i < m; i++) norm += A[i][k] * A[i][k];
    norm = Math.sqrt(norm);
    if (norm === 0) return null;
    const alpha = A[k][k] > 0 ? -norm : norm;
    const v = new Array<number>(m - k);
    for (let i = k; i < m; i++) v[i - k] = A[i][k];
    v[0] -= alpha;
    let vv = 0;
    for (const e of v) vv += e * e;
    if (vv === 0) continue;
    for (let j = k; j < p; j++) {
      let s = 0;
      for (let i = k; i < m; i++) s += v[i - k] * A[i][j];
      const f = (2 * s) / vv;
      for (let i = k; i < m; i++) A[i][j] -= f * v[i - k];
    }
    let s = 0;
    for (let i = k; i < m; i++) s += v[i - k] * y[i];
    const f = (2 * s) / vv;
    for (let i = k; i < m; i++) y[i] -= f * v[i - k];
  }
  const r: number[][] = [];
  for (let i = 0; i < p; i++) r.push(A[i].slice(0, p).map((v, j) => (j < i ? 0 : v)));
  const scale = Math.max(...r.map((row, i) => Math.abs(row[i])));
  const x = new Array<number>(p).fill(0);
  for (let i = p - 1; i >= 0; i--) {
    if (Math.abs(r[i][i]) <= 1e-14 * scale) return null;
    let s = y[i];
    for (let j = i + 1; j < p; j++) s -= r[i][j] * x[j];
    x[i] = s / r[i][i];
  }
  return { x, r };
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
