/**
 * The preview's chart theme, in three pure steps:
 *
 *   editor theme kind (+ CSS variables in high contrast) ──► ChartColours ──► Vega config
 *                                                        ──► a compiled spec re-themed
 *
 * Light and dark editors get Vitrine's own look, the same as the exported charts: the surfaces,
 * role colours and fonts of the design tokens (`tokens.ts`), light or dark as the editor is. A
 * high-contrast editor keeps its own background, foreground and font, with the role colours of
 * the token theme closer to its background.
 *
 * No DOM access and no DOM types: the webview reads the variables and passes them in, and the
 * unit tests run this file on plain Node.
 *
 * The compiled specs come from the language server already themed for light or dark. Their own
 * config keeps what the chart says; its colours and fonts give way to ours. Marks carry constant
 * token colours (ink, the halo in the sheet colour, role and material colours), so those are
 * mapped as well: a surface colour of either token theme becomes the matching chart colour, and
 * a role, material or Tsub-ramp colour of the other token theme becomes its counterpart in this one.
 */
import type { Config } from 'vega';
import { MATERIAL_COLOURS, ROLE, SURFACE, TSUB_RAMP, TYPE, type Theme } from '../core/charts/tokens.js';
import type { ChartTheme } from '../protocol/webview.js';

/** The editor variables the chart theme reads. */
export const THEME_VARIABLES = ['--vscode-editor-background', '--vscode-editor-foreground', '--vscode-font-family', '--vscode-editor-font-size', '--vscode-panel-border'] as const;

export type ThemeVariable = (typeof THEME_VARIABLES)[number];

/** Values as `getPropertyValue` returns them; a missing or empty value falls back to the kind's default. */
export type ThemeVariables = Readonly<Partial<Record<ThemeVariable, string>>>;

export interface ChartColours {
  readonly background: string;
  readonly foreground: string;
  /** Axis lines and ticks, axis titles. */
  readonly muted: string;
  readonly grid: string;
  readonly font: string;
  /** The chart title's face. */
  readonly titleFont: string;
  /** The base size in px that chart text sizes derive from. */
  readonly fontSize: number;
  /** The token theme whose role and material colours the marks take. */
  readonly tokens: Theme;
}

/** Vitrine's surfaces for a token theme. */
function tokenColours(theme: Theme): ChartColours {
  const s = SURFACE[theme];
  return { background: s.sheet, foreground: s.ink, muted: s.pencil, grid: s.grid, font: TYPE.figures, titleFont: TYPE.text, fontSize: TOKEN_FONT_SIZE, tokens: theme };
}

const HIGH_CONTRAST = { background: '#000000', foreground: '#ffffff', grid: '#6fc3df', muted: '#ffffff' } as const;

const DEFAULT_FONT = 'sans-serif';
const DEFAULT_FONT_SIZE = 13;
/** The base size that makes the labels TYPE.size.chartLabel (0.8 of it, rounded). */
const TOKEN_FONT_SIZE = 14;

/** The theme kind from the body's classes (`vscode-light`, `vscode-dark`, `vscode-high-contrast`…), else `fallback`. */
export function themeKindOf(bodyClasses: readonly string[], fallback: ChartTheme): ChartTheme {
  if (bodyClasses.includes('vscode-high-contrast') || bodyClasses.includes('vscode-high-contrast-light')) return 'high-contrast';
  if (bodyClasses.includes('vscode-dark')) return 'dark';
  if (bodyClasses.includes('vscode-light')) return 'light';
  return fallback;
}

/**
 * The chart colours for the editor's theme kind: Vitrine's light or dark surfaces, or in high
 * contrast the editor's own colours and font. With `forceLight`, Vitrine's light surfaces
 * whatever the editor shows.
 */
export function chartColours(vars: ThemeVariables, kind: ChartTheme, forceLight: boolean): ChartColours {
  if (forceLight || kind === 'light') return tokenColours('light');
  if (kind === 'dark') return tokenColours('dark');
  const font = clean(vars['--vscode-font-family']) ?? DEFAULT_FONT;
  const fontSize = pixelSize(vars['--vscode-editor-font-size']);
  const background = clean(vars['--vscode-editor-background']) ?? HIGH_CONTRAST.background;
  const foreground = clean(vars['--vscode-editor-foreground']) ?? HIGH_CONTRAST.foreground;
  const border = clean(vars['--vscode-panel-border']);
  const bg = parseColour(background);
  const fg = parseColour(foreground);
  // Full ink for the axes; a grid plain enough to see but quieter than the data.
  const grid = bg && fg ? toHex(mix(fg, bg, 0.35)) : (border ?? HIGH_CONTRAST.grid);
  const tokens: Theme = bg && luminance(bg) > 0.5 ? 'light' : 'dark';
  return { background, foreground, muted: foreground, grid, font, titleFont: font, fontSize, tokens };
}

