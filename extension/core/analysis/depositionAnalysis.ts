/**
 * Deposition results: `tsub_over_tg` (substrate temperature over the material's standard Tg,
 * both in kelvin) and `expected_thickness` (rate × duration), with the physical checks of a
 * deposition record: substrate at or above Tg, Tsub/Tg outside 0.75–0.95, implausible base
 * pressure, and thickness differing from rate × duration by more than 15 %.
 * Thresholds and their sources: the most stable glasses form near Tsub = 0.85 Tg, stability
 * falling off on either side (Swallen et al., Science 315, 353, 2007; Kearns et al., J. Chem.
 * Phys. 127, 154702, 2007), hence the info outside 0.75–0.95 (the bounds themselves are common
 * practice, no source); a base pressure above 1e-5 Torr, a rate varying by more than 20 % and a
 * thickness 15 % away from rate × duration are common practice, no source.
 *
 * A substrate temperature written as a multiple of Tg (`0.85 Tg`) is resolved against the
 * material's written tg (substrateTemperature.ts) and reported, in kelvin, among the block's
 * quantities, so the summary, the charts and the ramps of the film read the resolved value.
 *
 * Policy: a missing material or Tg gives no ratio (and a warning; an error when Tsub itself was
 * written as a multiple of Tg); uncertainties combine the written "±" of Tsub and Tg in
 * quadrature of relative errors. A base pressure written as a bound is checked only on the side
 * the bound tells.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { result, type ResultValue } from '../model/result.js';
import type { Analysis, AnalysisContext } from './context.js';
import { materialOf } from './blockLinks.js';
import { statedTg } from './materialAnalysis.js';
import { SUBSTRATE_TEMPERATURE, substrateTemperatureOf } from './substrateTemperature.js';
import type { Quantity } from '../model/quantity.js';

const TORR = 133.322;
const HIGH_PRESSURE_PA = 1e-5 * TORR;

export function analyzeDeposition(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const quantities: Record<string, Quantity> = {};
  const materialId = block.metadata.data.material;
  const material = materialOf(block, ctx);
  const tg = material ? statedTg(material) : null;
  const substrate = substrateTemperatureOf(block, ctx);
  const span = block.spanOf(SUBSTRATE_TEMPERATURE);

  if (substrate?.source === 'unresolved') {
    // A multiple of Tg without a Tg: the dangling material is reported at the reference itself.
    const why = substrate.material === null ? 'missing' : material ? 'no-tg' : 'dangling';
    diagnostics.push(at(messages.tsubUnresolved(substrate.multiple.factor, substrate.material, why), span));
  } else if (substrate && material && !tg) {
    diagnostics.push(at(messages.tgReferenceUnknown(String(materialId)), block.spanOf('/material')));
  }
  if (substrate?.source === 'tg') {
    // Tsub/Tg is the factor itself: Tg's own uncertainty cancels in the ratio.
    const { factor, uncertainty } = substrate.multiple;
    quantities[SUBSTRATE_TEMPERATURE] = substrate.quantity;
    diagnostics.push(at(messages.tsubFromTg(factor, substrate.tg.value, substrate.material, substrate.quantity.value), span));
    results.tsub_over_tg = result(factor, '1', `substrate temperature written as ${factor} Tg of ${substrate.material} (tg ${Number(substrate.tg.value.toPrecision(6))} K)`, uncertainty);
    if (factor >= 1) diagnostics.push(at(messages.tsubAboveTg(substrate.quantity.value, substrate.tg.value), span));
    else if (factor < 0.75 || factor > 0.95) diagnostics.push(at(messages.tsubRatioOutside(factor), span));
  } else if (substrate?.source === 'written' && tg && tg.value > 0) {
    const tsub = substrate.quantity;
    const ratio = tsub.value / tg.value;
    const rel = Math.hypot((tsub.uncertainty ?? 0) / tsub.value, (tg.uncertainty ?? 0) / tg.value);
    results.tsub_over_tg = result(ratio, '1', `substrate temperature / standard Tg of ${String(materialId)} (both in K)`, rel > 0 ? ratio * rel : undefined);
    if (ratio >= 1) diagnostics.push(at(messages.tsubAboveTg(tsub.value, tg.value), span));
    else if (ratio < 0.75 || ratio > 0.95) diagnostics.push(at(messages.tsubRatioOutside(ratio), span));
  }

  const rate = block.quantities.get('/rate');
  const duration = block.quantities.get('/duration');
  const thickness = block.quantities.get('/thickness');
  if (rate?.uncertainty !== undefined && rate.value > 0 && rate.uncertainty / rate.value > 0.2) {
    diagnostics.push(at(messages.rateUnstable(rate.uncertainty / rate.value), block.spanOf('/rate')));
  }
  if (rate && duration) {
    const expected = rate.value * duration.value;
    const rel = Math.hypot((rate.uncertainty ?? 0) / rate.value, (duration.uncertainty ?? 0) / duration.value);
    results.expected_thickness = result(expected, 'nm', 'rate × duration', rel > 0 ? Math.abs(expected) * rel : undefined);
    if (thickness && expected > 0 && Math.abs(thickness.value - expected) / expected > 0.15) {
      diagnostics.push(at(messages.thicknessMismatch(thickness.value, expected), block.spanOf('/thickness')));
    }
  }

  const pressure = block.quantities.get('/base_pressure');
  if (pressure) {
    const span = block.spanOf('/base_pressure');
    // A bound says only on which side the pressure lies: "< p" can show a good vacuum, "> p" a poor one.
    if (!(pressure.value > 0) || pressure.value > 1.1e5) diagnostics.push(at(messages.pressureImplausible(pressure.value), span));
    else if (pressure.value > HIGH_PRESSURE_PA && pressure.bound === 'upper') diagnostics.push(at(messages.pressureBoundAboveLimit(pressure.value), span));
    else if (pressure.value > HIGH_PRESSURE_PA) diagnostics.push(at(messages.pressureHigh(pressure.value), span));
  }
  return { results, diagnostics, ...(Object.keys(quantities).length > 0 ? { quantities } : {}) };
}
