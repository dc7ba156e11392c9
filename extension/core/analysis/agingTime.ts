/**
 * Equivalent aging time of a glass with fictive temperature Tf: how long the equilibrium liquid
 * would take to relax at Tf. Estimates disagree by orders
 * of magnitude (Berthier & Ediger, J. Chem. Phys. 152, 044501 (2020)), so the result is a bracket
 * of two named methods, always flagged as an extrapolation:
 * 1. VFT extrapolation: τα(Tf) = 10^(A + B/(Tf − T0)) s;
 * 2. constant slope at Tg: log10 τ = 2 + m·(Tg/Tf − 1).
 * `interval` holds the two estimates (the bracket, printed first: catalogue `bracket`); the value
 * is their geometric mean, which says nothing the bracket does not.
 *
 * Policy: without a VFT law (and Tg, m) no result.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { result, type ResultValue } from '../model/result.js';
import { materialOf } from './blockLinks.js';
import type { AnalysisContext } from './context.js';
import { materialVft } from './materialAnalysis.js';
import { vftFragility, vftLog10Tau, vftTg, type VftParameters } from './vft.js';

export function equivalentAgingTime(tf: number, vft: VftParameters, tgRef?: number): ResultValue | undefined {
  const tg = tgRef ?? vftTg(vft);
  const m = vftFragility(vft);
  const logVft = vftLog10Tau(vft, tf);
  if (!Number.isFinite(tg) || !Number.isFinite(m) || !(tf > 0)) return undefined;
  const logSlope = 2 + m * (tg / tf - 1);
  const logs = [logVft, logSlope].filter(Number.isFinite);
  if (logs.length < 2) return undefined;
  const lo = Math.pow(10, Math.min(...logs));
  const hi = Math.pow(10, Math.max(...logs));
  const value = Math.pow(10, (logs[0] + logs[1]) / 2);
  const decades = Math.log10(hi / lo);
  return result(
    value,
    's',
    `bracket [${lo.toExponential(1)}, ${hi.toExponential(1)}] s (${decades.toFixed(1)} decades) between VFT extrapolation τα(Tf) (${Math.pow(10, logVft).toExponential(1)} s) and constant slope at Tg, log τ = 2 + m(Tg/Tf − 1) (${Math.pow(10, logSlope).toExponential(1)} s); the value is only their geometric mean; an extrapolation`,
    undefined,
    [lo, hi],
  );
}

/** Adds `equivalent_aging_time` for a block's fictive temperature, from its material's VFT law. */
export function addAging(block: ParsedBlock, ctx: AnalysisContext, tf: number, results: Record<string, ResultValue>, diagnostics: Diagnostic[]): void {
  const material = materialOf(block, ctx);
  const vft = material ? materialVft(material, ctx) : null;
  if (!vft) return;
  const tg = material?.quantities.get('/tg')?.value;
  // Only a glass well below Tg has an aging time worth estimating.
  if (tg !== undefined && tf > tg - 5) return;
  const aging = equivalentAgingTime(tf, vft.p, tg);
  if (aging) {
    results.equivalent_aging_time = aging;
    diagnostics.push(at(messages.agingExtrapolated(), block.header.kindSpan));
  }
}
