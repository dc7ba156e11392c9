/** `--csv`: one row per film with units in the header, the numbers printed as in the tables. */
import { SUMMARY_COLUMNS, csvCells, csvHeaders } from '../engine/summaryColumns.js';
import type { FilmSummary } from '../engine/summary.js';
import { csvField } from './escape.js';

export function summaryCsv(rows: readonly FilmSummary[]): string {
  const lines = [SUMMARY_COLUMNS.flatMap(csvHeaders).map(csvField).join(',')];
  for (const r of rows) lines.push(SUMMARY_COLUMNS.flatMap((c) => csvCells(c, r)).map(csvField).join(','));
  return lines.join('\n') + '\n';
}
