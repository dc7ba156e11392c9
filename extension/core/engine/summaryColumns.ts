/**
 * The columns of the per-film summary (summary.ts computes the rows), defined once for every
 * presenter: the CLI table, the HTML summary table and the CSV. Each column says what it shows,
 * its header, how its numbers are printed (from the results catalogue) and its CSV header names;
 * the cell functions below give each presenter the same text for the same value.
 */
import { RESULT_CATALOGUE, type CatalogueEntry, type NumberFormat } from '../model/catalogue.js';
import { formatCsvNumber, formatIntervalEnds, formatMeasurement, formatUncertainty, MISSING } from '../model/formatResult.js';
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
  /** The unit of its numbers ('' for text, '1' for a pure number). */
  readonly unit: string;
  /** An absolute temperature in K (catalogue `absolute`): tables give °C beside it, the CSV a °C column where it has one. */
  readonly absoluteTemperature?: boolean;
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
  /** Header of the CSV column of the value in °C (a temperature), when the CSV has one. */
  readonly csvCelsiusHeader?: string;
}

/** A computed result, printed with its uncertainty. */
export interface ResultColumn extends ColumnBase {
  readonly type: 'result';
  readonly format: NumberFormat;
  readonly result: (row: FilmSummary) => ResultValue | undefined;
  /** Header of the CSV column of the standard uncertainty, when the CSV has one. */
  readonly csvUncertaintyHeader?: string;
  /** Header of the CSV column of the value in °C (a temperature), when the CSV has one. */
  readonly csvCelsiusHeader?: string;
  /** Headers of the CSV columns of the interval's two ends (a bracket). */
  readonly csvIntervalHeaders?: readonly [string, string];
  /** False when the CSV leaves out the central value (a bracket, whose ends say all). */
  readonly csvValue?: boolean;
  /** Header of the CSV column of the method. */
  readonly csvMethodHeader?: string;
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

interface CsvParts {
  readonly u?: string;
  readonly celsius?: string;
  readonly interval?: readonly [string, string];
  readonly value?: boolean;
  readonly method?: string;
  readonly inTables?: boolean;
}

function resultColumn(key: keyof typeof RESULT_CATALOGUE, pick: (row: FilmSummary) => ResultValue | undefined, csvHeader: string, csv: CsvParts = {}): ResultColumn {
  const e: CatalogueEntry = RESULT_CATALOGUE[key];
  // A °C column only beside an absolute temperature: the same rule as the report's tables.
  const celsius = e.absolute === true ? csv.celsius : undefined;
  const column: ResultColumn = { key, type: 'result', header: quantityHeader(e.label, e.unit), meaning: e.meaning, csvHeader, inTables: csv.inTables ?? true, unit: e.unit, format: { digits: e.digits, notation: e.notation }, result: pick };
  return {
    ...column,
    ...(e.absolute === true ? { absoluteTemperature: true } : {}),
    ...(csv.u ? { csvUncertaintyHeader: csv.u } : {}),
    ...(celsius ? { csvCelsiusHeader: celsius } : {}),
    ...(csv.interval ? { csvIntervalHeaders: csv.interval } : {}),
    ...(csv.value === false ? { csvValue: false } : {}),
    ...(csv.method ? { csvMethodHeader: csv.method } : {}),
  };
}

/**
 * The summary columns, in order. The tables show the conditions and the main figures; the CSV
 * has every per-film figure with its uncertainty, its value in °C beside a temperature in K, and
 * the method it was found by.
 */
export const SUMMARY_COLUMNS: readonly SummaryColumn[] = [
  { key: 'film', type: 'text', header: 'film', meaning: 'the deposition block', csvHeader: 'film', inTables: true, unit: '', text: (r) => r.film },
  { key: 'material', type: 'text', header: 'material', meaning: 'the material deposited', csvHeader: 'material', inTables: true, unit: '', text: (r) => r.material },
  { key: 'file', type: 'text', header: 'file', meaning: 'the notebook file of the deposition block', csvHeader: 'file', inTables: false, unit: '', text: (r) => r.file },
  { key: 'tsub', type: 'number', header: quantityHeader('Tsub', 'K'), meaning: 'substrate temperature during deposition', csvHeader: 'Tsub/K', csvCelsiusHeader: 'Tsub/°C', inTables: true, unit: 'K', absoluteTemperature: true, format: { digits: 4, notation: 'fixed' }, number: (r) => r.tsub },
  resultColumn('tsub_over_tg', (r) => r.tsubOverTg, 'Tsub/Tg'),
  { key: 'rate', type: 'number', header: quantityHeader('rate', 'nm/s'), meaning: 'deposition rate', csvHeader: 'rate/(nm/s)', inTables: true, unit: 'nm/s', format: { digits: 3, notation: 'fixed' }, number: (r) => r.rate },
  { key: 'thickness', type: 'number', header: quantityHeader('h', 'nm'), meaning: 'film thickness as written, else rate × duration', csvHeader: 'thickness/nm', inTables: true, unit: 'nm', format: { digits: RESULT_CATALOGUE.expected_thickness.digits, notation: 'fixed' }, number: (r) => r.thickness },
  resultColumn('tg', (r) => r.tg, 'Tg/K', { u: 'u(Tg)/K', celsius: 'Tg/°C', method: 'method(Tg)' }),
  { key: 'technique', type: 'text', header: 'technique', meaning: 'how the heating scan that gave T_onset and Tf was measured', csvHeader: 'technique', inTables: false, unit: '', text: (r) => r.scan?.technique || null },
  { key: 'scan', type: 'text', header: 'scan', meaning: 'the block of the heating scan that gave T_onset and Tf', csvHeader: 'scan', inTables: false, unit: '', text: (r) => r.scan?.block ?? null },
  { key: 'scan_rate', type: 'number', header: quantityHeader('q', 'K/min'), meaning: 'heating rate of that scan', csvHeader: 'scan_rate/(K/min)', inTables: false, unit: 'K/min', format: { digits: 3, notation: 'fixed' }, number: (r) => r.scan?.rate },
  resultColumn('tonset', (r) => r.tonset, 'Tonset/K', { u: 'u(Tonset)/K', celsius: 'Tonset/°C', method: 'method(Tonset)' }),
  resultColumn('tfictive', (r) => r.tfictive, 'Tf/K', { u: 'u(Tf)/K', celsius: 'Tf/°C', method: 'method(Tf)' }),
  resultColumn('density_gain', (r) => r.densityGain, 'density_gain/%', { u: 'u(density_gain)/%', method: 'method(density_gain)' }),
  resultColumn('stability_ratio', (r) => r.stabilityRatio, 'stability_ratio', { u: 'u(stability_ratio)', method: 'method(stability_ratio)' }),
  resultColumn('equivalent_aging_time', (r) => r.agingTime, 'aging_time/s', { value: false, interval: ['aging_time_low/s', 'aging_time_high/s'], method: 'method(aging_time)', inTables: false }),
  resultColumn('enthalpy_gap', (r) => r.enthalpyGap, 'enthalpy_gap/(J/g)', { u: 'u(enthalpy_gap)/(J/g)', method: 'method(enthalpy_gap)', inTables: false }),
  resultColumn('front_velocity', (r) => r.frontVelocity, 'front_velocity/(nm/s)', { u: 'u(front_velocity)/(nm/s)', method: 'method(front_velocity)', inTables: false }),
  resultColumn('fragility', (r) => r.fragility, 'fragility', { u: 'u(fragility)', method: 'method(fragility)', inTables: false }),
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

/** CSV headers of one column: its value, then its uncertainty, °C, interval ends and method where the CSV has them. */
export function csvHeaders(column: SummaryColumn): string[] {
  if (column.type === 'text') return [column.csvHeader];
  if (column.type === 'number') return column.csvCelsiusHeader ? [column.csvHeader, column.csvCelsiusHeader] : [column.csvHeader];
  return [
    ...(column.csvValue === false ? [] : [column.csvHeader]),
    ...(column.csvUncertaintyHeader ? [column.csvUncertaintyHeader] : []),
    ...(column.csvCelsiusHeader ? [column.csvCelsiusHeader] : []),
    ...(column.csvIntervalHeaders ?? []),
    ...(column.csvMethodHeader ? [column.csvMethodHeader] : []),
  ];
}

/** Kelvin to degrees Celsius (ITS-90 and the SI: t/°C = T/K − 273.15), kept free of binary noise. */
export function kelvinToCelsius(kelvin: number): number {
  return Number((kelvin - 273.15).toPrecision(12));
}

/**
 * A temperature in °C at the decimal place of its text in K (`313.829` K → `40.679`), so the two
 * columns carry the same resolution; '' when the kelvin text is not in fixed notation.
 */
export function celsiusText(kelvinText: string, kelvin: number): string {
  if (!/^-?\d+(\.\d+)?$/.test(kelvinText)) return '';
  const decimals = kelvinText.includes('.') ? kelvinText.length - kelvinText.indexOf('.') - 1 : 0;
  const celsius = kelvinToCelsius(kelvin);
  // Half away from zero on the decimal value (−3.15 → −3.2), not on its binary neighbour (−3.1499…).
  const scaled = Math.round(Number((Math.abs(celsius) * 10 ** decimals).toPrecision(12)));
  const digits = String(scaled).padStart(decimals + 1, '0');
  const body = decimals > 0 ? `${digits.slice(0, -decimals)}.${digits.slice(-decimals)}` : digits;
  return celsius < 0 && scaled !== 0 ? `-${body}` : body;
}

/** CSV texts of one column for a row (before CSV quoting), matching `csvHeaders`; '' for nothing. */
export function csvCells(column: SummaryColumn, row: FilmSummary): string[] {
  switch (column.type) {
    case 'text':
      return [column.text(row) ?? ''];
    case 'number': {
      const v = column.number(row);
      const text = v === undefined ? '' : formatCsvNumber(v, undefined, column.format);
      return column.csvCelsiusHeader ? [text, v === undefined ? '' : celsiusText(text, v)] : [text];
    }
    case 'result': {
      const r = column.result(row);
      const value = r ? formatCsvNumber(r.value, r.uncertainty, column.format) : '';
      const cells: string[] = [];
      if (column.csvValue !== false) cells.push(value);
      if (column.csvUncertaintyHeader) cells.push(r ? formatUncertainty(r.value, r.uncertainty, column.format) : '');
      if (column.csvCelsiusHeader) cells.push(r ? celsiusText(value, r.value) : '');
      if (column.csvIntervalHeaders) {
        const ends = r?.interval ? formatIntervalEnds(r.interval, r.value, r.uncertainty, column.format) : ['', ''];
        cells.push(...ends.map((e) => (e === MISSING ? '' : e)));
      }
      if (column.csvMethodHeader) cells.push(r?.method ?? '');
      return cells;
    }
  }
}
