/**
 * Tg as the intersection of a glass line and a liquid line fitted in two windows that keep a gap
 * from the transition (the construction of most experimental papers), with the windows placed by
 * iteration: glass [T_min, Tg − 2δ], liquid [Tg + δ, T_max], Tg the intersection of the two
 * lines, repeated until Tg moves by less than 1 mK. The transition region is curved over a few
 * Tg/m, where τ changes by about two decades, so δ starts from 2·Tg/m (Moynihan et al., J. Am.
 * Ceram. Soc. 59, 12 (1976), for dTg/d log q ≈ Tg/m). The glass keeps twice the gap because it
 * goes on relaxing below Tg while it cools (the nonlinear Tool–Narayanaswamy–Moynihan kinetics:
 * Tf approaches its limiting value slowly), so its line straightens far below Tg, the liquid's
 * just above it. While either window still bends (quadratic term, |t| > 3: curvature.ts), its gap
 * grows by half, up to three times.
 * The uncertainty of the intersection is the delta-method one of lineFit.ts.
 *
 * Policy: a window with fewer than `minPoints` points or less than `minSpan` kelvin gives
 * `{ ok: false, end }`, the side of the data that is too short, and the temperature the data
 * would have to reach. Never throws.
 */
import { curvatureT } from './curvature.js';
import { t95 } from './distributions.js';
import { fitLineInRange, intersect, type Intersection, type LineFit } from './lineFit.js';

export interface TwoWindowOptions {
  /** Points required in each window (default 8). */
  readonly minPoints?: number;
  /** Span required of each window, K (default 5). */
  readonly minSpan?: number;
  /** Widen δ while a window bends (default true). */
  readonly adapt?: boolean;
}

export interface TwoWindowFit {
  readonly ok: true;
  readonly tg: number;
  readonly crossing: Intersection;
  readonly glass: LineFit;
  readonly liquid: LineFit;
  /** The gaps finally used below and above Tg, K. */
  readonly glassGap: number;
  readonly liquidGap: number;
  readonly glassWindow: readonly [number, number];
  readonly liquidWindow: readonly [number, number];
  /** A window still bends at the widest gap the data allow. */
  readonly curved: boolean;
  /** The data end less than 2δ + the minimum span below Tg: the glass gap had to shrink. */
  readonly glassShort?: boolean;
}

export interface TwoWindowFailure {
  readonly ok: false;
  /** `low`: the glass side is too short; `high`: the liquid side. */
  readonly end: 'low' | 'high';
  /** Where the data would have to reach for the window to hold. */
  readonly needed: number;
}

const CURVATURE_T = 3;
const MAX_WIDENINGS = 3;
/** The glass window starts this many δ below Tg. */
const GLASS_FACTOR = 2;

function range(T: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < T.length; i++) {
    if (T[i] < lo) lo = T[i];
    if (T[i] > hi) hi = T[i];
  }
  return [lo, hi];
}

/** The iteration at fixed gaps below (glass) and above (liquid) Tg. */
function atGaps(T: ArrayLike<number>, h: ArrayLike<number>, tg0: number, dg: number, dl: number, minPoints: number, minSpan: number): TwoWindowFit | TwoWindowFailure {
  const [lo, hi] = range(T);
  let tg = tg0;
  let last: TwoWindowFit | null = null;
  for (let iteration = 0; iteration < 30; iteration++) {
    const gHi = tg - dg;
    const lLo = tg + dl;
    if (gHi - lo < minSpan) return { ok: false, end: 'low', needed: tg - dg - minSpan };
    if (hi - lLo < minSpan) return { ok: false, end: 'high', needed: tg + dl + minSpan };
    const glass = fitLineInRange(T, h, -Infinity, gHi);
    const liquid = fitLineInRange(T, h, lLo, Infinity);
    if (!glass || glass.n < minPoints) return { ok: false, end: 'low', needed: lo - minSpan };
    if (!liquid || liquid.n < minPoints) return { ok: false, end: 'high', needed: hi + minSpan };
    const crossing = intersect(glass, liquid, t95);
    if (!crossing || !Number.isFinite(crossing.x)) return { ok: false, end: 'low', needed: lo - minSpan };
    last = { ok: true, tg: crossing.x, crossing, glass, liquid, glassGap: dg, liquidGap: dl, glassWindow: [lo, gHi], liquidWindow: [lLo, hi], curved: false };
    if (Math.abs(crossing.x - tg) < 1e-3) break;
    // A crossing outside the data cannot place windows: stop there.
    if (crossing.x < lo || crossing.x > hi) return { ok: false, end: crossing.x < lo ? 'low' : 'high', needed: crossing.x };
    tg = crossing.x;
  }
  return last!;
}

/**
 * Two-window Tg from a start value and the gap δ: the glass window keeps 2δ below Tg, falling
 * back to 1.5δ and δ where the data do not reach that far, the liquid window δ above it; then
 * each gap grows by half while its window bends.
 */
export function fitTwoWindows(T: ArrayLike<number>, h: ArrayLike<number>, tgStart: number, delta: number, options: TwoWindowOptions = {}): TwoWindowFit | TwoWindowFailure {
  const minPoints = options.minPoints ?? 8;
  const minSpan = options.minSpan ?? 5;
  let fit: TwoWindowFit | TwoWindowFailure = { ok: false, end: 'low', needed: NaN };
  for (const factor of [GLASS_FACTOR, 1.5, 1]) {
    fit = atGaps(T, h, tgStart, factor * delta, delta, minPoints, minSpan);
    if (fit.ok && factor < GLASS_FACTOR) fit = { ...fit, glassShort: true };
    if (fit.ok || fit.end === 'high') break;
  }
  if (!fit.ok || options.adapt === false) return fit;
  for (let k = 0; k < MAX_WIDENINGS; k++) {
    const f: TwoWindowFit = fit;
    const glassBends = Math.abs(curvatureT(T, h, -Infinity, f.glassWindow[1])) > CURVATURE_T;
    const liquidBends = Math.abs(curvatureT(T, h, f.liquidWindow[0], Infinity)) > CURVATURE_T;
    if (!glassBends && !liquidBends) return f;
    const wider = atGaps(T, h, f.tg, f.glassGap * (glassBends ? 1.5 : 1), f.liquidGap * (liquidBends ? 1.5 : 1), minPoints, minSpan);
    if (!wider.ok) return { ...f, curved: true };
    fit = f.glassShort ? { ...wider, glassShort: true } : wider;
  }
  // After the last widening, windows that still bend are said to.
  const last: TwoWindowFit = fit;
  const stillBends =
    Math.abs(curvatureT(T, h, -Infinity, last.glassWindow[1])) > CURVATURE_T || Math.abs(curvatureT(T, h, last.liquidWindow[0], Infinity)) > CURVATURE_T;
  return stillBends ? { ...last, curved: true } : last;
}
