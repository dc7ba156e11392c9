/**
 * Incoming messages, checked before use: anything that is not a well-formed `ToWebview` is
 * dropped (null). Pure: no DOM access.
 */
import type { BlockChart, SummaryResult } from '../protocol/server.js';
import type { ChartTheme, ToWebview } from '../protocol/webview.js';

const THEMES: ReadonlySet<string> = new Set<ChartTheme>(['light', 'dark', 'high-contrast']);

export function readMessage(data: unknown): ToWebview | null {
  if (!isRecord(data)) return null;
  switch (data.type) {
    case 'show':
      return isString(data.uri) && isString(data.fileName) && (data.version === null || isNumber(data.version)) && isArrayOf(data.blocks, isBlockChart) && isThemed(data)
        ? (data as unknown as ToWebview)
        : null;
    case 'cursor':
      return isString(data.uri) && isNumber(data.line) ? (data as unknown as ToWebview) : null;
    case 'theme':
      return isThemed(data) ? (data as unknown as ToWebview) : null;
    case 'summary':
      return isSummary(data.summary) && isThemed(data) ? (data as unknown as ToWebview) : null;
    default:
      return null;
  }
}

function isThemed(data: Record<string, unknown>): boolean {
  return isString(data.theme) && THEMES.has(data.theme) && typeof data.forceLight === 'boolean';
}

function isBlockChart(x: unknown): x is BlockChart {
  return (
    isRecord(x) &&
    isString(x.kind) &&
    (x.id === null || isString(x.id)) &&
    isNumber(x.line) &&
    isNumber(x.endLine) &&
    isString(x.title) &&
    'vega' in x &&
    isArrayOf(x.figures, (f) => isRecord(f) && isString(f.label) && isString(f.text) && isString(f.method)) &&
    isArrayOf(x.diagnostics, (d) => isRecord(d) && isString(d.severity) && isString(d.code) && isString(d.message))
  );
}

function isSummary(x: unknown): x is SummaryResult {
  return (
    isRecord(x) &&
    isArrayOf(x.columns, isString) &&
    isArrayOf(x.rows, (r) => isRecord(r) && isString(r.film) && isString(r.uri) && isNumber(r.line) && isArrayOf(r.cells, isString)) &&
    isArrayOf(x.maps, (m) => isRecord(m) && isString(m.title) && 'vega' in m)
  );
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

function isString(x: unknown): x is string {
  return typeof x === 'string';
}

function isNumber(x: unknown): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

function isArrayOf(x: unknown, item: (y: unknown) => boolean): boolean {
  return Array.isArray(x) && x.every(item);
}
