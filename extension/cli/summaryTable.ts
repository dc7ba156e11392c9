/** The plain-text summary table the CLI prints: one row per film, columns from the core's one definition. */
import { SUMMARY_TABLE_COLUMNS, isNumeric, summaryCell, type FilmSummary } from '../core/index.js';

export function summaryTable(rows: readonly FilmSummary[]): string {
  const columns = SUMMARY_TABLE_COLUMNS;
  const header = columns.map((c) => c.header);
  const body = rows.map((r) => columns.map((c) => summaryCell(c, r)));
  const widths = header.map((h, i) => Math.max(h.length, ...body.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (isNumeric(columns[i]) ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...body.map(line)].join('\n');
}
