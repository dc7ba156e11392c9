/**
 * Isotherm results: the continuous plateau–transformation–plateau fit
 * (threeSegmentFit.ts, global breakpoint search) over the rows from t₀ on gives the start t₁ and
 * end t₂ of the transformation, t₀ when the sample came within 0.5 K of the hold temperature
 * (the first row without a temperature column); the ramp-in before t₀ is not fitted.
 * - `onset_time` = t₁ − t₀ and `transformation_time` = t₂ − t₀;
 * - `front_velocity` = h_VD/((t₂ − t₁)·n_f), h_VD the as-deposited plateau at t₁ (growth fronts
 *   from the free surface, n_f = 1, or also from the substrate, n_f = 2; Swallen et al., PRL 102,
 *   065503 (2009) for the constant-velocity front);
 * - `tau_alpha` from the material's VFT law at the hold temperature, and
 *   `stability_ratio` = transformation_time/τα.
 * - Budgets (GUM, JCGM 100:2008): statistical (the fit covariance) and the time origin (t₀ within
 *   one sampling interval, rectangular).
 *
 * Policy: without a final plateau the transformation time is a lower bound (t_last − t₀) and the
 * front velocity an upper bound (h_VD/((t_last − t₁)·n_f)), labelled so, with a warning; a hold
 * that began on the transformation reports only its end; a material without VFT parameters or
 * relaxation data gives no τα.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { firstAbruptDrop } from '../numeric/abruptDrop.js';
import { fitThreeSegments, threeSegmentValue, type ThreeSegmentFit } from '../numeric/threeSegmentFit.js';
import { budgeted, type ResultValue } from '../model/result.js';
import { thinIndices } from '../numeric/thin.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData } from '../model/figure.js';
import { materialOf } from './blockLinks.js';
import { materialVft } from './materialAnalysis.js';
import { relaxationWithoutFit } from './relaxationAnalysis.js';
import { vftLog10Tau } from './vft.js';

/** Where the hold starts: t₀ (s), its first row, and the standard uncertainty of t₀ (s). */
export interface HoldStart {
  readonly t0: number;
  readonly t0Row: number;
  readonly uT0: number;
  /** How t₀ was found, for the method labels. */
  readonly how: string;
}

/**
 * t₀: when the temperature column first comes within 0.5 K of the hold temperature, interpolated
 * linearly between the two rows that bracket the crossing; without a temperature column (or when
 * it never comes that close), the first row. Its standard uncertainty is that of a rectangular
 * distribution over one sampling interval (GUM, JCGM 100:2008, §4.3.7: half-width a, u = a/√3),
 * since the log says no more than that the sample was at temperature by the next row.
 */
export function holdStart(block: ParsedBlock): HoldStart | null {
  const t = block.table?.byRole.get('time')?.values;
  if (!t || t.length < 2) return null;
  const hold = block.quantities.get('/temperature')?.value;
  const T = block.table?.byRole.get('temperature')?.values;
  const interval = (i: number): number => Math.abs(t[Math.min(t.length - 1, Math.max(1, i))] - t[Math.min(t.length - 1, Math.max(1, i)) - 1]);
  if (T && hold !== undefined) {
    const i = T.findIndex((v) => Math.abs(v - hold) <= 0.5);
    if (i > 0) {
      // The crossing of hold ∓ 0.5 K between rows i − 1 and i.
      const target = T[i - 1] < hold ? hold - 0.5 : hold + 0.5;
      const f = T[i] !== T[i - 1] ? (target - T[i - 1]) / (T[i] - T[i - 1]) : 1;
      const t0 = t[i - 1] + Math.min(1, Math.max(0, f)) * (t[i] - t[i - 1]);
      return { t0, t0Row: i, uT0: interval(i) / 2 / Math.sqrt(3), how: 't₀ where T first came within 0.5 K of the hold' };
    }
    if (i === 0) return { t0: t[0], t0Row: 0, uT0: interval(1) / 2 / Math.sqrt(3), how: 't₀ the first row (already within 0.5 K of the hold)' };
  }
  return { t0: t[0], t0Row: 0, uT0: interval(1) / 2 / Math.sqrt(3), how: 't₀ the first row (no temperature column)' };
}