/** The Vega config for a set of chart colours: background, axes, legends, titles and text. */
export function vegaConfig(c: ChartColours): Config {
  const label = Math.round(c.fontSize * 0.8);
  const guideTitle = Math.round(c.fontSize * 0.86);
  const title = Math.round(c.fontSize * 0.93);
  const ink = { fill: c.foreground, font: c.font };
  return {
    background: c.background,
    axis: {
      labelColor: c.foreground,
      titleColor: c.muted,
      domainColor: c.muted,
      tickColor: c.muted,
      gridColor: c.grid,
      labelFont: c.font,
      titleFont: c.font,
      labelFontSize: label,
      titleFontSize: guideTitle,
      // Where an axis thins overlapping labels, keep a little air between those it keeps.
      labelSeparation: 4,
    },
    legend: { labelColor: c.foreground, titleColor: c.foreground, labelFont: c.font, titleFont: c.font, labelFontSize: label, titleFontSize: label },
    title: { color: c.foreground, subtitleColor: c.muted, font: c.titleFont, subtitleFont: c.font, fontSize: title },
    text: { ...ink },
    style: {
      'guide-label': { ...ink },
      'guide-title': { ...ink },
      'group-title': { ...ink, font: c.titleFont, fontSize: title },
      'group-subtitle': { ...ink },
      text: { ...ink },
    },
  };
}

export interface ThemedSpecOptions {
  /** Leave out the chart's own title (the preview shows it above the chart). */
  readonly dropTitle?: boolean;
}

/**
 * A compiled Vega spec re-themed with the chart colours: its background, its config (ours wins
 * over its own) and the constant token colours of its marks. Returns a new object; the input is
 * not changed. Null when `spec` is not an object.
 */
export function themedSpec(spec: unknown, c: ChartColours, options: ThemedSpecOptions = {}): Record<string, unknown> | null {
  if (!isRecord(spec)) return null;
  const oldBackground = typeof spec.background === 'string' ? parseColour(spec.background) : null;
  const out: Record<string, unknown> = { ...spec, background: c.background, config: mergeDeep(isRecord(spec.config) ? spec.config : {}, vegaConfig(c) as Record<string, unknown>) };
  const map = colourMap(c);
  if (Array.isArray(spec.marks)) out.marks = spec.marks.map((m) => recolourMark(m, oldBackground, c, map));
  if (options.dropTitle) delete out.title;
  return out;
}

/**
 * Token colours to chart colours: the surfaces of both token themes to the chart's surfaces, and
 * the role and material colours of both to those of the chart's token theme (keys lower case).
 */
function colourMap(c: ChartColours): Map<string, string> {
  const map = new Map<string, string>();
  // The substrate-temperature ramp of the other theme to this theme's stop of the same rank; the
  // stops the two ramps share keep their colour (a spec compiled for this theme stays as it is).
  const other: Theme = c.tokens === 'light' ? 'dark' : 'light';
  const own = new Set(TSUB_RAMP[c.tokens].map((x) => x.toLowerCase()));
  TSUB_RAMP[other].forEach((colour, i) => {
    if (!own.has(colour.toLowerCase())) map.set(colour.toLowerCase(), TSUB_RAMP[c.tokens][i]);
  });
  // Later entries win where tokens share a colour: roles over materials, surfaces (the ink that
  // is also the fit's colour) over roles.
  for (const theme of ['light', 'dark'] as const) MATERIAL_COLOURS[theme].forEach((colour, i) => map.set(colour.toLowerCase(), MATERIAL_COLOURS[c.tokens][i]));
  for (const theme of ['light', 'dark'] as const) for (const role of Object.values(ROLE)) map.set(role[theme].toLowerCase(), role[c.tokens]);
  for (const theme of ['light', 'dark'] as const) {
    const s = SURFACE[theme];
    for (const [from, to] of [
      [s.sheet, c.background],
      [s.paper, c.background],
      [s.ink, c.foreground],
      [s.pencil, c.muted],
      [s.rule, c.muted],
      [s.grid, c.grid],
    ]) {
      map.set(from.toLowerCase(), to);
    }
  }
  return map;
}

const COLOUR_CHANNELS = ['fill', 'stroke'] as const;
const INK_MARKS = new Set(['text', 'rule']);

function recolourMark(mark: unknown, oldBackground: Rgba | null, c: ChartColours, map: ReadonlyMap<string, string>): unknown {
  if (!isRecord(mark)) return mark;
  const out: Record<string, unknown> = { ...mark };
  const inkMark = typeof mark.type === 'string' && INK_MARKS.has(mark.type);
  if (isRecord(mark.encode)) {
    const encode: Record<string, unknown> = {};
    for (const [set, channels] of Object.entries(mark.encode)) {
      if (!isRecord(channels)) {
        encode[set] = channels;
        continue;
      }
      const next: Record<string, unknown> = { ...channels };
      for (const channel of COLOUR_CHANNELS) {
        if (channel in channels) next[channel] = recolourRef(channels[channel], oldBackground, inkMark, c, map);
      }
      encode[set] = next;
    }
    out.encode = encode;
  }
  if (Array.isArray(mark.marks)) out.marks = mark.marks.map((m) => recolourMark(m, oldBackground, c, map));
  return out;
}

