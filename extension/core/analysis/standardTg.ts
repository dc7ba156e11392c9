/**
 * `standard_tg`: Tg at the reference cooling rate of 10 K/min from the cooling ramps of a
 * material's films ("Tg at 10 K/min from a series of rates").
 *
 * - Several rates: model M1, Tg = a + b·log10 q, by least squares; the prediction at
 *   q_ref = 10 K/min has standard uncertainty s·√(1/n + (x0 − x̄)²/Sxx), widened by
 *   t₀.₉₇₅(n − 2)/1.96 so that ±1.96u is the t-based 95 % interval. With no residual degrees of freedom, the ramps' own Tg
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
import { fisherFCdf, t95 } from '../numeric/distributions.js';
import { fitLine } from '../numeric/lineFit.js';
import { budgeted, type ResultValue, type UncertaintyTerm } from '../model/result.js';
import type { AnalysisContext } from './context.js';
import { relaxationWithoutFit } from './relaxationAnalysis.js';

export const REFERENCE_RATE = 10; // K/min

interface RatePoint {
  readonly logq: number;
  readonly tg: number;
  /** The ramp's own standard uncertainty without the thermometer calibration. */
  readonly u: number;
  /** The calibration term of the ramp's budget: shared by ramps on the same stage, never averaged down. */
  readonly cal: number;
}

