/**
 * The notebook-wide summary: one row per film (deposition block) with its conditions and the
 * figures of merit found in the blocks that refer to it. Values are the computed results; a
 * figure that no block has produced yet is absent.
 */
import type { NotebookReport } from './notebook.js';
import type { ResultValue } from '../model/result.js';

export interface FilmSummary {
  readonly film: string;
  readonly file: string;
  readonly material: string | null;
  readonly tsub?: number;
  readonly tsubOverTg?: ResultValue;
  readonly rate?: number;
  readonly thickness?: number;
  readonly tg?: ResultValue;
  readonly tonset?: ResultValue;
  readonly tfictive?: ResultValue;
  readonly densityGain?: ResultValue;
  readonly stabilityRatio?: ResultValue;
}

/** Rows in notebook order (file path, then position). */
export function summarise(report: NotebookReport): FilmSummary[] {
  const rows: Array<{ -readonly [K in keyof FilmSummary]: FilmSummary[K] }> = [];
  const byFilm = new Map<string, (typeof rows)[number]>();
  for (const file of report.files) {
    for (const b of file.blocks) {
      if (b.kind !== 'deposition' || b.id === null || byFilm.has(b.id)) continue;
      const q = b.quantities;
      const material = b.metadata.material;
      const row = {
        film: b.id,
        file: file.path,
        material: typeof material === 'string' ? material : null,
        tsub: q['/substrate_temperature']?.value,
        tsubOverTg: b.results.tsub_over_tg,
        rate: q['/rate']?.value,
        thickness: q['/thickness']?.value ?? b.results.expected_thickness?.value,
      };
      rows.push(row);
      byFilm.set(b.id, row);
    }
  }
  for (const file of report.files) {
    for (const b of file.blocks) {
      const film = b.metadata.film;
      const row = typeof film === 'string' ? byFilm.get(film) : undefined;
      if (!row) continue;
      const r = b.results;
      if (b.kind === 'ramp') {
        row.tg ??= r.tg;
        row.tonset ??= r.tonset;
        row.tfictive ??= r.tfictive;
        row.densityGain ??= r.density_gain;
      } else if (b.kind === 'isotherm') {
        row.stabilityRatio ??= r.stability_ratio;
      } else if (b.kind === 'dsc') {
        row.tfictive ??= r.tfictive;
        row.tonset ??= r.tonset;
      }
    }
  }
  return rows;
}
