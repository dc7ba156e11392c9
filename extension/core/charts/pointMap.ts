/**
 * The scatter chart behind the notebook maps: one point per measurement, coloured by material
 * (materialColour) and shaped by technique, error bars from the uncertainties, reference lines
 * labelled where they leave the plot, film labels placed where they collide with nothing, and a
 * legend of materials and techniques. Drawn at a fixed size, so that text stays legible.
 *
 * With fewer than `minPoints` points, or all at one x, a map has nothing to show: the builder
 * returns a note ("needs at least 2 films …") instead of a degenerate chart.
 */
import { legendHeight, legendLayers, type LegendItem } from './legend.js';
import { linear, paddedDomain, pointLabels, textWidth, type Box } from './labels.js';
import { SCHEMA, type VegaLiteSpec } from './figureSpec.js';
import { themeConfig, type ChartLook } from './theme.js';
import { materialColour, PRINT, ROLE, roleColour, TECHNIQUE_SHAPE } from './tokens.js';

export type Technique = keyof typeof TECHNIQUE_SHAPE;

export interface MapPoint {
  /** The point's label on the chart (a film id), and the block it comes from (for the tooltip). */
  readonly label: string;
  readonly block: string;
  readonly material: string;
  readonly technique: Technique;
  readonly x: number;
  readonly y: number;
  /** Standard uncertainties, drawn as ± 1 u error bars. */
  readonly ux?: number;
  readonly uy?: number;
}

/** A reference line: y = const ('level') or y = x ('identity'), labelled on the plot. */
export type ReferenceLine = { readonly kind: 'level'; readonly y: number; readonly label: string } | { readonly kind: 'identity'; readonly label: string };

/** A chart, or a note saying why it is not drawn; the report prints either. */
export type MapChart = { readonly name: string; readonly title: string; readonly spec: VegaLiteSpec } | { readonly name: string; readonly title: string; readonly note: string };

export interface PointMapInput {
  readonly name: string;
  readonly title: string;
  readonly xTitle: string;
  readonly yTitle: string;
  readonly points: readonly MapPoint[];
  /** Every material of the notebook, for stable colours. */
  readonly materials: readonly string[];
  readonly xLog?: boolean;
  readonly yLog?: boolean;
  readonly xFormat?: string;
  readonly yFormat?: string;
  readonly references?: readonly ReferenceLine[];
  /** What the points are and what must vary between them, for the note: "films", "Tsub/Tg". */
  readonly countedAs?: string;
  readonly varying?: string;
  /** The number of distinct things the points need (2 films, 2 rates); defaults to 2. */
  readonly minPoints?: number;
}

/** Plot area of a map on screen (px): fixed, never scaled into a grid cell. */
export const MAP_SIZE = { width: 300, height: 220 } as const;

const TECHNIQUE_WORDS: Record<Technique, string> = { ellipsometry: 'ellipsometry (ramps)', dilatometry: 'dilatometry (ramps)', calorimetry: 'calorimetry (dsc)', other: 'other' };

