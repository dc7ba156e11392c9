/**
 * Calorimetry results (ASTM E1356 and ISO 11357-2 for the construction names).
 *
 * - Heat capacity from the data, or from heat flow as Cp = Φ/(m·q), its sign by `endotherm:`
 *   (up or down), else the convention the column header states, else endotherm up; a mass
 *   missing from the block is read from the export's preamble.
 * - Glass and liquid baselines: straight lines over `windows.glass` and `windows.liquid`
 *   (default the lowest 20 % and the highest 15 % of the temperature range); a start-up
 *   transient at the start of the scan is left out of the automatic glass window.
 * - Slopes by local cubic regression over a quarter of the transition width (Savitzky & Golay,
 *   Anal. Chem. 36, 1627 (1964)): `tinflection` where its second derivative changes sign;
 *   `tonset`: the tangent there meets the glass baseline (extrapolated onset of the glass
 *   transition, T_g,onset); `tg_midpoint`: the smoothed curve crosses the line halfway between
 *   the baselines (half step height); `step_height`: ΔCp between the baselines at the midpoint.
 * - `tfictive` by Moynihan area matching (Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)):
 *   ∫_{Tf}^{T₂}(Cp,l − Cp,g)dT = ∫_{T₁}^{T₂}(Cp − Cp,g)dT, T₁ the start of the glass window and T₂
 *   the end of the liquid window; with linear baselines the left side is quadratic in Tf.
 * - `enthalpy_gap` = ∫_{T₁}^{T₂}(Cp − Cp,ref)dT against the liquid-cooled reference scan named by
 *   `reference:` (H_LC − H of this glass), over the range both scans cover.
 * - Every temperature carries a budget (GUM, JCGM 100:2008): statistical (delta method with the
 *   noise of the baselines), baseline windows (each shortened by a quarter at either end, half
 *   range/√3) and the temperature calibration (`temperature_calibration`, default 0.5 K).
 *
 * Policy: missing columns, mass or windows give diagnostics; a scan without a significant step,
 * with an inverted step, or whose construction contradicts itself (a baseline extrapolating to a
 * negative Cp, the inflection below the onset, the midpoint far below it) gives a diagnostic
 * and no transition results.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { fitLineWhere, predict, predictVariance, type LineFit } from '../numeric/lineFit.js';
import { localCubic, spanOf, type LocalCubic } from '../numeric/localCubic.js';
import { budgeted, type ResultValue, type UncertaintyTerm } from '../model/result.js';
import { linePoints, thinIndices } from '../numeric/thin.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData } from '../model/figure.js';
import { addAging } from './agingTime.js';
import { metadataWindow } from './blockLinks.js';

export interface DscCurve {
  readonly T: number[];
  readonly cp: number[];
}

/** How the heat capacity was obtained: the sign convention used and a mass read from the export's preamble. */
export interface DscCurveInfo extends DscCurve {
  /** `endotherm up` or `endotherm down` (heat flow), or null for heat-capacity data. */
  readonly convention: 'endotherm up' | 'endotherm down' | null;
  /** Where the convention came from: the `endotherm:` key, the column header, or the default. */
  readonly conventionFrom: string;
  /** The sample mass (mg) read from the preamble, when the block gives none. */
  readonly preambleMass?: { readonly mg: number; readonly text: string };
}

/** A sample mass in a preamble entry (`Sample Mass: 5.12 mg`, `Weight = 3.1`), in mg. */
function preambleMass(table: ParsedBlock['table']): { mg: number; text: string } | undefined {
  const entries = (table as { preamble?: readonly { key: string; value: string }[] } | null | undefined)?.preamble ?? [];
  for (const e of entries) {
    if (!/^(sample\s*)?(mass|weight)\b|^sample\s*size$/i.test(e.key.trim())) continue;
    const m = /^\s*([+]?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?)\s*(mg|g|µg|μg|ug)?\s*$/.exec(e.value);
    if (!m) continue;
    const v = Number(m[1]);
    const unit = (m[2] ?? 'mg').replace('μ', 'µ');
    const mg = unit === 'g' ? v * 1000 : unit === 'µg' || unit === 'ug' ? v / 1000 : v;
    if (mg > 0 && Number.isFinite(mg)) return { mg, text: `${e.key.trim()}: ${e.value.trim()}` };
  }
  return undefined;
}

