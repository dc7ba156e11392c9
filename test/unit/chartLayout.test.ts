import assert from 'node:assert/strict';
import { figureSpec, stabilityMaps, chartTitle, tsubSeriesSpec, relaxationMapSpec } from '../../extension/core/charts/index.js';
import { markerLanes, pointLabels, paddedDomain, textWidth } from '../../extension/core/charts/labels.js';
import { logTicks } from '../../extension/core/charts/pointMap.js';
import { MATERIAL_COLOURS, PRINT, ROLE, TSUB_RAMP, TYPE } from '../../extension/core/charts/tokens.js';
import { legendHeight, legendItemWidth, legendLayers, legendWidth } from '../../extension/core/charts/legend.js';
import { chartLook } from '../../extension/core/charts/theme.js';
import { techniqueOf } from '../../extension/core/engine/summary.js';
import { summarise, type BlockReport, type FigureData, type NotebookReport } from '../../extension/core/index.js';
import { uniform } from '../support/random.js';

// Layout of the charts: labels that do not collide, maps that refuse to draw too little, titles
// that name film, material and Tsub, and the print size. Common practice, no source, unless named.

type Layer = Record<string, unknown> & { mark?: Record<string, unknown>; encoding?: Record<string, { value?: unknown }>; data?: { values?: Array<Record<string, unknown>> } };

function layersOf(spec: Record<string, unknown>): Layer[] {
  return (spec.layer as Layer[]) ?? [];
}

const temperature = (value: number) => ({ value, unit: 'K', dimension: 'temperature', written: `${value} K` });
const result = (value: number, unit: string, uncertainty?: number) => ({ value, unit, method: 'test', ...(uncertainty !== undefined ? { uncertainty } : {}) });

function block(kind: BlockReport['kind'], id: string, metadata: Record<string, unknown>, extra: Partial<BlockReport> = {}): BlockReport {
  return { kind, id, span: { start: 0, end: 1 }, metadata, quantities: {}, results: {}, diagnostics: [], ...extra } as BlockReport;
}

/** A notebook of films of one material with Tg 300 K, each with a ramp giving Tf, Tonset and Δρ/ρ. */
function notebook(films: ReadonlyArray<{ id: string; tsub: number; tf: number }>): NotebookReport {
  const blocks: BlockReport[] = [block('material', 'm-1', { tg: '300 K' })];
  for (const f of films) {
    blocks.push(block('deposition', f.id, { material: 'm-1' }, { quantities: { '/substrate_temperature': temperature(f.tsub) } as unknown as BlockReport['quantities'], results: { tsub_over_tg: result(f.tsub / 300, '1') } }));
    blocks.push(block('ramp', `R-${f.id}`, { film: f.id }, { results: { tfictive: result(f.tf, 'K', 1.5), tonset: result(f.tf + 40, 'K'), density_gain: result(1, '%', 0.1) } }));
  }
  return { files: [{ path: 'n.md', text: '', blocks, diagnostics: [] }] };
}

