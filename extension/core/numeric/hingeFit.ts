/**
 * Continuous two-line ("hinge") regression with an optimised breakpoint:
 *   h(T) = c + s_g·min(T − T_b, 0) + s_l·max(T − T_b, 0),   Tg ≡ T_b.
 *
 * Method: exact search of Hudson (J. Am. Stat. Assoc. 61, 1097 (1966)): for every split of the
 * sorted data the two separately fitted lines are a candidate when they meet inside the gap of
 * the split; otherwise the optimum of that gap lies at a data point, where the constrained fit is
 * evaluated directly. Every evaluation is O(1) from prefix sums of centred data, so the search is
 * O(n) after an O(n log n) sort. The 95 % interval is the profile-likelihood set
 * SSE(T_b) ≤ SSE_min·(1 + F₀.₉₅(1, n − 4)/(n − 4)) (Lerman, Appl. Stat. 29, 77 (1980);
 * the two-line method). Whether there is a transition at all is an F-test against one line.
 *
 * Policy: fewer than 2·nMin points, or a span too short for two sides of `minSpan`, gives a
 * `reason` instead of a fit. Never throws.
 */
import { fisherFCdf, fisherFQuantile } from './distributions.js';

export interface HingeOptions {
  /** Points required on each side (default 8). */
  readonly nMin?: number;
  /** Temperature span required on each side, K (default 10). */
  readonly minSpan?: number;
}

export interface HingeFit {
  readonly n: number;
  readonly breakpoint: number;
  /** 95 % profile-likelihood interval of the breakpoint. */
  readonly interval: readonly [number, number];
  /** The interval reached the edge of the allowed range (a bound, not an interval). */
  readonly intervalOpen: boolean;
  /** Fitted value at the breakpoint. */
  readonly hAtBreak: number;
  readonly slopeLow: number;
  readonly slopeHigh: number;
  /**
   * Standard errors of the slopes from the covariance of all four parameters, the breakpoint
   * included (the breakpoint's own uncertainty widens them; Muggeo, Stat. Med. 22, 3055 (2003)).
   */
  readonly seSlopeLow: number;
  readonly seSlopeHigh: number;
  readonly sse: number;
  /** Residual standard deviation, √(SSE/(n − 4)). */
  readonly sigma: number;
  /** F-test of the hinge against one straight line: p-value. */
  readonly pTransition: number;
  /** Optimum at the edge of the allowed breakpoint range. */
  readonly atEdge: boolean;
  readonly nLow: number;
  readonly nHigh: number;
  /** Durbin–Watson statistic of the residuals in temperature order. */
  readonly durbinWatson: number;
  readonly range: readonly [number, number];
}

export type HingeResult = { readonly ok: true; readonly fit: HingeFit } | { readonly ok: false; readonly reason: 'too-few-points' | 'too-short-span' | 'degenerate' };

class PrefixSums {
  readonly n: number;
  readonly sx: Float64Array;
  readonly sxx: Float64Array;
  readonly sy: Float64Array;
  readonly sxy: Float64Array;
  readonly syy: Float64Array;
  /** The breakpoint given to `hingeSse` and what it found (see there). */
  readonly io = new Float64Array(10);

  /** Sums of x and y (n points each), written into `sums`: five arrays of n + 1. */
  constructor(x: Float64Array, y: Float64Array, sums: readonly Float64Array[]) {
    const n = x.length;
    this.n = n;
    [this.sx, this.sxx, this.sy, this.sxy, this.syy] = sums;
    this.sx[0] = this.sxx[0] = this.sy[0] = this.sxy[0] = this.syy[0] = 0;
    for (let i = 0; i < n; i++) {
      this.sx[i + 1] = this.sx[i] + x[i];
      this.sxx[i + 1] = this.sxx[i] + x[i] * x[i];
      this.sy[i + 1] = this.sy[i] + y[i];
      this.sxy[i + 1] = this.sxy[i] + x[i] * y[i];
      this.syy[i + 1] = this.syy[i] + y[i] * y[i];
    }
  }
}

/** Coefficients of a line: the separate fits of a split, written into by `lineOver`. */
interface LineCoefficients {
  sse: number;
  slope: number;
  intercept: number;
}

