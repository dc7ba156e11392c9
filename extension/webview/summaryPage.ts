/**
 * The summary view: every film of the workspace in one table (a row reveals the film's
 * deposition block), then the stability maps as chart cards.
 */
import type { SummaryResult } from '../protocol/server.js';
import { safeName, type CardContext } from './blockCards.js';
import { h, onActivate } from './dom.js';

/** A column of numbers (blanks and dashes aside) is right-aligned, so that its digits line up. */
const NUMBER = /^[-+−]?(\d|\.\d)/;

export function summaryPage(summary: SummaryResult, ctx: CardContext): HTMLElement {
  const count = summary.rows.length;
  const header = h('header', { className: 'page-header' }, [
    h('h1', { className: 'page-title', text: 'Films' }),
    h('span', { className: 'page-meta', text: count === 1 ? '1 film' : `${count} films` }),
  ]);
  const films = count > 0 ? filmsTable(summary, ctx) : h('p', { className: 'empty', text: 'No films in the workspace yet.' });
  const maps = summary.maps.map((m) => mapCard(m, ctx));
  return h('div', { className: 'page' }, [header, films, maps.length > 0 ? h('div', { className: 'maps' }, maps) : null]);
}

function filmsTable(summary: SummaryResult, ctx: CardContext): HTMLElement {
  const numeric = summary.columns.map((_, i) => i > 0 && summary.rows.some((r) => NUMBER.test(r.cells[i] ?? '')) && summary.rows.every((r) => !r.cells[i] || NUMBER.test(r.cells[i]) || !/[0-9]/.test(r.cells[i])));
  const cls = (i: number) => (numeric[i] ? 'num' : '');
  const head = h('thead', {}, [h('tr', {}, summary.columns.map((c, i) => h('th', { text: c, className: cls(i), attrs: { scope: 'col' } })))]);
  const rows = summary.rows.map((row) => {
    const cells = summary.columns.map((_, i) => {
      const text = row.cells[i] ?? '';
      return i === 0 ? h('th', { text, attrs: { scope: 'row' } }) : h('td', { text, className: cls(i) });
    });
    const tr = h('tr', { className: 'film-row', attrs: { tabindex: '0', title: `Show ${row.film} in the editor` } }, cells);
    onActivate(tr, () => ctx.post({ type: 'reveal', uri: row.uri, line: row.line }));
    return tr;
  });
  return h('div', { className: 'table-scroll' }, [h('table', { className: 'films' }, [head, h('tbody', {}, rows)])]);
}

function mapCard(map: SummaryResult['maps'][number], ctx: CardContext): HTMLElement {
  const title = specTitle(map.vega) ?? map.title;
  const buttons = ctx.painter.exportButtons(title);
  const slot = h('div', { className: 'chart' });
  const card = h('section', { className: 'card', attrs: { 'aria-label': title } }, [
    h('header', { className: 'card-header' }, [h('h2', { className: 'card-title', text: title }), h('div', { className: 'card-actions' }, buttons)]),
    slot,
  ]);
  ctx.painter.paint(slot, map.vega, ctx.style, safeName(map.title), buttons);
  return card;
}

/** The title text a compiled spec carries, if any. */
function specTitle(spec: unknown): string | null {
  if (typeof spec !== 'object' || spec === null) return null;
  const title = (spec as { title?: unknown }).title;
  if (typeof title === 'string') return title;
  if (typeof title === 'object' && title !== null) {
    const text = (title as { text?: unknown }).text;
    if (typeof text === 'string') return text;
    if (Array.isArray(text) && text.every((t) => typeof t === 'string')) return text.join(' ');
  }
  return null;
}
