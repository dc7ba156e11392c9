/**
 * Householder QR least squares in a reusable column-major workspace (Golub & Van Loan, Matrix
 * Computations, 4th ed., §5.2 and §5.3), for fits that solve many tall problems of one shape
 * (a profile search over breakpoints, Levenberg–Marquardt steps) without an array per row.
 *
 * Storage: one Float64Array, column j of the design at [j·capacity, …). `solveLeastSquares` in
 * qr.ts is this solver for a design given as rows.
 *
 * Policy: a rank-deficient design returns null. `solve` overwrites the design and
 * the right-hand side; fill them again before the next solve. Allocates nothing per row.
 */
export interface QrSolution {
  readonly x: number[];
  /** Upper-triangular R (p × p). */
  readonly r: number[][];
}

export class QrWorkspace {
  /** The design A, column-major: A(i, j) = design[j·capacity + i]. */
  readonly design: Float64Array;
  /** The right-hand side b. */
  readonly rhs: Float64Array;
  /** The current Householder vector, indexed by row. */
  private readonly v: Float64Array;

  constructor(
    readonly capacity: number,
    readonly maxColumns: number,
  ) {
    this.design = new Float64Array(capacity * maxColumns);
    this.rhs = new Float64Array(capacity);
    this.v = new Float64Array(capacity);
  }

  /** Minimises ‖A x − b‖₂ over the first m rows and p columns (m ≥ p, m ≤ capacity). */
  solve(m: number, p: number): QrSolution | null {
    if (m < p || p === 0 || m > this.capacity || p > this.maxColumns) return null;
    const A = this.design;
    const y = this.rhs;
    const v = this.v;
    const c = this.capacity;
    for (let k = 0; k < p; k++) {
      const ck = k * c;
      let norm = 0;
      for (let i = k; i < m; i++) norm += A[ck + i] * A[ck + i];
      norm = Math.sqrt(norm);
      if (norm === 0) return null;
      const alpha = A[ck + k] > 0 ? -norm : norm;
      for (let i = k; i < m; i++) v[i] = A[ck + i];
      v[k] -= alpha;
      let vv = 0;
      for (let i = k; i < m; i++) vv += v[i] * v[i];
      if (vv === 0) continue;
      for (let j = k; j < p; j++) {
        const cj = j * c;
        let s = 0;
        for (let i = k; i < m; i++) s += v[i] * A[cj + i];
        const f = (2 * s) / vv;
        for (let i = k; i < m; i++) A[cj + i] -= f * v[i];
      }
      let s = 0;
      for (let i = k; i < m; i++) s += v[i] * y[i];
      const f = (2 * s) / vv;
      for (let i = k; i < m; i++) y[i] -= f * v[i];
    }
    const r: number[][] = [];
    let scale = -Infinity;
    for (let i = 0; i < p; i++) {
      const row = new Array<number>(p);
      for (let j = 0; j < p; j++) row[j] = j < i ? 0 : A[j * c + i];
      r.push(row);
      scale = Math.max(scale, Math.abs(row[i]));
    }
    const x = new Array<number>(p).fill(0);
    for (let i = p - 1; i >= 0; i--) {
      if (Math.abs(r[i][i]) <= 1e-14 * scale) return null;
      let s = y[i];
      for (let j = i + 1; j < p; j++) s -= r[i][j] * x[j];
      x[i] = s / r[i][i];
    }
    return { x, r };
  }
}
