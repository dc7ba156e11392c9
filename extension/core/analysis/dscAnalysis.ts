/**
 * Calorimetry results (ASTM E1356 and ISO 11357-2 for the construction names).
 *
 * - Heat capacity from the data, or from heat flow as Cp = Φ/(m·q).
 * - Glass and liquid baselines: straight lines over `windows.glass` and `windows.liquid`
 *   (default the lowest 20 % and the highest 15 % of the temperature range).
 * - `tinflection`: the greatest slope of Cp (local linear regression over about ±0.3 K);
 *   `tonset`: the tangent there meets the glass baseline (extrapolated onset);
 *   `tg_midpoint`: Cp crosses the line halfway between the baselines (half step height);
 *   `step_height`: ΔCp between the baselines at the midpoint.
 * - `tfictive` by Moynihan area matching (Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)):
 *   ∫_{Tf}^{T₂}(Cp,l − Cp,g)dT = ∫_{T₁}^{T₂}(Cp − Cp,g)dT, T₁ the start of the glass window and T₂
 *   the end of the liquid window; with linear baselines the left side is quadratic in Tf.
 * - `enthalpy_gap` = ∫_{T₁}^{T₂}(Cp − Cp,ref)dT against the liquid-cooled reference scan named by
 *   `reference:` (H_LC − H of this glass), over the range both scans cover.
 *
 * Policy: missing columns, mass or windows give diagnostics; a scan without a step gives no
 * transition results.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { fitLine, fitLineWhere, predict, type LineFit } from '../numeric/lineFit.js';
import { result, type ResultValue } from '../model/result.js';
import { linePoints, thinIndices } from '../numeric/thin.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData } from '../model/figure.js';
import { addAging } from './agingTime.js';
import { metadataWindow } from './blockLinks.js';

export interface DscCurve {
  readonly T: number[];
  readonly cp: number[];
}

/** The heat-capacity curve of a dsc block, sorted by temperature, or a reason. */
export function dscCurve(block: ParsedBlock): DscCurve | { error: 'columns' | 'mass' } {
  const table = block.table;
  const T = table?.byRole.get('temperature')?.values;
  const heatFlow = block.metadata.data.quantity === 'heat flow';
  const specific = heatFlow ? table?.byRole.get('specific_heat_flow')?.values : undefined;
  const y = heatFlow ? (specific ?? table?.byRole.get('heat_flow')?.values) : table?.byRole.get('heat_capacity')?.values;
  if (!T || !y) return { error: 'columns' };
  let factor = 1;
  if (specific) {
    const rate = block.quantities.get('/rate')?.value; // K/min
    if (!rate) return { error: 'mass' };
    factor = 1 / (rate / 60); // (W/g)/(K/s) = J/(g·K)
  } else if (heatFlow) {
    const mass = block.quantities.get('/mass')?.value; // mg
    const rate = block.quantities.get('/rate')?.value; // K/min
    if (!mass || !rate) return { error: 'mass' };
    factor = 1 / (mass * (rate / 60)); // mW/(mg·K/s) = J/(g·K)
  }
  const idx = Array.from(T, (_, i) => i).sort((a, b) => T[a] - T[b]);
  return { T: idx.map((i) => T[i]), cp: idx.map((i) => y[i] * factor) };
}

function window(block: ParsedBlock, name: string, fallback: [number, number]): [number, number] {
  return metadataWindow(block, name) ?? fallback;
}

