/** The plain-text summary table the CLI prints: one row per film. */
import type { FilmSummary, ResultValue } from '../core/index.js';

function num(v: number | undefined, digits: number): string {
  return v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits);
}

function res(v: ResultValue | undefined, digits: number): string {
  if (!v) return '—';
  if (v.uncertainty === undefined) return v.value.toFixed(digits);
  // Two significant digits of uncertainty, and the value to the same decimal place.
  const places = Math.max(digits, Math.min(6, 1 - Math.floor(Math.log10(Math.max(v.uncertainty, 1e-12)))));
  return `${v.value.toFixed(places)} ± ${v.uncertainty.toFixed(places)}`;
}

export function summaryTable(rows: readonly FilmSummary[]): string {
  const header = ['film', 'material', 'Tsub/K', 'Tsub/Tg', 'rate/(nm/s)', 'h/nm', 'Tg/K', 'Tonset/K', 'Tf/K', 'Δρ/ρ/%', 'S'];
  const body = rows.map((r) => [
    r.film,
    r.material ?? '—',
    num(r.tsub, 1),
    res(r.tsubOverTg, 3),
    num(r.rate, 3),
    num(r.thickness, 0),
    res(r.tg, 1),
    res(r.tonset, 1),
    res(r.tfictive, 1),
    res(r.densityGain, 2),
    r.stabilityRatio ? r.stabilityRatio.value.toExponential(2) : '—',
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...body.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (i < 2 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...body.map(line)].join('\n');
}
