/**
 * Vitrine's look, as design tokens: the one place where a colour, a font or a marker shape is
 * written. The report's stylesheet, the chart theme, the PNG/SVG exports and the editor preview
 * all read from here (a test holds them to it).
 *
 * The idea is a bench notebook: warm paper and blue-black ink by day, a dim instrument room by
 * night. Colours are given by role, never by order of appearance, so that the as-deposited glass
 * is the same colour in every chart of a notebook. The role hues differ in lightness as well as
 * hue, and every role also has its own marker shape, so the charts do not rely on hue alone.
 */
import type { ChartRole } from '../model/figure.js';

export type Theme = 'light' | 'dark';

/** Surfaces and text. */
export interface Surface {
  /** The page. */
  readonly paper: string;
  /** Cards and chart backgrounds. */
  readonly sheet: string;
  /** Body text. */
  readonly ink: string;
  /** Secondary text: units, notes, axis titles. */
  readonly pencil: string;
  /** Rules, card edges, axis lines. */
  readonly rule: string;
  /** Grid lines inside charts, fainter than rules. */
  readonly grid: string;
  /** Vitrine's own accent: links, the header band, focus. */
  readonly accent: string;
  /** Severity colours of findings. */
  readonly error: string;
  readonly warning: string;
  readonly info: string;
  /** A figure that passed its checks. */
  readonly good: string;
}

export const SURFACE: Readonly<Record<Theme, Surface>> = {
  light: {
    paper: '#f7f4ec',
    sheet: '#fffdf8',
    ink: '#1b2230',
    pencil: '#5d6170',
    rule: '#d8d1c0',
    grid: '#ece6d8',
    accent: '#7a3e65',
    error: '#a8321c',
    warning: '#86590a',
    info: '#31608f',
    good: '#2c6b4a',
  },
  dark: {
    paper: '#15181d',
    sheet: '#1c2027',
    ink: '#e6e1d5',
    pencil: '#a39e92',
    rule: '#3a3f48',
    grid: '#292e36',
    accent: '#d49bc2',
    error: '#f08d76',
    warning: '#e3b65e',
    info: '#93badf',
    good: '#84c7a0',
  },
};

/** What a series or marker stands for in a chart (defined with the figure data it labels). */
export type Role = ChartRole;

/** Vega shape names. */
export type MarkerShape = 'circle' | 'square' | 'triangle-up' | 'triangle-down' | 'diamond' | 'cross' | 'wedge';

export interface RoleStyle {
  readonly light: string;
  readonly dark: string;
  readonly shape: MarkerShape;
  /** Dashed for constructions and reference lines, solid otherwise. */
  readonly dash: readonly number[];
}

export const ROLE: Readonly<Record<Role, RoleStyle>> = {
  'as-deposited': { light: '#b5482a', dark: '#ea7a58', shape: 'circle', dash: [] },
  'supercooled-liquid': { light: '#2a5fa8', dark: '#7fb0ea', shape: 'square', dash: [] },
  'liquid-cooled': { light: '#1d7d6b', dark: '#4fb8a0', shape: 'triangle-up', dash: [] },
  fit: { light: '#1b2230', dark: '#e6e1d5', shape: 'cross', dash: [] },
  construction: { light: '#a4760f', dark: '#e3b65e', shape: 'diamond', dash: [5, 3] },
  'reference-line': { light: '#8c8778', dark: '#7d786d', shape: 'cross', dash: [2, 3] },
  data: { light: '#4f5566', dark: '#858075', shape: 'circle', dash: [] },
};

/**
 * Colours of materials across a notebook, given in the order of the materials' ids sorted, so a
 * material keeps its colour in every chart. Distinct from the role colours' hues where possible.
 */
export const MATERIAL_COLOURS: Readonly<Record<Theme, readonly string[]>> = {
  light: ['#2a5fa8', '#b5482a', '#1d7d6b', '#7a3e65', '#a4760f', '#4f5566', '#5b8f2a', '#3d8fb8'],
  dark: ['#7fb0ea', '#ea7a58', '#4fb8a0', '#d49bc2', '#e3b65e', '#858075', '#a6d36f', '#83c6e6'],
};

/**
 * A sequential ramp for the films of a substrate-temperature series, from the lowest Tsub (first)
 * to the highest: the dark end of ColorBrewer's YlOrBr (Harrower & Brewer, Cartogr. J. 40, 27
 * (2003)), one warm hue family stepping in lightness, as the curves are all as-deposited glasses.
 * No stop equals a role or material colour. On the dark sheet the ramp starts lighter so that
 * every stop stays visible.
 */
export const TSUB_RAMP: Readonly<Record<Theme, readonly string[]>> = {
  light: ['#662506', '#7f2d05', '#993404', '#b34003', '#cc4c02', '#dc5e0b', '#ec7014', '#f58620', '#fe9929'],
  dark: ['#cc4c02', '#dc5e0b', '#ec7014', '#f58620', '#fe9929', '#feb441', '#fec44f', '#fed776', '#fee391'],
};

/** The ramp colour of the `i`-th of `n` films ordered by Tsub: spread over the ramp, distinct while n ≤ its length. */
export function tsubRampColour(i: number, n: number, theme: Theme): string {
  const ramp = TSUB_RAMP[theme];
  const at = n <= 1 ? 0 : Math.round((i * (ramp.length - 1)) / (n - 1));
  return ramp[Math.max(0, Math.min(ramp.length - 1, at))];
}

/** Marker shapes by measuring technique, for the stability maps. */
export const TECHNIQUE_SHAPE: Readonly<Record<'ellipsometry' | 'dilatometry' | 'calorimetry' | 'other', MarkerShape>> = {
  ellipsometry: 'circle',
  dilatometry: 'triangle-down',
  calorimetry: 'diamond',
  other: 'square',
};

/** Type: one family for text and one for figures' numbers, and a small scale (px). */
export const TYPE = {
  text: "'Source Serif 4', 'Iowan Old Style', 'Palatino Linotype', Palatino, Georgia, serif",
  figures: "'DejaVu Sans', 'Verdana', sans-serif",
  mono: "'DejaVu Sans Mono', 'Menlo', 'Consolas', monospace",
  size: { small: 11, body: 14, lead: 16, title: 22, chartLabel: 11, chartTitle: 12.5 },
} as const;

/** Print sizes for `--svg --print`: one journal column (8.5 cm at 96 px per inch) and its font size. */
export const PRINT = { width: 321, height: 210, fontSize: 8 } as const;

/** The colour of a role in a theme. */
export function roleColour(role: Role, theme: Theme): string {
  return ROLE[role][theme];
}

/** The colour of a material, from its place among the notebook's materials sorted by id. */
export function materialColour(material: string, materials: readonly string[], theme: Theme): string {
  const sorted = [...new Set(materials)].sort();
  const i = Math.max(0, sorted.indexOf(material));
  const list = MATERIAL_COLOURS[theme];
  return list[i % list.length];
}
