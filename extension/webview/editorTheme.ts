/**
 * Reads the editor's theme from the page: the CSS variables VS Code sets on the root element and
 * the theme class on the body. Watches both, as the editor changes them in place.
 */
import type { ChartTheme } from '../protocol/webview.js';
import { chartColours, themeKindOf, THEME_VARIABLES, vegaConfig, type ThemeVariables } from './chartConfig.js';
import type { ChartStyle } from './chartPainter.js';

export function readThemeVariables(): ThemeVariables {
  const computed = getComputedStyle(document.documentElement);
  return Object.fromEntries(THEME_VARIABLES.map((name) => [name, computed.getPropertyValue(name)]));
}

/** The chart style for the page as it is now; `theme` is the extension's word, used when the body has no theme class. */
export function currentChartStyle(theme: ChartTheme, forceLight: boolean): ChartStyle {
  const kind = themeKindOf([...document.body.classList], theme);
  const colours = chartColours(readThemeVariables(), kind, forceLight);
  return { colours, config: vegaConfig(colours) };
}

/** Calls `onChange` (once per frame at most) when the body's classes or the root's variables change. */
export function watchEditorTheme(onChange: () => void): void {
  let pending = false;
  const observer = new MutationObserver(() => {
    if (pending) return;
    pending = true;
    requestAnimationFrame(() => {
      pending = false;
      onChange();
    });
  });
  observer.observe(document.body, { attributes: true, attributeFilter: ['class'] });
  observer.observe(document.documentElement, { attributes: true, attributeFilter: ['style', 'class'] });
}

export function prefersReducedMotion(): boolean {
  return document.body.classList.contains('vscode-reduce-motion') || matchMedia('(prefers-reduced-motion: reduce)').matches;
}
