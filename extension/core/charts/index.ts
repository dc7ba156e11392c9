/** Charts of blocks and notebook maps: vega-lite specs from plain figure data, compiled to Vega. */
export { figureSpec, type VegaLiteSpec } from './figureSpec.js';
export { stabilityMapSpecs } from './mapSpecs.js';
export { toVega } from './compile.js';
export { themeConfig, PALETTE, type Theme } from './theme.js';
