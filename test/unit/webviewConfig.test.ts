import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as path from 'node:path';
import * as vega from 'vega';
import { expressionInterpreter } from 'vega-interpreter';
import { figureSpec, toVega } from '../../extension/core/charts/index.js';
import { ROLE, SURFACE, TSUB_RAMP, TYPE } from '../../extension/core/charts/tokens.js';
import type { FigureData } from '../../extension/core/index.js';
import { chartColours, parseColour, themedSpec, themeKindOf, vegaConfig, type ThemeVariables } from '../../extension/webview/chartConfig.js';
import { readMessage } from '../../extension/webview/messages.js';
import { REPO } from '../support/loadNotebook.js';

const DARK_VARS: ThemeVariables = {
  '--vscode-editor-background': '#282a36',
  '--vscode-editor-foreground': '#f8f8f2',
  '--vscode-font-family': '"Segoe WPC", "Segoe UI", sans-serif',
  '--vscode-editor-font-size': '14px',
  '--vscode-panel-border': '#bd93f9',
};

/** A high-contrast editor's variables (dark background). */
const HC_VARS: ThemeVariables = { ...DARK_VARS };

const FIGURE: FigureData = {
  xTitle: 'T / K',
  yTitle: 'h / nm',
  series: [
    { name: 'as deposited', role: 'data', meaning: 'as-deposited', points: [[300, 400], [310, 400.4], [320, 400.8], [330, 402], [340, 404]] },
    { name: 'glass line', role: 'line', points: [[300, 400], [330, 401.2]] },
  ],
  markers: [{ label: 'Tf', x: 325 }],
};

/** Every constant colour (`{ value: '#…' }` on fill or stroke) of the marks of a spec, with the mark type. */
function markColours(spec: Record<string, unknown>): Array<{ type: string; colour: string }> {
  const out: Array<{ type: string; colour: string }> = [];
  const walk = (marks: unknown) => {
    if (!Array.isArray(marks)) return;
    for (const m of marks as Array<Record<string, unknown>>) {
      const encode = (m.encode ?? {}) as Record<string, Record<string, { value?: unknown }>>;
      for (const set of Object.values(encode)) {
        for (const ch of ['fill', 'stroke']) {
          const v = set[ch]?.value;
          if (typeof v === 'string') out.push({ type: String(m.type), colour: v });
        }
      }
      walk(m.marks);
    }
  };
  walk(spec.marks);
  return out;
}

async function svgOf(spec: Record<string, unknown>, config: vega.Config): Promise<string> {
  const view = new vega.View(vega.parse(spec as vega.Spec, config, { ast: true }), { expr: expressionInterpreter, renderer: 'none' });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}

