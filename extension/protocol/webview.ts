/**
 * Messages between the VS Code extension and the chart preview webview: types only. Data travel
 * by message, never by URL.
 */
import type { BlockChart, SummaryResult } from './server.js';

export type ChartTheme = 'light' | 'dark' | 'high-contrast';

/** Extension → webview. */
export type ToWebview =
  /** The charts of a notebook file (every data block, in order). */
  | { readonly type: 'show'; readonly uri: string; readonly fileName: string; readonly version: number | null; readonly blocks: readonly BlockChart[]; readonly theme: ChartTheme; readonly forceLight: boolean }
  /** The cursor is on this 0-based line of the shown file: scroll its block into view and mark it. */
  | { readonly type: 'cursor'; readonly uri: string; readonly line: number }
  /** The editor's colour theme changed. */
  | { readonly type: 'theme'; readonly theme: ChartTheme; readonly forceLight: boolean }
  /** The notebook summary (films table and stability maps), for the summary view. */
  | { readonly type: 'summary'; readonly summary: SummaryResult; readonly theme: ChartTheme; readonly forceLight: boolean };

/** Webview → extension. */
export type FromWebview =
  | { readonly type: 'ready' }
  /** The user clicked a chart: reveal its block (0-based line of its fence) in the editor. */
  | { readonly type: 'reveal'; readonly uri: string; readonly line: number }
  /** The user asked to export a chart; `data` is SVG text or a PNG data URL, background included. */
  | { readonly type: 'export'; readonly name: string; readonly format: 'svg' | 'png'; readonly data: string }
  | { readonly type: 'error'; readonly message: string };

/** What the webview keeps across a reload (VS Code's webview state), restored by the serializer. */
export interface WebviewState {
  readonly uri: string | null;
  readonly view: 'charts' | 'summary';
}
