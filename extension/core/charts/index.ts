/**
 * Charts of blocks and notebooks: vega-lite specs from plain figure data, in Vitrine's theme
 * (design tokens in tokens.ts), compiled to Vega.
 *
 *   block ──► blockChartSpec (title from the report) ──► figureSpec ──► toVega ──► SVG / view
 *   notebook ──► stabilityMaps, tsubSeriesSpec, relaxationMapSpec ──► a spec, or a note
 */
export { figureSpec, type VegaLiteSpec } from './figureSpec.js';
export { stabilityMaps, stabilityMapSpecs, notebookMaterials } from './mapSpecs.js';
export { tsubSeriesSpec, relaxationMapSpec } from './materialCharts.js';
export { blockChartSpec, blockChartTitle, chartTitle } from './titles.js';
export type { MapChart } from './pointMap.js';
export { toVega } from './compile.js';
export { themeConfig, type Theme, type ChartOptions } from './theme.js';
