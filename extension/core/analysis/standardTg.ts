/**
 * `standard_tg`: Tg at the reference cooling rate of 10 K/min from the cooling ramps of a
 * material's films ("Tg at 10 K/min from a series of rates").
 *
 * - Several rates: model M1, Tg = a + b·log10 q, by least squares; the prediction at
 *   q_ref = 10 K/min has standard uncertainty s·√(1/n + (x0 − x̄)²/Sxx) and the interval
 *   ± t₀.₉₇₅(n − 2) times that. With no residual degrees of freedom, the ramps' own Tg
 *   uncertainties are propagated instead.
 * - One rate q ≠ q_ref: the fragility-based conversion Tg(q_ref) ≈ Tg(q) + (Tg/m)·log10(q_ref/q),
 *   which follows from dTg/d log q ≈ Tg/m (Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)),
 *   flagged as such.
 * - Flags: fewer than 3 rates; q_ref outside the measured rates; slope outside 1–10 K/decade.
 *
 * Policy: no ramp with a Tg gives no result.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { t95 } from '../numeric/distributions.js';
import { fitLine } from '../numeric/lineFit.js';
import { result, type ResultValue } from '../model/result.js';
import type { AnalysisContext } from './context.js';

export const REFERENCE_RATE = 10; // K/min

interface RatePoint {
  readonly logq: number;
  readonly tg: number;
  readonly u: number;
}

export function standardTg(material: ParsedBlock, ctx: AnalysisContext, fragility: number | undefined, diagnostics: Diagnostic[]): ResultValue | undefined {
  if (material.id === null) return undefined;
  const points: RatePoint[] = [];
  for (const film of ctx.referrers('deposition', 'material', material.id)) {
    if (film.id === null) continue;
    for (const ramp of ctx.referrers('ramp', 'film', film.id)) {
      const q = ramp.quantities.get('/rate')?.value;
      const tg = ctx.resultsOf(ramp).tg;
      if (q && q > 0 && tg) points.push({ logq: Math.log10(q), tg: tg.value, u: tg.uncertainty ?? 0 });
    }
  }
  if (points.length === 0) return undefined;
  const span = material.header.idSpan ?? material.header.kindSpan;
  const x0 = Math.log10(REFERENCE_RATE);
  const rates = new Set(points.map((p) => p.logq.toFixed(6)));
  const lo = Math.min(...points.map((p) => p.logq));
  const hi = Math.max(...points.map((p) => p.logq));

  if (rates.size === 1) {
    const mean = points.reduce((s, p) => s + p.tg, 0) / points.length;
    const u = Math.sqrt(points.reduce((s, p) => s + p.u * p.u, 0)) / points.length;
    const q = Math.pow(10, points[0].logq);
    if (Math.abs(points[0].logq - x0) < 1e-9) return result(mean, 'K', `cooling ramps at 10 K/min (${points.length})`, u);
    if (!fragility) {
      diagnostics.push(at(messages.noFragilityForConversion(), span));
      return undefined;
    }
    diagnostics.push(at(messages.fragilityConversion(q), span));
    const value = mean + (mean / fragility) * (x0 - points[0].logq);
    return result(value, 'K', `fragility-based conversion from ${q} K/min with m = ${Number(fragility.toPrecision(4))}`, u);
  }

  if (rates.size < 3) diagnostics.push(at(messages.fewRates(rates.size), span));
  if (x0 < lo - 1e-9 || x0 > hi + 1e-9) diagnostics.push(at(messages.standardTgExtrapolated(Math.pow(10, lo), Math.pow(10, hi)), span));
  const f = fitLine(
    points.map((p) => p.logq),
    points.map((p) => p.tg),
  )!;
  const value = f.c + f.slope * (x0 - f.xc);
  if (!(f.slope >= 1 && f.slope <= 10)) diagnostics.push(at(messages.rateSlopeOdd(f.slope), span));
  const n = points.length;
  let u: number;
  let k: number;
  if (n > 2) {
    u = Math.sqrt(f.sigma2 * (1 / n + ((x0 - f.xc) * (x0 - f.xc)) / f.sxx));
    k = t95(n - 2);
  } else {
    // Two points: the line's prediction is a fixed combination of the two Tg values.
    const w = points.map((p) => 1 / n + ((p.logq - f.xc) * (x0 - f.xc)) / f.sxx);
    u = Math.sqrt(points.reduce((s, p, i) => s + w[i] * w[i] * p.u * p.u, 0));
    k = 1.96;
  }
  return result(value, 'K', `Tg = a + b·log10 q over ${rates.size} cooling rates (${n} ramps), at 10 K/min; slope ${Number(f.slope.toPrecision(3))} K/decade`, u, [value - k * u, value + k * u]);
}