/** The heat-capacity curve of a dsc block, sorted by temperature, or a reason. */
export function dscCurve(block: ParsedBlock): DscCurveInfo | { error: 'columns' | 'mass' } {
  const table = block.table;
  const T = table?.byRole.get('temperature')?.values;
  const heatFlow = block.metadata.data.quantity === 'heat flow';
  const specificColumn = heatFlow ? table?.byRole.get('specific_heat_flow') : undefined;
  const column = heatFlow ? (specificColumn ?? table?.byRole.get('heat_flow')) : table?.byRole.get('heat_capacity');
  const y = column?.values;
  if (!T || !y) return { error: 'columns' };
  // Sign: the `endotherm:` key, else the convention the column header states, else endotherm up.
  let convention: DscCurveInfo['convention'] = null;
  let conventionFrom = '';
  if (heatFlow) {
    const key = block.metadata.data.endotherm;
    const stated = (column as { convention?: string } | undefined)?.convention;
    if (key === 'up' || key === 'down') {
      convention = key === 'up' ? 'endotherm up' : 'endotherm down';
      conventionFrom = '`endotherm:`';
    } else if (stated === 'endotherm-up' || stated === 'endotherm-down') {
      convention = stated === 'endotherm-up' ? 'endotherm up' : 'endotherm down';
      conventionFrom = 'the column header';
    } else {
      convention = 'endotherm up';
      conventionFrom = 'the default';
    }
  }
  const sign = convention === 'endotherm down' ? -1 : 1;
  let factor = 1;
  let fromPreamble: DscCurveInfo['preambleMass'];
  if (specificColumn) {
    const rate = block.quantities.get('/rate')?.value; // K/min
    if (!rate) return { error: 'mass' };
    factor = 1 / (rate / 60); // (W/g)/(K/s) = J/(g·K)
  } else if (heatFlow) {
    let mass = block.quantities.get('/mass')?.value; // mg
    if (!mass) {
      fromPreamble = preambleMass(table);
      mass = fromPreamble?.mg;
    }
    const rate = block.quantities.get('/rate')?.value; // K/min
    if (!mass || !rate) return { error: 'mass' };
    factor = 1 / (mass * (rate / 60)); // mW/(mg·K/s) = J/(g·K)
  }
  const idx = Array.from(T, (_, i) => i).sort((a, b) => T[a] - T[b]);
  return { T: idx.map((i) => T[i]), cp: idx.map((i) => sign * y[i] * factor), convention, conventionFrom, ...(fromPreamble ? { preambleMass: fromPreamble } : {}) };
}

/** A baseline over a window; at least 3 points. */
function fitRange(c: DscCurve, w: readonly [number, number]): LineFit | null {
  const f = fitLineWhere(c.T, c.cp, (i) => c.T[i] >= w[0] && c.T[i] <= w[1]);
  return f && f.n >= 3 ? f : null;
}

/** Trapezoid integral of f over [a, b] on the curve's points (linear interpolation at the ends). */
export function integrate(T: readonly number[], f: readonly number[], a: number, b: number): number {
  let s = 0;
  for (let i = 1; i < T.length; i++) {
    const x0 = Math.max(a, T[i - 1]);
    const x1 = Math.min(b, T[i]);
    if (!(x1 > x0)) continue;
    const slope = (f[i] - f[i - 1]) / (T[i] - T[i - 1]);
    const y0 = f[i - 1] + slope * (x0 - T[i - 1]);
    const y1 = f[i - 1] + slope * (x1 - T[i - 1]);
    s += 0.5 * (y0 + y1) * (x1 - x0);
  }
  return s;
}

/** Solves ∫_{Tf}^{T2}(a + bT)dT = area for Tf (the root nearest the data). */
export function moynihanTf(a: number, b: number, t2: number, area: number): number {
  // (b/2)Tf² + a·Tf − (a·T2 + (b/2)T2² − area) = 0
  const c = -(a * t2 + 0.5 * b * t2 * t2 - area);
  if (Math.abs(b) < 1e-14) return -c / a;
  const A = 0.5 * b;
  const disc = a * a - 4 * A * c;
  if (disc < 0) return NaN;
  const q = -0.5 * (a + Math.sign(a) * Math.sqrt(disc));
  const r1 = q / A;
  const r2 = c / q;
  // The root on the side of T2 where the area is positive: the one nearest T2 from below.
  const candidates = [r1, r2].filter((r) => Number.isFinite(r) && r <= t2 + 1e-9);
  return candidates.length === 0 ? NaN : Math.max(...candidates);
}

/** Rows a scan needs: baselines of at least 3 points on both sides of a step. */
const MIN_DSC_ROWS = 10;

/** Default standard uncertainty of the temperature calibration (K) when `temperature_calibration` is not given. */
export const DEFAULT_DSC_CALIBRATION = 0.5;

/**
 * The start-up transient of a heating scan (the heat flow settling after the heating starts):
 * the leading rows of the automatic glass window that depart from the line fitted to the rest
 * of it by more than 5σ, with a margin as wide again. Returns the temperature where the window
 * should start, or null when the start is clean.
 */
export function startupCut(c: DscCurve, w: readonly [number, number], floor: number): number | null {
  const { T, cp } = c;
  let lo = w[0];
  let cut: number | null = null;
  for (let pass = 0; pass < 4; pass++) {
    const upper = fitRange(c, [lo + 0.5 * (w[1] - lo), w[1]]);
    if (!upper) return cut;
    const sigma = Math.max(Math.sqrt(upper.sigma2), floor);
    let last = -1;
    for (let i = 0; i < T.length && T[i] < lo + 0.5 * (w[1] - lo); i++) {
      if (T[i] < w[0]) continue;
      if (Math.abs(cp[i] - predict(upper, T[i])) > 5 * sigma) last = i;
    }
    if (last < 0) return cut;
    const next = Math.min(w[0] + 2 * (T[last] - w[0]) + (T[1] - T[0]), w[0] + 0.8 * (w[1] - w[0]));
    if (cut !== null && next <= cut) return cut;
    cut = next;
    lo = cut;
  }
  return cut;
}

/** Local-cubic slopes over [from, to] with half-width h: the centres, values and slopes. */
function slopes(c: DscCurve, from: number, to: number, h: number, maxCentres = 400): { i: number; value: number; slope: number }[] {
  const out: { i: number; value: number; slope: number }[] = [];
  const [a, b] = spanOf(c.T, 0.5 * (from + to), 0.5 * (to - from));
  const stride = Math.max(1, Math.ceil((b - a) / maxCentres));
  for (let i = a; i < b; i += stride) {
    const [lo, hi] = spanOf(c.T, c.T[i], h);
    const f = localCubic(c.T, c.cp, c.T[i], lo, hi, h, false);
    if (f) out.push({ i, value: f.c[0], slope: f.c[1] });
  }
  return out;
}

