/**
 * Hovers: on a reference (`film: D-17`), the referenced block's figures and metadata; on a figure
 * in a results block, its meaning, method and source; on a quantity, its value in the units
 * practitioners read (K and °C, nm and Å); on a block's fence line, the block's own figures.
 */
import type { Hover, Position } from 'vscode-languageserver';
import { catalogueEntry, type Quantity, type TableExcerpt } from '../core/index.js';
import { at, reportOf } from './blocks.js';
import { blockHoverMarkdown, figureHoverMarkdown } from './figures.js';
import type { Workspace } from './workspace.js';

const REFERENCE_KEYS = new Set(['/film', '/material', '/reference', '/of']);

export function hover(ws: Workspace, uri: string, position: Position): Hover | null {
  const a = at(ws, uri, position);
  if (!a) return null;
  const engine = a.place.folder.engine;
  const entry = engine.entryAt(a.place.rel, a.offset);
  const markdown = (value: string, span: { start: number; end: number }): Hover => ({ contents: { kind: 'markdown', value }, range: a.text.range(span) });
  if (entry) {
    if (REFERENCE_KEYS.has(entry.pointer) && typeof entry.value === 'string' && !entry.onKey) {
      const target = engine.definitionOf(entry.value);
      const report = target ? reportOf(a.place, target) : undefined;
      return report ? markdown(blockHoverMarkdown(report), entry.valueSpan) : null;
    }
    const own = reportOf(a.place, entry.block);
    const name = entry.pointer.slice(1);
    if (entry.block.kind === 'results' && catalogueEntry(name)) {
      const of = own?.metadata.of;
      const target = typeof of === 'string' ? engine.definitionOf(of) : undefined;
      const current = target ? reportOf(a.place, target)?.results[name] : undefined;
      return markdown(figureHoverMarkdown(name, current), entry.onKey ? entry.keySpan : entry.valueSpan);
    }
    if (entry.pointer === '/data' && own?.tableExcerpt && !entry.onKey) return markdown(tableExcerptMarkdown(own.tableExcerpt), entry.valueSpan);
    const q = own?.quantities[entry.pointer];
    if (q && !entry.onKey) return markdown(quantityMarkdown(q), entry.valueSpan);
    return null;
  }
  const block = engine.blockAt(a.place.rel, a.offset);
  if (!block) return null;
  const fenceLine = a.text.position(block.span.start).line;
  if (position.line !== fenceLine) return null;
  const report = reportOf(a.place, block);
  if (!report) return null;
  const excerpt = report.tableExcerpt ? `\n\n---\n\n${tableExcerptMarkdown(report.tableExcerpt)}` : '';
  return markdown(blockHoverMarkdown(report) + excerpt, block.idSpan ?? { start: block.span.start, end: block.span.start + 3 });
}

/** The first lines of a failed data table as Vitrine read them, in a fence long enough for any backticks inside. */
export function tableExcerptMarkdown(excerpt: TableExcerpt): string {
  const longest = Math.max(2, ...excerpt.lines.map((l) => Math.max(0, ...(l.match(/`+/g) ?? []).map((r) => r.length))));
  const fence = '`'.repeat(longest + 1);
  const where = excerpt.path ? `\`${excerpt.path}\`, from line ${excerpt.firstLine + 1}` : `the inline table, from line ${excerpt.firstLine + 1}`;
  return `**The table as read** (${where}):\n\n${fence}text\n${excerpt.lines.join('\n')}\n${fence}`;
}

/** A quantity in its canonical unit and the other units people read it in. */
export function quantityMarkdown(q: Quantity): string {
  const v = q.value;
  const u = q.uncertainty;
  const n = (x: number) => String(Number(x.toPrecision(6)));
  const pm = (factor: number) => (u !== undefined ? ` ± ${n(u * factor)}` : '');
  const lines: string[] = [];
  switch (q.dimension === 'temperature_interval' ? 'ΔK' : q.unit) {
    case 'K':
      lines.push(`${n(v)}${pm(1)} K`, `${n(v - 273.15)}${pm(1)} °C`);
      break;
    case 'nm':
      lines.push(`${n(v)}${pm(1)} nm`, `${n(v * 10)}${pm(10)} Å`, `${n(v / 1000)}${pm(1e-3)} µm`);
      break;
    case 's':
      lines.push(`${n(v)}${pm(1)} s`, `${n(v / 60)}${pm(1 / 60)} min`, `${n(v / 3600)}${pm(1 / 3600)} h`);
      break;
    case 'Pa':
      lines.push(`${n(v)}${pm(1)} Pa`, `${n(v / 133.322368)}${pm(1 / 133.322368)} Torr`, `${n(v / 100)}${pm(1e-2)} mbar`);
      break;
    case 'nm/s':
      lines.push(`${n(v)}${pm(1)} nm/s`, `${n(v * 10)}${pm(10)} Å/s`);
      break;
    case 'K/min':
      lines.push(`${n(v)}${pm(1)} K/min`, `${n(v / 60)}${pm(1 / 60)} K/s`);
      break;
    default:
      lines.push(`${n(v)}${pm(1)} ${q.unit}`);
  }
  const written = q.writtenUnit ? `written in ${q.writtenUnit}` : 'written without a unit';
  // A bound (`< 3e-7 Torr`) is shown as one, in every unit.
  const sign = q.bound === 'upper' ? '< ' : q.bound === 'lower' ? '> ' : '';
  const bound = q.bound ? `, an ${q.bound} bound` : '';
  return `${lines.map((l) => sign + l).join(' = ')}\n\n_${written}${bound}_`;
}
