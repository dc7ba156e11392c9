/**
 * The columns of the per-film summary (summary.ts computes the rows), defined once for every
 * presenter: the CLI table, the HTML summary table and the CSV. Each column says what it shows,
 * its header, how its numbers are printed (from the results catalogue) and its CSV header names;
 * the cell functions below give each presenter the same text for the same value.
 */
import { RESULT_CATALOGUE, type NumberFormat } from '../model/catalogue.js';
import { formatCsvNumber, formatMeasurement, formatUncertainty, MISSING } from '../model/formatResult.js';
import type { ResultValue } from '../model/result.js';
import type { FilmSummary } from './summary.js';

interface ColumnBase {
  /** Stable key of the column. */
  readonly key: string;
  /** Header of the tables: the label with its unit in quantity-calculus form (`Tg/K`). */
  readonly header: string;
  /** One line: what the column shows (a tooltip in the HTML report). */
  readonly meaning: string;
  /** Header in the CSV. */
  readonly csvHeader: string;
  /** False for a column written to the CSV only. */
  readonly inTables: boolean;
}

/** Text: left-aligned, never formatted. */
export interface TextColumn extends ColumnBase {
  readonly type: 'text';
  readonly text: (row: FilmSummary) => string | null;
}

/** A number as written in the notebook (a condition of the film). */
export interface NumberColumn extends ColumnBase {
  readonly type: 'number';
  readonly format: NumberFormat;
  readonly number: (row: FilmSummary) => number | undefined;
}

/** A computed result, printed with its uncertainty. */
export interface ResultColumn extends ColumnBase {
  readonly type: 'result';
  readonly format: NumberFormat;
  readonly result: (row: FilmSummary) => ResultValue | undefined;
  /** Header of the CSV column of the standard uncertainty, when the CSV has one. */
  readonly csvUncertaintyHeader?: string;
}

export type SummaryColumn = TextColumn | NumberColumn | ResultColumn;

/**
 * `label/unit` (IUPAC quantity calculus), with parentheses around a label or unit that is itself
 * a quotient or product: `rate/(nm/s)`, `(Δρ/ρ)/%`; a dimensionless quantity shows its label only.
 */
export function quantityHeader(label: string, unit: string): string {
  if (unit === '' || unit === '1') return label;
  const wrap = (s: string): string => (/[/*· ]/.test(s) ? `(${s})` : s);
  return `${wrap(label)}/${wrap(unit.replace(/\*/g, '·'))}`;
}

function resultColumn(key: keyof typeof RESULT_CATALOGUE, pick: (row: FilmSummary) => ResultValue | undefined, csvHeader: string, csvUncertaintyHeader?: string): ResultColumn {
  const e = RESULT_CATALOGUE[key];
  const column: ResultColumn = { key, type: 'result', header: quantityHeader(e.label, e.unit), meaning: e.meaning, csvHeader, inTables: true, format: { digits: e.digits, notation: e.notation }, result: pick };
  return csvUncertaintyHeader ? { ...column, csvUncertaintyHeader } : column;
}

/** The summary columns, in order. */
export const SUMMARY_COLUMNS: readonly SummaryColumn[] = [
  { key: 'film', type: 'text', header: 'film', meaning: 'the deposition block', csvHeader: 'film', inTables: true, text: (r) => r.film },
  { key: 'material', type: 'text', header: 'material', meaning: 'the material deposited', csvHeader: 'material', inTables: true, text: (r) => r.material },
  { key: 'file', type: 'text', header: 'file', meaning: 'the notebook file of the deposition block', csvHeader: 'file', inTables: false, text: (r) => r.file },
  { key: 'tsub', type: 'number', header: quantityHeader('Tsub', 'K'), meaning: 'substrate temperature during deposition', csvHeader: 'Tsub/K', inTables: true, format: { digits: 4, notation: 'fixed' }, number: (r) => r.tsub },
  resultColumn('tsub_over_tg', (r) => r.tsubOverTg, 'Tsub/Tg'),
  { key: 'rate', type: 'number', header: quantityHeader('rate', 'nm/s'), meaning: 'deposition rate', csvHeader: 'rate/(nm/s)', inTables: true, format: { digits: 3, notation: 'fixed' }, number: (r) => r.rate },
  { key: 'thickness', type: 'number', header: quantityHeader('h', 'nm'), meaning: 'film thickness as written, else rate × duration', csvHeader: 'thickness/nm', inTables: true, format: { digits: RESULT_CATALOGUE.expected_thickness.digits, notation: 'fixed' }, number: (r) => r.thickness },
  resultColumn('tg', (r) => r.tg, 'Tg/K', 'u(Tg)/K'),
  resultColumn('tonset', (r) => r.tonset, 'Tonset/K', 'u(Tonset)/K'),
  resultColumn('tfictive', (r) => r.tfictive, 'Tf/K', 'u(Tf)/K'),
  resultColumn('density_gain', (r) => r.densityGain, 'density_gain/%', 'u(density_gain)/%'),
  resultColumn('stability_ratio', (r) => r.stabilityRatio, 'stability_ratio'),
];

/** The columns of the CLI and HTML tables. */
export const SUMMARY_TABLE_COLUMNS: readonly SummaryColumn[] = SUMMARY_COLUMNS.filter((c) => c.inTables);

/** Text columns read left to right; numbers are right-aligned. */
export function isNumeric(column: SummaryColumn): boolean {
  return column.type !== 'text';
}

/** A table cell: the text, the number, or `value ± u`; `—` when there is nothing. */
export function summaryCell(column: SummaryColumn, row: FilmSummary): string {
  switch (column.type) {
    case 'text':
      return column.text(row) ?? MISSING;
    case 'number': {
      const v = column.number(row);
      return v === undefined ? MISSING : formatMeasurement(v, undefined, column.format);
    }
    case 'result': {
      const r = column.result(row);
      return r ? formatMeasurement(r.value, r.uncertainty, column.format) : MISSING;
    }
  }
}

/** CSV headers of one column: its own, then its uncertainty's where the CSV has one. */
export function csvHeaders(column: SummaryColumn): string[] {
  return column.type === 'result' && column.csvUncertaintyHeader ? [column.csvHeader, column.csvUncertaintyHeader] : [column.csvHeader];
}

/** CSV texts of one column for a row (before CSV quoting), matching `csvHeaders`; '' for nothing. */
export function csvCells(column: SummaryColumn, row: FilmSummary): string[] {
  switch (column.type) {
    case 'text':
      return [column.text(row) ?? ''];
    case 'number': {
      const v = column.number(row);
      return [v === undefined ? '' : formatCsvNumber(v, undefined, column.format)];
    }
    case 'result': {
      const r = column.result(row);
      const value = r ? formatCsvNumber(r.value, r.uncertainty, column.format) : '';
      if (!column.csvUncertaintyHeader) return [value];
      return [value, r ? formatUncertainty(r.value, r.uncertainty, column.format) : ''];
    }
  }
}
