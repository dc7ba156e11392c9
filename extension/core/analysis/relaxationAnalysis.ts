/**
 * Relaxation results: the decadic VFT fit log10 τ = A + B/(T − T0) by variable projection
 * (vftFit.ts) with its covariance; `tg_vft` (τ = 100 s) and `fragility` (m at Tg)
 * with delta-method uncertainties from the full covariance (T0 is strongly correlated with A and
 * B). Flags: fewer than 4 points, τ ≤ 0, fewer than 3 decades, T0 within 5 K
 * of T_min or ≤ 0, longest τ below 1 s.
 *
 * τ comes from a τ column, or from a dielectric loss-peak frequency through `tau_definition`
 * (τ = 1/(2π f_max) by default, or 1/f_max); the method labels say which.
 *
 * Policy: rows with τ ≤ 0 are reported and left out; the rest are fitted. A fit is refused, with
 * an error that says why and no VFT parameters, when the data hold fewer than 3 distinct
 * temperatures, or when it gives B ≤ 0 or T0 at or above the lowest measured temperature (the
 * law then has no meaning over the data: τ would rise with T, or diverge inside the range).
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages, type RelaxationState } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { extent } from '../numeric/extent.js';
import { fitVft, type VftFit } from '../numeric/vftFit.js';
import { budgeted, type ResultValue, type UncertaintyTerm } from '../model/result.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData } from '../model/figure.js';
import { vftDerivedUncertainty, vftFragility, vftTg } from './vft.js';

export interface RelaxationFit {
  readonly fit: VftFit;
  readonly tmin: number;
  readonly tmax: number;
}

/** How τ is obtained from a dielectric loss-peak frequency. */
export type TauDefinition = 'angular' | 'cyclic';

const TAU_DEFINITION_LABEL: Readonly<Record<TauDefinition, string>> = { angular: 'τ = 1/(2π f_max)', cyclic: 'τ = 1/f_max' };

/**
 * The block's `tau_definition` as it applies to loss-peak frequencies: `1/(2 pi f_max)` (the
 * default: τ = 1/ω_max, the Debye relation at the loss peak, Kremer & Schönhals, Broadband
 * Dielectric Spectroscopy, 2003, ch. 1) or `1/f_max`; null when it says something else.
 */
export function tauDefinition(written: unknown): TauDefinition | null {
  if (written === undefined || written === null) return 'angular';
  if (typeof written !== 'string') return null;
  const s = written
    .toLowerCase()
    .replace(/[\s*·×⋅]/g, '')
    .replace(/π/g, 'pi')
    .replace(/^τ=|^tau=/, '')
    .replace(/f_?max|f_?peak|ν_?max|nu_?max|f_?p\b/g, 'f');
  if (s === '1/(2pif)' || s === '(2pif)^-1' || s === '1/2pif') return 'angular';
  if (s === '1/f' || s === '1/(f)' || s === 'f^-1') return 'cyclic';
  return null;
}

/**
 * τ in s: from a `tau` column, a `log10_tau` column (log10 of τ in s), or a loss-peak frequency
 * column (`f_max` in Hz or `log10_fmax`) through the block's τ definition. `label` says how τ was
 * obtained from a frequency; `unknownDefinition` is the written definition that cannot be applied.
 */
export function tauData(block: ParsedBlock): { tau: Float64Array; label?: string } | { unknownDefinition: string } | undefined {
  const tau = block.table?.byRole.get('tau')?.values;
  if (tau) return { tau };
  const log = block.table?.byRole.get('log10_tau')?.values;
  if (log) return { tau: Float64Array.from(log, (v) => Math.pow(10, v)) };
  const f = block.table?.byRole.get('f_max')?.values;
  const logF = block.table?.byRole.get('log10_fmax')?.values;
  if (!f && !logF) return undefined;
  const written = block.metadata.data.tau_definition;
  const definition = tauDefinition(written);
  if (!definition) return { unknownDefinition: String(written) };
  const k = definition === 'angular' ? 2 * Math.PI : 1;
  const hz = f ?? Float64Array.from(logF!, (v) => Math.pow(10, v));
  return { tau: Float64Array.from(hz, (v) => 1 / (k * v)), label: TAU_DEFINITION_LABEL[definition] };
}

/** τ in s, or undefined when the table gives none (or a τ definition that cannot be applied). */
export function tauColumn(block: ParsedBlock): Float64Array | undefined {
  const d = tauData(block);
  return d && 'tau' in d ? d.tau : undefined;
}