/** Value and slope of a local cubic at x₀ + d, with their variances (σ² given). */
function cubicAt(f: LocalCubic, d: number, sigma2: number): { value: number; slope: number; varValue: number; varSlope: number; cov: number } {
  const gv = [1, d, d * d, d * d * d];
  const gs = [0, 1, 2 * d, 3 * d * d];
  const q = (a: number[], b: number[]): number => {
    let s = 0;
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) s += a[i] * f.unitCov[i][j] * b[j];
    return s * sigma2;
  };
  const value = f.c[0] + f.c[1] * d + f.c[2] * d * d + f.c[3] * d * d * d;
  const slope = f.c[1] + 2 * f.c[2] * d + 3 * f.c[3] * d * d;
  return { value, slope, varValue: q(gv, gv), varSlope: q(gs, gs), cov: q(gv, gs) };
}

/** Where the local cubic's second derivative changes sign within ±h of `near`, the crossing nearest it (or `near`). */
function inflectionNear(c: DscCurve, near: number, h: number): number {
  const { T, cp } = c;
  const [a, b] = spanOf(T, near, h);
  const stride = Math.max(1, Math.ceil((b - a) / 200));
  let prev: { t: number; c2: number } | null = null;
  let best = near;
  let nearest = Infinity;
  for (let i = a; i < b; i += stride) {
    const [l2, h2] = spanOf(T, T[i], h);
    const f = localCubic(T, cp, T[i], l2, h2, h, false);
    if (!f) continue;
    const cur = { t: T[i], c2: f.c[2] };
    if (prev && prev.c2 > 0 !== cur.c2 > 0) {
      const cross = prev.t + ((cur.t - prev.t) * prev.c2) / (prev.c2 - cur.c2);
      if (Math.abs(cross - near) < nearest) {
        nearest = Math.abs(cross - near);
        best = cross;
      }
    }
    prev = cur;
  }
  return best;
}

/** What the construction gives for one choice of baseline windows. */
interface Construction {
  readonly glass: LineFit;
  readonly liquid: LineFit;
  readonly sigma2: number;
  /** Half-width of the local fits (K) and the transition width ΔCp/slope (K). */
  readonly span: number;
  readonly width: number;
  readonly step: { readonly value: number; readonly u: number; readonly significant: boolean; readonly steep: boolean; readonly inverted: boolean };
  readonly inflection?: { readonly T: number; readonly u: number; readonly value: number; readonly slope: number; readonly varValue: number; readonly varSlope: number; readonly cov: number };
  readonly onset?: { readonly T: number; readonly u: number };
  readonly midpoint?: { readonly T: number; readonly u: number; readonly step: number; readonly uStep: number };
  readonly tf?: { readonly T: number; readonly u: number };
}