export function pointMap(input: PointMapInput, look: ChartLook): MapChart {
  const { name, title } = input;
  const min = input.minPoints ?? 2;
  const points = input.points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y) && (!input.xLog || p.x > 0) && (!input.yLog || p.y > 0));
  const distinctX = new Set(points.map((p) => p.x.toPrecision(9))).size;
  if (points.length < min || distinctX < 2) {
    const what = input.countedAs ?? 'films';
    const varying = input.varying ?? input.xTitle;
    const have = points.length >= min ? `all ${points.length} at one value` : `${points.length} so far`;
    return { name, title, note: `needs at least ${min} ${what} at different ${varying} (${have})` };
  }

  const theme = look.theme;
  const fs = look.fontSize;
  const materials = [...new Set(points.map((p) => p.material))].sort();
  const techniques = (['ellipsometry', 'dilatometry', 'calorimetry', 'other'] as const).filter((t) => points.some((p) => p.technique === t));
  const references = input.references ?? [];
  const refColour = roleColour('reference-line', theme);

  const legend: LegendItem[] = [];
  if (materials.length > 0) legend.push({ heading: 'material' });
  for (const m of materials) legend.push({ label: m, swatch: { kind: 'point', shape: 'circle', colour: materialColour(m, input.materials, theme), filled: true } });
  legend.push({ heading: 'technique' });
  for (const t of techniques) legend.push({ label: TECHNIQUE_WORDS[t], swatch: { kind: 'point', shape: TECHNIQUE_SHAPE[t], colour: look.surface.pencil, filled: true } });

  // On screen the legend stands right of the plot; in print it goes below, so that the plot keeps
  // most of the column's width.
  const width = look.print ? Math.round(PRINT.width - 8 * fs) : MAP_SIZE.width;
  const height = look.print ? Math.max(100, Math.round(PRINT.height - 4.5 * fs - legendHeight(legend, look, width))) : MAP_SIZE.height;

  // Domains from the points and their error bars (and the level lines), in log10 on log axes.
  const tx = (v: number) => (input.xLog ? Math.log10(v) : v);
  const ty = (v: number) => (input.yLog ? Math.log10(v) : v);
  const xv: number[] = [];
  const yv: number[] = [];
  for (const p of points) {
    const ux = p.ux ?? 0;
    const uy = p.uy ?? 0;
    xv.push(tx(p.x), tx(p.x + ux));
    if (!input.xLog || p.x - ux > 0) xv.push(tx(p.x - ux));
    yv.push(ty(p.y), ty(p.y + uy));
    if (!input.yLog || p.y - uy > 0) yv.push(ty(p.y - uy));
  }
  for (const r of references) if (r.kind === 'level') yv.push(ty(r.y));
  const [xa, xb] = paddedDomain(xv, 0.1);
  const [ya, yb] = paddedDomain(yv, 0.12);
  const xDomain: [number, number] = input.xLog ? [10 ** xa, 10 ** xb] : [xa, xb];
  const yDomain: [number, number] = input.yLog ? [10 ** ya, 10 ** yb] : [ya, yb];
  const px = (v: number) => linear([xa, xb], width)(tx(v));
  const py = (v: number) => linear([ya, yb], height, true)(ty(v));

  const scale = (log: boolean | undefined, domain: [number, number]) => (log ? { type: 'log', domain, nice: false } : { domain, zero: false, nice: false });
  // Log axes are labelled at 1, 2 and 5 of each decade, linear ones at about five ticks.
  const axis = (log: boolean | undefined, domain: [number, number], format: string | undefined) =>
    log ? { format: format ?? '~g', values: logTicks(domain) } : { format: format ?? '~g', tickCount: look.print ? 4 : 5 };
  const x = { field: 'x', type: 'quantitative', title: input.xTitle, scale: scale(input.xLog, xDomain), axis: axis(input.xLog, xDomain, input.xFormat) };
  const y = { field: 'y', type: 'quantitative', title: input.yTitle, scale: scale(input.yLog, yDomain), axis: axis(input.yLog, yDomain, input.yFormat) };
  const layers: VegaLiteSpec[] = [];

  // Reference lines, each labelled at the end where it leaves the plot.
  const obstacles: Box[] = [];
  for (const r of references) {
    const lo = r.kind === 'level' ? [xDomain[0], r.y] : [Math.max(xDomain[0], yDomain[0]), Math.max(xDomain[0], yDomain[0])];
    const hi = r.kind === 'level' ? [xDomain[1], r.y] : [Math.min(xDomain[1], yDomain[1]), Math.min(xDomain[1], yDomain[1])];
    if (r.kind === 'level' && (r.y < yDomain[0] || r.y > yDomain[1])) continue;
    if (r.kind === 'identity' && hi[0] <= lo[0]) continue;
    layers.push({ data: { values: [{ x: lo[0], y: lo[1] }, { x: hi[0], y: hi[1] }] }, mark: { type: 'line', color: refColour, strokeWidth: 1, strokeDash: [...ROLE['reference-line'].dash], clip: true }, encoding: { x, y } });
    const ex = px(hi[0]);
    const ey = py(hi[1]);
    const w = textWidth(r.label, fs);
    const below = ey < fs + 2;
    const box = { x0: ex - 3 - w, x1: ex - 3, y0: below ? ey + 2 : ey - 2 - fs, y1: below ? ey + 2 + fs : ey - 2 };
    obstacles.push(box);
    layers.push({ data: { values: [{}] }, mark: { type: 'text', text: r.label, align: 'right', baseline: below ? 'top' : 'bottom', fontSize: fs, color: refColour, fontStyle: 'italic' }, encoding: { x: { value: box.x1 }, y: { value: below ? box.y0 : box.y1 } } });
  }

  // One layer per material and technique, each in constant token colours (so that a preview can
  // re-theme them like every other mark), error bars under the points.
  const tooltip = [
    { field: 'label', type: 'nominal', title: 'film' },
    { field: 'material', type: 'nominal' },
    { field: 'block', type: 'nominal', title: 'block' },
    { field: 'x', type: 'quantitative', title: input.xTitle, format: '.4~g' },
    { field: 'y', type: 'quantitative', title: input.yTitle, format: '.4~g' },
  ];
  for (const m of materials) {
    const colour = materialColour(m, input.materials, theme);
    const rows = points
      .filter((p) => p.material === m)
      .map((p) => ({
        x: p.x,
        y: p.y,
        label: p.label,
        block: p.block,
        material: p.material,
        technique: p.technique,
        xlo: p.ux ? p.x - p.ux : null,
        xhi: p.ux ? p.x + p.ux : null,
        ylo: p.uy ? p.y - p.uy : null,
        yhi: p.uy ? p.y + p.uy : null,
      }));
    const yBars = rows.filter((r) => r.ylo !== null && (!input.yLog || (r.ylo ?? 0) > 0));
    const xBars = rows.filter((r) => r.xlo !== null && (!input.xLog || (r.xlo ?? 0) > 0));
    if (yBars.length > 0) layers.push({ data: { values: yBars }, mark: { type: 'rule', strokeWidth: 1, clip: true, color: colour }, encoding: { x, y: { ...y, field: 'ylo' }, y2: { field: 'yhi' } } });
    if (xBars.length > 0) layers.push({ data: { values: xBars }, mark: { type: 'rule', strokeWidth: 1, clip: true, color: colour }, encoding: { y, x: { ...x, field: 'xlo' }, x2: { field: 'xhi' } } });
    for (const t of techniques) {
      const values = rows.filter((r) => r.technique === t);
      if (values.length === 0) continue;
      layers.push({ data: { values }, mark: { type: 'point', shape: TECHNIQUE_SHAPE[t], filled: true, color: colour, size: look.print ? 30 : 60, opacity: 1, strokeWidth: 0 }, encoding: { x, y, tooltip } });
    }
  }

  // Film labels where they collide with no point, error bar end, other label or reference label.
  if (points.length <= 40) {
    const xs = points.map((p) => px(p.x));
    const ys = points.map((p) => py(p.y));
    const placed = pointLabels(xs, ys, points.map((p) => textWidth(p.label, fs)), fs, width, height, look.print ? 4 : 5, obstacles);
    points.forEach((p, i) => {
      const at = placed[i];
      if (!at) return;
      layers.push({
        data: { values: [{ x: p.x, y: p.y, label: p.label }] },
        mark: { type: 'text', align: at.align, baseline: at.baseline, dx: at.dx, dy: at.dy, fontSize: fs, color: look.surface.ink },
        encoding: { x, y, text: { field: 'label' } },
      });
    });
  }

  layers.push(...(look.print ? legendLayers(legend, look, 0, height + 3.2 * fs, width) : legendLayers(legend, look, width + 16, 0)));
  const spec: VegaLiteSpec = { $schema: SCHEMA, width, height, layer: layers, config: themeConfig(look) };
  if (!look.print) spec.title = title;
  return { name, title, spec };
}

/** 1, 2 and 5 times the powers of ten inside a positive domain (the two ends' decades when none falls inside). */
export function logTicks([lo, hi]: readonly [number, number]): number[] {
  const out: number[] = [];
  if (!(lo > 0) || !(hi > lo)) return out;
  for (let k = Math.floor(Math.log10(lo)); k <= Math.ceil(Math.log10(hi)) && out.length < 40; k++) {
    for (const m of [1, 2, 5]) {
      const v = Number((m * 10 ** k).toPrecision(12));
      if (v >= lo && v <= hi) out.push(v);
    }
  }
  return out.length > 0 ? out : [lo, hi];
}
