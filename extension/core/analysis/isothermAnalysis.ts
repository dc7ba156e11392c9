/**
 * Isotherm results: the continuous plateau–transformation–plateau fit
 * (threeSegmentFit.ts) gives the start t₁ and end t₂ of the transformation.
 * - `onset_time` = t₁ − t₀ and `transformation_time` = t₂ − t₀, with t₀ when the sample came within
 *   0.5 K of the hold temperature (the first time without a temperature column);
 * - `front_velocity` = h_VD/((t₂ − t₁)·n_f), h_VD the as-deposited plateau at t₁ (growth fronts
 *   from the free surface, n_f = 1, or also from the substrate, n_f = 2; Swallen et al., PRL 102,
 *   065503 (2009) for the constant-velocity front);
 * - `tau_alpha` from the material's VFT law at the hold temperature, and
 *   `stability_ratio` = transformation_time/τα.
 *
 * Policy: no final plateau gives the values as lower bounds with a warning; a material without
 * VFT parameters or relaxation data gives no τα.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { firstAbruptDrop } from '../numeric/abruptDrop.js';
import { fitThreeSegments, threeSegmentValue, type ThreeSegmentFit } from '../numeric/threeSegmentFit.js';
import { result, type ResultValue } from '../model/result.js';
import { thinIndices } from '../numeric/thin.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData } from '../model/figure.js';
import { materialOf } from './blockLinks.js';
import { materialVft } from './materialAnalysis.js';
import { vftLog10Tau } from './vft.js';

export function isothermFit(block: ParsedBlock): { fit: ThreeSegmentFit; t0: number; t0Row: number } | null {
  const t = block.table?.byRole.get('time')?.values;
  const h = block.table?.byRole.get('thickness')?.values;
  if (!t || !h) return null;
  const fit = fitThreeSegments(t, h);
  if (!fit) return null;
  const hold = block.quantities.get('/temperature')?.value;
  const T = block.table?.byRole.get('temperature')?.values;
  let t0Row = 0;
  if (T && hold !== undefined) {
    const i = T.findIndex((v) => Math.abs(v - hold) <= 0.5);
    if (i >= 0) t0Row = i;
  }
  return { fit, t0: t[t0Row], t0Row };
}

export function analyzeIsotherm(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const table = block.table;
  if (!table || table.rowCount === 0) return { results, diagnostics };
  const t = table.byRole.get('time')?.values;
  const h = table.byRole.get('thickness')?.values;
  if (!t || !h) {
    if (table.problems.length === 0) diagnostics.push(at(messages.isoNoColumns(), block.spanOf('/data')));
    return { results, diagnostics };
  }
  const found = isothermFit(block);
  if (!found) {
    diagnostics.push(at(messages.isoNoFit(), block.header.kindSpan));
    return { results, diagnostics };
  }
  const { fit, t0, t0Row } = found;
  const hold = block.quantities.get('/temperature')?.value;
  const T = table.byRole.get('temperature')?.values;
  if (T && hold !== undefined) {
    let worst = 0;
    let row = -1;
    for (let i = t0Row; i < T.length; i++) {
      const dev = Math.abs(T[i] - hold);
      if (dev > worst) {
        worst = dev;
        row = i;
      }
    }
    if (worst > 0.3 && row >= 0) diagnostics.push(at(messages.isoDrift(worst), block.rowSpan(row)));
  }
  const hVd = fit.a + fit.b1 * fit.t1;
  const hL = fit.a + fit.b1 * fit.t2 + fit.b2 * (fit.t2 - fit.t1);
  const sigmaH = Math.max(fit.sigma, 1e-12);
  if (Math.abs(hL - hVd) < 5 * sigmaH) {
    diagnostics.push(at(messages.isoNoTransformation(), block.header.kindSpan));
    return { results, diagnostics };
  }
  const figure = isothermFigure(t, h, fit, hVd, hL, t0);
  const cov = fit.covariance;
  const se = (k: number): number | undefined => (cov ? Math.sqrt(Math.max(0, cov[k][k])) : undefined);
  // A final plateau needs points after t₂ and a final slope well below the transformation's.
  const rampSlope = fit.b1 + fit.b2;
  const finalSlope = rampSlope + fit.b3;
  const lowerBound = fit.pointsAfter < 5 || Math.abs(finalSlope) > 0.2 * Math.abs(rampSlope);
  const bound = lowerBound ? ' (lower bound: no final plateau)' : '';
  if (lowerBound) diagnostics.push(at(messages.isoNoFinalPlateau(), block.rowSpan(table.rowCount - 1)));
  if (fit.t1 < t0) diagnostics.push(at(messages.isoTransformedDuringRamp(), block.rowSpan(t0Row)));
  isothermChecks(block, t, h, fit, lowerBound, diagnostics);
  const method = 'plateau–transformation–plateau fit (continuous, three segments)';
  results.onset_time = result(fit.t1 - t0, 's', `${method}: t₁ − t₀`, se(4));
  const trans = fit.t2 - t0;
  results.transformation_time = result(trans, 's', `${method}: t₂ − t₀${bound}`, se(5));
  const fronts = block.metadata.data.fronts === 2 ? 2 : 1;
  const duration = fit.t2 - fit.t1;
  const varDuration = cov ? cov[4][4] + cov[5][5] - 2 * cov[4][5] : NaN;
  const v = hVd / (duration * fronts);
  results.front_velocity = result(v, 'nm/s', `h_VD/((t₂ − t₁)·${fronts}) with ${fronts} front${fronts === 2 ? 's' : ''}${bound}`, Number.isFinite(varDuration) ? (v * Math.sqrt(Math.max(0, varDuration))) / duration : undefined);

  // τα from the material's VFT law.
  const material = materialOf(block, ctx);
  const materialId = material?.id;
  if (material && hold !== undefined) {
    const vft = materialVft(material, ctx);
    if (!vft) {
      diagnostics.push(at(messages.isoNoVft(String(materialId)), block.spanOf('/temperature')));
    } else {
      const logTau = vftLog10Tau(vft.p, hold);
      if (Number.isFinite(logTau)) {
        const tau = Math.pow(10, logTau);
        results.tau_alpha = result(tau, 's', `VFT law of ${String(materialId)} (${vft.source}) at ${hold} K`);
        const s = trans / tau;
        const u = se(5);
        results.stability_ratio = result(s, '1', `transformation_time / tau_alpha${bound}`, u !== undefined ? u / tau : undefined);
        if (vft.range && (hold < vft.range[0] || hold > vft.range[1])) diagnostics.push(at(messages.isoTauExtrapolated(hold, vft.range[0], vft.range[1]), block.spanOf('/temperature')));
      }
    }
  }
  return { results, diagnostics, figure };
}

/** Evaporation after the plateau, abrupt drops and a non-linear transformation. */
function isothermChecks(block: ParsedBlock, t: Float64Array, h: Float64Array, fit: ThreeSegmentFit, lowerBound: boolean, diagnostics: Diagnostic[]): void {
  const n = t.length;
  const model = (ti: number): number => threeSegmentValue(fit, ti);
  const rampSlope = fit.b1 + fit.b2;
  const finalSlope = rampSlope + fit.b3;
  if (!lowerBound && Math.sign(finalSlope) === -Math.sign(rampSlope) && Math.abs(finalSlope) > 0.02 * Math.abs(rampSlope)) {
    diagnostics.push(at(messages.isoEvaporation(), block.rowSpan(n - 1)));
  }
  // The fitted transformation is smooth, so a drop against the plateau steps is abrupt.
  const drop = firstAbruptDrop(h, 1e-9 * Math.abs(h[0]));
  if (drop.index >= 0) diagnostics.push(at(messages.isoAbruptDrop(drop.drop), block.rowSpan(drop.index)));
  // Residual autocorrelation over the transformation.
  let num = 0;
  let den = 0;
  let prev: number | null = null;
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (t[i] <= fit.t1 || t[i] >= fit.t2) continue;
    const e = h[i] - model(t[i]);
    if (prev !== null) num += (e - prev) ** 2;
    den += e * e;
    prev = e;
    count++;
  }
  // Exact data have rounding-level residuals with no meaning: require residuals above 1e-9 of h.
  const meaningful = fit.sigma > 1e-9 * Math.abs(fit.a + fit.b1 * fit.t1);
  if (meaningful && count >= 20 && den > 0 && num / den < 1) diagnostics.push(at(messages.isoSigmoidal(num / den), block.header.kindSpan));
}

/** The transformed fraction x(t) = (h − h_VD)/(h_L − h_VD) with the fitted three segments. */
function isothermFigure(t: Float64Array, h: Float64Array, fit: ThreeSegmentFit, hVd: number, hL: number, t0: number): FigureData {
  const x = (v: number): number => (v - hVd) / (hL - hVd);
  const model = (ti: number): number => threeSegmentValue(fit, ti);
  const first = t[0];
  const last = t[t.length - 1];
  return {
    xTitle: 't / s (from the start of the hold)',
    yTitle: 'transformed fraction x',
    series: [
      { name: 'data', role: 'data', points: thinIndices(t.length).map((i) => [t[i] - t0, x(h[i])]) },
      { name: 'three-segment fit', role: 'line', points: [first, fit.t1, fit.t2, last].map((ti) => [ti - t0, x(model(ti))]) },
    ],
    markers: [
      { label: `onset ${(fit.t1 - t0).toFixed(0)} s`, x: fit.t1 - t0 },
      { label: `end ${(fit.t2 - t0).toFixed(0)} s`, x: fit.t2 - t0 },
    ],
  };
}