export function standardTg(material: ParsedBlock, ctx: AnalysisContext, fragilityResult: ResultValue | undefined, diagnostics: Diagnostic[]): ResultValue | undefined {
  const fragility = fragilityResult?.value;
  if (material.id === null) return undefined;
  const points: RatePoint[] = [];
  for (const film of ctx.referrers('deposition', 'material', material.id)) {
    if (film.id === null) continue;
    for (const ramp of ctx.referrers('ramp', 'film', film.id)) {
      const q = ramp.quantities.get('/rate')?.value;
      const tg = ctx.resultsOf(ramp).tg;
      if (q && q > 0 && tg) {
        const cal = tg.budget?.find((t) => t.source === 'calibration')?.value ?? 0;
        const u = tg.uncertainty ?? 0;
        points.push({ logq: Math.log10(q), tg: tg.value, u: Math.sqrt(Math.max(0, u * u - cal * cal)), cal });
      }
    }
  }
  if (points.length === 0) return undefined;
  const span = material.header.idSpan ?? material.header.kindSpan;
  const x0 = Math.log10(REFERENCE_RATE);
  const rates = new Set(points.map((p) => p.logq.toFixed(6)));
  const lo = Math.min(...points.map((p) => p.logq));
  const hi = Math.max(...points.map((p) => p.logq));

  const calibration: UncertaintyTerm = { source: 'calibration', value: Math.max(0, ...points.map((p) => p.cal)), note: 'stage thermometer, common to all ramps (not averaged down)' };
  for (const group of groupByRate(points)) {
    const c = consistency(group);
    if (c && c.p < 0.01) diagnostics.push(at(messages.replicatesDisagree(Math.pow(10, group[0].logq), group.length, c.spread, c.birge), span));
  }

  if (rates.size === 1) {
    const n = points.length;
    const mean = points.reduce((s, p) => s + p.tg, 0) / n;
    const meanU2 = points.reduce((s, p) => s + p.u * p.u, 0) / n;
    const sample = n > 1 ? points.reduce((s, p) => s + (p.tg - mean) ** 2, 0) / (n - 1) : 0;
    const terms: UncertaintyTerm[] = [
      { source: 'statistical', value: Math.sqrt(meanU2 / n), note: "the ramps' own uncertainties, √(Σu²)/n" },
      // Widened by t₀.₉₇₅(n − 1)/1.96 as the regression term below, so that ±2u keeps its meaning
      // for a scatter estimated from few ramps.
      {
        source: 'replicates',
        value: n > 1 ? (Math.sqrt(Math.max(0, sample - meanU2) / n) * t95(n - 1)) / 1.96 : 0,
        note: `scatter of the ${n} ramps beyond their own uncertainties, √((s² − mean u²)/n) × t₀.₉₇₅(${n - 1})/1.96`,
      },
      calibration,
    ];
    const q = Math.pow(10, points[0].logq);
    if (Math.abs(points[0].logq - x0) < 1e-9) return budgeted(mean, 'K', `mean of the cooling ramps at 10 K/min (${n})`, terms);
    if (!fragility) {
      diagnostics.push(at(messages.noFragilityForConversion(relaxationWithoutFit(material.id, ctx)), span));
      return undefined;
    }
    diagnostics.push(at(messages.fragilityConversion(q), span));
    const value = mean + (mean / fragility) * (x0 - points[0].logq);
    // The conversion's sensitivity to m: |∂Tg/∂m| = (Tg/m²)·|log10(q_ref/q)| (GUM §5.1.3).
    const um = fragilityResult?.uncertainty;
    if (um !== undefined && um > 0) {
      terms.push({ source: 'fragility', value: (mean / (fragility * fragility)) * Math.abs(x0 - points[0].logq) * um, note: `u(m) = ${Number(um.toPrecision(2))} through (Tg/m²)·|log10(10 K/min / q)|` });
    }
    return budgeted(value, 'K', `fragility-based conversion of the mean of ${n} ramp${n === 1 ? '' : 's'} from ${q} K/min with m = ${Number(fragility.toPrecision(4))}`, terms);
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
  if (n > 2) {
    // With few residual degrees of freedom ν = n − 2 the scatter is itself uncertain: the term is
    // widened by t₀.₉₇₅(ν)/1.96, so that ±1.96u is the t-based 95 % interval (GUM, JCGM 100:2008,
    // annex G) and ±2u means the same here as for every other figure.
    u = (Math.sqrt(f.sigma2 * (1 / n + ((x0 - f.xc) * (x0 - f.xc)) / f.sxx)) * t95(n - 2)) / 1.96;
  } else {
    // Two points: the line's prediction is a fixed combination of the two Tg values.
    const w = points.map((p) => 1 / n + ((p.logq - f.xc) * (x0 - f.xc)) / f.sxx);
    u = Math.sqrt(points.reduce((s, p, i) => s + w[i] * w[i] * p.u * p.u, 0));
  }
  const k = 1.96;
  const combined = Math.hypot(u, calibration.value);
  return budgeted(
    value,
    'K',
    `Tg = a + b·log10 q over ${rates.size} cooling rates (${n} ramps), at 10 K/min; slope ${Number(f.slope.toPrecision(3))} K/decade`,
    [{ source: 'statistical', value: u, note: n > 2 ? `residual scatter of the regression, s·√(1/n + (x₀ − x̄)²/Sxx) × t₀.₉₇₅(${n - 2})/1.96` : "the two ramps' own uncertainties through the line" }, calibration],
    [value - k * combined, value + k * combined],
  );
}

function groupByRate(points: readonly RatePoint[]): RatePoint[][] {
  const groups = new Map<string, RatePoint[]>();
  for (const p of points) {
    const key = p.logq.toFixed(6);
    const g = groups.get(key);
    if (g) g.push(p);
    else groups.set(key, [p]);
  }
  return [...groups.values()];
}

/**
 * Whether replicate ramps agree within their uncertainties: χ² of their Tg about the weighted
 * mean, the Birge ratio R_B = √(χ²/(n − 1)) (Birge, Phys. Rev. 40, 207 (1932)) and the p-value of
 * χ² with n − 1 degrees of freedom. Null for fewer than 2 ramps.
 */
function consistency(group: readonly RatePoint[]): { birge: number; p: number; spread: number } | null {
  if (group.length < 2) return null;
  // No Tg is known better than 0.01 K, whatever a noise-free ramp claims.
  const w = group.map((p) => 1 / Math.max(p.u, 0.01) ** 2);
  const sw = w.reduce((s, x) => s + x, 0);
  const mean = group.reduce((s, p, i) => s + w[i] * p.tg, 0) / sw;
  const chi2 = group.reduce((s, p, i) => s + w[i] * (p.tg - mean) ** 2, 0);
  const dof = group.length - 1;
  // χ²/dof follows F(dof, ∞); a large second degree of freedom stands for ∞.
  const p = 1 - fisherFCdf(chi2 / dof, dof, 1e7);
  let lo = Infinity;
  let hi = -Infinity;
  for (const q of group) {
    lo = Math.min(lo, q.tg);
    hi = Math.max(hi, q.tg);
  }
  return { birge: Math.sqrt(chi2 / dof), p, spread: hi - lo };
}
