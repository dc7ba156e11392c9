/**
 * Turns a block's FigureData into a vega-lite specification in Vitrine's look:
 *
 *   FigureData ──► roles (colour, shape, dash per series) ──► padded domains (px scales known)
 *              ──► series layers ──► markers in lanes ──► endotherm arrow ──► legend ──► spec
 *
 * Data are small points in their role's shape, fitted lines solid, constructions (baselines,
 * tangents) dashed, the excess area shaded, each marker a rule that starts at its label (a leader)
 * with the labels staggered in lanes so that they do not overlap. Colours come from the role
 * tokens, so the same role has the same colour in every chart; nothing depends on the order in
 * which series appear.
 */
import type { ChartRole, FigureData, FigureSeries } from '../model/figure.js';
import { markerLanes, paddedDomain, textWidth, linear } from './labels.js';
import { legendLayers, legendWidth, legendHeight, type LegendEntry } from './legend.js';
import { chartLook, themeConfig, type ChartLook, type ChartOptions, type Theme } from './theme.js';
import { PRINT, ROLE, roleColour } from './tokens.js';

export type VegaLiteSpec = Record<string, unknown>;

export const SCHEMA = 'https://vega.github.io/schema/vega-lite/v6.json';

/** Plot area of a block chart on screen (px, axes and legend outside). */
const SCREEN = { width: 420, height: 260 } as const;

/** Opacity of a shaded area, the same in the chart and in its legend swatch. */
export const AREA_OPACITY = 0.22;

/** Roles of series by the names the analyses give them, for figures that do not say. */
const ROLE_BY_NAME: Readonly<Record<string, ChartRole>> = {
  heating: 'as-deposited',
  'as deposited': 'as-deposited',
  cooling: 'liquid-cooled',
  'liquid-cooled glass': 'liquid-cooled',
  'supercooled liquid': 'supercooled-liquid',
  'liquid baseline': 'supercooled-liquid',
};

/**
 * The role of a series: as given, else by its name, else 'data' for points, 'fit' for lines and
 * 'construction' for the rest.
 */
export function seriesRole(s: FigureSeries): ChartRole {
  if (s.meaning) return s.meaning;
  const named = Object.hasOwn(ROLE_BY_NAME, s.name) ? ROLE_BY_NAME[s.name] : undefined;
  if (named) return named;
  if (s.role === 'data') return 'data';
  if (s.role === 'line') return 'fit';
  return 'construction';
}

/** The dash of a series: its role's, and a dash for constructions drawn as solid roles (a liquid baseline). */
function dashOf(s: FigureSeries, role: ChartRole): readonly number[] {
  const dash = ROLE[role].dash;
  if (dash.length > 0) return dash;
  return s.role === 'baseline' || s.role === 'tangent' ? ROLE.construction.dash : [];
}

/** Plot size for the look: the screen size, or what is left of one journal column for print. */
export function plotSize(look: ChartLook, legend: number, screen: { width: number; height: number } = SCREEN): { width: number; height: number; legendBelow: boolean } {
  if (!look.print) return { ...screen, legendBelow: false };
  // Print: the y axis (labels and title) and the paddings take about 8 em, the legend goes below the plot.
  const width = Math.max(120, Math.round(PRINT.width - 8 * look.fontSize));
  return { width, height: Math.max(90, Math.round(PRINT.height - 4.5 * look.fontSize - legend)), legendBelow: true };
}

/**
 * The chart of a block. `options` is `{ theme, print }` (a bare theme name is accepted); `size`
 * overrides the plot area on screen.
 */
export function figureSpec(title: string, figure: FigureData, options: ChartOptions | Theme = {}, size?: { width: number; height: number }): VegaLiteSpec {
  return seriesChartSpec(title, figure, options, size);
}

/**
 * `figureSpec` with an optional colour for each series in place of its role's (the notebook
 * charts colour films of one material by the material colours); `colourOf` returns a token
 * colour, or undefined for the role's.
 */