/** Fits a separate line over sorted indices [a, b) into `out`; false when it has no slope. */
function lineOver(p: PrefixSums, a: number, b: number, out: LineCoefficients): boolean {
  const m = b - a;
  if (m < 2) return false;
  const sx = p.sx[b] - p.sx[a];
  const sy = p.sy[b] - p.sy[a];
  const cxx = p.sxx[b] - p.sxx[a] - (sx * sx) / m;
  const cxy = p.sxy[b] - p.sxy[a] - (sx * sy) / m;
  const cyy = p.syy[b] - p.syy[a] - (sy * sy) / m;
  if (!(cxx > 0)) return false;
  out.slope = cxy / cxx;
  out.sse = Math.max(0, cyy - out.slope * cxy);
  out.intercept = sy / m - (out.slope * sx) / m;
  return true;
}

/**
 * The constrained hinge fit with the joint at tb = p.io[0], k = number of points with x ≤ tb,
 * written to p.io: [1] its SSE (Infinity when singular), [2..4] c, s_g, s_l, and [5..7] what the
 * inverse of its normal matrix is made of (1/d, −su/suu, −sv/svv) with [8], [9] suu and svv.
 * (A double passed to or returned from a call that is not inlined becomes a new heap number,
 * and this runs about a thousand times per fit.)
 */
function hingeSse(p: PrefixSums, k: number): void {
  const io = p.io;
  const n = p.n;
  const tb = io[0];
  const sxL = p.sx[k];
  const sxR = p.sx[n] - sxL;
  const nR = n - k;
  const su = sxL - k * tb;
  const sv = sxR - nR * tb;
  const suu = p.sxx[k] - 2 * tb * sxL + k * tb * tb;
  const svv = p.sxx[n] - p.sxx[k] - 2 * tb * sxR + nR * tb * tb;
  io[1] = Infinity;
  // Solve [[n, su, sv], [su, suu, 0], [sv, 0, svv]] β = [sy, suy, svy] by eliminating the
  // slopes: β1 = (suy − su·c)/suu, β2 = (svy − sv·c)/svv.
  if (!(suu > 0) || !(svv > 0)) return;
  const d = n - (su * su) / suu - (sv * sv) / svv;
  if (!(Math.abs(d) > 0)) return;
  const sy = p.sy[n];
  const suy = p.sxy[k] - tb * p.sy[k];
  const svy = p.sxy[n] - p.sxy[k] - tb * (p.sy[n] - p.sy[k]);
  const c = (sy - (su * suy) / suu - (sv * svy) / svv) / d;
  const sg = (suy - su * c) / suu;
  const sl = (svy - sv * c) / svv;
  io[1] = Math.max(0, p.syy[n] - (c * sy + sg * suy + sl * svy));
  io[2] = c;
  io[3] = sg;
  io[4] = sl;
  io[5] = 1 / d;
  io[6] = -su / suu;
  io[7] = -sv / svv;
  io[8] = suu;
  io[9] = svv;
}

/** Constrained hinge fit with the joint at tb, k = number of points with x ≤ tb, with the inverse of its normal matrix (by the Schur complement on c). */
function hingeAt(p: PrefixSums, tb: number, k: number): { sse: number; c: number; sg: number; sl: number; inv: number[][] } | null {
  const io = p.io;
  io[0] = tb;
  hingeSse(p, k);
  if (!Number.isFinite(io[1])) return null;
  const [ic, a, b, suu, svv] = [io[5], io[6], io[7], io[8], io[9]];
  const inv = [
    [ic, ic * a, ic * b],
    [ic * a, 1 / suu + ic * a * a, ic * a * b],
    [ic * b, ic * a * b, 1 / svv + ic * b * b],
  ];
  return { sse: io[1], c: io[2], sg: io[3], sl: io[4], inv };
}

/**
 * (JᵀJ)⁻¹ of the hinge model in (c, s_g, s_l, T_b) at the optimum, k points at or below T_b:
 * ∂h/∂T_b = −s_g below the breakpoint and −s_l above it. Gauss–Jordan with partial pivoting;
 * null when singular.
 */