/** The three-segment fit of a hold over its rows from t₀ on (the ramp-in is not fitted). */
export function isothermFit(block: ParsedBlock): { fit: ThreeSegmentFit; start: HoldStart } | null {
  const t = block.table?.byRole.get('time')?.values;
  const h = block.table?.byRole.get('thickness')?.values;
  const start = holdStart(block);
  if (!t || !h || !start) return null;
  const fit = fitThreeSegments(t.subarray(start.t0Row), h.subarray(start.t0Row));
  return fit ? { fit, start } : null;
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
  const { fit, start } = found;
  const { t0, t0Row, uT0 } = start;
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
  // Which segment is the transformation: the middle one, unless the fit spent its first
  // breakpoint on the as-deposited plateau and the last segment runs up to the end of the log
  // (the hold ended during the transformation), or the hold began on it (transformed during the
  // ramp-in). A segment is the transformation when it changes h most and is much steeper than the middle one.
  const tStart = t[t0Row];
  const tLast = t[t.length - 1];
  const s1 = fit.b1;
  const s2 = fit.b1 + fit.b2;
  const s3 = s2 + fit.b3;
  const d1 = Math.abs(s1) * (fit.t1 - tStart);
  const d2 = Math.abs(s2) * (fit.t2 - fit.t1);
  const d3 = Math.abs(s3) * (tLast - fit.t2);
  const sigmaH = Math.max(fit.sigma, 1e-12);
  // The hold began on the transformation: the first segment changes h most and is steep, or is
  // as steep as the middle one (a transformation split in two), or the plateau holds < 3 rows.
  let rowsBefore = 0;
  for (let i = t0Row; i < t.length && t[i] <= fit.t1; i++) rowsBefore++;
  const beganOnRamp = (d1 > d2 && Math.abs(s1) > 3 * Math.abs(s2) && d1 > 5 * sigmaH) || (Math.sign(s1) === Math.sign(s2) && Math.abs(s1) > 0.3 * Math.abs(s2) && d1 > 5 * sigmaH) || rowsBefore < 3;
  if (beganOnRamp) {
    // Only the end of the transformation is measured; the onset and the as-deposited thickness are not.
    diagnostics.push(at(messages.isoTransformedDuringRamp(), block.rowSpan(t0Row)));
    const end = d1 > d2 && Math.abs(s1) > 3 * Math.abs(s2) ? fit.t1 : fit.t2;
    const k = end === fit.t1 ? 4 : 5;
    const u = fit.covariance ? Math.sqrt(Math.max(0, fit.covariance[k][k])) : NaN;
    results.transformation_time = budgeted(end - start.t0, 's', `end of the transformation, which began during the ramp-in (three-segment fit from ${start.how})`, [
      { source: 'statistical', value: u, note: 'from the fit covariance σ²(JᵀJ)⁻¹' },
      { source: 'time origin', value: uT0, note: 't₀ within one sampling interval: half-width / √3' },
    ]);
    return { results, diagnostics, figure: isothermFigure(t, h, fit, threeSegmentValue(fit, start.t0), threeSegmentValue(fit, end), start.t0, start.t0, end) };
  }
  const lastIsRamp = d3 > d2 && Math.abs(s3) > 3 * Math.abs(s2);
  // Onset, end, as-deposited plateau and slopes of the transformation and after it.
  const cov = fit.covariance;
  const se = (k: number): number => (cov ? Math.sqrt(Math.max(0, cov[k][k])) : NaN);
  const seg = lastIsRamp
    ? { on: fit.t2, uOn: se(5), off: tLast, uOff: NaN, rampSlope: s3, finalSlope: NaN, after: 0 }
    : { on: fit.t1, uOn: se(4), off: fit.t2, uOff: se(5), rampSlope: s2, finalSlope: s3, after: fit.pointsAfter };
  const hVd = threeSegmentValue(fit, seg.on);
  const hL = threeSegmentValue(fit, seg.off);
  if (Math.abs(hL - hVd) < 5 * sigmaH) {
    diagnostics.push(at(messages.isoNoTransformation(), block.header.kindSpan));
    return { results, diagnostics };
  }
  // A final plateau needs points after the end and a final slope well below the transformation's
  // in the same direction (a slope against it is evaporation, checked below).
  const unfinished = lastIsRamp || seg.after < 5 || (Math.sign(seg.finalSlope) === Math.sign(seg.rampSlope) && Math.abs(seg.finalSlope) > 0.2 * Math.abs(seg.rampSlope));
  if (unfinished) diagnostics.push(at(messages.isoNoFinalPlateau(), block.rowSpan(table.rowCount - 1)));
  const figure = isothermFigure(t, h, fit, hVd, hL, t0, seg.on, seg.off);
  isothermChecks(block, t, h, fit, unfinished || lastIsRamp, diagnostics);
  const method = `plateau–transformation–plateau fit (continuous, three segments, global breakpoint search) from ${start.how}`;
  const origin = { source: 'time origin', value: uT0, note: 't₀ within one sampling interval: half-width / √3' };
  results.onset_time = budgeted(seg.on - t0, 's', `${method}: t₁ − t₀`, [{ source: 'statistical', value: seg.uOn, note: 't₁ from the fit covariance σ²(JᵀJ)⁻¹' }, origin]);
  const fronts = block.metadata.data.fronts === 2 ? 2 : 1;
  const frontText = `${fronts} front${fronts === 2 ? 's' : ''}`;
  let trans: number;
  if (unfinished) {
    // The film had not finished transforming when the log ends: t_trans ≥ t_last − t₀, so v ≤ h_VD/((t_last − t₁)·n_f).
    trans = tLast - t0;
    results.transformation_time = budgeted(trans, 's', 'lower bound: end of the data t_last − t₀ (no final plateau; the transformation lasts longer)', [origin]);
    const duration = tLast - seg.on;
    const v = hVd / (duration * fronts);
    results.front_velocity = budgeted(v, 'nm/s', `upper bound: h_VD/((t_last − t₁)·${fronts}) with ${frontText} (no final plateau; the front is slower)`, [
      { source: 'statistical', value: (v * seg.uOn) / duration, note: 't₁ from the fit covariance' },
    ]);
  } else {
    trans = seg.off - t0;
    results.transformation_time = budgeted(trans, 's', `${method}: t₂ − t₀`, [{ source: 'statistical', value: seg.uOff, note: 't₂ from the fit covariance σ²(JᵀJ)⁻¹' }, origin]);
    const duration = seg.off - seg.on;
    const varDuration = cov ? cov[4][4] + cov[5][5] - 2 * cov[4][5] : NaN;
    const v = hVd / (duration * fronts);
    results.front_velocity = budgeted(v, 'nm/s', `h_VD/((t₂ − t₁)·${fronts}) with ${frontText}, from the three-segment fit`, [
      { source: 'statistical', value: (v * Math.sqrt(Math.max(0, varDuration))) / duration, note: 't₂ − t₁ from the fit covariance' },
    ]);
  }
  const bound = unfinished ? ' (lower bound: no final plateau)' : '';

  // τα from the material's VFT law.
  const material = materialOf(block, ctx);
  const materialId = material?.id;
  if (material && hold !== undefined) {
    const vft = materialVft(material, ctx);
    if (!vft) {
      diagnostics.push(at(messages.isoNoVft(String(materialId), relaxationWithoutFit(material.id ?? '', ctx)), block.spanOf('/temperature')));
    } else {
      const logTau = vftLog10Tau(vft.p, hold);
      if (Number.isFinite(logTau)) {
        const tau = Math.pow(10, logTau);
        // u(log10 τ) by the delta method with the covariance of (A, B, T0): gradient (1, 1/(T − T0), B/(T − T0)²).
        let uLog = NaN;
        if (vft.cov) {
          const d = hold - vft.p.T0;
          const g = [1, 1 / d, vft.p.B / (d * d)];
          let v = 0;
          for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) v += g[i] * (vft.cov[i]?.[j] ?? 0) * g[j];
          uLog = Math.sqrt(Math.max(0, v));
        }
        const lawNote = `u(log10 τα) = ${Number(uLog.toPrecision(2))} from the VFT parameters' covariance, delta method`;
        // The hold's thermometer: d log10 τ / dT = −B/(T − T0)², so u(log10 τ) = B·u_T/(T − T0)²
        // (about 0.1 decade for 0.5 K near Tg): calibration as in the other temperature figures.
        const written = block.quantities.get('/temperature_calibration');
        const uT = written?.value ?? DEFAULT_HOLD_CALIBRATION;
        const uLogT = (vft.p.B * uT) / ((hold - vft.p.T0) * (hold - vft.p.T0));
        const calibrationNote = `hold temperature ± ${uT} K${written ? '' : ' assumed (write temperature_calibration to change it)'}: u(log10 τα) = B·u_T/(T − T0)²`;
        results.tau_alpha = budgeted(tau, 's', `VFT law of ${String(materialId)} (${vft.source}) at ${hold} K`, [
          { source: 'VFT law', value: tau * Math.LN10 * uLog, note: lawNote },
          { source: 'calibration', value: tau * Math.LN10 * uLogT, note: calibrationNote },
        ]);
        const s = trans / tau;
        const uTrans = results.transformation_time.uncertainty;
        results.stability_ratio = budgeted(s, '1', `transformation_time / tau_alpha${bound}`, [
          { source: 'transformation time', value: uTrans !== undefined ? uTrans / tau : NaN, note: 'u(t_trans)/τα' },
          { source: 'VFT law', value: s * Math.LN10 * uLog, note: lawNote },
          { source: 'calibration', value: s * Math.LN10 * uLogT, note: calibrationNote },
        ]);
        if (vft.range && (hold < vft.range[0] || hold > vft.range[1])) diagnostics.push(at(messages.isoTauExtrapolated(hold, vft.range[0], vft.range[1]), block.spanOf('/temperature')));
      }
    }
  }
  return { results, diagnostics, figure };
}

/** Standard uncertainty of the hold temperature when `temperature_calibration` is not written, K. */
const DEFAULT_HOLD_CALIBRATION = 0.5;

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
function isothermFigure(t: Float64Array, h: Float64Array, fit: ThreeSegmentFit, hVd: number, hL: number, t0: number, on: number, off: number): FigureData {
  const x = (v: number): number => (v - hVd) / (hL - hVd);
  const model = (ti: number): number => threeSegmentValue(fit, ti);
  const first = Math.max(t[0], t0);
  const last = t[t.length - 1];
  return {
    xTitle: 't / s (from the start of the hold)',
    yTitle: 'transformed fraction x',
    series: [
      { name: 'data', role: 'data', meaning: 'data', points: thinIndices(t.length).map((i) => [t[i] - t0, x(h[i])]) },
      { name: 'three-segment fit', role: 'line', meaning: 'fit', points: [first, fit.t1, fit.t2, last].map((ti) => [ti - t0, x(model(ti))]) },
    ],
    markers: [
      { label: `onset ${(on - t0).toFixed(0)} s`, x: on - t0 },
      { label: `end ${(off - t0).toFixed(0)} s`, x: off - t0 },
    ],
  };
}
