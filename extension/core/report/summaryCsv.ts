/**
 * `--csv`: one row per film with units in the header: every per-film figure with its uncertainty,
 * its value in °C beside a temperature in K, and its method; the numbers printed as in the tables
 * (rounded to their uncertainty).
 */
import { SUMMARY_COLUMNS, csvCells, csvHeaders } from '../engine/summaryColumns.js';
import type { FilmSummary } from '../engine/summary.js';
import { csvField, csvNumberField } from './escape.js';

/**
 * Text cells (film, material, file: whatever the notebook wrote) are guarded against formulas;
 * the numbers Vitrine formatted stay numbers.
 */
export function summaryCsv(rows: readonly FilmSummary[]): string {
  const lines = [SUMMARY_COLUMNS.flatMap(csvHeaders).map((h) => csvField(h)).join(',')];
  for (const r of rows) {
    lines.push(SUMMARY_COLUMNS.flatMap((c) => csvCells(c, r).map((cell) => (c.type === 'text' ? csvField(cell) : csvNumberField(cell)))).join(','));
  }
  return lines.join('\n') + '\n';
}
