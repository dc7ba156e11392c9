/**
 * Tg, α_g and α_l from one cooling segment: the construction chosen from the data.
 *
 * 1. Method A, the continuous two-line (hinge) fit with an optimised breakpoint and its
 *    profile-likelihood interval (hingeFit.ts; Hudson, J. Am. Stat. Assoc. 61, 1097 (1966);
 *    Lerman, Appl. Stat. 29, 77 (1980)).
 * 2. A hinge fit pulls both lines into a broad transition. The curve counts as broad when the
 *    residuals of the hinge are serially correlated (Durbin–Watson below 1.5; Durbin & Watson,
 *    Biometrika 38, 159 (1951)), when either side of the breakpoint bends (quadratic term,
 *    |t| > 3: curvature.ts), or when the hinge slopes differ from those of the window fit below
 *    by more than 2 standard deviations of their difference (Hausman, Econometrica 46, 1251 (1978)).
 * 3. Then Method B: two windows with a gap δ from 2·Tg/m, iterated and widened while a window
 *    bends (twoWindowFit.ts). m is the material's fragility (stated VFT law or relaxation data),
 *    else 80, typical of molecular glass formers (Böhmer et al., J. Chem. Phys. 99, 4201 (1993)).
 * 4. With `windows.glass` and `windows.liquid` written, those windows are used as they are.
 *
 * α = slope / ĥ(Tg) of each line: the out-of-plane expansivity of the film, since a supported
 * film is clamped laterally by its substrate. The lines are those of the two windows whenever the
 * data hold them, also when Tg comes from the hinge: a hinge pulls both slopes into a rounded
 * corner, the windows do not.
 *
 * Policy: returns the figures with their statistical uncertainty only (the caller adds the window
 * and calibration terms), or a message and the row it belongs on. Never throws.
 */
import type { Message } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import { t95 } from '../numeric/distributions.js';
import { curvatureT } from '../numeric/curvature.js';
import { fitHinge } from '../numeric/hingeFit.js';
import { fitLineWhere, intersect, predict, type LineFit } from '../numeric/lineFit.js';
import { fitTwoWindows } from '../numeric/twoWindowFit.js';

/** Fragility assumed when the material gives none. */
export const DEFAULT_FRAGILITY = 80;
/** Distance of the lines from Tg in a hinge fit, K. */
const LINE_GAP = 5;
/** Durbin–Watson statistic below which the hinge residuals show curvature. */
const DW_BROAD = 1.5;
/** |t| of a quadratic term above which one side of the hinge bends. */
const CURVATURE_T = 3;
/** Hausman statistic above which the hinge and window slopes disagree. */
const HAUSMAN_Z = 2;

export interface CoolingInput {
  readonly T: ArrayLike<number>;
  readonly h: ArrayLike<number>;
  /** `windows.glass` and `windows.liquid`, when written. */
  readonly glassWindow: readonly [number, number] | null;
  readonly liquidWindow: readonly [number, number] | null;
  /** The material's fragility, when known. */
  readonly fragility: number | null;
  /** Scale of the gap δ (a sensitivity variant), default 1. */
  readonly gapScale?: number;
}

export interface CoolingFigures {
  readonly ok: true;
  readonly construction: 'hinge' | 'windows' | 'user windows';
  readonly tg: number;
  readonly uTg: number;
  /** 95 % interval of the statistical uncertainty alone. */
  readonly interval: readonly [number, number];
  readonly hAtTg: number;
  readonly slopeGlass: number;
  readonly slopeLiquid: number;
  readonly uSlopeGlass: number;
  readonly uSlopeLiquid: number;
  /** Text for the method label: construction and windows in K (made when asked: a window variant's figures are never shown). */
  readonly label: () => string;
  /** Where the glass and liquid lines (and so α_g and α_l) come from. */
  readonly lineLabel: () => string;
  /** Liquid-cooled glass and supercooled-liquid lines, for the first heating. */
  readonly lc: LineFit | null;
  readonly scl: LineFit | null;
  /**
   * Model terms of a hinge fit: how far the window fit's Tg and slopes lie from the hinge's,
   * beyond what the noise explains (the Hausman variance), as the half-width of a rectangular
   * distribution, /√3. Zero for the window constructions.
   */
  readonly model: { readonly tg: number; readonly slopeGlass: number; readonly slopeLiquid: number };
  /** Warnings that leave the figures standing. */
  readonly warnings: ReadonlyArray<{ message: Message; at: 'windows' | 'segment' | 'low' }>;
}