describe('chart layout', () => {
  describe('markerLanes', () => {
    it('staggers the labels of close markers in lanes, right of their rules, and keeps far ones in the first lane', () => {
      const lanes = markerLanes([100, 110, 300], [80, 80, 80], 420);
      assert.deepEqual(lanes.map((l) => [l.lane, l.align]), [[0, 'left'], [1, 'left'], [0, 'left']]);
      const three = markerLanes([100, 110, 120], [80, 80, 80], 420);
      assert.deepEqual(three.map((l) => l.lane), [0, 1, 2]);
    });

    it('gives every marker a lane when no arrangement keeps clear (eight markers at one x)', () => {
      const lanes = markerLanes(Array(8).fill(200), Array(8).fill(60), 420);
      assert.equal(lanes.length, 8);
      assert.ok(lanes.every((l) => Number.isInteger(l.lane) && l.lane >= 0));
    });

    it('turns a label to the left of its rule at the right edge', () => {
      assert.equal(markerLanes([400], [80], 420)[0].align, 'right');
      assert.equal(markerLanes([20], [80], 420)[0].align, 'left');
    });

    it('never lets two labels of a lane overlap, a rule cross a label, or a label leave the plot when it fits (random markers, seed 7)', () => {
      const rnd = uniform(7);
      for (let run = 0; run < 300; run++) {
        const n = 1 + Math.floor(rnd() * 5);
        const xs = Array.from({ length: n }, () => rnd() * 420);
        const ws = Array.from({ length: n }, () => 40 + rnd() * 60);
        const lanes = markerLanes(xs, ws, 420);
        const boxes = lanes.map((l, i) => ({ lane: l.lane, x: xs[i], a: l.align === 'left' ? xs[i] + 3 : xs[i] - 3 - ws[i], b: l.align === 'left' ? xs[i] + 3 + ws[i] : xs[i] - 3 }));
        for (let i = 0; i < n; i++) {
          if (boxes[i].lane >= 8) continue;
          // A label that fits on either side of its rule lies wholly inside the plot.
          const fits = xs[i] + 3 + ws[i] <= 420 || xs[i] - 3 - ws[i] >= 0;
          if (fits) assert.ok(boxes[i].a >= 0 && boxes[i].b <= 420, `run ${run}: label ${i} [${boxes[i].a}, ${boxes[i].b}] leaves the plot`);
          for (let j = 0; j < n; j++) {
            if (i === j) continue;
            if (boxes[i].lane === boxes[j].lane) assert.ok(boxes[i].b <= boxes[j].a || boxes[j].b <= boxes[i].a, `run ${run}: labels ${i} and ${j} overlap`);
            // Rule j runs from its lane down: it must not pass through label i in a lower lane.
            if (boxes[j].lane < boxes[i].lane) assert.ok(boxes[j].x <= boxes[i].a || boxes[j].x >= boxes[i].b, `run ${run}: rule ${j} crosses label ${i}`);
          }
        }
      }
    });
  });

  describe('pointLabels', () => {
    it('places labels clear of every point, each other and the edges, or leaves them out (random points, seed 11)', () => {
      const rnd = uniform(11);
      for (let run = 0; run < 100; run++) {
        const n = 2 + Math.floor(rnd() * 12);
        const xs = Array.from({ length: n }, () => rnd() * 300);
        const ys = Array.from({ length: n }, () => rnd() * 220);
        const ws = xs.map(() => 30);
        const placed = pointLabels(xs, ys, ws, 11, 300, 220, 5);
        const boxes = placed.flatMap((p, i) => {
          if (!p) return [];
          const x = xs[i] + p.dx;
          const y = ys[i] + p.dy;
          const x0 = p.align === 'left' ? x : p.align === 'right' ? x - 30 : x - 15;
          const y0 = p.baseline === 'top' ? y : p.baseline === 'bottom' ? y - 11 : y - 5.5;
          return [{ x0, x1: x0 + 30, y0, y1: y0 + 11 }];
        });
        for (const b of boxes) {
          assert.ok(b.x0 >= 0 && b.x1 <= 300 && b.y0 >= 0 && b.y1 <= 220, 'inside');
          for (let k = 0; k < n; k++) assert.ok(!(b.x0 < xs[k] + 5 && xs[k] - 5 < b.x1 && b.y0 < ys[k] + 5 && ys[k] - 5 < b.y1), 'clear of points');
        }
        for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) assert.ok(!(boxes[i].x0 < boxes[j].x1 && boxes[j].x0 < boxes[i].x1 && boxes[i].y0 < boxes[j].y1 && boxes[j].y0 < boxes[i].y1), 'labels apart');
      }
    });
  });

  it('logTicks labels 1, 2 and 5 of each decade inside the domain', () => {
    assert.deepEqual(logTicks([0.8, 12]), [1, 2, 5, 10]);
    assert.deepEqual(logTicks([0.03, 0.3]), [0.05, 0.1, 0.2]);
    assert.deepEqual(logTicks([2.5, 4]), [2.5, 4]);
    assert.deepEqual(logTicks([-1, 4]), []);
  });

  it('paddedDomain widens a span, and a single value by 5 %', () => {
    assert.deepEqual(paddedDomain([0, 10], 0.1), [-1, 11]);
    assert.deepEqual(paddedDomain([200, 200], 0.1), [190, 210]);
    assert.deepEqual(paddedDomain([], 0.1), [0, 1]);
    assert.equal(textWidth('Tf 300 K', 10), 48);
  });

  describe('figureSpec', () => {
    const dsc: FigureData = {
      xTitle: 'T / K',
      yTitle: 'Cp / (J g⁻¹ K⁻¹)',
      endotherm: 'up',
      series: [
        { name: 'data', role: 'data', meaning: 'data', points: [[300, 1.2], [320, 1.3], [330, 1.8], [340, 1.85]] },
        { name: 'excess area', role: 'area', meaning: 'construction', points: [[320, 1.3, 1.25], [330, 1.8, 1.27]] },
      ],
      markers: [
        { label: 'onset 321.0 K', x: 321 },
        { label: 'midpoint 323.5 K', x: 323.5 },
        { label: 'Tf 318.2 K', x: 318.2 },
      ],
    };
    const textLayers = (spec: Record<string, unknown>) => layersOf(spec).filter((l) => l.mark?.type === 'text' && l.encoding && 'text' in l.encoding);

    it('places the DSC onset, midpoint and Tf labels apart in the chart’s pixels, each rule starting at its label', () => {
      const spec = figureSpec('C-1', dsc);
      const x = (layersOf(spec).find((l) => l.mark?.type === 'point')!.encoding as unknown as { x: { scale: { domain: [number, number] } } }).x;
      const [d0, d1] = x.scale.domain;
      const px = (v: number) => ((v - d0) / (d1 - d0)) * (spec.width as number);
      // Ink layers only (each label also has a halo layer under it).
      const labels = textLayers(spec).filter((l) => l.mark!.stroke === undefined);
      assert.equal(labels.length, 3);
      const boxes = labels.map((l) => {
        const v = l.data!.values![0] as { x: number; label: string };
        const w = textWidth(v.label, TYPE.size.chartLabel);
        const at = px(v.x) + (l.mark!.dx as number);
        return { x: px(v.x), y: l.mark!.y as number, a: l.mark!.align === 'left' ? at : at - w, b: l.mark!.align === 'left' ? at + w : at };
      });
      for (const p of boxes) {
        for (const q of boxes) {
          if (p === q) continue;
          if (p.y === q.y) assert.ok(p.b <= q.a || q.b <= p.a, `labels overlap: ${JSON.stringify([p, q])}`);
          if (p.y < q.y) assert.ok(p.x <= q.a || p.x >= q.b, `a rule crosses a label: ${JSON.stringify([p, q])}`);
        }
      }
      assert.ok(new Set(boxes.map((b) => b.y)).size >= 2, 'close markers are staggered');
      const rules = layersOf(spec).filter((l) => l.mark?.type === 'rule' && l.data?.values?.[0]?.label !== undefined);
      assert.deepEqual(new Set(rules.map((r) => r.encoding!.y.value)), new Set(boxes.map((b) => b.y)));
    });

    it('draws the endotherm direction: up unless the figure says down', () => {
      const arrow = (f: FigureData) => layersOf(figureSpec('C-1', f)).find((l) => typeof l.mark?.text === 'string' && String(l.mark.text).startsWith('endo'))?.mark?.text;
      assert.equal(arrow(dsc), 'endo ↑');
      assert.equal(arrow({ ...dsc, endotherm: 'down' }), 'endo ↓');
      assert.equal(arrow({ ...dsc, endotherm: undefined }), undefined);
    });

    it('gives the excess area’s legend swatch the area’s own colour and opacity', () => {
      const layers = layersOf(figureSpec('C-1', dsc));
      const area = layers.find((l) => l.mark?.type === 'area')!.mark!;
      const swatch = layers.find((l) => l.mark?.type === 'rect')!.mark!;
      assert.equal(swatch.color, area.color);
      assert.equal(swatch.opacity, area.opacity);
    });

    it('print: one journal column, print type, no title (the caption carries it)', () => {
      const spec = figureSpec('C-1', dsc, { print: true });
      assert.equal(spec.title, undefined);
      assert.ok((spec.width as number) < PRINT.width);
      const config = spec.config as { axis: { labelFontSize: number } };
      assert.equal(config.axis.labelFontSize, PRINT.fontSize);
      assert.equal((figureSpec('C-1', dsc).config as { axis: { labelFontSize: number } }).axis.labelFontSize, TYPE.size.chartLabel);
    });
  });

  describe('stabilityMaps', () => {
    it('draws every map with two films at different Tsub/Tg, Tf = Tsub and Tf = Tg labelled', () => {
      const report = notebook([{ id: 'D-1', tsub: 255, tf: 280 }, { id: 'D-2', tsub: 280, tf: 290 }]);
      const maps = stabilityMaps(summarise(report), report);
      const tf = maps.find((m) => m.name === 'fictive-temperature')!;
      assert.ok('spec' in tf);
      const texts = layersOf(tf.spec).map((l) => l.mark?.text);
      assert.ok(texts.includes('Tf = Tsub') && texts.includes('Tf = Tg'));
      assert.ok(layersOf(tf.spec).some((l) => l.mark?.type === 'rule' && (l.encoding as Record<string, { field?: string }>).y?.field === 'ylo'), 'error bars from the uncertainty of Tf');
    });

    it('returns a note, not a chart, for one film or for films all at one Tsub/Tg', () => {
      const one = notebook([{ id: 'D-1', tsub: 255, tf: 280 }]);
      const m1 = stabilityMaps(summarise(one), one).find((m) => m.name === 'fictive-temperature')!;
      assert.ok('note' in m1 && m1.note.startsWith('needs at least 2 films'), JSON.stringify(m1));
      const same = notebook([{ id: 'D-1', tsub: 255, tf: 280 }, { id: 'D-2', tsub: 255, tf: 282 }]);
      const m2 = stabilityMaps(summarise(same), same).find((m) => m.name === 'density-gain')!;
      assert.ok('note' in m2 && m2.note.includes('all 2 at one value'), JSON.stringify(m2));
      const none = notebook([]);
      assert.ok(stabilityMaps(summarise(none), none).every((m) => 'note' in m));
    });
  });

  describe('stabilityMaps over several notebook folders, and techniques', () => {
    /** Every point drawn on a map, with its fields. */
    const pointsOf = (spec: Record<string, unknown>) => layersOf(spec).flatMap((l) => (l.mark?.type === 'point' ? (l.data?.values ?? []) : [])).filter((v) => 'technique' in v);

    it('keeps same-id films of two folders apart: each point at its own film’s Tsub/Tg', () => {
      const a = notebook([{ id: 'D-1', tsub: 255, tf: 280 }]);
      const b = notebook([{ id: 'D-1', tsub: 285, tf: 295 }]);
      const rooted = (r: NotebookReport, root: string): NotebookReport => ({ files: r.files.map((f) => ({ ...f, root })) });
      const parts = [rooted(a, '/lab/a'), rooted(b, '/lab/b')];
      const report: NotebookReport = { files: parts.flatMap((p) => p.files) };
      const tf = stabilityMaps(parts.flatMap((p) => summarise(p)), report).find((m) => m.name === 'fictive-temperature')!;
      assert.ok('spec' in tf, JSON.stringify(tf));
      // Tf/Tg and Tsub/Tg with Tg = 300 K (the model notebook's): 280/300 at 255/300, 295/300 at 285/300.
      const xy = pointsOf(tf.spec).map((p) => [Number((p.x as number).toFixed(4)), Number((p.y as number).toFixed(4))]).sort();
      assert.deepEqual(xy, [[0.85, 0.9333], [0.95, 0.9833]]);
    });

    it('marks a ramp of specific volume as dilatometry, the technique the CSV names', () => {
      const report = notebook([{ id: 'D-1', tsub: 255, tf: 280 }, { id: 'D-2', tsub: 280, tf: 290 }]);
      const blocks = report.files[0].blocks as BlockReport[];
      const i = blocks.findIndex((b) => b.id === 'R-D-2');
      blocks[i] = { ...blocks[i], figure: { xTitle: 'T / K', yTitle: 'V / (cm^3/g)', series: [], markers: [], measured: 'volume' } };
      assert.equal(techniqueOf(blocks[i]), 'dilatometry');
      const tf = stabilityMaps(summarise(report), report).find((m) => m.name === 'fictive-temperature')!;
      assert.ok('spec' in tf);
      assert.deepEqual(pointsOf(tf.spec).map((p) => [p.label, p.technique]).sort(), [['D-1', 'ellipsometry'], ['D-2', 'dilatometry']]);
    });
  });

  describe('legend', () => {
    it('wraps rows where the items’ widths say, the same in the layers and in the height', () => {
      const look = chartLook({});
      const items = ['a', 'longer label', 'x', 'another longer label', 'b'].map((label) => ({ label, swatch: { kind: 'point' as const, shape: 'circle' as const, colour: '#000', filled: true } }));
      for (const wrap of [60, 120, 200, 1000]) {
        const rows = new Set(legendLayers(items, look, 0, 0, wrap).map((l) => (l.encoding as { y: { value: number } }).y.value));
        assert.equal(legendHeight(items, look, wrap), rows.size * (look.fontSize + 6), `wrap ${wrap}`);
      }
      assert.equal(legendWidth(items, look), Math.max(...items.map((it) => legendItemWidth(it, look))));
    });
  });

  describe('titles', () => {
    it('names the block, film, material and Tsub', () => {
      const film = block('deposition', 'D-17', { material: 'aster-3' }, { quantities: { '/substrate_temperature': temperature(281) } as unknown as BlockReport['quantities'] });
      // The same subject text as the report's cards: Tsub to 4 digits, °C beside (ITS-90: 281.0 K = 7.85 °C, shown at 0.1).
      assert.equal(chartTitle(block('ramp', 'R-17a', { film: 'D-17' }), film), 'R-17a · film D-17 · aster-3 · Tsub 281.0 K (7.9 °C)');
      assert.equal(chartTitle(film), 'D-17 · aster-3 · Tsub 281.0 K (7.9 °C)');
      assert.equal(chartTitle(block('ramp', 'R-17a', { film: 'D-17' })), 'R-17a · film D-17');
      assert.equal(chartTitle(block('relaxation', 'Q-1', { material: 'aster-3' })), 'Q-1 · aster-3');
    });
  });

  describe('material charts', () => {
    it('colours a Tsub series along the sequential ramp in order of Tsub, never in a role or material colour', () => {
      // Nine films, each with a heating and a supercooled-liquid line h = 100 + 0.05 (T − 300) nm (a model, no source).
      const blocks: BlockReport[] = [];
      const tsubs = [262, 250, 270, 254, 258, 266, 274, 278, 282];
      for (const [k, tsub] of tsubs.entries()) {
        blocks.push(block('deposition', `F-${k}`, { material: 'm-1' }, { quantities: { '/substrate_temperature': temperature(tsub) } as unknown as BlockReport['quantities'] }));
        const liquid = [[300, 100], [340, 102]];
        const heating = [[300, 98], [320, 99], [340, 102]];
        blocks.push(block('ramp', `R-${k}`, { film: `F-${k}` }, { figure: { xTitle: 'T / K', yTitle: 'h / nm', markers: [], series: [{ name: 'heating', role: 'data', meaning: 'as-deposited', points: heating }, { name: 'supercooled liquid', role: 'line', meaning: 'supercooled-liquid', points: liquid }] } }));
      }
      const report: NotebookReport = { files: [{ path: 'n.md', text: '', blocks, diagnostics: [] }] };
      for (const theme of ['light', 'dark'] as const) {
        const chart = tsubSeriesSpec('m-1', report, { theme });
        assert.ok('spec' in chart);
        // The legend: each swatch (a point in the role's shape) followed by its label.
        const colourOf = new Map<string, string>();
        const layers = layersOf(chart.spec);
        layers.forEach((l, k) => {
          const label = layers[k + 1]?.mark?.text;
          if (l.mark?.type === 'point' && l.encoding?.x?.value !== undefined && typeof label === 'string') colourOf.set(label, l.mark.color as string);
        });
        const ordered = [...tsubs].sort((a, b) => a - b).map((t) => [...colourOf].find(([name]) => name.includes(`Tsub ${t.toFixed(1)} K`))?.[1]);
        assert.deepEqual(ordered, TSUB_RAMP[theme], `${theme}: ${JSON.stringify([...colourOf])}`);
        const taken = new Set([...Object.values(ROLE).flatMap((r) => [r.light, r.dark]), ...MATERIAL_COLOURS.light, ...MATERIAL_COLOURS.dark]);
        for (const c of TSUB_RAMP[theme]) assert.ok(!taken.has(c), c);
      }
    });

    it('return notes when a material has too little to show', () => {
      const report = notebook([{ id: 'D-1', tsub: 255, tf: 280 }]);
      const series = tsubSeriesSpec('m-1', report);
      assert.ok('note' in series && series.note.startsWith('needs at least 2 films'));
      const relax = relaxationMapSpec('m-1', report);
      assert.ok('note' in relax && relax.note.includes('relaxation data or a stated VFT law'));
    });
  });
});
