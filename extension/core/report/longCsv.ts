/**
 * `--csv-long`: the tidy form of every figure in the notebook (Wickham, "Tidy data", J. Stat.
 * Softw. 59(10), 2014: one observation per row, one variable per column), ready for a data
 * frame: one row per block × figure, with the film, material, technique and rate the block
 * belongs to, the value at full precision and as printed (rounded to its uncertainty), the
 * interval's ends and the method. Units are those of the results contract.
 */
import type { NotebookReport } from '../engine/notebook.js';
import { techniqueOf } from '../engine/summary.js';
import { catalogueEntry } from '../model/catalogue.js';
import { formatCsvNumber, formatIntervalEnds, formatOf, formatUncertainty, MISSING } from '../model/formatResult.js';
import { csvField, csvNumberField } from './escape.js';
import { subjectsOf } from './subject.js';

export const LONG_CSV_HEADERS = [
  'file',
  'block',
  'kind',
  'film',
  'material',
  'technique',
  'rate',
  'rate_unit',
  'figure',
  'label',
  'value',
  'uncertainty',
  'unit',
  'value_rounded',
  'uncertainty_rounded',
  'interval_low',
  'interval_high',
  'method',
] as const;

/**
 * A number at full precision: the shortest decimal that reads back as the same double (at most
 * 17 significant digits, ECMAScript Number::toString), so a data frame gets the computed value
 * itself; '' for a missing or non-finite number.
 */
function fullPrecision(x: number | undefined): string {
  return x === undefined || !Number.isFinite(x) ? '' : String(x);
}

/** Rows in notebook order (files by path as the report lists them, blocks by position, figures as computed). */
export function longCsv(report: NotebookReport): string {
  const subjectOf = subjectsOf(report);
  const lines = [LONG_CSV_HEADERS.join(',')];
  for (const f of report.files) {
    for (const b of f.blocks) {
      const s = subjectOf(b);
      const rate = b.quantities['/rate'];
      for (const [name, r] of Object.entries(b.results)) {
        const format = formatOf(name);
        const ends = r.interval ? formatIntervalEnds(r.interval, r.value, r.uncertainty, format) : ['', ''];
        const cells = [
          csvField(f.path),
          csvField(b.id ?? ''),
          csvField(b.kind),
          csvField(s.film ?? ''),
          csvField(s.material ?? ''),
          csvField(techniqueOf(b)),
          rate && Number.isFinite(rate.value) ? csvField(rate.value) : '',
          rate ? csvField(rate.unit) : '',
          csvField(name),
          csvField(catalogueEntry(name)?.label ?? ''),
          fullPrecision(r.value),
          fullPrecision(r.uncertainty),
          csvField(r.unit),
          csvNumberField(formatCsvNumber(r.value, r.uncertainty, format)),
          csvNumberField(formatUncertainty(r.value, r.uncertainty, format)),
          ...ends.map((e) => (e === MISSING ? '' : csvNumberField(e))),
          csvField(r.method),
        ];
        lines.push(cells.join(','));
      }
    }
  }
  return lines.join('\n') + '\n';
}
