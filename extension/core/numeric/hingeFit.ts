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

const HINGE_IO = new Float64Array(10);

class PrefixSums {
  readonly n: number;
  readonly sx: Float64Array;
  readonly sxx: Float64Array;
  readonly sy: Float64Array;
  readonly sxy: Float64Array;
  readonly syy: Float64Array;
  /**
   * The breakpoint given to `hingeSse` and what it found (see there). One array for every fit (a
   * fit never runs inside another): a small typed array costs microseconds to make.
   */
  readonly io = HINGE_IO;

  /** Sums of x and y (n points each), written into `sums`: five arrays of n + 1. */
  constructor(x: Float64Array, y: Float64Array, sums: readonly Float64Array[]) {
    this.n = x.length;
    [this.sx, this.sxx, this.sy, this.sxy, this.syy] = sums;
    fillPrefixSums(x, y, this.sx, this.sxx, this.sy, this.sxy, this.syy);
  }
}

/** The running sums of x, x², y, xy and y² (n + 1 each, from 0). (A loop of its own, compiled early.) */
function fillPrefixSums(x: Float64Array, y: Float64Array, sx: Float64Array, sxx: Float64Array, sy: Float64Array, sxy: Float64Array, syy: Float64Array): void {
  sx[0] = sxx[0] = sy[0] = sxy[0] = syy[0] = 0;
  for (let i = 0; i < x.length; i++) {
    sx[i + 1] = sx[i] + x[i];
    sxx[i + 1] = sxx[i] + x[i] * x[i];
    sy[i + 1] = sy[i] + y[i];
    sxy[i + 1] = sxy[i] + x[i] * y[i];
    syy[i + 1] = syy[i] + y[i] * y[i];
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
function hingeAt(p: PrefixSums, tb: number, k: number): { sse: number; c: number; sg: number; sl: number; varSlopeLow: number; varSlopeHigh: number } | null {
  const io = p.io;
  io[0] = tb;
  hingeSse(p, k);
  if (!Number.isFinite(io[1])) return null;
  const ic = io[5];
  const a = io[6];
  const b = io[7];
  // The slopes' diagonal entries of the inverse, [[ic, ic·a, ic·b], [ic·a, 1/suu + ic·a², ic·a·b], [ic·b, ic·a·b, 1/svv + ic·b²]].
  return { sse: io[1], c: io[2], sg: io[3], sl: io[4], varSlopeLow: 1 / io[8] + ic * a * a, varSlopeHigh: 1 / io[9] + ic * b * b };
}

/**
 * (JᵀJ)⁻¹ of the hinge model in (c, s_g, s_l, T_b) at the optimum, k points at or below T_b:
 * ∂h/∂T_b = −s_g below the breakpoint and −s_l above it, by Gauss–Jordan with partial pivoting:
 * its two slope entries, or null when singular.
 */
function fullCovariance(p: PrefixSums, tb: number, k: number, sg: number, sl: number): { slopeLow: number; slopeHigh: number } | null {
  const n = p.n;
  const su = p.sx[k] - k * tb;
  const sv = p.sx[n] - p.sx[k] - (n - k) * tb;
  const suu = p.sxx[k] - 2 * tb * p.sx[k] + k * tb * tb;
  const svv = p.sxx[n] - p.sxx[k] - 2 * tb * (p.sx[n] - p.sx[k]) + (n - k) * tb * tb;
  const sd = -sg * k - sl * (n - k);
  // Row-major 4 × 4 in typed arrays: nested literal arrays change their elements kind from fit to
  // fit (a whole number in one, doubles in the next), and the optimised code then keeps bailing out.
  const a = COVARIANCE_WORK.subarray(0, 16);
  const inv = COVARIANCE_WORK.subarray(16, 32);
  a[0] = n;
  a[1] = su;
  a[2] = sv;
  a[3] = sd;
  a[4] = su;
  a[5] = suu;
  a[6] = 0;
  a[7] = -sg * su;
  a[8] = sv;
  a[9] = 0;
  a[10] = svv;
  a[11] = -sl * sv;
  a[12] = sd;
  a[13] = -sg * su;
  a[14] = -sl * sv;
  a[15] = sg * sg * k + sl * sl * (n - k);
  inv.fill(0);
  for (let i = 0; i < 4; i++) inv[5 * i] = 1;
  const swapRows = (m: Float64Array, r1: number, r2: number): void => {
    for (let j = 0; j < 4; j++) {
      const t = m[4 * r1 + j];
      m[4 * r1 + j] = m[4 * r2 + j];
      m[4 * r2 + j] = t;
    }
  };
  for (let c = 0; c < 4; c++) {
    let piv = c;
    for (let r = c + 1; r < 4; r++) if (Math.abs(a[4 * r + c]) > Math.abs(a[4 * piv + c])) piv = r;
    if (!(Math.abs(a[4 * piv + c]) > 1e-300)) return null;
    if (piv !== c) {
      swapRows(a, c, piv);
      swapRows(inv, c, piv);
    }
    const d = a[5 * c];
    for (let j = 0; j < 4; j++) {
      a[4 * c + j] /= d;
      inv[4 * c + j] /= d;
    }
    for (let r = 0; r < 4; r++) {
      if (r === c) continue;
      const f = a[4 * r + c];
      if (f === 0) continue;
      for (let j = 0; j < 4; j++) {
        a[4 * r + j] -= f * a[4 * c + j];
        inv[4 * r + j] -= f * inv[4 * c + j];
      }
    }
  }
  return inv[5] > 0 && inv[10] > 0 ? { slopeLow: inv[5], slopeHigh: inv[10] } : null;
}

/** The two 4 × 4 matrices of `fullCovariance` (a fit keeps neither). */
const COVARIANCE_WORK = new Float64Array(32);

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

// The loops of a fit live in small functions of their own, which are compiled to fast code
// after a few fits; the fit itself is compiled much later in a run.

/** x̄ and ȳ of the last `centredSorted`. */
const MEANS = new Float64Array(2);

/** Writes x and y sorted by x (ties in their order), less their means (written to MEANS). */
function centredSorted(xIn: ArrayLike<number>, yIn: ArrayLike<number>, x: Float64Array, y: Float64Array): void {
  const n = xIn.length;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += xIn[i];
    my += yIn[i];
  }
  mx /= n;
  my /= n;
  const order = sortedOrder(xIn);
  for (let i = 0; i < n; i++) {
    const o = order === null ? i : order === 'reversed' ? n - 1 - i : order[i];
    x[i] = xIn[o] - mx;
    y[i] = yIn[o] - my;
  }
  MEANS[0] = mx;
  MEANS[1] = my;
}

/**
 * The exact search: the least-squares joint within [lo, hi] at each data x, and within each gap
 * between data x where the two free lines on either side meet there. Improves `best` in place.
 */
function searchBreakpoint(p: PrefixSums, x: Float64Array, lo: number, hi: number, best: { sse: number; tb: number }): void {
  const n = p.n;
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
}

/** Durbin–Watson statistic of the hinge's residuals in temperature order (2 when they are all 0). */
function durbinWatson(x: Float64Array, y: Float64Array, tb: number, c: number, sg: number, sl: number): number {
  let num = 0;
  let den = 0;
  let prev = 0;
  for (let i = 0; i < x.length; i++) {
    const u = Math.min(x[i] - tb, 0);
    const v = Math.max(x[i] - tb, 0);
    const e = y[i] - (c + sg * u + sl * v);
    if (i > 0) num += (e - prev) * (e - prev);
    den += e * e;
    prev = e;
  }
  return den > 0 ? num / den : 2;
}

export function fitHinge(xIn: ArrayLike<number>, yIn: ArrayLike<number>, options: HingeOptions = {}): HingeResult {
  const nMin = options.nMin ?? 8;
  const minSpan = options.minSpan ?? 10;
  const n = xIn.length;
  if (n < 2 * nMin || n < 5) return { ok: false, reason: 'too-few-points' };
  const work = workArrays(n);
  const x = work[0];
  const y = work[1];
  centredSorted(xIn, yIn, x, y);
  const mx = MEANS[0];
  const my = MEANS[1];
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
  searchBreakpoint(p, x, lo, hi, best);
  const tb = best.tb;
  if (!Number.isFinite(tb)) return { ok: false, reason: 'degenerate' };

  const nLow = countAtOrBelow(x, tb);
  const final = hingeAt(p, tb, nLow);
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

  const line: LineCoefficients = { sse: 0, slope: 0, intercept: 0 };
  const sseLine = lineOver(p, 0, n, line) ? line.sse : Infinity;
  const fStat = dof > 0 && sse > 0 ? (sseLine - sse) / (sse / dof) : Infinity;
  const pTransition = Number.isFinite(fStat) ? 1 - fisherFCdf(Math.max(0, fStat), 1, Math.max(1, dof)) : 0;

  const full = fullCovariance(p, tb, nLow, final.sg, final.sl);
  // Every figure a plain number before the result is made (its shape stays the same from fit to fit).
  const seSlopeLow = Math.sqrt(sigma2 * (full ? full.slopeLow : final.varSlopeLow));
  const seSlopeHigh = Math.sqrt(sigma2 * (full ? full.slopeHigh : final.varSlopeHigh));
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
    durbinWatson: durbinWatson(x, y, tb, final.c, final.sg, final.sl),
    range: [x[0] + mx, x[n - 1] + mx],
  };
  return { ok: true, fit };
}
