/**
 * Notebook-wide stability maps: density gain, fictive temperature and stability ratio against
 * Tsub/Tg, one mark per film coloured by material; and Tg against log10 of the cooling rate per
 * material. Built from the summary rows and the ramps' results.
 */
import type { NotebookReport } from '../engine/notebook.js';
import type { FilmSummary } from '../engine/summary.js';
import type { VegaLiteSpec } from './figureSpec.js';
import { themeConfig, type Theme } from './theme.js';

function scatter(title: string, yTitle: string, values: Array<Record<string, unknown>>, theme: Theme, yLog = false): VegaLiteSpec {
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title,
    width: 260,
    height: 200,
    data: { values },
    layer: [
      {
        mark: { type: 'point', filled: true, size: 70 },
        encoding: {
          x: { field: 'x', type: 'quantitative', title: 'Tsub / Tg', scale: { zero: false, padding: 12 } },
          y: { field: 'y', type: 'quantitative', title: yTitle, scale: yLog ? { type: 'log', padding: 12 } : { zero: false, padding: 12 } },
          color: { field: 'material', type: 'nominal', title: 'material', legend: { orient: 'bottom' } },
        },
      },
      { mark: { type: 'text', dx: 7, align: 'left', fontSize: 10 }, encoding: { x: { field: 'x', type: 'quantitative' }, y: { field: 'y', type: 'quantitative', ...(yLog ? { scale: { type: 'log' } } : {}) }, text: { field: 'film' } } },
    ],
    config: themeConfig(theme),
  };
}

export function stabilityMapSpecs(rows: readonly FilmSummary[], report: NotebookReport, theme: Theme = 'light'): Array<{ name: string; spec: VegaLiteSpec }> {
  const pick = (f: (r: FilmSummary) => number | undefined) =>
    rows.flatMap((r) => {
      const y = f(r);
      return r.tsubOverTg && y !== undefined && Number.isFinite(y) ? [{ film: r.film, material: r.material ?? '—', x: r.tsubOverTg.value, y }] : [];
    });
  const out: Array<{ name: string; spec: VegaLiteSpec }> = [];
  const gain = pick((r) => r.densityGain?.value);
  if (gain.length > 0) out.push({ name: 'density-gain', spec: scatter('Density gain over the liquid-cooled glass', 'Δρ/ρ / %', gain, theme) });
  const tf = pick((r) => r.tfictive?.value);
  if (tf.length > 0) out.push({ name: 'fictive-temperature', spec: scatter('Fictive temperature', 'Tf / K', tf, theme) });
  const s = pick((r) => r.stabilityRatio?.value);
  if (s.length > 0) out.push({ name: 'stability-ratio', spec: scatter('Kinetic stability', 'transformation time / τα', s, theme, true) });

  // Tg against log q, per material, from every cooling ramp with a Tg.
  const materialOfFilm = new Map(rows.map((r) => [r.film, r.material ?? '—']));
  const tgPoints: Array<Record<string, unknown>> = [];
  for (const f of report.files) {
    for (const b of f.blocks) {
      const film = b.metadata.film;
      const q = b.quantities['/rate']?.value;
      if (b.kind !== 'ramp' || !b.results.tg || typeof film !== 'string' || !q) continue;
      tgPoints.push({ material: materialOfFilm.get(film) ?? '—', logq: Math.log10(q), tg: b.results.tg.value, ramp: b.id ?? '' });
    }
  }
  if (tgPoints.length > 0) {
    out.push({
      name: 'tg-rate',
      spec: {
        $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
        title: 'Tg against cooling rate',
        width: 260,
        height: 200,
        data: { values: tgPoints },
        layer: [
          { mark: { type: 'point', filled: true, size: 70 }, encoding: { x: { field: 'logq', type: 'quantitative', title: 'log10(q / (K/min))', scale: { zero: false, padding: 12 } }, y: { field: 'tg', type: 'quantitative', title: 'Tg / K', scale: { zero: false, padding: 12 } }, color: { field: 'material', type: 'nominal', title: 'material', legend: { orient: 'bottom' } } } },
          { mark: { type: 'line', strokeDash: [4, 3] }, encoding: { x: { field: 'logq', type: 'quantitative' }, y: { field: 'tg', type: 'quantitative' }, color: { field: 'material', type: 'nominal' } } },
        ],
        config: themeConfig(theme),
      },
    });
  }
  return out;
}