/** A baseline over a window; at least 3 points. */
function fitRange(c: DscCurve, w: [number, number]): LineFit | null {
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
  const { T, cp } = curve;
  const n = T.length;
  if (n < MIN_DSC_ROWS) {
    diagnostics.push(at(messages.tableTooFewRows('dsc', n, MIN_DSC_ROWS, 'to fit the glass and liquid baselines on both sides of the step'), block.header.kindSpan));
    return { results, diagnostics };
  }
  const range = T[n - 1] - T[0];
  const glassW = window(block, 'glass', [T[0], T[0] + 0.2 * range]);
  const liquidW = window(block, 'liquid', [T[n - 1] - 0.15 * range, T[n - 1]]);
  const glass = fitRange(curve, glassW);
  const liquid = fitRange(curve, liquidW);
  if (!glass) diagnostics.push(at(messages.dscTooFew('glass'), block.spanOf('/windows')));
  if (!liquid) diagnostics.push(at(messages.dscTooFew('liquid'), block.spanOf('/windows')));
  if (!glass || !liquid) return { results, diagnostics };

  // Greatest slope between the windows, by local linear regression over about ±0.3 K.
  const spacing = range / (n - 1);
  const half = Math.max(2, Math.round(0.3 / spacing));
  let best = { slope: -Infinity, i: -1, value: NaN };
  for (let i = half; i < n - half; i++) {
    const f = fitLine(T, cp, i - half, i + half + 1);
    if (f && f.slope > best.slope) best = { slope: f.slope, i, value: predict(f, T[i]) };
  }
  if (best.i < 0) return { results, diagnostics };
  const tInfl = T[best.i];
  if (tInfl <= glassW[1]) {
    diagnostics.push(at(messages.dscWindowOverlap('glass'), block.spanOf('/windows')));
    return { results, diagnostics };
  }
  if (tInfl >= liquidW[0]) {
    diagnostics.push(at(messages.dscWindowOverlap('liquid'), block.spanOf('/windows')));
    return { results, diagnostics };
  }
  const at0 = (f: LineFit, t: number): number => predict(f, t);
  if (!(at0(liquid, tInfl) > at0(glass, tInfl))) {
    diagnostics.push(at(messages.dscNoStep(), block.header.kindSpan));
    return { results, diagnostics };
  }
  results.tinflection = result(tInfl, 'K', 'greatest slope of Cp (local linear regression)');
  // Tangent at the inflection: Cp = value + slope·(T − tInfl).
  const tangentMeets = (f: LineFit): number => (best.value - best.slope * tInfl - (f.c - f.slope * f.xc)) / (f.slope - best.slope);
  results.tonset = result(tangentMeets(glass), 'K', 'extrapolated onset: tangent at greatest slope ∩ glass baseline (ASTM E1356 / ISO 11357-2 construction)');

  // Half step height: first upward crossing of the mid line after the glass window.
  const g = (i: number): number => cp[i] - 0.5 * (at0(glass, T[i]) + at0(liquid, T[i]));
  for (let i = 1; i < n; i++) {
    if (T[i] <= glassW[1]) continue;
    if (g(i - 1) < 0 && g(i) >= 0) {
      const tm = T[i - 1] + ((T[i] - T[i - 1]) * -g(i - 1)) / (g(i) - g(i - 1));
      results.tg_midpoint = result(tm, 'K', 'half step height between the extrapolated baselines (ISO 11357-2 midpoint)');
      results.step_height = result(at0(liquid, tm) - at0(glass, tm), 'J/(g*K)', 'liquid minus glass baseline at the midpoint');
      break;
    }
  }

  // Peaks in the liquid region (crystallisation exotherm, melting endotherm).
  {
    const sigma = Math.max(Math.sqrt(liquid.sigma2), 1e-9);
    let low = 0;
    let high = 0;
    for (let i = 0; i < n; i++) {
      if (T[i] < liquidW[0]) continue;
      const r = cp[i] - at0(liquid, T[i]);
      if (r < -8 * sigma) low++;
      if (r > 8 * sigma) high++;
    }
    if (low >= 3) diagnostics.push(at(messages.dscPeaks('exothermic'), block.spanOf('/windows')));
    else if (high >= 3) diagnostics.push(at(messages.dscPeaks('endothermic'), block.spanOf('/windows')));
  }

  // Moynihan area matching.
  const t1 = glassW[0];
  const t2 = liquidW[1];
  const excess = cp.map((c, i) => c - at0(glass, T[i]));
  const area = integrate(T, excess, t1, t2);
  // ΔCp_b(T) = a + b·T, the difference of the two baselines.
  const b = liquid.slope - glass.slope;
  const a = liquid.c - liquid.slope * liquid.xc - (glass.c - glass.slope * glass.xc);
  const tf = moynihanTf(a, b, t2, area);
  if (Number.isFinite(tf)) {
    if (tf < t1) diagnostics.push(at(messages.dscTfBelowWindow(tf, t1), block.spanOf('/windows')));
    else results.tfictive = result(tf, 'K', `Moynihan area matching between ${Number(t1.toPrecision(5))} and ${Number(t2.toPrecision(5))} K`);
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
        let k = 1;
        while (k < R.length - 1 && R[k] < t) k++;
        const s = (refCurve.cp[k] - refCurve.cp[k - 1]) / (R[k] - R[k - 1]);
        return refCurve.cp[k - 1] + s * (t - R[k - 1]);
      };
      const diff = T.map((t, i) => cp[i] - refAt(t));
      results.enthalpy_gap = result(integrate(T, diff, lo, hi), 'J/g', `∫(Cp − Cp of ${String(refId)})dT from ${Number(lo.toPrecision(5))} to ${Number(hi.toPrecision(5))} K`);
      const glassDiff = T.map((t, i) => (t >= glassW[0] && t <= glassW[1] ? diff[i] : 0));
      if (glassDiff.reduce((s, v) => s + v, 0) < 0) diagnostics.push(at(messages.dscCpBelowReference(), block.spanOf('/reference')));
    }
  }

  // Equivalent aging time from the fictive temperature.
  if (results.tfictive) addAging(block, ctx, results.tfictive.value, results, diagnostics);
  const tangent = { c: best.value, slope: best.slope, xc: tInfl };
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
    series: [
      { name: 'excess area', role: 'area', points: idx.filter((i) => c.T[i] >= t1 && c.T[i] <= t2).map((i) => [c.T[i], c.cp[i], predict(glass, c.T[i])]) },
      { name: 'data', role: 'data', points: idx.map((i) => [c.T[i], c.cp[i]]) },
      { name: 'glass baseline', role: 'baseline', points: linePoints(glass, lo, hi) },
      { name: 'liquid baseline', role: 'baseline', points: linePoints(liquid, lo, hi) },
      { name: 'tangent at greatest slope', role: 'tangent', points: linePoints(tangent, Math.min(t0, te) - 1, Math.max(t0, te) + 1) },
    ],
    markers: [
      ...(on !== undefined ? [{ label: `onset ${on.toFixed(1)} K`, x: on }] : []),
      ...(tm !== undefined ? [{ label: `midpoint ${tm.toFixed(1)} K`, x: tm }] : []),
      ...(tf !== undefined ? [{ label: `Tf ${tf.toFixed(1)} K`, x: tf }] : []),
    ],
  };
}
