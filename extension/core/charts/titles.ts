/**
 * Chart titles that say what a chart shows: the block, then its subject as the report's cards
 * write it (charts/subject.ts), e.g. "R-17a · film D-17 · aster-3 · Tsub 281.0 K (7.9 °C)"; for a
 * block of a material, "Q-dielectric · quillite".
 */
import type { BlockReport, NotebookReport } from '../engine/notebook.js';
import { figureSpec, type VegaLiteSpec } from './figureSpec.js';
import { filmBlockOf, subjectOf, subjectText } from './subject.js';
import type { ChartOptions, Theme } from './theme.js';

/** A temperature in K for a chart label: at most one decimal, none when it is whole. */
export function kelvin(value: number): string {
  return `${Number(value.toFixed(1))} K`;
}

/** The title of a block's chart, given the deposition block of its film when it has one. */
export function chartTitle(block: BlockReport, film?: BlockReport): string {
  const name = block.id ?? block.kind;
  if (block.kind === 'material') return block.id ? `${block.kind} ${block.id}` : block.kind;
  const s = subjectOf(block, film);
  // A deposition block is the film itself: its material and Tsub remain.
  const about = subjectText(block.kind === 'deposition' ? { ...s, film: null } : s);
  return about ? `${name} · ${about}` : block.id ? `${block.kind} ${block.id}` : block.kind;
}

/** The title of a block's chart, looking its film up in the report. */
export function blockChartTitle(block: BlockReport, report: NotebookReport): string {
  return chartTitle(block, filmBlockOf(block, report));
}

/** The chart of a block with its title (film, material, Tsub) from the report; null when the block has no figure. */
export function blockChartSpec(block: BlockReport, report: NotebookReport, options: ChartOptions | Theme = {}): VegaLiteSpec | null {
  return block.figure ? figureSpec(blockChartTitle(block, report), block.figure, options) : null;
}