function fullCovariance(p: PrefixSums, tb: number, k: number, sg: number, sl: number): number[][] | null {
  const n = p.n;
  const su = p.sx[k] - k * tb;
  const sv = p.sx[n] - p.sx[k] - (n - k) * tb;
  const suu = p.sxx[k] - 2 * tb * p.sx[k] + k * tb * tb;
  const svv = p.sxx[n] - p.sxx[k] - 2 * tb * (p.sx[n] - p.sx[k]) + (n - k) * tb * tb;
  const sd = -sg * k - sl * (n - k);
  const a = [
    [n, su, sv, sd],
    [su, suu, 0, -sg * su],
    [sv, 0, svv, -sl * sv],
    [sd, -sg * su, -sl * sv, sg * sg * k + sl * sl * (n - k)],
  ];
  const inv = [0, 1, 2, 3].map((i) => [0, 1, 2, 3].map((j) => (i === j ? 1 : 0)));
  for (let c = 0; c < 4; c++) {
    let piv = c;
    for (let r = c + 1; r < 4; r++) if (Math.abs(a[r][c]) > Math.abs(a[piv][c])) piv = r;
    if (!(Math.abs(a[piv][c]) > 1e-300)) return null;
    [a[c], a[piv]] = [a[piv], a[c]];
    [inv[c], inv[piv]] = [inv[piv], inv[c]];
    const d = a[c][c];
    for (let j = 0; j < 4; j++) {
      a[c][j] /= d;
      inv[c][j] /= d;
    }
    for (let r = 0; r < 4; r++) {
      if (r === c) continue;
      const f = a[r][c];
      if (f === 0) continue;
      for (let j = 0; j < 4; j++) {
        a[r][j] -= f * a[c][j];
        inv[r][j] -= f * inv[c][j];
      }
    }
  }
  return inv[1][1] > 0 && inv[2][2] > 0 ? inv : null;
}

/** Fits up to this many points reuse one set of work arrays (a fit keeps none of them). */
const REUSED_WORK_POINTS = 20000;
let reusedWork = new Float64Array(0);

/** x and y (n each) and the five prefix sums (n + 1 each) of a fit, without a new allocation per fit where n allows. */
function workArrays(n: number): Float64Array[] {
  const size = 7 * (n + 1);
  let store: Float64Array;
  if (n > REUSED_WORK_POINTS) store = new Float64Array(size);
  else {
    if (reusedWork.length < size) reusedWork = new Float64Array(7 * (Math.max(n, 1024) + 1));
    store = reusedWork;
  }
  return [0, 1, 2, 3, 4, 5, 6].map((k) => store.subarray(k * (n + 1), (k + 1) * (n + 1) - (k < 2 ? 1 : 0)));
}

/** The order that sorts x ascending: null when it already is, 'reversed' when it descends, else the indices. */
function sortedOrder(x: ArrayLike<number>): Int32Array | 'reversed' | null {
  let ascending = true;
  let descending = true;
  for (let i = 1; i < x.length && (ascending || descending); i++) {
    if (x[i] < x[i - 1]) ascending = false;
    if (x[i] >= x[i - 1]) descending = false;
  }
  // Ties keep their order, as a stable sort would (a reversed run may have none).
  if (ascending) return null;
  if (descending) return 'reversed';
  return Int32Array.from({ length: x.length }, (_, i) => i).sort((a, b) => x[a] - x[b] || a - b);
}

