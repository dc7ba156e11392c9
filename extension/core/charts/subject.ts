/**
 * What a block is about, the one rule for chart titles, card captions and the long CSV: its film,
 * the film's material and substrate temperature (from the deposition block), or the material a
 * dsc or relaxation block names. The deposition blocks of a report are indexed once per report
 * object (kept while the report lives), so asking for many blocks costs one pass.
 */
import type { BlockReport, FileReport, NotebookReport } from '../model/report.js';
import { filmKey } from '../engine/summary.js';
import { celsiusText } from '../engine/summaryColumns.js';
import { formatValue } from '../model/formatResult.js';

export interface BlockSubject {
  readonly film: string | null;
  readonly material: string | null;
  /** Substrate temperature of the film in K. */
  readonly tsub?: number;
}

interface ReportIndex {
  /** Deposition blocks by folder and id (the first of an id in a folder). */
  readonly films: ReadonlyMap<string, BlockReport>;
  /** The file of each block. */
  readonly fileOf: ReadonlyMap<BlockReport, FileReport>;
}

const indexes = new WeakMap<NotebookReport, ReportIndex>();

function indexOf(report: NotebookReport): ReportIndex {
  let index = indexes.get(report);
  if (!index) {
    const films = new Map<string, BlockReport>();
    const fileOf = new Map<BlockReport, FileReport>();
    for (const f of report.files) {
      for (const b of f.blocks) {
        fileOf.set(b, f);
        const key = b.kind === 'deposition' && b.id !== null ? filmKey(f.root, b.id) : undefined;
        if (key !== undefined && !films.has(key)) films.set(key, b);
      }
    }
    index = { films, fileOf };
    indexes.set(report, index);
  }
  return index;
}

const text = (v: unknown): string | null => (typeof v === 'string' && v !== '' ? v : null);

/** The notebook folder of a block in the report (undefined for a report of one folder). */
export function rootOf(block: BlockReport, report: NotebookReport): string | undefined {
  return indexOf(report).fileOf.get(block)?.root;
}

/** The deposition block of the film a block refers to (`film:`), in the block's own notebook folder. */
export function filmBlockOf(block: BlockReport, report: NotebookReport): BlockReport | undefined {
  const film = text(block.metadata.film);
  if (film === null) return undefined;
  const index = indexOf(report);
  return index.films.get(filmKey(index.fileOf.get(block)?.root, film));
}

/** The subject of a block, given the deposition block of its film when it has one. */
export function subjectOf(block: BlockReport, film?: BlockReport): BlockSubject {
  if (block.kind === 'material') return { film: null, material: block.id };
  if (block.kind === 'deposition') return subjectOfFilm(block.id, block);
  const filmId = text(block.metadata.film);
  if (filmId !== null) {
    const s = subjectOfFilm(filmId, film);
    return s.material === null ? { ...s, material: text(block.metadata.material) } : s;
  }
  return { film: null, material: text(block.metadata.material) };
}

/** A function from a block of `report` to its subject. */
export function subjectsOf(report: NotebookReport): (block: BlockReport) => BlockSubject {
  return (block) => subjectOf(block, filmBlockOf(block, report));
}

function subjectOfFilm(film: string | null, deposition: BlockReport | undefined): BlockSubject {
  const tsub = deposition?.quantities['/substrate_temperature']?.value;
  const material = text(deposition?.metadata.material);
  return tsub === undefined ? { film, material } : { film, material, tsub };
}

/** `Tsub 270.0 K (-3.2 °C)`: four significant digits in K, °C at the same decimal place. */
export function tsubText(tsub: number): string {
  const k = formatValue(tsub, undefined, { digits: 4, notation: 'fixed' });
  const c = celsiusText(k, tsub);
  return `Tsub ${k} K${c ? ` (${c} °C)` : ''}`;
}

/** `film D-02 · amberine-3 · Tsub 270.0 K (-3.2 °C)`; '' when the block has no subject. */
export function subjectText(s: BlockSubject): string {
  const parts: string[] = [];
  if (s.film !== null) parts.push(`film ${s.film}`);
  if (s.material !== null) parts.push(s.material);
  if (s.tsub !== undefined && Number.isFinite(s.tsub)) parts.push(tsubText(s.tsub));
  return parts.join(' · ');
}
