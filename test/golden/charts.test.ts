import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { figureSpec, stabilityMapSpecs, toVega } from '../../extension/core/charts/index.js';
import { summarise } from '../../extension/core/index.js';
import { renderSvg } from '../../extension/node/renderSvg.js';
import { loadNotebook, REPO } from '../support/loadNotebook.js';

// Golden SVG snapshots, one per chart kind, from the demo notebook. The SVG renderer estimates
// text width without a canvas, so the output does not depend on the machine's fonts.
// Regenerate with UPDATE=1 and review the diff (and the picture) before committing.
const DIR = path.join(REPO, 'test', 'golden', 'svg');

function check(name: string, svg: string): void {
  const file = path.join(DIR, `${name}.svg`);
  if (process.env.UPDATE === '1' || !fs.existsSync(file)) {
    fs.writeFileSync(file, svg);
    if (process.env.UPDATE !== '1') assert.fail(`wrote new snapshot ${file}; review it and run again`);
    return;
  }
  assert.equal(svg, fs.readFileSync(file, 'utf8'), `${name}.svg changed; review with UPDATE=1`);
}

describe('chart snapshots', () => {
  const { notebook } = loadNotebook('fixtures/demo');
  const report = notebook.analyze();
  const blocks = report.files.flatMap((f) => f.blocks);
  for (const [kind, id] of [['ramp', 'R-02'], ['isotherm', 'I-01'], ['dsc', 'C-01'], ['relaxation', 'Q-dielectric']] as const) {
    it(`${kind} ${id}`, async () => {
      const b = blocks.find((x) => x.id === id)!;
      assert.ok(b.figure, 'has a figure');
      const svg = await renderSvg(toVega(figureSpec(`${kind} ${id}`, b.figure)));
      assert.match(svg, /^<svg /);
      for (const m of b.figure.markers) assert.ok(svg.includes(m.label.replace(/</g, '&lt;')), `marker ${m.label} labelled`);
      assert.ok(svg.includes(b.figure.xTitle.split(' ')[0]), 'x axis titled');
      check(`${kind}-${id}`, svg);
    });
  }
  it('dark theme differs from light only in colours', async () => {
    const b = blocks.find((x) => x.id === 'R-02')!;
    const dark = await renderSvg(toVega(figureSpec('ramp R-02', b.figure!, 'dark')));
    assert.match(dark, /#1e1e1e/);
    check('ramp-R-02-dark', dark);
  });
  it('escapes hostile text in titles, series names and labels', async () => {
    const svg = await renderSvg(toVega(figureSpec('ramp <script>alert(1)</script>', { xTitle: '<b>T</b>', yTitle: 'h', series: [{ name: '<img src=x onerror=1>', role: 'data', points: [[1, 2], [2, 3]] }], markers: [{ label: '<i>m</i>', x: 1.5 }] })));
    assert.doesNotMatch(svg, /<script|<img|<b>|<i>/);
    assert.match(svg, /&lt;script&gt;alert\(1\)&lt;\/script&gt;/);
  });

  it('stability maps', async () => {
    const maps = stabilityMapSpecs(summarise(report), report);
    assert.deepEqual(maps.map((m) => m.name), ['density-gain', 'fictive-temperature', 'stability-ratio', 'tg-rate']);
    for (const m of maps) check(`map-${m.name}`, await renderSvg(toVega(m.spec)));
  });
});