function countAtOrBelow(x: Float64Array, v: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (x[mid] <= v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export function fitHinge(xIn: ArrayLike<number>, yIn: ArrayLike<number>, options: HingeOptions = {}): HingeResult {
  const nMin = options.nMin ?? 8;
  const minSpan = options.minSpan ?? 10;
  const n = xIn.length;
  if (n < 2 * nMin || n < 5) return { ok: false, reason: 'too-few-points' };
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += xIn[i];
    my += yIn[i];
  }
  mx /= n;
  my /= n;
  const work = workArrays(n);
  const x = work[0];
  const y = work[1];
  const order = sortedOrder(xIn);
  for (let i = 0; i < n; i++) {
    const o = order === null ? i : order === 'reversed' ? n - 1 - i : order[i];
    x[i] = xIn[o] - mx;
    y[i] = yIn[o] - my;
  }
  const p = new PrefixSums(x, y, work.slice(2));

  const lo = Math.max(x[nMin - 1], x[0] + minSpan);
  const hi = Math.min(x[n - nMin], x[n - 1] - minSpan);
  if (!(lo <= hi)) return { ok: false, reason: x[n - 1] - x[0] < 2 * minSpan ? 'too-short-span' : 'too-few-points' };

  // Updated in place (a captured variable would take a new heap number at every write).
  const best = { sse: Infinity, tb: NaN };
  /** `below`: the points at or below t, when known. */
  const consider = (t: number, below: number): void => {
    if (!(t >= lo && t <= hi)) return;
    p.io[0] = t;
    hingeSse(p, below);
    if (p.io[1] < best.sse) {
      best.sse = p.io[1];
      best.tb = t;
    }
  };
  consider(lo, countAtOrBelow(x, lo));
  consider(hi, countAtOrBelow(x, hi));
  const left: LineCoefficients = { sse: 0, slope: 0, intercept: 0 };
  const right: LineCoefficients = { sse: 0, slope: 0, intercept: 0 };
  for (let k = 1; k < n; k++) {
    const xa = x[k - 1];
    const xb = x[k];
    if (xb < lo || xa > hi) continue;
    // Sorted x: k points lie at or below x[k − 1] unless x[k] equals it.
    if (xa >= lo && xa <= hi) {
      p.io[0] = xa;
      hingeSse(p, xb > xa ? k : countAtOrBelow(x, xa));
      if (p.io[1] < best.sse) {
        best.sse = p.io[1];
        best.tb = xa;
      }
    }
    if (xb > xa && lineOver(p, 0, k, left) && lineOver(p, k, n, right) && left.slope !== right.slope) {
      const t = (right.intercept - left.intercept) / (left.slope - right.slope);
      if (t > xa && t < xb && t >= lo && t <= hi && left.sse + right.sse < best.sse) {
        best.sse = left.sse + right.sse;
        best.tb = t;
      }
    }
  }
  const tb = best.tb;
  if (!Number.isFinite(tb)) return { ok: false, reason: 'degenerate' };

  const final = hingeAt(p, tb, countAtOrBelow(x, tb));
  if (!final) return { ok: false, reason: 'degenerate' };
  const dof = n - 4;
  const sse = final.sse;
  const sigma2 = dof > 0 ? sse / dof : 0;

  // Profile-likelihood interval: walk out from the optimum, then bisect the crossing.
  const threshold = sse * (1 + fisherFQuantile(0.95, 1, Math.max(1, dof)) / Math.max(1, dof));
  /** Is the profile SSE at t above the threshold (t outside the interval)? */
  const outside = (t: number): boolean => {
    p.io[0] = t;
    hingeSse(p, countAtOrBelow(x, t));
    return p.io[1] > threshold;
  };
  const step = Math.max((hi - lo) / 20000, 1e-6);
  const edge = (dir: 1 | -1): { at: number; open: boolean } => {
    const limit = dir > 0 ? hi : lo;
    let inside = tb;
    let t = tb;
    let grow = step;
    for (;;) {
      const next = dir > 0 ? Math.min(limit, t + grow) : Math.max(limit, t - grow);
      if (outside(next)) {
        let a = inside;
        let b = next;
        for (let i = 0; i < 60; i++) {
          const m = 0.5 * (a + b);
          if (outside(m)) b = m;
          else a = m;
        }
        return { at: 0.5 * (a + b), open: false };
      }
      inside = next;
      t = next;
      if (next === limit) return { at: limit, open: true };
      grow *= 1.5;
    }
  };
  const low = sse > 0 ? edge(-1) : { at: tb, open: false };
  const high = sse > 0 ? edge(1) : { at: tb, open: false };

  const sseLine = lineOver(p, 0, n, left) ? left.sse : Infinity;
  const fStat = dof > 0 && sse > 0 ? (sseLine - sse) / (sse / dof) : Infinity;
  const pTransition = Number.isFinite(fStat) ? 1 - fisherFCdf(Math.max(0, fStat), 1, Math.max(1, dof)) : 0;

  // Durbin–Watson on residuals in temperature order.
  let num = 0;
  let den = 0;
  let prev = 0;
  for (let i = 0; i < n; i++) {
    const u = Math.min(x[i] - tb, 0);
    const v = Math.max(x[i] - tb, 0);
    const e = y[i] - (final.c + final.sg * u + final.sl * v);
    if (i > 0) num += (e - prev) * (e - prev);
    den += e * e;
    prev = e;
  }
  const nLow = countAtOrBelow(x, tb);
  const full = fullCovariance(p, tb, nLow, final.sg, final.sl);
  // Every figure a plain number before the result is made (its shape stays the same from fit to fit).
  const seSlopeLow = Math.sqrt(sigma2 * (full ? full[1][1] : final.inv[1][1]));
  const seSlopeHigh = Math.sqrt(sigma2 * (full ? full[2][2] : final.inv[2][2]));
  const atEdge = tb <= lo + 1e-9 * Math.max(1, Math.abs(lo)) || tb >= hi - 1e-9 * Math.max(1, Math.abs(hi));
  const fit: HingeFit = {
    n,
    breakpoint: tb + mx,
    interval: [low.at + mx, high.at + mx],
    intervalOpen: low.open || high.open,
    hAtBreak: final.c + my,
    slopeLow: final.sg,
    slopeHigh: final.sl,
    seSlopeLow,
    seSlopeHigh,
    sse,
    sigma: Math.sqrt(sigma2),
    pTransition,
    atEdge,
    nLow,
    nHigh: n - nLow,
    durbinWatson: den > 0 ? num / den : 2,
    range: [x[0] + mx, x[n - 1] + mx],
  };
  return { ok: true, fit };
}
