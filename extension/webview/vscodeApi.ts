/** The webview host's API, acquired once for the page's lifetime. */
import type { FromWebview, WebviewState } from '../protocol/webview.js';

export interface HostApi {
  postMessage(message: FromWebview): void;
  getState(): WebviewState | undefined;
  setState(state: WebviewState): void;
}

declare global {
  function acquireVsCodeApi(): HostApi;
}

let api: HostApi | null = null;

export function hostApi(): HostApi {
  api ??= acquireVsCodeApi();
  return api;
}
