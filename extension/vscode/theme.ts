/** The editor's colour theme as the charts need it. */
import * as vscode from 'vscode';
import type { ChartTheme } from '../protocol/webview.js';

export function chartTheme(): ChartTheme {
  const kind = vscode.window.activeColorTheme.kind;
  if (kind === vscode.ColorThemeKind.HighContrast) return 'high-contrast';
  return kind === vscode.ColorThemeKind.Dark ? 'dark' : 'light';
}

/** The theme the server draws SVG charts in: light or dark (high contrast draws on dark). */
export function serverTheme(): 'light' | 'dark' {
  if (forceLight()) return 'light';
  return chartTheme() === 'light' ? 'light' : 'dark';
}

export function forceLight(): boolean {
  return vscode.workspace.getConfiguration('vitrine').get<boolean>('preview.forceLightCharts', false);
}
