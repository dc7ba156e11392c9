import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { blockChartSpec, figureSpec, relaxationMapSpec, stabilityMaps, toVega, tsubSeriesSpec, type MapChart, type VegaLiteSpec } from '../../extension/core/charts/index.js';
import { MATERIAL_COLOURS, PRINT, ROLE, SURFACE, TSUB_RAMP, TYPE, type Theme } from '../../extension/core/charts/tokens.js';
import { summarise } from '../../extension/core/index.js';
import { renderSvg } from '../../extension/node/renderSvg.js';
import { loadNotebook, REPO } from '../support/loadNotebook.js';

// Golden SVG snapshots of every chart kind, map and notebook chart of the demo notebook, in the
// light and dark themes and for print, and a check that every colour and font in the specs and
// in the drawn SVG comes from the design tokens. The SVG renderer estimates text width without
// a canvas, so the output does not depend on the machine's fonts. Regenerate with UPDATE=1 and
// review the diff (and the picture) before committing.
const DIR = path.join(REPO, 'test', 'golden', 'svg');
const THEMES: readonly Theme[] = ['light', 'dark'];

function check(name: string, svg: string): void {
  const file = path.join(DIR, `${name}.svg`);
  if (process.env.UPDATE === '1' || !fs.existsSync(file)) {
    fs.writeFileSync(file, svg);
    if (process.env.UPDATE !== '1') assert.fail(`wrote new snapshot ${file}; review it and run again`);
    return;
  }
  assert.equal(svg, fs.readFileSync(file, 'utf8'), `${name}.svg changed; review with UPDATE=1`);
}