export function seriesChartSpec(title: string, figure: FigureData, options: ChartOptions | Theme = {}, size?: { width: number; height: number }, colourOf?: (s: FigureSeries) => string | undefined): VegaLiteSpec {
  const look = chartLook(options);
  const theme = look.theme;
  const fs = look.fontSize;

  const legend: LegendEntry[] = [];
  const seen = new Set<string>();
  for (const s of figure.series) {
    if (seen.has(s.name) || s.points.length === 0) continue;
    seen.add(s.name);
    const role = seriesRole(s);
    const colour = colourOf?.(s) ?? roleColour(role, theme);
    if (s.role === 'data') legend.push({ label: s.name, swatch: { kind: 'point', shape: ROLE[role].shape, colour, filled: true } });
    else if (s.role === 'area') legend.push({ label: s.name, swatch: { kind: 'area', colour, opacity: AREA_OPACITY } });
    else legend.push({ label: s.name, swatch: { kind: 'line', colour, dash: dashOf(s, role), width: s.role === 'line' ? 1.8 : 1.3 } });
  }
  const wrapProbe = look.print ? Math.round(PRINT.width - 8 * fs) : undefined;
  const legendH = look.print ? legendHeight(legend, look, wrapProbe) : 0;
  const { width, height, legendBelow } = plotSize(look, legendH, size);

  // The domains hold the data, the fitted lines and the area; constructions (baselines, tangents)
  // are clipped to them, so that a steep tangent does not squash the data.
  const xs: number[] = [];
  const ys: number[] = [];
  for (const s of figure.series) {
    const construction = s.role === 'baseline' || s.role === 'tangent';
    for (const p of s.points) {
      if (!construction) xs.push(p[0]);
      if (!construction) ys.push(p[1]);
      if (p.length > 2) ys.push(p[2]);
    }
  }
  if (xs.length === 0) for (const s of figure.series) for (const p of s.points) xs.push(p[0]);
  if (ys.length === 0) for (const s of figure.series) for (const p of s.points) ys.push(p[1]);
  for (const m of figure.markers) xs.push(m.x);
  const xDomain = paddedDomain(xs, 0.03);
  const yDomain = paddedDomain(ys, 0.06);
  const x = { field: 'x', type: 'quantitative', title: figure.xTitle, scale: { domain: xDomain, zero: false, nice: false } };
  const y = { field: 'y', type: 'quantitative', title: figure.yTitle, scale: { domain: yDomain, zero: false, nice: false } };

  const dataPoints = figure.series.filter((s) => s.role === 'data').reduce((n, s) => n + s.points.length, 0);
  const order: Record<FigureSeries['role'], number> = { area: 0, data: 1, line: 2, baseline: 3, tangent: 3 };
  const layers: VegaLiteSpec[] = [];
  for (const s of [...figure.series].sort((a, b) => order[a.role] - order[b.role])) {
    if (s.points.length === 0) continue;
    const role = seriesRole(s);
    const colour = colourOf?.(s) ?? roleColour(role, theme);
    const values = s.points.map((p, i) => ({ x: p[0], y: p[1], y2: p[2] ?? null, order: i }));
    const tooltip = [{ field: 'x', type: 'quantitative', title: figure.xTitle, format: '.4~f' }, { field: 'y', type: 'quantitative', title: figure.yTitle, format: '.5~g' }];
    if (s.role === 'area') {
      layers.push({ data: { values }, mark: { type: 'area', color: colour, opacity: AREA_OPACITY }, encoding: { x, y, y2: { field: 'y2' } } });
    } else if (s.role === 'data') {
      const small = dataPoints >= 200;
      layers.push({ data: { values }, mark: { type: 'point', shape: ROLE[role].shape, filled: true, color: colour, size: look.print ? (small ? 6 : 14) : small ? 10 : 26, opacity: 0.85, strokeWidth: 0 }, encoding: { x, y, tooltip } });
    } else {
      const line = s.role === 'line';
      layers.push({ data: { values }, mark: { type: 'line', color: colour, strokeWidth: line ? 1.8 : 1.3, strokeDash: [...dashOf(s, role)], clip: true }, encoding: { x, y, order: { field: 'order' } } });
    }
  }

  // Markers: rules that start at their labels, the labels in lanes measured in the x scale's px.
  if (figure.markers.length > 0) {
    const px = linear(xDomain, width);
    const markers = figure.markers.filter((m) => Number.isFinite(m.x));
    const lanes = markerLanes(
      markers.map((m) => px(m.x)),
      markers.map((m) => textWidth(m.label, fs)),
      width,
    );
    const laneHeight = fs + 4;
    markers.forEach((m, i) => {
      const role: ChartRole = m.meaning ?? 'construction';
      const ink = roleColour(role, theme);
      const { lane, align } = lanes[i];
      const top = 2 + lane * laneHeight;
      const xm = { field: 'x', type: 'quantitative', scale: { domain: xDomain, zero: false, nice: false } };
      const datum = { data: { values: [{ x: m.x, label: m.label }] } };
      layers.push({ ...datum, mark: { type: 'rule', color: ink, strokeWidth: 1, strokeDash: [...ROLE.construction.dash], opacity: 0.9 }, encoding: { x: xm, y: { value: top }, y2: { value: height } } });
      const text = { type: 'text', align, dx: align === 'left' ? 3 : -3, baseline: 'top', fontSize: fs, y: top };
      // A halo in the sheet colour keeps the label legible over data and lines.
      layers.push({ ...datum, mark: { ...text, stroke: look.surface.sheet, strokeWidth: 3, strokeOpacity: 0.9, color: look.surface.sheet }, encoding: { x: xm, text: { field: 'label' } } });
      layers.push({ ...datum, mark: { ...text, color: look.surface.ink }, encoding: { x: xm, text: { field: 'label' } } });
    });
  }

  // Calorimetry: which way an endotherm goes, above the top left corner of the plot.
  if (figure.endotherm) {
    const arrow = figure.endotherm === 'down' ? 'endo ↓' : 'endo ↑';
    layers.push({ data: { values: [{}] }, mark: { type: 'text', text: arrow, align: 'left', baseline: 'bottom', fontSize: fs, color: look.surface.pencil }, encoding: { x: { value: 0 }, y: { value: -4 } } });
  }

  if (legend.length > 0) {
    if (legendBelow) layers.push(...legendLayers(legend, look, 0, height + 3.2 * fs, width));
    else if (legendWidth(legend, look) > 0) layers.push(...legendLayers(legend, look, width + 16, 0));
  }

  const spec: VegaLiteSpec = {
    $schema: SCHEMA,
    width,
    height,
    layer: layers,
    config: themeConfig(look),
  };
  if (!look.print) spec.title = figure.endotherm ? { text: title, offset: fs + 12 } : title;
  return spec;
}