/** A value reference `{ value: colour }`, or a list of production rules, with its constant colours mapped. */
function recolourRef(ref: unknown, oldBackground: Rgba | null, inkMark: boolean, c: ChartColours, map: ReadonlyMap<string, string>): unknown {
  if (Array.isArray(ref)) return ref.map((r) => recolourRef(r, oldBackground, inkMark, c, map));
  if (!isRecord(ref) || typeof ref.value !== 'string') return ref;
  const colour = parseColour(ref.value);
  if (!colour) return ref;
  if (oldBackground && sameColour(colour, oldBackground)) return { ...ref, value: c.background };
  const mapped = map.get(ref.value.trim().toLowerCase());
  if (mapped) return { ...ref, value: mapped };
  if (inkMark && isGrey(colour)) return { ...ref, value: c.foreground };
  return ref;
}

// ── colours ────────────────────────────────────────────────────────────────────────────────────

/** Red, green, blue in 0–255 and alpha in 0–1. */
export type Rgba = readonly [number, number, number, number];

/** `#rgb`, `#rgba`, `#rrggbb`, `#rrggbbaa`, `rgb(…)` and `rgba(…)` (commas or spaces); null for anything else. */
export function parseColour(text: string): Rgba | null {
  const s = text.trim().toLowerCase();
  const hex = /^#([0-9a-f]{3,4}|[0-9a-f]{6}|[0-9a-f]{8})$/.exec(s);
  if (hex) {
    const h = hex[1].length <= 4 ? [...hex[1]].map((d) => d + d).join('') : hex[1];
    const n = (i: number) => parseInt(h.slice(2 * i, 2 * i + 2), 16);
    return [n(0), n(1), n(2), h.length === 8 ? n(3) / 255 : 1];
  }
  const fn = /^rgba?\(\s*([^)]*)\)$/.exec(s);
  if (!fn) return null;
  const parts = fn[1].split(/\s*[,/]\s*|\s+/).filter((p) => p.length > 0);
  if (parts.length !== 3 && parts.length !== 4) return null;
  const channel = (p: string) => (p.endsWith('%') ? (parseFloat(p) * 255) / 100 : parseFloat(p));
  const rgb = parts.slice(0, 3).map(channel);
  const alpha = parts.length === 4 ? (parts[3].endsWith('%') ? parseFloat(parts[3]) / 100 : parseFloat(parts[3])) : 1;
  if (![...rgb, alpha].every(Number.isFinite)) return null;
  return [rgb[0], rgb[1], rgb[2], alpha];
}

/** `t` of `a` over `1 − t` of `b`, opaque. */
function mix(a: Rgba, b: Rgba, t: number): Rgba {
  return [a[0] * t + b[0] * (1 - t), a[1] * t + b[1] * (1 - t), a[2] * t + b[2] * (1 - t), 1];
}

function toHex(c: Rgba): string {
  const byte = (v: number) => Math.max(0, Math.min(255, Math.round(v))).toString(16).padStart(2, '0');
  return `#${byte(c[0])}${byte(c[1])}${byte(c[2])}`;
}

function sameColour(a: Rgba, b: Rgba): boolean {
  return Math.abs(a[0] - b[0]) < 1 && Math.abs(a[1] - b[1]) < 1 && Math.abs(a[2] - b[2]) < 1;
}

/** Relative luminance (WCAG 2.x) of an sRGB colour, 0–1. */
function luminance(c: Rgba): number {
  const lin = (v: number) => {
    const x = v / 255;
    return x <= 0.04045 ? x / 12.92 : ((x + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(c[0]) + 0.7152 * lin(c[1]) + 0.0722 * lin(c[2]);
}

function isGrey(c: Rgba): boolean {
  return Math.max(c[0], c[1], c[2]) - Math.min(c[0], c[1], c[2]) <= 2;
}

// ── small helpers ──────────────────────────────────────────────────────────────────────────────

function clean(value: string | undefined): string | null {
  const s = value?.trim() ?? '';
  return s.length > 0 ? s : null;
}

/** `14px` → 14, kept within 10–20 px; the default for anything else. */
function pixelSize(value: string | undefined): number {
  const n = parseFloat(value ?? '');
  return Number.isFinite(n) && n > 0 ? Math.min(20, Math.max(10, n)) : DEFAULT_FONT_SIZE;
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/** `over` merged into `base`, recursively for plain objects; arrays and other values of `over` replace. */
function mergeDeep(base: Record<string, unknown>, over: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = { ...base };
  for (const [key, value] of Object.entries(over)) {
    const prior = out[key];
    out[key] = isRecord(prior) && isRecord(value) ? mergeDeep(prior, value) : value;
  }
  return out;
}