/** Every colour and font face the tokens define, lower case. */
const TOKEN_COLOURS = new Set(
  [
    ...THEMES.flatMap((t) => Object.values(SURFACE[t])),
    ...Object.values(ROLE).flatMap((r) => [r.light, r.dark]),
    ...THEMES.flatMap((t) => MATERIAL_COLOURS[t]),
    ...THEMES.flatMap((t) => TSUB_RAMP[t]),
  ].map((c) => c.toLowerCase()),
);
const TOKEN_FONTS = new Set<string>([TYPE.text, TYPE.figures, TYPE.mono]);
/** Not colours: no paint at all. */
const NO_PAINT = new Set(['none', 'transparent']);
const COLOUR_LIKE = /^(#[0-9a-f]{3,8}|rgba?\(.*\)|hsla?\(.*\))$/i;
const COLOUR_KEY = /^(color|fill|stroke|background)$|Color$/;
const FONT_KEY = /^(font|[a-z]+Font)$/;

/** Every colour-like string and every font of a spec (vega-lite or Vega), with where it is. */
function paints(spec: unknown): { colours: Array<[string, string]>; fonts: Array<[string, string]> } {
  const colours: Array<[string, string]> = [];
  const fonts: Array<[string, string]> = [];
  const walk = (x: unknown, where: string, key: string) => {
    if (typeof x === 'string') {
      if (COLOUR_LIKE.test(x.trim()) || COLOUR_KEY.test(key)) colours.push([where, x]);
      if (FONT_KEY.test(key)) fonts.push([where, x]);
    } else if (Array.isArray(x)) {
      x.forEach((v, i) => walk(v, `${where}[${i}]`, key));
    } else if (typeof x === 'object' && x !== null) {
      for (const [k, v] of Object.entries(x)) {
        // A Vega value reference: { value: '#…' } under a colour channel.
        walk(v, `${where}.${k}`, k === 'value' ? key : k);
      }
    }
  };
  walk(spec, '', '');
  return { colours, fonts };
}

function assertTokensOnly(name: string, spec: VegaLiteSpec, svg: string): void {
  for (const s of [spec, toVega(spec)]) {
    const { colours, fonts } = paints(s);
    const strange = colours.filter(([, c]) => !TOKEN_COLOURS.has(c.trim().toLowerCase()) && !NO_PAINT.has(c.trim()));
    assert.deepEqual(strange, [], `${name}: colours not from tokens.ts`);
    assert.deepEqual(fonts.filter(([, f]) => !TOKEN_FONTS.has(f)), [], `${name}: fonts not from tokens.ts`);
  }
  const drawn = [...svg.matchAll(/(?:fill|stroke)="([^"]+)"/g)].map((m) => m[1]).filter((c) => !NO_PAINT.has(c) && !c.startsWith('url('));
  assert.deepEqual(drawn.filter((c) => !TOKEN_COLOURS.has(c.toLowerCase())), [], `${name}: drawn colours not from tokens.ts`);
  assert.doesNotMatch(svg, />-?\d+\.0{5,}</, `${name}: a tick label like 0.000000`);
}

describe('chart snapshots', () => {
  const { notebook } = loadNotebook('fixtures/demo');
  const report = notebook.analyze();
  const blocks = report.files.flatMap((f) => f.blocks);
  const films = summarise(report);

  for (const [kind, id] of [['ramp', 'R-02'], ['isotherm', 'I-01'], ['dsc', 'C-01'], ['relaxation', 'Q-dielectric']] as const) {
    for (const theme of THEMES) {
      it(`${kind} ${id}, ${theme}`, async () => {
        const b = blocks.find((x) => x.id === id)!;
        assert.ok(b.figure, 'has a figure');
        const spec = blockChartSpec(b, report, { theme })!;
        const svg = await renderSvg(toVega(spec));
        assert.match(svg, /^<svg /);
        for (const m of b.figure.markers) assert.ok(svg.includes(m.label.replace(/</g, '&lt;')), `marker ${m.label} labelled`);
        assert.ok(svg.includes(b.figure.xTitle.split(' ')[0]), 'x axis titled');
        assert.ok(svg.includes(SURFACE[theme].sheet), 'the theme’s sheet as background');
        assertTokensOnly(`${kind}-${id}-${theme}`, spec, svg);
        check(`${kind}-${id}-${theme}`, svg);
      });
    }
  }

  it('block titles name the film, material and Tsub', () => {
    const r02 = blocks.find((x) => x.id === 'R-02')!;
    assert.equal((blockChartSpec(r02, report) as { title: string }).title, 'R-02 · film D-02 · amberine-3 · Tsub 270.0 K (-3.2 °C)');
    const q = blocks.find((x) => x.id === 'Q-dielectric')!;
    assert.equal((blockChartSpec(q, report) as { title: string }).title, 'Q-dielectric · quillite');
  });

  it('ramp R-02 and the fictive-temperature map for print', async () => {
    const r02 = blocks.find((x) => x.id === 'R-02')!;
    const spec = blockChartSpec(r02, report, { print: true })!;
    const svg = await renderSvg(toVega(spec));
    assertTokensOnly('ramp-R-02-print', spec, svg);
    const width = Number(/^<svg[^>]* width="([\d.]+)"/.exec(svg)?.[1]);
    assert.ok(width > PRINT.width - 12 && width <= PRINT.width + 2, `one journal column wide: ${width}`);
    check('ramp-R-02-print', svg);
    const placed = await renderSvg(toVega(spec), { physicalSize: true });
    assert.match(placed, new RegExp(`^<svg[^>]* width="${((width * 2.54) / 96).toFixed(2)}cm"`), 'print size in cm, 96 px to the inch');
    const map = stabilityMaps(films, report, { print: true }).find((m) => m.name === 'fictive-temperature')!;
    assert.ok('spec' in map);
    const mapSvg = await renderSvg(toVega(map.spec));
    assertTokensOnly('map-fictive-temperature-print', map.spec, mapSvg);
    const mapWidth = Number(/^<svg[^>]* width="([\d.]+)"/.exec(mapSvg)?.[1]);
    assert.ok(mapWidth > PRINT.width - 24 && mapWidth <= PRINT.width + 2, `one journal column wide: ${mapWidth}`);
    check('map-fictive-temperature-print', mapSvg);
  });

  it('a degenerate figure (one point, all at one x) draws with readable ticks', async () => {
    const spec = figureSpec('one point', { xTitle: 'T / K', yTitle: 'h / nm', series: [{ name: 'heating', role: 'data', points: [[300, 400]] }], markers: [{ label: 'Tg 300.0 K', x: 300 }] });
    const svg = await renderSvg(toVega(spec));
    assertTokensOnly('degenerate-figure', spec, svg);
    check('degenerate-figure', svg);
  });

  it('escapes hostile text in titles, series names and labels', async () => {
    const svg = await renderSvg(toVega(figureSpec('ramp <script>alert(1)</script>', { xTitle: '<b>T</b>', yTitle: 'h', series: [{ name: '<img src=x onerror=1>', role: 'data', points: [[1, 2], [2, 3]] }], markers: [{ label: '<i>m</i>', x: 1.5 }] })));
    assert.doesNotMatch(svg, /<script|<img|<b>|<i>/);
    assert.match(svg, /&lt;script&gt;alert\(1\)&lt;\/script&gt;/);
  });

  for (const theme of THEMES) {
    it(`stability maps, ${theme}; the one the demo cannot draw says what it needs`, async () => {
      const maps = stabilityMaps(films, report, { theme });
      assert.deepEqual(
        maps.map((m) => m.name),
        ['density-gain', 'fictive-temperature', 'onset-temperature', 'stability-ratio', 'tg-rate'],
      );
      const note = maps.find((m) => m.name === 'stability-ratio')!;
      assert.deepEqual(note, { name: 'stability-ratio', title: 'Kinetic stability', note: 'needs at least 2 films at different Tsub/Tg (1 so far)' });
      for (const m of maps) {
        if (!('spec' in m)) continue;
        const svg = await renderSvg(toVega(m.spec));
        assertTokensOnly(`map-${m.name}-${theme}`, m.spec, svg);
        check(`map-${m.name}-${theme}`, svg);
      }
    });

    it(`notebook charts of a material, ${theme}: the Tsub series and the relaxation maps`, async () => {
      const charts: MapChart[] = [tsubSeriesSpec('amberine-3', report, { theme }), relaxationMapSpec('amberine-3', report, { theme }), relaxationMapSpec('quillite', report, { theme })];
      for (const c of charts) {
        assert.ok('spec' in c, `${c.name}: ${'note' in c ? c.note : ''}`);
        const svg = await renderSvg(toVega(c.spec));
        assertTokensOnly(`${c.name}-${theme}`, c.spec, svg);
        check(`${c.name}-${theme}`, svg);
      }
      const single = tsubSeriesSpec('quillite', report, { theme });
      assert.ok('note' in single && single.note === 'needs at least 2 films of quillite with a heating ramp and a supercooled-liquid line (1 so far)');
    });
  }
});