/** The VFT fit of a relaxation block, or null (no diagnostics: see analyzeRelaxation). */
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
  const data = tauData(block);
  if (data && 'unknownDefinition' in data) {
    diagnostics.push(at(messages.relaxUnknownTauDefinition(data.unknownDefinition), block.spanOf('/tau_definition')));
    return { results, diagnostics };
  }
  const tau = data?.tau;
  if (!T || !tau) {
    if (table.problems.length === 0) diagnostics.push(at(messages.relaxNoColumns(), block.spanOf('/data')));
    return { results, diagnostics };
  }
  // Which τ the fit is of, when it came from loss-peak frequencies.
  const from = data.label ? `; ${data.label} from the loss-peak frequency` : '';
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
  const se = (k: number): number => (fit.covariance ? Math.sqrt(Math.max(0, fit.covariance[k][k])) : NaN);
  const method = `decadic VFT fit of log10 τ by variable projection, polished by Levenberg–Marquardt${from}`;
  const fitTerm = (value: number, note: string): UncertaintyTerm[] => [{ source: 'statistical', value, note }];
  // T0 ≤ 0 K (or T0 pushed to the 0 K end of the search) is no divergence temperature: the three
  // parameters then describe an Arrhenius-like curve, not a VFT law, and are not reported (Tg and
  // m of the fitted curve still are).
  const physical = fit.T0 > 0 && !fit.t0AtBound;
  if (physical) {
    results.vft_log10_tau0 = budgeted(fit.A, '1', method, fitTerm(se(0), 'fit covariance σ²(JᵀJ)⁻¹'));
    results.vft_B = budgeted(fit.B, 'K', method, fitTerm(se(1), 'fit covariance σ²(JᵀJ)⁻¹'));
    results.vft_T0 = budgeted(fit.T0, 'K', method, fitTerm(se(2), 'fit covariance σ²(JᵀJ)⁻¹'));
  } else diagnostics.push(at(messages.relaxT0NotPhysical(fit.T0), block.header.kindSpan));
  const p = { log10Tau0: fit.A, B: fit.B, T0: fit.T0 };
  const tg = vftTg(p);
  if (Number.isFinite(tg)) {
    const u = fit.covariance ? vftDerivedUncertainty(p, fit.covariance) : undefined;
    const note = 'delta method with the full covariance of (A, B, T0)';
    results.tg_vft = budgeted(tg, 'K', `VFT fit: temperature where τ = 100 s${from}`, fitTerm(u?.tg ?? NaN, note));
    results.fragility = budgeted(vftFragility(p), '1', `VFT fit: m = B·Tg/(Tg − T0)²${from}`, fitTerm(u?.m ?? NaN, note));
  }
  const decades = Math.log10(maxTau / minTau);
  if (decades < 3) diagnostics.push(at(messages.relaxShortRange(decades), block.header.kindSpan));
  if (physical && fit.T0 > r.tmin - 5) diagnostics.push(at(messages.relaxT0NearData(fit.T0, r.tmin), block.header.kindSpan));
  if (maxTau < 1) diagnostics.push(at(messages.relaxTgExtrapolated(maxTau), block.header.kindSpan));
  return { results, diagnostics, figure: relaxationFigure(T, tau, p, r, tg, data.label) };
}

/** log10 τ against 1000/T with the VFT curve, down to Tg when it lies below the data. */
function relaxationFigure(T: Float64Array, tau: Float64Array, p: { log10Tau0: number; B: number; T0: number }, r: RelaxationFit, tg: number, tauLabel?: string): FigureData {
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
    yTitle: tauLabel ? `log10(τ / s), ${tauLabel}` : 'log10(τ / s)',
    series: [
      { name: 'data', role: 'data', meaning: 'data', points: data },
      { name: 'VFT fit', role: 'line', meaning: 'fit', points: curve },
    ],
    markers: Number.isFinite(tg) ? [{ label: `Tg(100 s) ${tg.toFixed(1)} K`, x: 1000 / tg }] : [],
  };
}

/**
 * The material's first relaxation block, when none of them gave a VFT law: what messages say
 * instead of "no relaxation data" (its table had errors, or its fit was refused). Undefined when
 * the material has no relaxation block.
 */
export function relaxationWithoutFit(materialId: string, ctx: AnalysisContext): RelaxationState | undefined {
  const [first] = ctx.referrers('relaxation', 'material', materialId);
  if (!first) return undefined;
  const table = first.table;
  return { id: first.id ?? `at offset ${first.span.start}`, tableErrors: !table || table.rowCount === 0 || table.problems.length > 0 };
}