function construct(c: DscCurve, glassW: readonly [number, number], liquidW: readonly [number, number], floor: number): Construction | 'glass' | 'liquid' {
  const { T, cp } = c;
  const n = T.length;
  const glass = fitRange(c, glassW);
  if (!glass) return 'glass';
  const liquid = fitRange(c, liquidW);
  if (!liquid) return 'liquid';
  const sigma2 = Math.max((glass.sse + liquid.sse) / Math.max(1, glass.n + liquid.n - 4), floor * floor);
  const spacing = (T[n - 1] - T[0]) / (n - 1);
  const baseSlope = 0.5 * (glass.slope + liquid.slope);
  const from = glassW[0];
  const to = liquidW[1];
  // Pass 1 at a short span over the whole scan, to find the step and its width; then spans of a
  // quarter of the width, near the step.
  let h = Math.max(4 * spacing, 0.01 * (to - from), 0.3);
  let width = NaN;
  let best = { i: -1, value: NaN, slope: NaN };
  let lo = from + h;
  let hi = to - h;
  let atEnd = false;
  for (let pass = 0; pass < 3; pass++) {
    const s = slopes(c, lo, hi, h);
    if (s.length === 0) break;
    let up = s[0];
    let down = s[0];
    for (const p of s) {
      if (p.slope > up.slope) up = p;
      if (p.slope < down.slope) down = p;
    }
    const dUp = predict(liquid, T[up.i]) - predict(glass, T[up.i]);
    const dDown = predict(liquid, T[down.i]) - predict(glass, T[down.i]);
    // The step goes the way the baselines part; the steepest point of that direction.
    best = dUp >= 0 || dDown >= 0 ? up : down;
    // A step has its steepest point inside the scan; a curve that only bends (no step) is steepest at an end.
    if (pass === 0) atEnd = T[best.i] < lo + h || T[best.i] > hi - h;
    const d = Math.abs(predict(liquid, T[best.i]) - predict(glass, T[best.i]));
    width = d / Math.max(Math.abs(best.slope - baseSlope), 1e-300);
    // A quarter of the width, widened on noisy data until the slope's standard error is about a
    // tenth of the step's slope (a local cubic's slope varies as σ²·37.5·Δx/h³ for rows Δx apart),
    // but not beyond half the width, where the cubic's own bias on the slope reaches about 1 %.
    const excess = Math.abs(best.slope - baseSlope);
    const hNoise = Math.cbrt((37.5 * spacing * sigma2) / (0.01 * excess * excess));
    const next = Math.min(Math.max(width / 4, Math.min(hNoise, width / 2), 4 * spacing, 0.3), 0.25 * (to - from));
    lo = Math.max(from + next, T[best.i] - Math.max(2 * width, 4 * next));
    hi = Math.min(to - next, T[best.i] + Math.max(2 * width, 4 * next));
    if (pass > 0 && Math.abs(next - h) < 0.05 * h) break;
    h = next;
  }
  const emptyStep = { value: NaN, u: NaN, significant: false, steep: false, inverted: false };
  if (best.i < 0) return { glass, liquid, sigma2, span: h, width, step: emptyStep };
  // The inflection: where the local cubic's second derivative changes sign, nearest the steepest centre.
  const [fLo, fHi] = spanOf(T, T[best.i], h);
  const tStar = inflectionNear(c, T[best.i], h);
  const [sLo, sHi] = spanOf(T, tStar, h);
  const fit = localCubic(T, cp, tStar, sLo, sHi, h) ?? localCubic(T, cp, T[best.i], fLo, fHi, h);
  if (!fit) return { glass, liquid, sigma2, span: h, width, step: emptyStep };
  const at = cubicAt(fit, 0, sigma2);
  const tInfl = fit.x0;
  // δT* = δc₂/(3c₃), delta method; c₃ from the same fit. The zero of a noisy second derivative
  // moves more than that first-order term says: the spread over spans of 0.7 h and 1.4 h (half
  // range/√3) is added, which also holds the smoothing's own shift of an asymmetric step.
  const uDelta = Math.abs(fit.c[3]) > 0 ? Math.sqrt(sigma2 * fit.unitCov[2][2]) / Math.abs(3 * fit.c[3]) : NaN;
  const others = [inflectionNear(c, T[best.i], 0.7 * h), inflectionNear(c, T[best.i], 1.4 * h)];
  const uSpan = (Math.max(tStar, ...others) - Math.min(tStar, ...others)) / 2 / Math.sqrt(3);
  // Near its maximum the slope is flat, s* − 3|c₃|·δ²: points within one standard error of the
  // slope are as steep as the inflection, δ = √(u(s)/(3|c₃|)); the larger of the two first-order terms.
  const uSlopeAt = Math.sqrt(sigma2 * fit.unitCov[1][1]);
  const uFlat = Math.abs(fit.c[3]) > 0 ? Math.sqrt(uSlopeAt / Math.abs(3 * fit.c[3])) : NaN;
  const uFirst = Math.max(Number.isFinite(uDelta) ? uDelta : 0, Number.isFinite(uFlat) ? uFlat : 0);
  const uInfl = Math.hypot(uFirst, uSpan);
  // Significance of the step against the noise: ΔCp at the inflection over its standard uncertainty, and the steepest slope over the baselines'.
  const dCp = predict(liquid, tInfl) - predict(glass, tInfl);
  const uD = Math.sqrt(predictVariance(glass, tInfl) + predictVariance(liquid, tInfl) + sigma2 / Math.max(1, sHi - sLo));
  const slopeExcess = (at.slope - baseSlope) * Math.sign(dCp);
  const uSlope = Math.sqrt(at.varSlope + glass.varSlope + liquid.varSlope);
  // A step narrower than the room between the windows (or half the scan): a curve that only bends
  // gives a "width" wider than that.
  const localised = !atEnd && width < Math.max(liquidW[0] - glassW[1], 0.5 * (to - from)) && Math.abs(dCp) > 5 * uD;
  const steep = slopeExcess > 3 * uSlope && localised;
  const significant = Math.abs(dCp) > 3 * Math.sqrt(sigma2) && slopeExcess > 3 * uSlope && localised;
  const step = { value: dCp, u: uD, significant, steep, inverted: significant && dCp < 0 };
  const inflection = { T: tInfl, u: uInfl, ...at };
  if (!significant || dCp < 0) return { glass, liquid, sigma2, span: h, width, step, inflection };
  // Extrapolated onset: the tangent at the inflection meets the glass baseline (delta method for u).
  const gIntercept = glass.c - glass.slope * glass.xc;
  const tOn = (at.value - at.slope * tInfl - gIntercept) / (glass.slope - at.slope);
  const dt = tOn - tInfl;
  const uOn = Math.sqrt(at.varValue + dt * dt * at.varSlope + 2 * dt * at.cov + predictVariance(glass, tOn)) / Math.abs(at.slope - glass.slope);
  // Midpoint: the smoothed curve crosses the line halfway between the baselines, nearest the inflection.
  const mid = (t: number): number => 0.5 * (predict(glass, t) + predict(liquid, t));
  const smooth = slopes(c, Math.max(glassW[1], from + h), Math.min(liquidW[0], to - h), h, 800);
  let tm = NaN;
  for (let k = 1; k < smooth.length; k++) {
    const a = smooth[k - 1];
    const b = smooth[k];
    const ga = a.value - mid(T[a.i]);
    const gb = b.value - mid(T[b.i]);
    if (ga < 0 && gb >= 0) {
      const cross = T[a.i] + ((T[b.i] - T[a.i]) * -ga) / (gb - ga);
      if (!Number.isFinite(tm) || Math.abs(cross - tInfl) < Math.abs(tm - tInfl)) tm = cross;
    }
  }
  let midpoint: Construction['midpoint'];
  if (Number.isFinite(tm)) {
    const [ml, mh] = spanOf(T, tm, h);
    const mf = localCubic(T, cp, tm, ml, mh, h);
    const ma = mf ? cubicAt(mf, 0, sigma2) : null;
    const varMid = 0.25 * (predictVariance(glass, tm) + predictVariance(liquid, tm));
    const uTm = ma ? Math.sqrt(ma.varValue + varMid) / Math.max(Math.abs(ma.slope - baseSlope), 1e-300) : NaN;
    const stepAt = predict(liquid, tm) - predict(glass, tm);
    midpoint = { T: tm, u: uTm, step: stepAt, uStep: Math.sqrt(predictVariance(glass, tm) + predictVariance(liquid, tm)) };
  }
  // Moynihan area matching, and its statistical uncertainty by first-order propagation of the
  // baselines' parameters and of the noise on the integrated excess (trapezoid weights).
  const t1 = glassW[0];
  const t2 = liquidW[1];
  const tfOf = (gc: number, gs: number, lc: number, ls: number): number => {
    let area = 0;
    for (let i = 1; i < n; i++) {
      const x0 = Math.max(t1, T[i - 1]);
      const x1 = Math.min(t2, T[i]);
      if (!(x1 > x0)) continue;
      const sl = (cp[i] - cp[i - 1]) / (T[i] - T[i - 1]);
      const y0 = cp[i - 1] + sl * (x0 - T[i - 1]) - (gc + gs * (x0 - glass.xc));
      const y1 = cp[i - 1] + sl * (x1 - T[i - 1]) - (gc + gs * (x1 - glass.xc));
      area += 0.5 * (y0 + y1) * (x1 - x0);
    }
    const b = ls - gs;
    const a = lc - ls * liquid.xc - (gc - gs * glass.xc);
    return moynihanTf(a, b, t2, area);
  };
  const tf0 = tfOf(glass.c, glass.slope, liquid.c, liquid.slope);
  let tf: Construction['tf'];
  if (Number.isFinite(tf0)) {
    const dv = (k: number, s: number): number => {
      const p = [glass.c, glass.slope, liquid.c, liquid.slope];
      p[k] += s;
      const up = tfOf(p[0], p[1], p[2], p[3]);
      p[k] -= 2 * s;
      const dn = tfOf(p[0], p[1], p[2], p[3]);
      return (up - dn) / (2 * s);
    };
    const sd = [Math.sqrt(glass.varC), Math.sqrt(glass.varSlope), Math.sqrt(liquid.varC), Math.sqrt(liquid.varSlope)];
    let v = 0;
    for (let k = 0; k < 4; k++) if (sd[k] > 0) v += (dv(k, sd[k]) * sd[k]) ** 2;
    // Noise on the excess between the windows (the windows' own rows are in the baselines).
    let w2 = 0;
    for (let i = 0; i < n; i++) {
      if (T[i] <= glassW[1] || T[i] >= liquidW[0]) continue;
      const wi = 0.5 * ((T[Math.min(n - 1, i + 1)] - T[Math.max(0, i - 1)]));
      w2 += wi * wi;
    }
    const dCpTf = predict(liquid, tf0) - predict(glass, tf0);
    v += (sigma2 * w2) / (dCpTf * dCpTf);
    tf = { T: tf0, u: Math.sqrt(v) };
  }
  return { glass, liquid, sigma2, span: h, width, step, inflection, onset: { T: tOn, u: uOn }, midpoint, tf };
}

