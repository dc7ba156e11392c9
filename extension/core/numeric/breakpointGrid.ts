/**
 * Exhaustive search of the two breakpoints of a continuous three-segment line,
 * h = a + b₁·t + b₂·(t − t₁)₊ + b₃·(t − t₂)₊, over candidate breakpoints at the data's own times
 * (a global grid: every pair of candidates is tried, so no starting value and no local optimum).
 *
 * Method: for fixed (t₁, t₂) the model is linear in (a, b₁, b₂, b₃) and the normal equations
 * need only sums of 1, t, t², h and t·h over the rows after each breakpoint
 * ((t − c)₊² = t² − 2ct + c² on those rows). Suffix sums make each pair cost O(1): a 4 × 4
 * Cholesky solve (Golub & Van Loan, Matrix Computations, 4th ed., §4.2). Times are centred and
 * scaled to [−1, 1] for conditioning. The residual sum of squares from the normal equations is
 * only used to rank the candidates; the caller refines the best pair with an exact QR solve.
 *
 * Cost: O(n) for the sums and O(G²) for the pairs, G ≤ `maxCandidates`.
 *
 * Policy: candidates keep at least `minEach` rows before t₁, between t₁ and t₂, and after t₂ (so
 * that every segment is determined), and the middle segment must be steeper than both others
 * and change h more than the first (it is the transformation after the as-deposited plateau:
 * without this, noise on a short first plateau is fitted better by a kink at the end of the
 * transformation); none possible gives null. Input must be
 * sorted by time.
 */

export interface BreakpointPair {
  /** Breakpoints in the input's time units. */
  readonly t1: number;
  readonly t2: number;
  /** The neighbouring candidates on either side of each breakpoint: the bracket a refinement searches. */
  readonly t1Range: readonly [number, number];
  readonly t2Range: readonly [number, number];
  readonly sse: number;
}

/** Solves the symmetric 4 × 4 system M x = r in place by Cholesky; false when M is not positive definite. */
function cholesky4(M: Float64Array, r: Float64Array, x: Float64Array): boolean {
  // M row-major 4 × 4; L overwrites the lower triangle.
  for (let j = 0; j < 4; j++) {
    let d = M[j * 4 + j];
    for (let k = 0; k < j; k++) d -= M[j * 4 + k] * M[j * 4 + k];
    if (!(d > 1e-12 * Math.max(1, M[j * 4 + j]))) return false;
    const l = Math.sqrt(d);
    M[j * 4 + j] = l;
    for (let i = j + 1; i < 4; i++) {
      let s = M[i * 4 + j];
      for (let k = 0; k < j; k++) s -= M[i * 4 + k] * M[j * 4 + k];
      M[i * 4 + j] = s / l;
    }
  }
  for (let i = 0; i < 4; i++) {
    let s = r[i];
    for (let k = 0; k < i; k++) s -= M[i * 4 + k] * x[k];
    x[i] = s / M[i * 4 + i];
  }
  for (let i = 3; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < 4; k++) s -= M[k * 4 + i] * x[k];
    x[i] = s / M[i * 4 + i];
  }
  return true;
}