describe('webview chart theme', () => {
  describe('themeKindOf', () => {
    it('reads the body classes VS Code sets, high contrast first, else the fallback', () => {
      assert.equal(themeKindOf(['vscode-light'], 'dark'), 'light');
      assert.equal(themeKindOf(['vscode-dark'], 'light'), 'dark');
      assert.equal(themeKindOf(['vscode-high-contrast', 'vscode-dark'], 'light'), 'high-contrast');
      assert.equal(themeKindOf(['vscode-high-contrast-light'], 'light'), 'high-contrast');
      assert.equal(themeKindOf(['other'], 'dark'), 'dark');
    });
  });

  describe('chartColours', () => {
    it('gives light and dark editors Vitrine’s own surfaces and faces from the tokens, whatever their variables', () => {
      for (const theme of ['light', 'dark'] as const) {
        const c = chartColours(DARK_VARS, theme, false);
        assert.equal(c.background, SURFACE[theme].sheet);
        assert.equal(c.foreground, SURFACE[theme].ink);
        assert.equal(c.muted, SURFACE[theme].pencil);
        assert.equal(c.grid, SURFACE[theme].grid);
        assert.equal(c.font, TYPE.figures);
        assert.equal(c.titleFont, TYPE.text);
        assert.equal(c.tokens, theme);
      }
    });

    it('draws light charts with forceLight whatever the editor shows', () => {
      const c = chartColours(DARK_VARS, 'dark', true);
      assert.equal(c.background, SURFACE.light.sheet);
      assert.equal(c.foreground, SURFACE.light.ink);
      assert.equal(chartColours(DARK_VARS, 'high-contrast', true).background, SURFACE.light.sheet);
    });

    it('keeps a high-contrast editor’s background, foreground and font, with a plainer grid (35 %) and full-ink axes', () => {
      const c = chartColours({ '--vscode-editor-background': '#000000', '--vscode-editor-foreground': '#ffffff', '--vscode-panel-border': '#6fc3df', '--vscode-font-family': 'Mono X' }, 'high-contrast', false);
      assert.equal(c.background, '#000000');
      assert.equal(c.foreground, '#ffffff');
      assert.equal(c.font, 'Mono X');
      // 0.35 × 255 = 89.25 → 0x59
      assert.equal(c.grid, '#595959');
      assert.equal(c.muted, '#ffffff');
      assert.equal(c.tokens, 'dark');
      assert.equal(chartColours({ '--vscode-editor-background': '#ffffff', '--vscode-editor-foreground': '#000000' }, 'high-contrast', false).tokens, 'light');
      assert.equal(chartColours({ '--vscode-editor-foreground': 'canvastext', '--vscode-panel-border': '#6fc3df' }, 'high-contrast', false).grid, '#6fc3df');
    });

    it('falls back to black and white in high contrast for missing or empty variables, and keeps the font size within 10–20 px', () => {
      const c = chartColours({ '--vscode-editor-background': '  ', '--vscode-editor-font-size': 'large' }, 'high-contrast', false);
      assert.equal(c.background, '#000000');
      assert.equal(c.foreground, '#ffffff');
      assert.equal(c.font, 'sans-serif');
      assert.equal(c.fontSize, 13);
      assert.equal(chartColours({ '--vscode-editor-font-size': '6px' }, 'high-contrast', false).fontSize, 10);
      assert.equal(chartColours({ '--vscode-editor-font-size': '28px' }, 'high-contrast', false).fontSize, 20);
    });
  });

  describe('parseColour', () => {
    it('reads the hex and rgb() forms themes use', () => {
      assert.deepEqual(parseColour('#fff'), [255, 255, 255, 1]);
      assert.deepEqual(parseColour(' #1E1E1E '), [30, 30, 30, 1]);
      assert.deepEqual(parseColour('#80808059'), [128, 128, 128, 0x59 / 255]);
      assert.deepEqual(parseColour('rgba(10, 20, 30, 0.5)'), [10, 20, 30, 0.5]);
      assert.deepEqual(parseColour('rgb(10 20 30 / 50%)'), [10, 20, 30, 0.5]);
      assert.equal(parseColour('var(--x)'), null);
      assert.equal(parseColour('#12345'), null);
    });
  });

  describe('vegaConfig', () => {
    it('puts the colours and fonts on the background, axes, legends, titles and text', () => {
      const c = chartColours(HC_VARS, 'high-contrast', false);
      const config = vegaConfig(c);
      assert.equal(config.background, '#282a36');
      assert.equal(config.axis?.labelColor, '#f8f8f2');
      assert.equal(config.axis?.gridColor, c.grid);
      assert.equal(config.axis?.labelFont, c.font);
      assert.equal(config.legend?.labelColor, '#f8f8f2');
      assert.equal(config.title?.color, '#f8f8f2');
      assert.equal(config.style?.['group-title']?.fill, '#f8f8f2');
      assert.equal(config.axis?.labelFontSize, 11);
      assert.equal(vegaConfig(chartColours({}, 'light', false)).axis?.labelFontSize, TYPE.size.chartLabel);
    });
  });

  describe('themedSpec', () => {
    it('in high contrast, replaces the spec’s background, config colours, marker ink and halo with the editor’s', () => {
      const compiled = toVega(figureSpec('ramp R-1', FIGURE, 'dark'));
      const c = chartColours(HC_VARS, 'high-contrast', false);
      const themed = themedSpec(compiled, c)!;
      assert.equal(themed.background, '#282a36');
      const config = themed.config as vega.Config;
      assert.equal(config.style?.['group-title']?.fill, '#f8f8f2');
      const colours = markColours(themed);
      assert.ok(colours.some((m) => m.type === 'text' && m.colour === '#282a36'), 'halo in the new background');
      assert.ok(colours.some((m) => m.type === 'text' && m.colour === '#f8f8f2'), 'label ink in the new foreground');
      assert.ok(!colours.some((m) => m.colour === SURFACE.dark.sheet || m.colour === SURFACE.dark.ink), JSON.stringify(colours));
      assert.equal(themed.title !== undefined, true);
      assert.equal(themedSpec(compiled, c, { dropTitle: true })!.title, undefined);
    });

    it('maps a light spec to the dark tokens in a dark editor: surfaces and role colours alike', () => {
      const compiled = toVega(figureSpec('ramp R-1', FIGURE, 'light'));
      const colours = markColours(themedSpec(compiled, chartColours(DARK_VARS, 'dark', false))!);
      const lightOnly = new Set([...Object.values(SURFACE.light), ...Object.values(ROLE).map((r) => r.light)].filter((x) => !Object.values(SURFACE.dark).includes(x) && !Object.values(ROLE).some((r) => r.dark === x)));
      assert.ok(!colours.some((m) => lightOnly.has(m.colour)), JSON.stringify(colours));
      assert.ok(colours.some((m) => m.colour === ROLE['as-deposited'].dark), 'the as-deposited data in its dark colour');
    });

    it('maps the Tsub ramp of a light spec to the dark ramp, stop for stop, and leaves a dark spec’s ramp alone', () => {
      const spec = (colours: readonly string[]) => ({ marks: colours.map((c) => ({ type: 'symbol', encode: { update: { fill: { value: c } } } })) });
      const dark = chartColours(DARK_VARS, 'dark', false);
      const fills = (s: Record<string, unknown> | null) => (s!.marks as Array<{ encode: { update: { fill: { value: string } } } }>).map((m) => m.encode.update.fill.value);
      const fromLight = fills(themedSpec(spec(TSUB_RAMP.light), dark));
      const shared = new Set(TSUB_RAMP.dark);
      TSUB_RAMP.light.forEach((c, i) => assert.equal(fromLight[i], shared.has(c) ? c : TSUB_RAMP.dark[i], `stop ${i}`));
      assert.deepEqual(fills(themedSpec(spec(TSUB_RAMP.dark), dark)), [...TSUB_RAMP.dark]);
    });

    it('does not change its input, and gives null for something that is not a spec', () => {
      const compiled = toVega(figureSpec('ramp R-1', FIGURE, 'dark'));
      const before = JSON.stringify(compiled);
      themedSpec(compiled, chartColours(HC_VARS, 'high-contrast', false));
      assert.equal(JSON.stringify(compiled), before);
      assert.equal(themedSpec(null, chartColours({}, 'light', false)), null);
      assert.equal(themedSpec([1, 2], chartColours({}, 'light', false)), null);
    });

    it('renders through vega-interpreter (no eval) to an SVG in the editor colours', async () => {
      const c = chartColours(HC_VARS, 'high-contrast', false);
      const svg = await svgOf(themedSpec(toVega(figureSpec('ramp R-1', FIGURE, 'light')), c)!, vegaConfig(c));
      assert.match(svg, /^<svg/);
      assert.ok(svg.includes('#282a36'), 'background');
      assert.ok(svg.includes('#f8f8f2'), 'foreground');
      assert.ok(!svg.includes(SURFACE.light.ink), 'no light-theme ink left');
    });
  });

  describe('readMessage', () => {
    const block = { kind: 'ramp', id: 'R-1', line: 3, endLine: 9, title: 'ramp R-1', vega: null, figures: [], diagnostics: [] };

    it('accepts the messages of the protocol', () => {
      const show = { type: 'show', uri: 'file:///n.md', fileName: 'n.md', version: 2, blocks: [block], theme: 'dark', forceLight: false };
      assert.equal(readMessage(show), show);
      assert.ok(readMessage({ type: 'cursor', uri: 'file:///n.md', line: 4 }));
      assert.ok(readMessage({ type: 'theme', theme: 'high-contrast', forceLight: true }));
      assert.ok(readMessage({ type: 'summary', summary: { columns: ['film'], rows: [{ film: 'D-1', uri: 'file:///n.md', line: 0, cells: ['D-1'] }], maps: [] }, theme: 'light', forceLight: false }));
    });

    it('drops anything else', () => {
      assert.equal(readMessage(null), null);
      assert.equal(readMessage('show'), null);
      assert.equal(readMessage({ type: 'reveal', uri: 'x', line: 1 }), null);
      assert.equal(readMessage({ type: 'cursor', uri: 'x', line: '1' }), null);
      assert.equal(readMessage({ type: 'theme', theme: 'sepia', forceLight: false }), null);
      assert.equal(readMessage({ type: 'show', uri: 'x', fileName: 'n.md', version: null, blocks: [{ ...block, line: 'x' }], theme: 'dark', forceLight: false }), null);
    });
  });

  describe('imports', () => {
    it('takes from the repository only the webview itself, the design tokens and protocol types, and from npm only vega and vega-interpreter', () => {
      const dir = path.join(REPO, 'extension', 'webview');
      for (const name of fs.readdirSync(dir).filter((f) => f.endsWith('.ts'))) {
        const text = fs.readFileSync(path.join(dir, name), 'utf8');
        for (const m of text.matchAll(/^\s*(import|export)\s+(type\s+)?[^;]*?from\s+'([^']+)'/gm)) {
          const [, , typeOnly, from] = m;
          // The design tokens are plain data, shared so that the preview draws Vitrine's look.
          const ok = from.startsWith('./') || from === 'vega' || from === 'vega-interpreter' || from === '../core/charts/tokens.js' || (from.startsWith('../protocol/') && typeOnly !== undefined);
          assert.ok(ok, `${name} imports ${typeOnly ? 'type ' : ''}'${from}'`);
        }
      }
    });
  });
});
