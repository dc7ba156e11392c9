/**
 * Deposition results: `tsub_over_tg` (substrate temperature over the material's standard Tg,
 * both in kelvin) and `expected_thickness` (rate × duration), with the physical checks of a
 * deposition record: substrate at or above Tg, Tsub/Tg outside 0.75–0.95, implausible base
 * pressure, and thickness differing from rate × duration by more than 15 %.
 * Thresholds follow the reference methods (sections 7 and 8: 1e-5 Torr; 10–15 % mismatch).
 *
 * Policy: a missing material or Tg gives no ratio (and a warning); uncertainties combine the
 * written "±" of Tsub and Tg in quadrature of relative errors.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { result, type ResultValue } from '../model/result.js';
import type { Analysis, AnalysisContext } from './context.js';
import { materialOf } from './blockLinks.js';
import { statedTg } from './materialAnalysis.js';

const TORR = 133.322;
const HIGH_PRESSURE_PA = 1e-5 * TORR;

export function analyzeDeposition(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const tsub = block.quantities.get('/substrate_temperature');
  const materialId = block.metadata.data.material;
  const material = materialOf(block, ctx);
  const tg = material ? statedTg(material) : null;

  if (tsub && material && !tg) diagnostics.push(at(messages.tgReferenceUnknown(String(materialId)), block.spanOf('/material')));
  if (tsub && tg && tg.value > 0) {
    const ratio = tsub.value / tg.value;
    const rel = Math.hypot((tsub.uncertainty ?? 0) / tsub.value, (tg.uncertainty ?? 0) / tg.value);
    results.tsub_over_tg = result(ratio, '1', `substrate temperature / standard Tg of ${String(materialId)} (both in K)`, rel > 0 ? ratio * rel : undefined);
    const span = block.spanOf('/substrate_temperature');
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
    if (!(pressure.value > 0) || pressure.value > 1.1e5) diagnostics.push(at(messages.pressureImplausible(pressure.value), span));
    else if (pressure.value > HIGH_PRESSURE_PA) diagnostics.push(at(messages.pressureHigh(pressure.value), span));
  }
  return { results, diagnostics };
}
