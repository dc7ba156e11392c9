/**
 * Turns a block's FigureData into a vega-lite specification: data as small points, fitted lines
 * solid, constructions (baselines, tangents) dashed, the excess area shaded, and each marker a
 * labelled vertical rule. Colours come from the colour-blind-safe palette by series name, so the
 * same name keeps its colour in every chart.
 */
import type { FigureData } from '../model/figure.js';
import { themeConfig, type Theme } from './theme.js';

export type VegaLiteSpec = Record<string, unknown>;

export function figureSpec(title: string, figure: FigureData, theme: Theme = 'light', size = { width: 420, height: 260 }): VegaLiteSpec {
  const rows: Array<Record<string, unknown>> = [];
  for (const s of figure.series) {
    s.points.forEach((p, i) => rows.push({ series: s.name, role: s.role, x: p[0], y: p[1], y2: p[2] ?? null, order: i }));
  }
  const names = [...new Set(figure.series.map((s) => s.name))];
  const dataPoints = figure.series.filter((s) => s.role === 'data').reduce((n, s) => n + s.points.length, 0);
  const color = { field: 'series', type: 'nominal', title: null, scale: { domain: names }, legend: { orient: 'bottom', labelLimit: 240 } };
  const x = { field: 'x', type: 'quantitative', title: figure.xTitle, scale: { zero: false, nice: false, padding: 6 } };
  const y = { field: 'y', type: 'quantitative', title: figure.yTitle, scale: { zero: false, padding: 6 } };
  const layers: VegaLiteSpec[] = [
    { transform: [{ filter: "datum.role === 'area'" }], mark: { type: 'area', opacity: 0.18 }, encoding: { x, y, y2: { field: 'y2' }, color } },
    { transform: [{ filter: "datum.role === 'data'" }], mark: { type: 'point', filled: true, size: dataPoints < 200 ? 30 : 9, opacity: 0.8 }, encoding: { x, y, color } },
    { transform: [{ filter: "datum.role === 'line'" }], mark: { type: 'line', strokeWidth: 1.8 }, encoding: { x, y, color, detail: { field: 'series' }, order: { field: 'order' } } },
    { transform: [{ filter: "datum.role === 'baseline' || datum.role === 'tangent'" }], mark: { type: 'line', strokeWidth: 1.3, strokeDash: [5, 3] }, encoding: { x, y, color, detail: { field: 'series' }, order: { field: 'order' } } },
  ];
  if (figure.markers.length > 0) {
    const markers = figure.markers.map((m) => ({ label: m.label, x: m.x }));
    const ink = theme === 'dark' ? '#d4d4d4' : '#444444';
    layers.push({ data: { values: markers }, mark: { type: 'rule', strokeDash: [2, 2], opacity: 0.8, color: ink }, encoding: { x: { field: 'x', type: 'quantitative' } } });
    // Labels in lanes from the top, so that close markers do not overlap.
    const halo = theme === 'dark' ? '#1e1e1e' : '#ffffff';
    markers.forEach((m, i) => {
      const text = { type: 'text', align: 'left', dx: 3, baseline: 'top', fontSize: 10, y: 4 + 13 * i };
      const encoding = { x: { field: 'x', type: 'quantitative' }, text: { field: 'label' } };
      // A halo in the background colour keeps the label legible over data and lines.
      layers.push({ data: { values: [m] }, mark: { ...text, stroke: halo, strokeWidth: 3, strokeOpacity: 0.9, color: halo }, encoding });
      layers.push({ data: { values: [m] }, mark: { ...text, color: ink }, encoding });
    });
  }
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title,
    width: size.width,
    height: size.height,
    data: { values: rows },
    layer: layers,
    config: themeConfig(theme),
  };
}
