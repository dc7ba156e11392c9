/**
 * What the editor shows of a block's results: the headline figures of each kind (for lenses),
 * every figure as a row (for hovers and the preview), all from the results catalogue and its one
 * formatter, so that the same value reads the same in the lens, the hover, the CLI and the report.
 */
import { catalogueEntry, resultText, type BlockKind, type BlockReport, type ResultValue } from '../core/index.js';
import type { FigureRow } from '../protocol/server.js';

/** The figures a lens shows first, per kind; others follow in the hover and the preview. */
export const HEADLINES: Readonly<Record<BlockKind, readonly string[]>> = {
  material: ['standard_tg', 'tg_vft', 'fragility'],
  deposition: ['tsub_over_tg', 'expected_thickness'],
  ramp: ['tg', 'tfictive', 'tonset', 'density_gain'],
  isotherm: ['onset_time', 'front_velocity', 'stability_ratio'],
  dsc: ['tonset', 'tfictive', 'enthalpy_gap'],
  relaxation: ['fragility', 'tg_vft'],
  results: [],
};

export function labelOf(name: string, kind?: BlockKind): string {
  return catalogueEntry(name, kind)?.label ?? name;
}

export function figureRow(name: string, r: ResultValue, kind?: BlockKind): FigureRow {
  const entry = catalogueEntry(name, kind);
  return { name, label: entry?.label ?? name, text: resultText(name, r), method: r.method, meaning: entry?.meaning ?? '' };
}

/** Every figure of a block, headlines first, then the rest in the analysis's order. */
export function figureRows(block: BlockReport): FigureRow[] {
  const head = HEADLINES[block.kind].filter((n) => block.results[n]);
  const rest = Object.keys(block.results).filter((n) => !head.includes(n));
  return [...head, ...rest].map((n) => figureRow(n, block.results[n], block.kind));
}

/** The headline figures as one line: `Tg 314.2 ± 0.3 K · Tf 301.5 K`. Empty when there are none. */
export function headlineText(block: BlockReport): string {
  return HEADLINES[block.kind]
    .filter((n) => block.results[n])
    .map((n) => `${labelOf(n, block.kind)} ${resultText(n, block.results[n])}`)
    .join(' · ');
}

/** The lens of a block: its headline figures, or what stands in their way. */
export function lensText(block: BlockReport): string {
  const errors = block.diagnostics.filter((d) => d.severity === 'error');
  const head = headlineText(block);
  if (errors.length > 0 && !head) return `${errors.length} error${errors.length === 1 ? '' : 's'}: ${errors[0].message}`;
  if (head) return errors.length > 0 ? `${head} · ${errors.length} error${errors.length === 1 ? '' : 's'}` : head;
  if (block.kind === 'results') {
    const stale = block.diagnostics.some((d) => d.code === 'results.stale');
    return stale ? 'recorded figures: out of date, refresh them' : 'recorded figures: up to date';
  }
  const warning = block.diagnostics.find((d) => d.severity === 'warning' && d.phase !== 'save');
  return warning ? `no figures: ${warning.message}` : 'no figures yet';
}

/** Markdown of a block for a hover: its figures and its metadata. */
export function blockHoverMarkdown(block: BlockReport): string {
  const title = `**${block.kind} ${block.id ?? ''}**`.trim();
  const rows = figureRows(block).map((f) => `| ${f.label} | ${f.text} |`);
  const figures = rows.length > 0 ? ['| figure | value |', '| --- | --- |', ...rows].join('\n') : '_no figures yet_';
  const meta = Object.entries(block.metadata)
    .filter(([, v]) => typeof v === 'string' || typeof v === 'number' || typeof v === 'boolean')
    .slice(0, 12)
    .map(([k, v]) => `- \`${k}\`: ${escapeMarkdown(String(v))}`)
    .join('\n');
  return [title, figures, meta].filter((s) => s.length > 0).join('\n\n');
}

/** Markdown of one figure for a hover: meaning, method, published source. */
export function figureHoverMarkdown(name: string, r: ResultValue | undefined): string {
  const entry = catalogueEntry(name);
  const lines = [`**${entry?.label ?? name}**${r ? ` = ${resultText(name, r)}` : ''}`];
  if (entry) lines.push(entry.meaning);
  if (r) lines.push(`Method: ${escapeMarkdown(r.method)}`);
  // The uncertainty budget, one line per term (standard uncertainties, largest first).
  if (r?.budget?.length) lines.push(['Uncertainty budget:', ...r.budget.map((t) => `- ${escapeMarkdown(t.source)}: ${escapeMarkdown(String(Number(t.value.toPrecision(2))))} ${escapeMarkdown(r.unit === '1' ? '' : r.unit)}${t.note ? ` (${escapeMarkdown(t.note)})` : ''}`)].join('\n'));
  if (entry) lines.push(`Source: ${escapeMarkdown(entry.source)}`);
  return lines.join('\n\n');
}

export function escapeMarkdown(text: string): string {
  return text.replace(/[\\`*_{}[\]()#+\-.!|<>]/g, (c) => `\\${c}`);
}
