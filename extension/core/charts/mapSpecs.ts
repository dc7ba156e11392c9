/**
 * Notebook-wide stability maps, one point per measurement (the technique of `techniqueOf`: a ramp
 * of thickness is ellipsometry, of specific volume dilatometry, a dsc block calorimetry), coloured by material and shaped by technique:
 *
 * - fictive temperature Tf/Tg against Tsub/Tg, with the lines Tf = Tsub (the film kept the
 *   liquid's structure at Tsub) and Tf = Tg (no gain over the liquid-cooled glass), as drawn by
 *   Kearns, Swallen, Ediger et al., J. Phys. Chem. B 112, 4934 (2008);
 * - density gain Δρ/ρ over the liquid-cooled glass against Tsub/Tg (Dalal & Ediger,
 *   J. Phys. Chem. Lett. 3, 1229 (2012)), with Δρ = 0;
 * - onset temperature Tonset/Tg against Tsub/Tg, with Tonset = Tg;
 * - the stability ratio (transformation time / τα) against Tsub/Tg on a log axis;
 * - Tg against the cooling rate on a log axis in K/min.
 *
 * Tf, Tonset and Tsub are divided by the same Tg, the material's (Tsub over Tsub/Tg), so the
 * reduced axes stay comparable between films; the error bars are the results' standard
 * uncertainties divided by that Tg (its own uncertainty moves every point of a material together
 * and is left out).
 */
import type { NotebookReport } from '../engine/notebook.js';
import { filmKey, techniqueOf, type FilmSummary } from '../engine/summary.js';
import type { BlockReport } from '../model/report.js';
import type { VegaLiteSpec } from './figureSpec.js';
import { pointMap, type MapChart, type MapPoint, type Technique } from './pointMap.js';
import { chartLook, type ChartOptions, type Theme } from './theme.js';

export type { MapChart } from './pointMap.js';

/** Every material named in the notebook (material blocks and films), for stable colours. */
export function notebookMaterials(report: NotebookReport): string[] {
  const out = new Set<string>();
  for (const f of report.files) {
    for (const b of f.blocks) {
      if (b.kind === 'material' && b.id) out.add(b.id);
      if (typeof b.metadata.material === 'string') out.add(b.metadata.material);
    }
  }
  return [...out].sort();
}

/** The marker of a block's technique (the one rule of `techniqueOf`, shared with the CSV). */
function mapTechnique(b: BlockReport): Technique {
  const t = techniqueOf(b);
  return t === 'ellipsometry' || t === 'dilatometry' || t === 'calorimetry' ? t : 'other';
}

/**
 * Every map, drawn or with a note saying what it still needs. `rows` are the film summaries of
 * `report`.
 */
export function stabilityMaps(rows: readonly FilmSummary[], report: NotebookReport, options: ChartOptions | Theme = {}): MapChart[] {
  const look = chartLook(options);
  const materials = notebookMaterials(report);
  // Films by notebook folder and id: a report over two folders keeps their same-id films apart.
  const films = new Map(rows.map((r) => [filmKey(r.root, r.film), r]));
  const tf: MapPoint[] = [];
  const gain: MapPoint[] = [];
  const onset: MapPoint[] = [];
  const ratio: MapPoint[] = [];
  const tgRate: MapPoint[] = [];
  // A calorimetry scan that another scan names as its reference is the liquid-cooled glass made
  // in the pan, not the deposited film: it has no place on a map of the films.
  const references = new Set<string>();
  for (const f of report.files) for (const b of f.blocks) if (b.kind === 'dsc' && typeof b.metadata.reference === 'string') references.add(filmKey(f.root, b.metadata.reference));
  for (const f of report.files) {
    for (const b of f.blocks) {
      const filmId = b.metadata.film;
      const row = typeof filmId === 'string' ? films.get(filmKey(f.root, filmId)) : undefined;
      if (!row || (b.kind === 'dsc' && b.id !== null && references.has(filmKey(f.root, b.id)))) continue;
      const material = row.material ?? '—';
      const technique = mapTechnique(b);
      const base = { label: row.film, block: b.id ?? b.kind, material, technique };
      const r = b.results;
      if (b.kind === 'ramp' && r.tg) {
        const q = b.quantities['/rate']?.value;
        if (q !== undefined && q > 0) tgRate.push({ ...base, x: q, y: r.tg.value, uy: r.tg.uncertainty });
      }
      const s = row.tsubOverTg;
      const tsub = row.tsub;
      if (!s || !(s.value > 0) || tsub === undefined) continue;
      const tgRef = tsub / s.value;
      const at = { ...base, x: s.value, ux: s.uncertainty };
      if ((b.kind === 'ramp' || b.kind === 'dsc') && r.tfictive) tf.push({ ...at, y: r.tfictive.value / tgRef, uy: r.tfictive.uncertainty !== undefined ? r.tfictive.uncertainty / tgRef : undefined });
      if ((b.kind === 'ramp' || b.kind === 'dsc') && r.tonset) onset.push({ ...at, y: r.tonset.value / tgRef, uy: r.tonset.uncertainty !== undefined ? r.tonset.uncertainty / tgRef : undefined });
      if (b.kind === 'ramp' && r.density_gain) gain.push({ ...at, y: r.density_gain.value, uy: r.density_gain.uncertainty });
      if (b.kind === 'isotherm' && r.stability_ratio) ratio.push({ ...at, y: r.stability_ratio.value, uy: r.stability_ratio.uncertainty });
    }
  }
  const reduced = { xTitle: 'Tsub / Tg', xFormat: '.2f', varying: 'Tsub/Tg', materials };
  return [
    pointMap({ ...reduced, name: 'density-gain', title: 'Density gain over the liquid-cooled glass', yTitle: 'Δρ/ρ / %', points: gain, references: [{ kind: 'level', y: 0, label: 'liquid-cooled glass' }] }, look),
    pointMap(
      { ...reduced, name: 'fictive-temperature', title: 'Fictive temperature', yTitle: 'Tf / Tg', yFormat: '.2f', points: tf, references: [{ kind: 'identity', label: 'Tf = Tsub' }, { kind: 'level', y: 1, label: 'Tf = Tg' }] },
      look,
    ),
    pointMap({ ...reduced, name: 'onset-temperature', title: 'Onset of transformation on heating', yTitle: 'Tonset / Tg', yFormat: '.2f', points: onset, references: [{ kind: 'level', y: 1, label: 'Tonset = Tg' }] }, look),
    pointMap({ ...reduced, name: 'stability-ratio', title: 'Kinetic stability', yTitle: 'transformation time / τα', yLog: true, points: ratio }, look),
    pointMap({ name: 'tg-rate', title: 'Tg against cooling rate', xTitle: 'cooling rate / (K/min)', yTitle: 'Tg / K', xLog: true, yFormat: '.0f', points: tgRate, materials, countedAs: 'ramps with a Tg', varying: 'cooling rates' }, look),
  ];
}

/** The maps that can be drawn, as specs (the notes of the others are in `stabilityMaps`). */
export function stabilityMapSpecs(rows: readonly FilmSummary[], report: NotebookReport, options: ChartOptions | Theme = {}): Array<{ name: string; title: string; spec: VegaLiteSpec }> {
  return stabilityMaps(rows, report, options).flatMap((m) => ('spec' in m ? [m] : []));
}