export interface CoolingFailure {
  readonly ok: false;
  readonly message: Message;
  /** Where the message belongs: the first row of the segment, its lowest or highest temperature, the windows key. */
  readonly at: 'segment' | 'low' | 'high' | 'windows';
}

const k1 = (x: number): string => String(Number(x.toFixed(1)));

function windowText(glass: readonly [number, number], liquid: readonly [number, number]): string {
  return `window lines, glass ${k1(glass[0])}–${k1(glass[1])} K, liquid ${k1(liquid[0])}–${k1(liquid[1])} K`;
}

function lineAway(T: ArrayLike<number>, h: ArrayLike<number>, keep: (T: number) => boolean): LineFit | null {
  return fitLineWhere(T, h, (i) => keep(T[i]));
}

/** 5 K from Tg, shrunk when a side would keep fewer than 5 points. */
function chooseGap(T: ArrayLike<number>, tg: number, scale: number): number {
  for (const gap of [LINE_GAP * scale, 3, 2, 1]) {
    let below = 0;
    let above = 0;
    for (let i = 0; i < T.length; i++) {
      if (T[i] <= tg - gap) below++;
      if (T[i] >= tg + gap) above++;
    }
    if (below >= 5 && above >= 5) return gap;
  }
  return 0;
}

/**
 * What `coolingTg` works out from the data alone, before the gap: filled on the first call and
 * read by later calls on the same T and h (the gap variants of the window budget).
 */
export interface CoolingMemo {
  hinge?: ReturnType<typeof fitHinge>;
  /** The larger |t| of the quadratic term on either side of the breakpoint. */
  bend?: number;
}

