/**
 * A film's substrate temperature, as every analysis reads it: written in a temperature unit, or
 * written as a multiple of the material's glass transition temperature (`0.85 Tg`, the way
 * depositions are planned: the most stable glasses grow near 0.85 Tg; Kearns et al., J. Chem.
 * Phys. 127, 154702, 2007), resolved against the `tg` written on the deposition's material.
 *
 * A resolved temperature's standard uncertainty combines the factor's and Tg's in quadrature:
 * u(f·Tg)² = (Tg·u_f)² + (f·u_Tg)² (GUM, JCGM 100:2008, eq. 10, uncorrelated inputs).
 *
 * Policy: no substrate temperature, or one that failed to parse, is null; a multiple of Tg whose
 * material or Tg cannot be found is `unresolved`, and nothing is computed from it.
 */
import type { ParsedBlock, TgMultiple } from '../block/parseBlock.js';
import type { Quantity } from '../model/quantity.js';
import type { AnalysisContext } from './context.js';
import { materialOf } from './blockLinks.js';
import { statedTg } from './materialAnalysis.js';

export const SUBSTRATE_TEMPERATURE = '/substrate_temperature';

export type SubstrateTemperature =
  | { readonly source: 'written'; readonly quantity: Quantity }
  | { readonly source: 'tg'; readonly quantity: Quantity; readonly multiple: TgMultiple; readonly tg: { readonly value: number; readonly uncertainty?: number }; readonly material: string }
  | { readonly source: 'unresolved'; readonly multiple: TgMultiple; readonly material: string | null };

/** The substrate temperature of a deposition block (kelvin), resolved through its material when written as a multiple of Tg. */
export function substrateTemperatureOf(film: ParsedBlock, ctx: AnalysisContext): SubstrateTemperature | null {
  const written = film.quantities.get(SUBSTRATE_TEMPERATURE);
  if (written) return { source: 'written', quantity: written };
  const multiple = film.tgMultiples?.get(SUBSTRATE_TEMPERATURE);
  if (!multiple) return null;
  const id = film.metadata.data.material;
  const materialId = typeof id === 'string' ? id : null;
  const material = materialOf(film, ctx);
  const tg = material ? statedTg(material) : null;
  if (!material || !tg || !(tg.value > 0) || materialId === null) return { source: 'unresolved', multiple, material: materialId };
  const value = multiple.factor * tg.value;
  const u = Math.hypot(tg.value * (multiple.uncertainty ?? 0), multiple.factor * (tg.uncertainty ?? 0));
  const quantity: Quantity = { value, ...(u > 0 ? { uncertainty: u } : {}), unit: 'K', dimension: 'temperature', writtenUnit: 'Tg', offsetTemperature: false };
  return { source: 'tg', quantity, multiple, tg, material: materialId };
}