export function searchBreakpoints(t: ArrayLike<number>, h: ArrayLike<number>, maxCandidates = 300, minEach = 2): BreakpointPair | null {
  const n = t.length;
  if (n < 3 * minEach + 1) return null;
  const t0 = t[0];
  const span = t[n - 1] - t0;
  if (!(span > 0)) return null;
  const mid = t0 + span / 2;
  const scale = span / 2;
  let hMean = 0;
  for (let i = 0; i < n; i++) hMean += h[i];
  hMean /= n;
  // Suffix sums S[k] over rows k…n−1 (index n holds zeros).
  const N = new Float64Array(n + 1);
  const U = new Float64Array(n + 1);
  const Q = new Float64Array(n + 1);
  const Y = new Float64Array(n + 1);
  const UY = new Float64Array(n + 1);
  let YY = 0;
  for (let i = n - 1; i >= 0; i--) {
    const u = (t[i] - mid) / scale;
    const y = h[i] - hMean;
    N[i] = N[i + 1] + 1;
    U[i] = U[i + 1] + u;
    Q[i] = Q[i + 1] + u * u;
    Y[i] = Y[i + 1] + y;
    UY[i] = UY[i + 1] + u * y;
    YY += y * y;
  }
  // Candidates: every stride-th row's time; `after[k]` is the first row strictly later than it.
  const stride = Math.max(1, Math.ceil(n / maxCandidates));
  const cand: number[] = [];
  const after: number[] = [];
  let j = 0;
  for (let i = 0; i < n; i += stride) {
    const c = t[i];
    if (cand.length > 0 && c === cand[cand.length - 1]) continue;
    while (j < n && t[j] <= c) j++;
    cand.push(c);
    after.push(j);
  }
  const G = cand.length;
  // Per candidate c, the sums of the hinge column P = max(u − c, 0) over the rows after it: ΣP,
  // Σu·P, ΣP², ΣP·y, made once for both breakpoints (u is the scaled time, y the centred h).
  const cs = new Float64Array(G);
  const sP = new Float64Array(G);
  const sUP = new Float64Array(G);
  const sPP = new Float64Array(G);
  const sPY = new Float64Array(G);
  for (let k = 0; k < G; k++) {
    const c = (cand[k] - mid) / scale;
    const jk = after[k];
    cs[k] = c;
    sP[k] = U[jk] - c * N[jk];
    sUP[k] = Q[jk] - c * U[jk];
    sPP[k] = Q[jk] - 2 * c * U[jk] + c * c * N[jk];
    sPY[k] = UY[jk] - c * Y[jk];
  }
  const M = new Float64Array(16);
  const r = new Float64Array(4);
  const x = new Float64Array(4);
  let best = { sse: Infinity, i: -1, k: -1 };
  for (let a = 0; a < G; a++) {
    const j1 = after[a];
    if (j1 < minEach) continue;
    const c1 = cs[a];
    for (let b = a + 1; b < G; b++) {
      const j2 = after[b];
      if (j2 - j1 < minEach) continue;
      if (n - j2 < minEach) break;
      const c2 = cs[b];
      // Σ P₁·P₂ over the rows after the later breakpoint, where both columns are non-zero.
      const sP1P2 = Q[j2] - (c1 + c2) * U[j2] + c1 * c2 * N[j2];
      M[0] = N[0];
      M[1] = M[4] = U[0];
      M[2] = M[8] = sP[a];
      M[3] = M[12] = sP[b];
      M[5] = Q[0];
      M[6] = M[9] = sUP[a];
      M[7] = M[13] = sUP[b];
      M[10] = sPP[a];
      M[11] = M[14] = sP1P2;
      M[15] = sPP[b];
      r[0] = Y[0];
      r[1] = UY[0];
      r[2] = sPY[a];
      r[3] = sPY[b];
      if (!cholesky4(M, r, x)) continue;
      // The middle segment is the transformation: steeper than the plateaus on either side, and
      // changing h more than the first one does.
      const s2 = Math.abs(x[1] + x[2]);
      if (!(s2 > Math.abs(x[1]) && s2 > Math.abs(x[1] + x[2] + x[3]) && s2 * (c2 - c1) > Math.abs(x[1]) * (c1 + 1))) continue;
      const sse = YY - (x[0] * r[0] + x[1] * r[1] + x[2] * r[2] + x[3] * r[3]);
      if (sse < best.sse) best = { sse, i: a, k: b };
    }
  }
  if (best.i < 0) return null;
  const lo = (k: number): number => cand[Math.max(0, k - 1)];
  const hi = (k: number): number => cand[Math.min(G - 1, k + 1)];
  return { t1: cand[best.i], t2: cand[best.k], t1Range: [lo(best.i), hi(best.i)], t2Range: [lo(best.k), hi(best.k)], sse: Math.max(0, best.sse) };
}