export function coolingTg(input: CoolingInput, memo: CoolingMemo = {}): CoolingFigures | CoolingFailure {
  const { T, h } = input;
  const scale = input.gapScale ?? 1;
  const warnings: Array<{ message: Message; at: 'windows' | 'segment' | 'low' }> = [];

  if (input.glassWindow && input.liquidWindow) {
    const [g0, g1] = input.glassWindow;
    const [l0, l1] = input.liquidWindow;
    const g = lineAway(T, h, (t) => t >= g0 && t <= g1);
    const l = lineAway(T, h, (t) => t >= l0 && t <= l1);
    const x = g && l ? intersect(g, l, t95) : null;
    if (!g || !l || !x) return { ok: false, message: messages.rampTooFewPoints('cooling segment'), at: 'windows' };
    if (!x.slopesDiffer) warnings.push({ message: messages.rampSlopesEqual('Tg'), at: 'windows' });
    const k = t95(Math.max(1, g.n + l.n - 4));
    return {
      ok: true,
      construction: 'user windows',
      tg: x.x,
      uTg: x.se,
      interval: [x.x - k * x.se, x.x + k * x.se],
      hAtTg: predict(g, x.x),
      slopeGlass: g.slope,
      slopeLiquid: l.slope,
      uSlopeGlass: Math.sqrt(g.varSlope),
      uSlopeLiquid: Math.sqrt(l.varSlope),
      model: { tg: 0, slopeGlass: 0, slopeLiquid: 0 },
      lineLabel: () => `windows as written, glass ${k1(g0)}–${k1(g1)} K, liquid ${k1(l0)}–${k1(l1)} K`,
      label: () => `two windows as written (glass ${k1(g0)}–${k1(g1)} K, liquid ${k1(l0)}–${k1(l1)} K), intersection`,
      lc: g,
      scl: l,
      warnings,
    };
  }

  const hinge = (memo.hinge ??= fitHinge(T, h));
  if (!hinge.ok) return { ok: false, message: messages.rampTooFewPoints('cooling segment'), at: 'segment' };
  const f = hinge.fit;
  if (f.pTransition > 0.05) return { ok: false, message: messages.rampNoTransition(f.pTransition), at: 'segment' };
  if (f.atEdge) return { ok: false, message: messages.rampTgAtEdge(), at: f.breakpoint - f.range[0] < f.range[1] - f.breakpoint ? 'low' : 'high' };
  if (f.intervalOpen) {
    // The 95 % interval runs into the edge of the allowed breakpoints: a bound, not a Tg.
    const low = f.interval[0] - f.range[0] < f.range[1] - f.interval[1];
    return { ok: false, message: messages.rampTgIntervalAtEdge(low ? 'low' : 'high', low ? f.range[0] : f.range[1], low ? f.interval[0] - 10 : f.interval[1] + 10), at: low ? 'low' : 'high' };
  }
  const uHinge = (f.interval[1] - f.interval[0]) / (2 * t95(Math.max(1, f.n - 4)));

  // Curvature near the breakpoint: correlated residuals, a side that bends, or hinge slopes that
  // disagree with the window slopes. (The breakpoint's movement when the span is trimmed enters the
  // window term: the analysis reruns with 5 K trimmed from both ends.)
  const bend = (memo.bend ??= Math.max(Math.abs(curvatureT(T, h, -Infinity, f.breakpoint)), Math.abs(curvatureT(T, h, f.breakpoint, Infinity))));
  const m = input.fragility !== null && input.fragility > 0 ? input.fragility : DEFAULT_FRAGILITY;
  const delta0 = (2 * f.breakpoint) / m;
  const w = fitTwoWindows(T, h, f.breakpoint, delta0 * scale);
  // Specification test of Hausman (Econometrica 46, 1251 (1978)): where the lines are straight,
  // the hinge and the window fit estimate the same slopes, and their difference has the variance
  // of the less efficient minus that of the more efficient one.
  const hausman = (a: number, ua: number, b: number, ub: number): number => {
    const v = Math.max(Math.abs(ua * ua - ub * ub), 0.1 * Math.min(ua * ua, ub * ub));
    // Noise-free lines: both fits are exact, there is nothing to test.
    return v > 0 ? Math.abs(a - b) / Math.sqrt(v) : 0;
  };
  const z = w.ok ? Math.max(hausman(f.slopeLow, f.seSlopeLow, w.glass.slope, Math.sqrt(w.glass.varSlope)), hausman(f.slopeHigh, f.seSlopeHigh, w.liquid.slope, Math.sqrt(w.liquid.varSlope))) : 0;
  const broad = f.durbinWatson < DW_BROAD || bend > CURVATURE_T || z > HAUSMAN_Z;

  if (!broad) {
    const ratio = f.slopeHigh / f.slopeLow;
    if (!(f.slopeHigh > f.slopeLow) || (f.slopeLow > 0 && ratio < 1.3)) warnings.push({ message: messages.rampWeakTransition(ratio), at: 'segment' });
    const gap = chooseGap(T, f.breakpoint, scale);
    const beyond = (a: number, ua: number, b: number, ub: number): number => Math.sqrt(Math.max(0, (a - b) ** 2 - Math.abs(ua * ua - ub * ub))) / Math.sqrt(3);
    // The expansivities are those of the lines away from the transition: the window lines where
    // the data allow them (unbiased however the corner is rounded), else the hinge's.
    const lines = w.ok ? { glass: w.glass, liquid: w.liquid } : null;
    return {
      ok: true,
      construction: 'hinge',
      tg: f.breakpoint,
      uTg: uHinge,
      interval: f.interval,
      hAtTg: f.hAtBreak,
      slopeGlass: lines ? lines.glass.slope : f.slopeLow,
      slopeLiquid: lines ? lines.liquid.slope : f.slopeHigh,
      uSlopeGlass: lines ? Math.sqrt(lines.glass.varSlope) : f.seSlopeLow,
      uSlopeLiquid: lines ? Math.sqrt(lines.liquid.varSlope) : f.seSlopeHigh,
      model: { tg: w.ok ? beyond(f.breakpoint, uHinge, w.tg, w.crossing.se) : 0, slopeGlass: 0, slopeLiquid: 0 },
      label: () => `hinge fit (continuous two-line, optimised breakpoint; no curvature found: Durbin–Watson ${f.durbinWatson.toFixed(2)}), 95 % profile-likelihood interval`,
      lineLabel: () => (w.ok ? windowText(w.glassWindow, w.liquidWindow) : 'hinge fit'),
      lc: w.ok ? w.glass : lineAway(T, h, (t) => t <= f.breakpoint - gap),
      scl: w.ok ? w.liquid : lineAway(T, h, (t) => t >= f.breakpoint + gap),
      warnings,
    };
  }

  if (!w.ok) return { ok: false, message: messages.rampTgIntervalAtEdge(w.end, w.end === 'low' ? f.range[0] : f.range[1], w.needed), at: w.end };
  if (!w.crossing.slopesDiffer) warnings.push({ message: messages.rampSlopesEqual('Tg'), at: 'segment' });
  const ratio = w.liquid.slope / w.glass.slope;
  if (!(w.liquid.slope > w.glass.slope) || (w.glass.slope > 0 && ratio < 1.3)) warnings.push({ message: messages.rampWeakTransition(ratio), at: 'segment' });
  if (w.curved) warnings.push({ message: messages.rampWindowsBend(w.glassGap, w.liquidGap), at: 'segment' });
  if (w.glassShort) warnings.push({ message: messages.rampShortGlass(2 * delta0 * scale, w.glassGap), at: 'low' });
  const k = t95(Math.max(1, w.glass.n + w.liquid.n - 4));
  const why = (): string =>
    f.durbinWatson < DW_BROAD
      ? `Durbin–Watson ${f.durbinWatson.toFixed(2)} of the hinge fit`
      : bend > CURVATURE_T
        ? `a side of the hinge fit bends, quadratic term t = ${bend.toFixed(1)}`
        : `the hinge slopes differ from the window slopes, Hausman z = ${z.toFixed(1)}`;
  const mText = (): string => (input.fragility !== null && input.fragility > 0 ? `m = ${Number(m.toPrecision(3))} of the material` : `m = ${m} assumed`);
  return {
    ok: true,
    construction: 'windows',
    model: { tg: 0, slopeGlass: 0, slopeLiquid: 0 },
    tg: w.tg,
    uTg: w.crossing.se,
    interval: [w.tg - k * w.crossing.se, w.tg + k * w.crossing.se],
    hAtTg: predict(w.glass, w.tg),
    slopeGlass: w.glass.slope,
    slopeLiquid: w.liquid.slope,
    uSlopeGlass: Math.sqrt(w.glass.varSlope),
    uSlopeLiquid: Math.sqrt(w.liquid.varSlope),
    lineLabel: () => windowText(w.glassWindow, w.liquidWindow),
    label: () => `two windows iterated from the hinge fit (glass ${k1(w.glassWindow[0])}–${k1(w.glassWindow[1])} K, liquid ${k1(w.liquidWindow[0])}–${k1(w.liquidWindow[1])} K; gaps ${k1(w.glassGap)} K below and ${k1(w.liquidGap)} K above, from δ = 2·Tg/m, ${mText()}), intersection; broad transition (${why()})`,
    lc: w.glass,
    scl: w.liquid,
    warnings,
  };
}
