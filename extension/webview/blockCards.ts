/**
 * The charts view: one card per data block of the shown file, in order — title and export
 * buttons, the chart, the figures table, the block's diagnostics.
 */
import type { BlockChart, BlockDiagnosticRow, FigureRow } from '../protocol/server.js';
import type { ChartPainter, ChartStyle, Post } from './chartPainter.js';
import { h, onActivate } from './dom.js';

export interface ChartsPage {
  readonly uri: string;
  readonly fileName: string;
  readonly blocks: readonly BlockChart[];
}

export interface CardContext {
  readonly painter: ChartPainter;
  readonly style: ChartStyle;
  readonly post: Post;
}

/** A stable key for a block's card across redraws of the same file. */
export function cardKey(block: BlockChart, index: number): string {
  return block.id ? `${block.kind}:${block.id}` : `${block.kind}#${index}`;
}

export function chartsPage(page: ChartsPage, ctx: CardContext): HTMLElement {
  const count = page.blocks.length;
  const header = h('header', { className: 'page-header' }, [
    h('h1', { className: 'page-title', text: page.fileName }),
    h('span', { className: 'page-meta', text: count === 1 ? '1 data block' : `${count} data blocks` }),
  ]);
  const cards = page.blocks.map((block, i) => blockCard(page.uri, block, i, ctx));
  const body = count > 0 ? cards : [h('p', { className: 'empty', text: 'This file has no data blocks.' })];
  return h('div', { className: 'page' }, [header, ...body]);
}

function blockCard(uri: string, block: BlockChart, index: number, ctx: CardContext): HTMLElement {
  const reveal = (line: number) => ctx.post({ type: 'reveal', uri, line });
  const name = exportName(block);
  const buttons = block.vega !== null && block.vega !== undefined ? ctx.painter.exportButtons(block.title) : [];
  const header = h('header', { className: 'card-header' }, [
    h('h2', { className: 'card-title', text: block.title }),
    h('span', { className: 'card-line', text: `line ${block.line + 1}` }),
    buttons.length > 0 ? h('div', { className: 'card-actions' }, buttons) : null,
  ]);
  const card = h('section', { className: 'card', attrs: { 'data-key': cardKey(block, index), 'data-line': String(block.line), 'data-end-line': String(block.endLine), 'aria-label': block.title } }, [header]);

  if (buttons.length > 0) {
    const slot = h('div', { className: 'chart', attrs: { role: 'button', tabindex: '0', title: 'Show this block in the editor', 'aria-label': `Chart of ${block.title}; show the block in the editor` } });
    onActivate(slot, () => reveal(block.line));
    card.appendChild(slot);
    ctx.painter.paint(slot, block.vega, ctx.style, name, buttons);
  }
  if (block.figures.length > 0) card.appendChild(figuresTable(block.figures));
  if (block.diagnostics.length > 0) card.appendChild(diagnosticsList(block.diagnostics, reveal));
  if (buttons.length === 0 && block.figures.length === 0 && block.diagnostics.length === 0) {
    card.appendChild(h('p', { className: 'empty', text: 'No figures for this block yet.' }));
  }
  return card;
}

function figuresTable(figures: readonly FigureRow[]): HTMLElement {
  const head = h('thead', {}, [h('tr', {}, [h('th', { text: 'figure', attrs: { scope: 'col' } }), h('th', { text: 'value', attrs: { scope: 'col' } }), h('th', { text: 'method', attrs: { scope: 'col' } })])]);
  const rows = figures.map((f) =>
    h('tr', {}, [
      h('th', { className: 'figure-label', text: f.label, attrs: { scope: 'row', ...(f.meaning ? { title: f.meaning } : {}) } }),
      h('td', { className: 'figure-value', text: f.text }),
      h('td', { className: 'figure-method', text: f.method }),
    ]),
  );
  return h('table', { className: 'figures' }, [head, h('tbody', {}, rows)]);
}

function diagnosticsList(diagnostics: readonly BlockDiagnosticRow[], reveal: (line: number) => void): HTMLElement {
  const items = diagnostics.map((d) => {
    const where = h('span', { className: 'diagnostic-line', text: `line ${d.line + 1}`, attrs: { role: 'link', tabindex: '0', title: 'Show this line in the editor' } });
    onActivate(where, () => reveal(d.line));
    return h('li', { className: `diagnostic severity-${severityClass(d.severity)}` }, [
      h('span', { className: 'diagnostic-severity', text: d.severity }),
      h('span', { className: 'diagnostic-message', text: d.message }),
      h('code', { className: 'diagnostic-code', text: d.code }),
      where,
    ]);
  });
  return h('ul', { className: 'diagnostics', attrs: { 'aria-label': 'Problems' } }, items);
}

function severityClass(severity: string): string {
  return severity === 'error' || severity === 'warning' ? severity : 'info';
}

/** The export's file name without extension: the block id, or its kind and line. */
function exportName(block: BlockChart): string {
  return safeName(block.id ?? `${block.kind}-line-${block.line + 1}`);
}

export function safeName(text: string): string {
  const s = text.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^[-.]+|-+$/g, '');
  return s.length > 0 ? s.slice(0, 80) : 'chart';
}