export function analyzeDsc(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const refId = block.metadata.data.reference;
  const selfReference = typeof refId === 'string' && refId === block.id;
  if (selfReference) diagnostics.push(at(messages.dscReferenceSelf(refId), block.spanOf('/reference')));
  const table = block.table;
  if (!table || table.rowCount === 0) return { results, diagnostics };
  const curve = dscCurve(block);
  if ('error' in curve) {
    if (curve.error === 'mass') diagnostics.push(at(messages.dscNoMass(), block.header.kindSpan));
    else if (table.problems.length === 0) diagnostics.push(at(messages.dscNoColumns(block.metadata.data.quantity === 'heat flow' ? 'heat-flow (Phi)' : 'heat-capacity (Cp)'), block.spanOf('/data')));
    return { results, diagnostics };
  }
  if (curve.preambleMass) diagnostics.push(at(messages.dscMassFromPreamble(curve.preambleMass.text, curve.preambleMass.mg), block.header.kindSpan));
  const { T, cp } = curve;
  const n = T.length;
  if (n < MIN_DSC_ROWS) {
    diagnostics.push(at(messages.tableTooFewRows('dsc', n, MIN_DSC_ROWS, 'to fit the glass and liquid baselines on both sides of the step'), block.header.kindSpan));
    return { results, diagnostics };
  }
  const range = T[n - 1] - T[0];
  // A floor for the noise of exact (synthetic) data: 1e-6 of the typical heat capacity.
  const typical = [...cp].map(Math.abs).sort((a, b) => a - b)[n >> 1];
  const floor = Math.max(1e-6 * typical, 1e-12);
  const userGlass = metadataWindow(block, 'glass');
  const userLiquid = metadataWindow(block, 'liquid');
  let glassW: [number, number] = userGlass ?? [T[0], T[0] + 0.2 * range];
  const liquidW: [number, number] = userLiquid ?? [T[n - 1] - 0.15 * range, T[n - 1]];
  let startup = '';
  if (!userGlass) {
    const cut = startupCut(curve, glassW, floor);
    if (cut !== null) {
      diagnostics.push(at(messages.dscStartupTransient(glassW[0], cut), block.header.kindSpan));
      // The window keeps its width when the transition leaves room: up to three transition widths below the onset.
      const width = glassW[1] - glassW[0];
      glassW = [cut, glassW[1]];
      const provisional = construct(curve, glassW, liquidW, floor);
      if (typeof provisional !== 'string' && provisional.onset && provisional.step.significant && !provisional.step.inverted) {
        const end = Math.min(cut + width, provisional.onset.T - 3 * provisional.width);
        if (end > glassW[1]) glassW = [cut, end];
      }
      startup = `, start-up transient below ${Number(cut.toPrecision(5))} K left out`;
    }
  }
  const nominal = construct(curve, glassW, liquidW, floor);
  if (nominal === 'glass' || nominal === 'liquid') {
    diagnostics.push(at(messages.dscTooFew(nominal), block.spanOf('/windows')));
    return { results, diagnostics };
  }
  const { glass, liquid } = nominal;
  const convention = curve.convention ? `${curve.convention} (${curve.conventionFrom})` : null;
  if (nominal.step.inverted) {
    diagnostics.push(at(messages.dscInvertedStep(convention), block.spanOf(block.metadata.data.endotherm !== undefined ? '/endotherm' : '/data')));
    return { results, diagnostics };
  }
  // A window that bends up at its transition end (glass) more than at its other end, or starts
  // below its line (liquid): it reaches into the step. Judged against the other window's noise.
  {
    const endResidual = (f: LineFit, w: readonly [number, number], top: boolean): number => {
      const edge = top ? w[1] - 0.15 * (w[1] - w[0]) : w[0] + 0.15 * (w[1] - w[0]);
      let sum = 0;
      let count = 0;
      for (let i = 0; i < n; i++) {
        if (T[i] < w[0] || T[i] > w[1] || (top ? T[i] < edge : T[i] > edge)) continue;
        sum += cp[i] - predict(f, T[i]);
        count++;
      }
      return count > 0 ? sum / count : 0;
    };
    const noiseOf = (f: LineFit): number => Math.max(Math.sqrt(f.sigma2), floor);
    if (userGlass && endResidual(glass, glassW, true) > Math.max(5 * noiseOf(liquid), endResidual(glass, glassW, false)) && glass.sigma2 > 9 * liquid.sigma2) {
      diagnostics.push(at(messages.dscWindowOverlap('glass'), block.spanOf('/windows')));
      return { results, diagnostics };
    }
    if (userLiquid && endResidual(liquid, liquidW, false) < Math.min(-5 * noiseOf(glass), endResidual(liquid, liquidW, true)) && liquid.sigma2 > 9 * glass.sigma2) {
      diagnostics.push(at(messages.dscWindowOverlap('liquid'), block.spanOf('/windows')));
      return { results, diagnostics };
    }
  }
  // A steep rise inside a window: the window reaches into the transition.
  const steepAt = nominal.step.steep ? nominal.inflection?.T : undefined;
  if (steepAt !== undefined && (steepAt <= glassW[1] || steepAt >= liquidW[0])) {
    diagnostics.push(at(messages.dscWindowOverlap(steepAt <= glassW[1] ? 'glass' : 'liquid'), block.spanOf('/windows')));
    return { results, diagnostics };
  }
  if (!nominal.step.significant || !nominal.inflection) {
    diagnostics.push(at(messages.dscNoStep(nominal.step.value, nominal.step.u), block.header.kindSpan));
    return { results, diagnostics };
  }
  const tInfl = nominal.inflection.T;
  if (tInfl <= glassW[1]) {
    diagnostics.push(at(messages.dscWindowOverlap('glass'), block.spanOf('/windows')));
    return { results, diagnostics };
  }
  if (tInfl >= liquidW[0]) {
    diagnostics.push(at(messages.dscWindowOverlap('liquid'), block.spanOf('/windows')));
    return { results, diagnostics };
  }
  // A construction that contradicts itself gives no numbers.
  const t1 = glassW[0];
  const t2 = liquidW[1];
  const onset = nominal.onset!;
  const negative = typical > 0 && [t1, t2].some((t) => predict(glass, t) < 0 || predict(liquid, t) < 0);
  if (negative) {
    diagnostics.push(at(messages.dscInconsistent('a baseline extrapolates to a negative heat capacity inside the scan'), block.spanOf(userGlass || userLiquid ? '/windows' : '/data')));
    return { results, diagnostics };
  }
  // With an overshoot the tangent at the steepest rise can meet the glass baseline a little above
  // the half-step point; a midpoint further below the onset than the inflection lies above it is
  // a construction on a wrong baseline.
  if (nominal.midpoint && nominal.midpoint.T < onset.T - Math.max(0, tInfl - onset.T)) {
    diagnostics.push(at(messages.dscInconsistent(`the midpoint (${nominal.midpoint.T.toFixed(1)} K) lies below the extrapolated onset (${onset.T.toFixed(1)} K)`), block.spanOf(userGlass || userLiquid ? '/windows' : '/data')));
    return { results, diagnostics };
  }
  if (tInfl < onset.T) {
    diagnostics.push(at(messages.dscInconsistent(`the inflection (${tInfl.toFixed(1)} K) lies below the extrapolated onset (${onset.T.toFixed(1)} K)`), block.spanOf(userGlass || userLiquid ? '/windows' : '/data')));
    return { results, diagnostics };
  }

  // Sensitivity to the baseline windows: each window shortened by a quarter at either end.
  const variants: Construction[] = [];
  const shrink = (w: readonly [number, number], side: 0 | 1): [number, number] => (side === 0 ? [w[0] + 0.25 * (w[1] - w[0]), w[1]] : [w[0], w[1] - 0.25 * (w[1] - w[0])]);
  for (const [g, l] of [
    [shrink(glassW, 0), liquidW],
    [shrink(glassW, 1), liquidW],
    [glassW, shrink(liquidW, 0)],
    [glassW, shrink(liquidW, 1)],
  ] as const) {
    const v = construct(curve, g, l, floor);
    if (typeof v !== 'string' && v.step.significant && !v.step.inverted) variants.push(v);
  }
  const spread = (pick: (c: Construction) => number | undefined, nominalValue: number): number => {
    const values = [nominalValue, ...variants.map(pick).filter((v): v is number => v !== undefined && Number.isFinite(v))];
    return values.length > 1 ? (Math.max(...values) - Math.min(...values)) / 2 / Math.sqrt(3) : NaN;
  };
  const calibration = block.quantities.get('/temperature_calibration')?.value ?? DEFAULT_DSC_CALIBRATION;
  const calibrationTerm = { source: 'calibration', value: calibration, note: `temperature calibration${block.quantities.get('/temperature_calibration') ? '' : ' (default 0.5 K)'}` };
  const windowNote = 'baseline windows shortened by a quarter at either end: half range / √3';
  const windows = `glass ${Number(glassW[0].toPrecision(5))}–${Number(glassW[1].toPrecision(5))} K${userGlass ? '' : ' (automatic)'}${startup}, liquid ${Number(liquidW[0].toPrecision(5))}–${Number(liquidW[1].toPrecision(5))} K${userLiquid ? '' : ' (automatic)'}`;
  const span = `local cubic over ±${nominal.span.toPrecision(2)} K`;
  const temperatureBudget = (stat: number, statNote: string, window: number): UncertaintyTerm[] => [
    { source: 'statistical', value: stat, note: statNote },
    { source: 'baseline windows', value: window, note: windowNote },
    calibrationTerm,
  ];

  results.tinflection = budgeted(tInfl, 'K', `inflection: zero of the second derivative of a ${span} at the steepest rise (ASTM E1356); baselines ${windows}`, temperatureBudget(nominal.inflection.u, 'from the local cubic fit', spread((v) => v.inflection?.T, tInfl)));
  results.tonset = budgeted(onset.T, 'K', `T_g onset: tangent at the inflection (${span}) ∩ glass baseline (ASTM E1356 / ISO 11357-2 extrapolated onset); baselines ${windows}`, temperatureBudget(onset.u, 'tangent and glass baseline, delta method', spread((v) => v.onset?.T, onset.T)));
  if (nominal.midpoint) {
    const m = nominal.midpoint;
    results.tg_midpoint = budgeted(m.T, 'K', `half step height between the extrapolated baselines (ISO 11357-2 midpoint), ${span}; baselines ${windows}`, temperatureBudget(m.u, 'smoothed curve and mid line, delta method', spread((v) => v.midpoint?.T, m.T)));
    results.step_height = budgeted(m.step, 'J/(g*K)', `liquid minus glass baseline at the midpoint (ISO 11357-2 step height); baselines ${windows}`, [
      { source: 'statistical', value: m.uStep, note: 'the two baselines at the midpoint' },
      { source: 'baseline windows', value: spread((v) => v.midpoint?.step, m.step), note: windowNote },
    ]);
  }

  // Peaks in the liquid region (crystallisation exotherm, melting endotherm).
  {
    const sigma = Math.max(Math.sqrt(liquid.sigma2), 1e-9);
    let low = 0;
    let high = 0;
    for (let i = 0; i < n; i++) {
      if (T[i] < liquidW[0]) continue;
      const r = cp[i] - predict(liquid, T[i]);
      if (r < -8 * sigma) low++;
      if (r > 8 * sigma) high++;
    }
    if (low >= 3) diagnostics.push(at(messages.dscPeaks('exothermic'), block.spanOf('/windows')));
    else if (high >= 3) diagnostics.push(at(messages.dscPeaks('endothermic'), block.spanOf('/windows')));
  }

  // Moynihan area matching.
  if (nominal.tf) {
    const tf = nominal.tf.T;
    if (tf < t1) diagnostics.push(at(messages.dscTfBelowWindow(tf, t1), block.spanOf('/windows')));
    else
      results.tfictive = budgeted(tf, 'K', `Moynihan area matching between ${Number(t1.toPrecision(5))} and ${Number(t2.toPrecision(5))} K; baselines ${windows}`, temperatureBudget(nominal.tf.u, 'baselines and noise on the excess area, first order', spread((v) => v.tf?.T, tf)));
  }

  // Enthalpy gap against the liquid-cooled reference scan (never the scan itself: the gap would be 0 by construction).
  const ref = typeof refId === 'string' && !selfReference ? ctx.lookup(refId, 'dsc') : undefined;
  if (ref) {
    const refCurve = dscCurve(ref);
    const rate = block.quantities.get('/rate')?.value;
    const refRate = ref.quantities.get('/rate')?.value;
    const mass = block.quantities.get('/mass')?.value;
    const refMass = ref.quantities.get('/mass')?.value;
    if (rate !== undefined && refRate !== undefined && Math.abs(rate - refRate) > 1e-9 * Math.max(rate, refRate)) {
      diagnostics.push(at(messages.dscReferenceMismatch('heating rate'), block.spanOf('/reference')));
    } else if (mass !== undefined && refMass !== undefined && Math.abs(mass - refMass) > 1e-9 * Math.max(mass, refMass)) {
      diagnostics.push(at(messages.dscReferenceMismatch('sample mass'), block.spanOf('/reference')));
    } else if ('error' in refCurve || refCurve.T.length < 3) {
      diagnostics.push(at(messages.dscReferenceNoData(String(refId)), block.spanOf('/reference')));
    } else {
      const lo = Math.max(t1, refCurve.T[0]);
      const hi = Math.min(t2, refCurve.T[refCurve.T.length - 1]);
      const refAt = (t: number): number => {
        const R = refCurve.T;
        // The first k ≥ 1 with R[k] ≥ t (or the last row), by bisection: the scans are in rising T.
        let k = 1;
        let hiK = R.length - 1;
        while (k < hiK) {
          const mid = (k + hiK) >> 1;
          if (R[mid] < t) k = mid + 1;
          else hiK = mid;
        }
        const s = (refCurve.cp[k] - refCurve.cp[k - 1]) / (R[k] - R[k - 1]);
        return refCurve.cp[k - 1] + s * (t - R[k - 1]);
      };
      const diff = T.map((t, i) => cp[i] - refAt(t));
      // Noise of both scans on the integral: σ·√(Σ w²) with trapezoid weights w ≈ the row spacing.
      let w2 = 0;
      for (let i = 0; i < n; i++) if (T[i] >= lo && T[i] <= hi) w2 += (0.5 * (T[Math.min(n - 1, i + 1)] - T[Math.max(0, i - 1)])) ** 2;
      const refFit = fitRange(refCurve, [refCurve.T[refCurve.T.length - 1] - 0.15 * (refCurve.T[refCurve.T.length - 1] - refCurve.T[0]), refCurve.T[refCurve.T.length - 1]]);
      const refSigma2 = refFit ? refFit.sigma2 : nominal.sigma2;
      results.enthalpy_gap = budgeted(integrate(T, diff, lo, hi), 'J/g', `∫(Cp − Cp of ${String(refId)})dT from ${Number(lo.toPrecision(5))} to ${Number(hi.toPrecision(5))} K`, [
        { source: 'statistical', value: Math.sqrt((nominal.sigma2 + refSigma2) * w2), note: 'noise of both scans on the trapezoid integral' },
      ]);
      const glassDiff = T.map((t, i) => (t >= glassW[0] && t <= glassW[1] ? diff[i] : 0));
      if (glassDiff.reduce((s, v) => s + v, 0) < 0) diagnostics.push(at(messages.dscCpBelowReference(), block.spanOf('/reference')));
    }
  }

  // Equivalent aging time from the fictive temperature.
  if (results.tfictive) addAging(block, ctx, results.tfictive.value, results, diagnostics);
  const tangent = { c: nominal.inflection.value, slope: nominal.inflection.slope, xc: tInfl };
  return { results, diagnostics, figure: dscFigure(curve, glass, liquid, tangent, results, t1, t2) };
}

