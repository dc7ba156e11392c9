/**
 * The notebook-wide summary: one row per film (deposition block) with its conditions and the
 * figures of merit found in the blocks that refer to it. Values are the computed results; a
 * figure that no block has produced yet is absent.
 */
import type { BlockReport, NotebookReport } from './notebook.js';
import type { ResultValue } from '../model/result.js';

/** How a block's data were measured, as practitioners name the technique. */
export type Technique = 'ellipsometry' | 'dilatometry' | 'calorimetry' | 'dielectric' | 'deposition' | '';

/**
 * The technique of a block, the one rule of the CSV columns and the stability maps: a ramp or
 * isotherm of thickness is ellipsometry, a ramp of specific volume (the role of its table's column,
 * carried by its figure) dilatometry, a dsc block calorimetry, a relaxation block (relaxation
 * times) dielectric; material blocks have none.
 */
export function techniqueOf(block: BlockReport): Technique {
  switch (block.kind) {
    case 'ramp':
      return block.figure?.measured === 'volume' ? 'dilatometry' : 'ellipsometry';
    case 'isotherm':
      return 'ellipsometry';
    case 'dsc':
      return 'calorimetry';
    case 'relaxation':
      return 'dielectric';
    case 'deposition':
      return 'deposition';
    default:
      return '';
  }
}

/** The heating scan whose figures (T_onset, Tf) a row shows. */
export interface ScanSource {
  /** The block's id (null when it has none). */
  readonly block: string | null;
  readonly technique: Technique;
  /** Its heating rate in K/min, when written. */
  readonly rate?: number;
}

/**
 * A film's key across a report: its id within its notebook folder (`root`, set where a report
 * joins several folders), so two folders' films of the same id stay apart.
 */
export function filmKey(root: string | undefined, id: string): string {
  return `${root ?? ''}\u0000${id}`;
}

export interface FilmSummary {
  readonly film: string;
  readonly file: string;
  /** The notebook folder of `file`, where the report joins several. */
  readonly root?: string;
  readonly material: string | null;
  readonly tsub?: number;
  readonly tsubOverTg?: ResultValue;
  readonly rate?: number;
  readonly thickness?: number;
  readonly tg?: ResultValue;
  readonly tonset?: ResultValue;
  readonly tfictive?: ResultValue;
  readonly densityGain?: ResultValue;
  readonly stabilityRatio?: ResultValue;
  /** The equivalent aging time: a bracket (its `interval`), not a central value. */
  readonly agingTime?: ResultValue;
  readonly enthalpyGap?: ResultValue;
  readonly frontVelocity?: ResultValue;
  /** The fragility of the film's material (from its material block). */
  readonly fragility?: ResultValue;
  /** The one heating scan (ramp or dsc) that gave T_onset and Tf. */
  readonly scan?: ScanSource;
}

/** Rows in notebook order (file path, then position). */
export function summarise(report: NotebookReport): FilmSummary[] {
  const rows: Array<{ -readonly [K in keyof FilmSummary]: FilmSummary[K] }> = [];
  const byFilm = new Map<string, (typeof rows)[number]>();
  const materials = new Map<string, BlockReport>();
  const heatings = new Map<(typeof rows)[number], BlockReport[]>();
  for (const file of report.files) {
    for (const b of file.blocks) {
      if (b.kind === 'material' && b.id !== null && !materials.has(filmKey(file.root, b.id))) materials.set(filmKey(file.root, b.id), b);
      if (b.kind !== 'deposition' || b.id === null || byFilm.has(filmKey(file.root, b.id))) continue;
      const q = b.quantities;
      const material = b.metadata.material;
      const row = {
        film: b.id,
        file: file.path,
        ...(file.root !== undefined ? { root: file.root } : {}),
        material: typeof material === 'string' ? material : null,
        tsub: q['/substrate_temperature']?.value,
        tsubOverTg: b.results.tsub_over_tg,
        rate: q['/rate']?.value,
        thickness: q['/thickness']?.value ?? b.results.expected_thickness?.value,
      };
      rows.push(row);
      byFilm.set(filmKey(file.root, b.id), row);
    }
  }
  for (const file of report.files) {
    for (const b of file.blocks) {
      const film = b.metadata.film;
      const row = typeof film === 'string' ? byFilm.get(filmKey(file.root, film)) : undefined;
      if (!row) continue;
      const r = b.results;
      if ((b.kind === 'ramp' || b.kind === 'dsc') && (r.tonset || r.tfictive)) {
        const list = heatings.get(row) ?? [];
        list.push(b);
        heatings.set(row, list);
      }
      if (b.kind === 'ramp') {
        row.tg ??= r.tg;
        row.densityGain ??= r.density_gain;
        row.agingTime ??= r.equivalent_aging_time;
      } else if (b.kind === 'isotherm') {
        row.stabilityRatio ??= r.stability_ratio;
        row.frontVelocity ??= r.front_velocity;
      } else if (b.kind === 'dsc') {
        row.enthalpyGap ??= r.enthalpy_gap;
        row.agingTime ??= r.equivalent_aging_time;
      }
    }
  }
  // T_onset and Tf from one heating scan, named in `scan`: the first that gave both, else the first that gave either.
  for (const [row, list] of heatings) {
    const b = list.find((x) => x.results.tonset && x.results.tfictive) ?? list[0];
    const rate = b.quantities['/rate']?.value;
    row.scan = rate === undefined ? { block: b.id, technique: techniqueOf(b) } : { block: b.id, technique: techniqueOf(b), rate };
    if (b.results.tonset) row.tonset = b.results.tonset;
    if (b.results.tfictive) row.tfictive = b.results.tfictive;
  }
  for (const row of rows) {
    const m = row.material !== null ? materials.get(filmKey(row.root, row.material)) : undefined;
    if (m?.results.fragility) row.fragility = m.results.fragility;
  }
  return rows;
}
