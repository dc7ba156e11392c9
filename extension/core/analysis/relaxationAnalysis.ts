/**
 * Relaxation results: the decadic VFT fit log10 τ = A + B/(T − T0) by variable projection
 * (vftFit.ts) with its covariance; `tg_vft` (τ = 100 s) and `fragility` (m at Tg)
 * with delta-method uncertainties from the full covariance (T0 is strongly correlated with A and
 * B). Flags: fewer than 4 points, τ ≤ 0, fewer than 3 decades, T0 within 5 K
 * of T_min or ≤ 0, longest τ below 1 s.
 *
 * Policy: rows with τ ≤ 0 are reported and left out; the rest are fitted. A fit is refused, with
 * an error that says why and no VFT parameters, when the data hold fewer than 3 distinct
 * temperatures, or when it gives B ≤ 0 or T0 at or above the lowest measured temperature (the
 * law then has no meaning over the data: τ would rise with T, or diverge inside the range).
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { extent } from '../numeric/extent.js';
import { fitVft, type VftFit } from '../numeric/vftFit.js';
import { result, type ResultValue } from '../model/result.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData } from '../model/figure.js';
import { vftDerivedUncertainty, vftFragility, vftTg } from './vft.js';

export interface RelaxationFit {
  readonly fit: VftFit;
  readonly tmin: number;
  readonly tmax: number;
}

/** The VFT fit of a relaxation block, or null (no diagnostics: see analyzeRelaxation). */
/** τ in s from a `tau` column, or from a `log10_tau` column (log10 of τ in s). */
export function tauColumn(block: ParsedBlock): Float64Array | undefined {
  const tau = block.table?.byRole.get('tau')?.values;
  if (tau) return tau;
  const log = block.table?.byRole.get('log10_tau')?.values;
  return log ? Float64Array.from(log, (v) => Math.pow(10, v)) : undefined;
}

export function relaxationFit(block: ParsedBlock): RelaxationFit | null {
  const T = block.table?.byRole.get('temperature')?.values;
  const tau = tauColumn(block);
  if (!T || !tau) return null;
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < T.length; i++) {
    if (tau[i] > 0) {
      xs.push(T[i]);
      ys.push(Math.log10(tau[i]));
    }
  }
  const fit = fitVft(xs, ys);
  if (!fit) return null;
  const [tmin, tmax] = extent(xs);
  return { fit, tmin, tmax };
}

export function analyzeRelaxation(block: ParsedBlock, _ctx: AnalysisContext): Analysis {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const table = block.table;
  if (!table || table.rowCount === 0) return { results, diagnostics };
  const T = table.byRole.get('temperature')?.values;
  const tau = tauColumn(block);
  if (!T || !tau) {
    if (table.problems.length === 0) diagnostics.push(at(messages.relaxNoColumns(), block.spanOf('/data')));
    return { results, diagnostics };
  }
  let good = 0;
  let maxTau = 0;
  let minTau = Infinity;
  for (let i = 0; i < tau.length; i++) {
    if (tau[i] > 0) {
      good++;
      maxTau = Math.max(maxTau, tau[i]);
      minTau = Math.min(minTau, tau[i]);
    } else diagnostics.push(at(messages.relaxNonPositive(tau[i]), block.rowSpan(i)));
  }
  if (good < 4) {
    diagnostics.push(at(messages.relaxTooFew(good), block.header.kindSpan));
    return { results, diagnostics };
  }
  const temperatures = new Set<number>();
  for (let i = 0; i < tau.length; i++) if (tau[i] > 0) temperatures.add(T[i]);
  if (temperatures.size < 3) {
    diagnostics.push(at(messages.relaxFewTemperatures(temperatures.size), block.header.kindSpan));
    return { results, diagnostics };
  }
  const r = relaxationFit(block);
  if (!r) {
    diagnostics.push(at(messages.relaxNoFit(), block.header.kindSpan));
    return { results, diagnostics };
  }
  const { fit } = r;
  if (!(fit.B > 0)) {
    diagnostics.push(at(messages.relaxVftBNotPositive(fit.B), block.header.kindSpan));
    return { results, diagnostics };
  }
  if (!(fit.T0 < r.tmin)) {
    diagnostics.push(at(messages.relaxVftT0AboveData(fit.T0, r.tmin), block.header.kindSpan));
    return { results, diagnostics };
  }
  const se = (k: number): number | undefined => (fit.covariance ? Math.sqrt(Math.max(0, fit.covariance[k][k])) : undefined);
  const method = 'decadic VFT fit of log10 τ by variable projection, polished by Levenberg–Marquardt';
  results.vft_log10_tau0 = result(fit.A, '1', method, se(0));
  results.vft_B = result(fit.B, 'K', method, se(1));
  results.vft_T0 = result(fit.T0, 'K', method, se(2));
  const p = { log10Tau0: fit.A, B: fit.B, T0: fit.T0 };
  const tg = vftTg(p);
  if (Number.isFinite(tg)) {
    const u = fit.covariance ? vftDerivedUncertainty(p, fit.covariance) : undefined;
    results.tg_vft = result(tg, 'K', 'VFT fit: temperature where τ = 100 s', u?.tg);
    results.fragility = result(vftFragility(p), '1', 'VFT fit: m = B·Tg/(Tg − T0)²', u?.m);
  }
  const decades = Math.log10(maxTau / minTau);
  if (decades < 3) diagnostics.push(at(messages.relaxShortRange(decades), block.header.kindSpan));
  if (fit.T0 > r.tmin - 5 || fit.T0 <= 0 || fit.t0AtBound) diagnostics.push(at(messages.relaxT0NearData(fit.T0, r.tmin), block.header.kindSpan));
  if (maxTau < 1) diagnostics.push(at(messages.relaxTgExtrapolated(maxTau), block.header.kindSpan));
  return { results, diagnostics, figure: relaxationFigure(T, tau, p, r, tg) };
}

/** log10 τ against 1000/T with the VFT curve, down to Tg when it lies below the data. */
function relaxationFigure(T: Float64Array, tau: Float64Array, p: { log10Tau0: number; B: number; T0: number }, r: RelaxationFit, tg: number): FigureData {
  const data: number[][] = [];
  for (let i = 0; i < T.length; i++) if (tau[i] > 0) data.push([1000 / T[i], Math.log10(tau[i])]);
  const lo = Number.isFinite(tg) ? Math.min(r.tmin, tg) : r.tmin;
  const curve: number[][] = [];
  for (let k = 0; k <= 60; k++) {
    const t = lo + ((r.tmax - lo) * k) / 60;
    if (t > p.T0) curve.push([1000 / t, p.log10Tau0 + p.B / (t - p.T0)]);
  }
  return {
    xTitle: '1000 K / T',
    yTitle: 'log10(τ / s)',
    series: [
      { name: 'data', role: 'data', points: data },
      { name: 'VFT fit', role: 'line', points: curve },
    ],
    markers: Number.isFinite(tg) ? [{ label: `Tg(100 s) ${tg.toFixed(1)} K`, x: 1000 / tg }] : [],
  };
}
