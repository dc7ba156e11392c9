/**
 * Material results from the stated VFT parameters: `tg_vft` (τ = 100 s) and `fragility` (m at
 * that Tg), by the identities in vft.ts. Uncertainties propagate from any "±" written on the
 * parameters (delta method, parameters taken as uncorrelated).
 *
 * Policy: no `vft` map, no results; parameters outside the VFT domain give a diagnostic.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { extent } from '../numeric/extent.js';
import { budgeted, type ResultValue } from '../model/result.js';
import type { Analysis, AnalysisContext } from './context.js';
import { relaxationFit } from './relaxationAnalysis.js';
import { standardTg } from './standardTg.js';
import { vftDerivedUncertainty, vftFragility, vftTg, type VftParameters } from './vft.js';

/** The VFT parameters written on a material block, or null when incomplete. */
export function statedVft(block: ParsedBlock): { p: VftParameters; sd: [number, number, number] } | null {
  const v = block.metadata.data.vft as Record<string, unknown> | undefined;
  const A = v?.log10_tau0;
  const B = block.quantities.get('/vft/B');
  const T0 = block.quantities.get('/vft/T0');
  if (typeof A !== 'number' || !Number.isFinite(A) || !B || !T0) return null;
  return { p: { log10Tau0: A, B: B.value, T0: T0.value }, sd: [0, B.uncertainty ?? 0, T0.uncertainty ?? 0] };
}

/** The material's standard Tg as written (K), with its uncertainty. */
export function statedTg(block: ParsedBlock): { value: number; uncertainty?: number } | null {
  const q = block.quantities.get('/tg');
  return q ? { value: q.value, uncertainty: q.uncertainty } : null;
}

/**
 * The VFT parameters of a material: stated on the block, else fitted to its relaxation data; with
 * the covariance of (A, B, T0) where known (the ± written on B and T0, taken as uncorrelated, or
 * the fit's covariance).
 */
export function materialVft(block: ParsedBlock, ctx: AnalysisContext): { p: VftParameters; source: string; range?: [number, number]; cov?: number[][] } | null {
  const stated = statedVft(block);
  if (stated) {
    const { sd } = stated;
    const cov = sd.some((x) => x > 0) ? [0, 1, 2].map((i) => [0, 1, 2].map((j) => (i === j ? sd[i] * sd[i] : 0))) : undefined;
    return { p: stated.p, source: 'stated', ...(cov ? { cov } : {}) };
  }
  if (block.id === null) return null;
  for (const relax of ctx.referrers('relaxation', 'material', block.id)) {
    const r = ctx.resultsOf(relax);
    if (r.vft_log10_tau0 && r.vft_B && r.vft_T0) {
      const T = relax.table?.byRole.get('temperature')?.values;
      const range: [number, number] | undefined = T && T.length > 0 ? extent(T) : undefined;
      // The full covariance: A, B and T0 are strongly correlated, so their separate uncertainties would overstate u(log τ).
      const fit = relaxationFit(relax)?.fit;
      const same = fit && fit.covariance && Math.abs(fit.T0 - r.vft_T0.value) <= 1e-9 * Math.abs(fit.T0) + 1e-12;
      return { p: { log10Tau0: r.vft_log10_tau0.value, B: r.vft_B.value, T0: r.vft_T0.value }, source: `fit of relaxation block ${relax.id ?? ''}`, range, ...(same ? { cov: fit.covariance! } : {}) };
    }
  }
  return null;
}

export function analyzeMaterial(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const vft = statedVft(block);
  if (vft) {
    const { p, sd } = vft;
    if (!(p.B > 0)) {
      diagnostics.push(at(messages.vftBadParameters('B must be positive'), block.spanOf('/vft/B')));
    } else if (!(p.log10Tau0 < 2)) {
      diagnostics.push(at(messages.vftNoTg(p.log10Tau0), block.spanOf('/vft/log10_tau0')));
    } else {
      const tg = vftTg(p);
      const m = vftFragility(p);
      const cov = [
        [sd[0] ** 2, 0, 0],
        [0, sd[1] ** 2, 0],
        [0, 0, sd[2] ** 2],
      ];
      const u = sd.some((s) => s > 0) ? vftDerivedUncertainty(p, cov) : undefined;
      const note = 'the ± written on B and T0, delta method, taken as uncorrelated';
      results.tg_vft = budgeted(tg, 'K', 'VFT parameters as stated: T0 + B/(2 − log10 τ0)', [{ source: 'stated parameters', value: u?.tg ?? NaN, note }]);
      results.fragility = budgeted(m, '1', 'VFT parameters as stated: B·Tg/(Tg − T0)²', [{ source: 'stated parameters', value: u?.m ?? NaN, note }]);
      const stated = statedTg(block);
      if (stated && Math.abs(stated.value - tg) > 10) {
        diagnostics.push(at(messages.vftTgDisagrees(tg, stated.value), block.spanOf('/tg')));
      }
    }
  } else if (block.id !== null) {
    // No stated VFT: take Tg and m from the material's relaxation data, if any.
    for (const relax of ctx.referrers('relaxation', 'material', block.id)) {
      const r = ctx.resultsOf(relax);
      if (r.tg_vft && r.fragility) {
        results.tg_vft = { ...r.tg_vft, method: `${r.tg_vft.method} (relaxation block ${relax.id ?? ''})` };
        results.fragility = { ...r.fragility, method: `${r.fragility.method} (relaxation block ${relax.id ?? ''})` };
        break;
      }
    }
  }
  const std = standardTg(block, ctx, results.fragility, diagnostics);
  if (std) {
    results.standard_tg = std;
    const stated = statedTg(block);
    if (stated && Math.abs(std.value - stated.value) > 5) diagnostics.push(at(messages.standardTgDisagrees(std.value, stated.value), block.spanOf('/tg')));
  }
  return { results, diagnostics };
}
