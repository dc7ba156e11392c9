/**
 * Local cubic regression: y ≈ c₀ + c₁·d + c₂·d² + c₃·d³ with d = x − x₀, fitted by least squares
 * to the points with |x − x₀| ≤ h (a Savitzky–Golay-type smoother on unevenly spaced points:
 * Savitzky & Golay, Anal. Chem. 36, 1627 (1964)). The slope c₁ at the centre carries no h²
 * curvature bias (a cubic absorbs the third derivative), so a span wide enough to average the
 * noise still gives the tangent of a step's steepest point.
 *
 * Returns the coefficients and (XᵀX)⁻¹ (times σ² the covariance of the coefficients, for the
 * caller's noise estimate σ²).
 *
 * Policy: fewer than 6 points in the span, or a singular design, gives null. x must be sorted.
 */

export interface LocalCubic {
  readonly x0: number;
  /** c₀…c₃ in the units of x (not scaled). */
  readonly c: readonly [number, number, number, number];
  /** (XᵀX)⁻¹ for the unscaled coefficients: Var(cⱼ) = σ²·unitCov[j][j]. */
  readonly unitCov: readonly (readonly number[])[];
  readonly n: number;
}

// Scratch for the 4 × 8 augmented matrix: the fits run in tight loops and allocate nothing per call.
const AUG = new Float64Array(32);
const SUMS = new Float64Array(7);
const RHS = new Float64Array(4);

/** Inverts the 4 × 4 matrix in AUG[·][0..3] into AUG[·][4..7] by Gauss–Jordan with partial pivoting; false when singular. */
function invert4(): boolean {
  const m = AUG;
  for (let c = 0; c < 4; c++) {
    let p = c;
    for (let r = c + 1; r < 4; r++) if (Math.abs(m[r * 8 + c]) > Math.abs(m[p * 8 + c])) p = r;
    if (!(Math.abs(m[p * 8 + c]) > 1e-13)) return false;
    if (p !== c) {
      for (let k = 0; k < 8; k++) {
        const tmp = m[c * 8 + k];
        m[c * 8 + k] = m[p * 8 + k];
        m[p * 8 + k] = tmp;
      }
    }
    const d = m[c * 8 + c];
    for (let k = 0; k < 8; k++) m[c * 8 + k] /= d;
    for (let r = 0; r < 4; r++) {
      if (r === c) continue;
      const f = m[r * 8 + c];
      if (f !== 0) for (let k = 0; k < 8; k++) m[r * 8 + k] -= f * m[c * 8 + k];
    }
  }
  return true;
}

/** The local cubic around x₀ over the rows lo ≤ i < hi (the caller's span); `covariance: false` skips (XᵀX)⁻¹ in the result. */
export function localCubic(x: ArrayLike<number>, y: ArrayLike<number>, x0: number, lo: number, hi: number, h: number, covariance = true): LocalCubic | null {
  const n = hi - lo;
  if (n < 6 || !(h > 0)) return null;
  // Sums of u^k (k ≤ 6) and u^k·y (k ≤ 3), u = (x − x₀)/h.
  SUMS.fill(0);
  RHS.fill(0);
  for (let i = lo; i < hi; i++) {
    const u = (x[i] - x0) / h;
    const yi = y[i];
    const u2 = u * u;
    const u3 = u2 * u;
    SUMS[0] += 1;
    SUMS[1] += u;
    SUMS[2] += u2;
    SUMS[3] += u3;
    SUMS[4] += u2 * u2;
    SUMS[5] += u2 * u3;
    SUMS[6] += u3 * u3;
    RHS[0] += yi;
    RHS[1] += u * yi;
    RHS[2] += u2 * yi;
    RHS[3] += u3 * yi;
  }
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) {
    AUG[i * 8 + j] = SUMS[i + j];
    AUG[i * 8 + 4 + j] = i === j ? 1 : 0;
  }
  if (!invert4()) return null;
  const inv = (i: number, j: number): number => AUG[i * 8 + 4 + j];
  // Back to unscaled coefficients: cⱼ = bⱼ/hʲ.
  const scale = [1, 1 / h, 1 / (h * h), 1 / (h * h * h)];
  const c = [0, 1, 2, 3].map((i) => (inv(i, 0) * RHS[0] + inv(i, 1) * RHS[1] + inv(i, 2) * RHS[2] + inv(i, 3) * RHS[3]) * scale[i]) as [number, number, number, number];
  const unitCov = covariance ? [0, 1, 2, 3].map((i) => [0, 1, 2, 3].map((j) => inv(i, j) * scale[i] * scale[j])) : [];
  return { x0, c, unitCov, n };
}

/** The rows lo ≤ i < hi with |x − x₀| ≤ h, for sorted x (binary search). */
export function spanOf(x: ArrayLike<number>, x0: number, h: number): [number, number] {
  const first = (v: number, strict: boolean): number => {
    let a = 0;
    let b = x.length;
    while (a < b) {
      const m = (a + b) >> 1;
      if (strict ? x[m] <= v : x[m] < v) a = m + 1;
      else b = m;
    }
    return a;
  };
  return [first(x0 - h, false), first(x0 + h, true)];
}
