/**
 * Legends drawn as marks, so that each entry shows exactly what it names: a point in the role's
 * shape, a line in its dash, an area swatch with the area's own fill and opacity. Vega-lite's own
 * legend draws one symbol type for a whole legend; a chart of data, fits and constructions needs
 * three.
 */
import { textWidth } from './labels.js';
import type { ChartLook } from './theme.js';
import type { MarkerShape } from './tokens.js';

export type Swatch =
  | { readonly kind: 'point'; readonly shape: MarkerShape; readonly colour: string; readonly filled: boolean }
  | { readonly kind: 'line'; readonly colour: string; readonly dash: readonly number[]; readonly width: number }
  | { readonly kind: 'area'; readonly colour: string; readonly opacity: number };

export interface LegendEntry {
  readonly label: string;
  readonly swatch: Swatch;
}

/** A heading line inside a legend (e.g. "material", "technique"). */
export interface LegendHeading {
  readonly heading: string;
}

export type LegendItem = LegendEntry | LegendHeading;

const SWATCH = 18;

/** The width in px of one legend item as drawn: a heading's text, or swatch, gap and label. */
export function legendItemWidth(it: LegendItem, look: ChartLook): number {
  return 'heading' in it ? textWidth(it.heading, look.fontSize) : SWATCH + 6 + textWidth(it.label, look.fontSize);
}

/** The legend's width in px as it will be drawn (one column). */
export function legendWidth(items: readonly LegendItem[], look: ChartLook): number {
  let w = 0;
  for (const it of items) w = Math.max(w, legendItemWidth(it, look));
  return w;
}

/**
 * Vega-lite layers drawing the legend with its top left corner at (`x`, `y`) px from the plot's
 * origin: one column, or rows wrapped at `wrap` px when given.
 */
export function legendLayers(items: readonly LegendItem[], look: ChartLook, x: number, y: number, wrap?: number): Array<Record<string, unknown>> {
  const layers: Array<Record<string, unknown>> = [];
  const row = look.fontSize + (look.print ? 4 : 6);
  let cx = x;
  let cy = y;
  const one = { values: [{}] };
  const at = (px: number, py: number) => ({ x: { value: px }, y: { value: py } });
  for (const it of items) {
    const w = legendItemWidth(it, look);
    if (wrap !== undefined && cx > x && cx + w > x + wrap) {
      cx = x;
      cy += row;
    }
    const mid = cy + row / 2;
    if ('heading' in it) {
      layers.push({ data: one, mark: { type: 'text', text: it.heading, align: 'left', baseline: 'middle', fontSize: look.fontSize, color: look.surface.pencil, fontStyle: 'italic' }, encoding: at(cx, mid) });
    } else {
      const s = it.swatch;
      if (s.kind === 'point') {
        layers.push({ data: one, mark: { type: 'point', shape: s.shape, filled: s.filled, size: look.print ? 24 : 40, opacity: 1, color: s.colour, strokeWidth: 1.2 }, encoding: at(cx + SWATCH / 2, mid) });
      } else if (s.kind === 'line') {
        layers.push({ data: one, mark: { type: 'rule', color: s.colour, strokeWidth: s.width, strokeDash: [...s.dash] }, encoding: { x: { value: cx }, x2: { value: cx + SWATCH }, y: { value: mid } } });
      } else {
        layers.push({ data: one, mark: { type: 'rect', color: s.colour, opacity: s.opacity }, encoding: { x: { value: cx }, x2: { value: cx + SWATCH }, y: { value: mid - row / 3 }, y2: { value: mid + row / 3 } } });
      }
      layers.push({ data: one, mark: { type: 'text', text: it.label, align: 'left', baseline: 'middle', fontSize: look.fontSize, color: look.surface.ink }, encoding: at(cx + SWATCH + 6, mid) });
    }
    if (wrap !== undefined) cx += w + 14;
    else cy += row;
  }
  return layers;
}

/** The legend's height in px when drawn by `legendLayers` with the same `wrap`. */
export function legendHeight(items: readonly LegendItem[], look: ChartLook, wrap?: number): number {
  const row = look.fontSize + (look.print ? 4 : 6);
  if (wrap === undefined) return items.length * row;
  let cx = 0;
  let rows = items.length > 0 ? 1 : 0;
  for (const it of items) {
    const w = legendItemWidth(it, look);
    if (cx > 0 && cx + w > wrap) {
      cx = 0;
      rows++;
    }
    cx += w + 14;
  }
  return rows * row;
}