/** Cp with both baselines, the tangent at greatest slope, the excess area and the markers. */
function dscFigure(c: DscCurve, glass: LineFit, liquid: LineFit, tangent: { c: number; slope: number; xc: number }, results: Record<string, ResultValue>, t1: number, t2: number): FigureData {
  const idx = thinIndices(c.T.length);
  const on = results.tonset?.value;
  const tm = results.tg_midpoint?.value;
  const tf = results.tfictive?.value;
  const lo = c.T[0];
  const hi = c.T[c.T.length - 1];
  // The tangent from where it meets the glass baseline to where it meets the liquid one.
  const meets = (f: LineFit): number => (tangent.c - tangent.slope * tangent.xc - (f.c - f.slope * f.xc)) / (f.slope - tangent.slope);
  const t0 = meets(glass);
  const te = meets(liquid);
  return {
    xTitle: 'T / K',
    yTitle: 'Cp / (J g⁻¹ K⁻¹)',
    // Heat capacity (heat flow is turned into Cp): an endotherm goes up.
    endotherm: 'up',
    series: [
      { name: 'excess area', role: 'area', meaning: 'construction', points: idx.filter((i) => c.T[i] >= t1 && c.T[i] <= t2).map((i) => [c.T[i], c.cp[i], predict(glass, c.T[i])]) },
      { name: 'data', role: 'data', meaning: 'data', points: idx.map((i) => [c.T[i], c.cp[i]]) },
      { name: 'glass baseline', role: 'baseline', meaning: 'construction', points: linePoints(glass, lo, hi) },
      { name: 'liquid baseline', role: 'baseline', meaning: 'supercooled-liquid', points: linePoints(liquid, lo, hi) },
      { name: 'tangent at greatest slope', role: 'tangent', meaning: 'construction', points: linePoints(tangent, Math.min(t0, te) - 1, Math.max(t0, te) + 1) },
    ],
    markers: [
      ...(on !== undefined ? [{ label: `onset ${on.toFixed(1)} K`, x: on }] : []),
      ...(tm !== undefined ? [{ label: `midpoint ${tm.toFixed(1)} K`, x: tm }] : []),
      ...(tf !== undefined ? [{ label: `Tf ${tf.toFixed(1)} K`, x: tf }] : []),
    ],
  };
}
