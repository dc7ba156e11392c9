/**
 * Vitrine's chart theme, built from the design tokens only (`tokens.ts`): the sheet colour as
 * background, the title in the text face at the top left, axes in the figures face with outward
 * ticks and no frame around the plot, a faint grid. Colours of data come from the role and
 * material tokens in the specs themselves, never from a categorical palette.
 *
 * Fonts are named explicitly, and the SVG renderer estimates text width without a canvas, so the
 * layout does not depend on the fonts installed on the machine.
 */
import { PRINT, SURFACE, TYPE, type Surface, type Theme } from './tokens.js';

export type { Theme } from './tokens.js';

/** How a chart is drawn: for the screen in a light or dark theme, or for print (one journal column). */
export interface ChartOptions {
  readonly theme?: Theme;
  /** One journal column wide (PRINT.width), print font size, no title (the caption carries it). */
  readonly print?: boolean;
}

/** Everything a spec builder needs to know about the look, resolved once. */
export interface ChartLook {
  readonly theme: Theme;
  readonly print: boolean;
  readonly surface: Surface;
  /** Size of labels, axis titles and legend text (px). */
  readonly fontSize: number;
  /** Size of the chart title (px). */
  readonly titleSize: number;
}

/** The options as given: a bare theme name is still accepted. */
export function chartLook(options: ChartOptions | Theme | undefined): ChartLook {
  const o: ChartOptions = typeof options === 'string' ? { theme: options } : (options ?? {});
  const theme: Theme = o.theme === 'dark' ? 'dark' : 'light';
  const print = o.print === true;
  return {
    theme,
    print,
    surface: SURFACE[theme],
    fontSize: print ? PRINT.fontSize : TYPE.size.chartLabel,
    titleSize: print ? PRINT.fontSize + 1 : TYPE.size.chartTitle,
  };
}

/** The vega-lite config of a theme (screen sizes), or of a resolved look. */
export function themeConfig(theme: Theme | ChartLook = 'light'): Record<string, unknown> {
  const look = typeof theme === 'string' ? chartLook(theme) : theme;
  const s = look.surface;
  const size = look.fontSize;
  return {
    background: s.sheet,
    padding: look.print ? 4 : 10,
    font: TYPE.figures,
    view: { stroke: null },
    axis: {
      domainColor: s.pencil,
      domainWidth: 0.8,
      tickColor: s.pencil,
      tickWidth: 0.8,
      tickSize: look.print ? 3 : 4,
      gridColor: s.grid,
      gridWidth: 0.8,
      labelColor: s.ink,
      labelFont: TYPE.figures,
      labelFontSize: size,
      labelPadding: 3,
      labelFlush: false,
      labelSeparation: 4,
      titleColor: s.pencil,
      titleFont: TYPE.figures,
      titleFontSize: size,
      titleFontWeight: 'normal',
      titlePadding: look.print ? 4 : 7,
      tickCount: look.print ? 4 : 6,
    },
    legend: { labelColor: s.ink, titleColor: s.pencil, labelFont: TYPE.figures, titleFont: TYPE.figures, labelFontSize: size, titleFontSize: size, symbolStrokeWidth: 1.5 },
    title: { color: s.ink, subtitleColor: s.pencil, font: TYPE.text, subtitleFont: TYPE.figures, fontSize: look.titleSize, subtitleFontSize: size, fontWeight: 600, anchor: 'start', frame: 'group', offset: 12 },
    text: { color: s.ink, font: TYPE.figures, fontSize: size },
    rule: { color: s.pencil },
    line: { strokeCap: 'round', strokeJoin: 'round' },
  };
}
