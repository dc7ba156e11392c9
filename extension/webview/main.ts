/**
 * The chart preview's page script. The extension posts `ToWebview` messages; this script draws
 * the charts view (one card per data block of a file) or the summary view, and posts back
 * `ready`, `reveal`, `export` and `error`. Everything shown is built with DOM calls and
 * `textContent`; charts are drawn by Vega without `eval`.
 *
 *   message ──► readMessage (drop what is not ours) ──► page state ──► draw ──► cards + charts
 *                                                                   ▲
 *              theme message, editor theme change (body class, CSS variables)
 */
import type { SummaryResult } from '../protocol/server.js';
import type { ChartTheme, ToWebview, WebviewState } from '../protocol/webview.js';
import { chartsPage, type ChartsPage } from './blockCards.js';
import { ChartPainter, type Post } from './chartPainter.js';
import { h } from './dom.js';
import { currentChartStyle, prefersReducedMotion, watchEditorTheme } from './editorTheme.js';
import { readMessage } from './messages.js';
import { summaryPage } from './summaryPage.js';
import { hostApi } from './vscodeApi.js';

type Page = { readonly view: 'charts'; readonly charts: ChartsPage; readonly version: number | null } | { readonly view: 'summary'; readonly summary: SummaryResult };

const host = hostApi();
const post: Post = (message) => host.postMessage(message);
const painter = new ChartPainter(post);
/** The page's `#vitrine-root`, or a new one when the page has none. */
const root = document.getElementById('vitrine-root') ?? document.body.appendChild(h('main', { attrs: { id: 'vitrine-root' } }));

let page: Page | null = null;
let theme: ChartTheme = 'light';
let forceLight = false;
/** The cursor's 0-based line in the shown file, or null. */
let cursorLine: number | null = null;
/** The colours of the last drawing, to redraw only when the editor theme really changed. */
let drawnStyle = '';

const restored = readState(host.getState());
root.appendChild(h('p', { className: 'empty', text: restored?.uri || restored?.view === 'summary' ? 'Loading…' : 'Open a notebook file to see its charts.' }));

window.addEventListener('message', (event: MessageEvent) => {
  const message = readMessage(event.data);
  if (message) receive(message);
});
watchEditorTheme(redrawIfThemeChanged);
post({ type: 'ready' });

function receive(message: ToWebview): void {
  switch (message.type) {
    case 'show': {
      const same = page?.view === 'charts' && page.charts.uri === message.uri;
      // A late answer for an older version of the same file is stale.
      if (same && page?.view === 'charts' && page.version !== null && message.version !== null && message.version < page.version) return;
      if (!same) cursorLine = null;
      page = { view: 'charts', charts: { uri: message.uri, fileName: message.fileName, blocks: message.blocks }, version: message.version };
      theme = message.theme;
      forceLight = message.forceLight;
      draw(same);
      saveState();
      return;
    }
    case 'cursor':
      if (page?.view !== 'charts' || page.charts.uri !== message.uri) return;
      cursorLine = message.line;
      markCursor(true);
      return;
    case 'theme':
      theme = message.theme;
      forceLight = message.forceLight;
      // The editor also changes the page's variables and body class, which the watcher sees; the
      // charts are drawn again once, by whichever comes first with new colours.
      redrawIfThemeChanged();
      return;
    case 'summary': {
      const same = page?.view === 'summary';
      page = { view: 'summary', summary: message.summary };
      theme = message.theme;
      forceLight = message.forceLight;
      draw(same);
      saveState();
      return;
    }
  }
}

/**
 * Draws the current page afresh. With `keepPlace`, the scroll position is kept and each chart
 * keeps the height its card had, so that a redraw while typing does not make the page jump.
 */
function draw(keepPlace: boolean): void {
  if (!page) return;
  const heights = new Map<string, number>();
  const scrollY = window.scrollY;
  if (keepPlace) {
    root.querySelectorAll<HTMLElement>('.card').forEach((card, i) => {
      const chart = card.querySelector<HTMLElement>('.chart');
      if (chart) heights.set(card.dataset.key ?? `#${i}`, chart.offsetHeight);
    });
  }
  painter.reset();
  const style = currentChartStyle(theme, forceLight);
  drawnStyle = JSON.stringify(style.colours);
  document.body.classList.toggle('force-light', forceLight);
  const ctx = { painter, style, post };
  root.replaceChildren(page.view === 'charts' ? chartsPage(page.charts, ctx) : summaryPage(page.summary, ctx));
  if (keepPlace) {
    root.querySelectorAll<HTMLElement>('.card').forEach((card, i) => {
      const height = heights.get(card.dataset.key ?? `#${i}`);
      const chart = card.querySelector<HTMLElement>('.chart');
      if (chart && height) chart.style.minHeight = `${height}px`;
    });
    window.scrollTo(0, scrollY);
  }
  markCursor(false);
}

function redrawIfThemeChanged(): void {
  if (page && JSON.stringify(currentChartStyle(theme, forceLight).colours) !== drawnStyle) draw(true);
}

/** Marks the card of the block that holds the cursor line, and scrolls it into view if asked. */
function markCursor(scroll: boolean): void {
  root.querySelectorAll('.card.is-current').forEach((card) => card.classList.remove('is-current'));
  if (cursorLine === null) return;
  const line = cursorLine;
  const card = [...root.querySelectorAll<HTMLElement>('.card[data-line]')].find((c) => Number(c.dataset.line) <= line && line <= Number(c.dataset.endLine));
  if (!card) return;
  card.classList.add('is-current');
  if (scroll) card.scrollIntoView({ block: 'nearest', behavior: prefersReducedMotion() ? 'auto' : 'smooth' });
}

function saveState(): void {
  const state: WebviewState = page?.view === 'charts' ? { uri: page.charts.uri, view: 'charts' } : { uri: null, view: 'summary' };
  host.setState(state);
}

function readState(state: unknown): WebviewState | null {
  if (typeof state !== 'object' || state === null) return null;
  const { uri, view } = state as { uri?: unknown; view?: unknown };
  if ((typeof uri === 'string' || uri === null) && (view === 'charts' || view === 'summary')) return { uri, view };
  return null;
}
