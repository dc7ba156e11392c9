/**
 * Chart themes and the colour-blind-safe palette (Okabe & Ito, "Color Universal Design", 2008).
 * Fonts are named explicitly, and the SVG renderer estimates text width without a canvas, so
 * the layout does not depend on the fonts installed on the machine.
 */
export type Theme = 'light' | 'dark';

export const PALETTE = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#F0E442', '#000000'] as const;

export const FONT = 'DejaVu Sans, Verdana, sans-serif';

export function themeConfig(theme: Theme): Record<string, unknown> {
  const fg = theme === 'dark' ? '#d4d4d4' : '#222222';
  const grid = theme === 'dark' ? '#3a3a3a' : '#e6e6e6';
  return {
    background: theme === 'dark' ? '#1e1e1e' : '#ffffff',
    font: FONT,
    view: { stroke: null },
    axis: { labelColor: fg, titleColor: fg, domainColor: fg, tickColor: fg, gridColor: grid, labelFontSize: 11, titleFontSize: 12, titleFontWeight: 'normal' },
    legend: { labelColor: fg, titleColor: fg, labelFontSize: 11, titleFontSize: 11, orient: 'bottom', direction: 'horizontal', columns: 3, symbolLimit: 12, labelLimit: 220, symbolOpacity: 1 },
    title: { color: fg, fontSize: 13, anchor: 'start', fontWeight: 'bold' },
    text: { color: fg },
    range: { category: [...PALETTE] },
  };
}
