/** `--csv`: one row per film with units in the header. */
import type { FilmSummary } from '../engine/summary.js';
import { csvField } from './escape.js';

const COLUMNS: ReadonlyArray<[string, (r: FilmSummary) => string | number | undefined]> = [
  ['film', (r) => r.film],
  ['material', (r) => r.material ?? undefined],
  ['file', (r) => r.file],
  ['Tsub/K', (r) => r.tsub],
  ['Tsub/Tg', (r) => r.tsubOverTg?.value],
  ['rate/(nm/s)', (r) => r.rate],
  ['thickness/nm', (r) => r.thickness],
  ['Tg/K', (r) => r.tg?.value],
  ['u(Tg)/K', (r) => r.tg?.uncertainty],
  ['Tonset/K', (r) => r.tonset?.value],
  ['u(Tonset)/K', (r) => r.tonset?.uncertainty],
  ['Tf/K', (r) => r.tfictive?.value],
  ['u(Tf)/K', (r) => r.tfictive?.uncertainty],
  ['density_gain/%', (r) => r.densityGain?.value],
  ['u(density_gain)/%', (r) => r.densityGain?.uncertainty],
  ['stability_ratio', (r) => r.stabilityRatio?.value],
];

export function summaryCsv(rows: readonly FilmSummary[]): string {
  const lines = [COLUMNS.map(([h]) => csvField(h)).join(',')];
  for (const r of rows) lines.push(COLUMNS.map(([, f]) => csvField(f(r))).join(','));
  return lines.join('\n') + '\n';
}
