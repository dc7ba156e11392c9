/**
 * What an analysis sees: its own parsed block and the blocks it refers to, resolved through the
 * notebook index. Analyses return results and diagnostics with spans relative to their block.
 */
import type { Diagnostic } from '../diagnostics/diagnostic.js';
import type { ParsedBlock } from '../notebook/parseBlock.js';
import type { Results } from '../results/result.js';

export interface AnalysisContext {
  /** The block with this id, if it exists and has the expected kind. */
  lookup(id: string, kind: ParsedBlock['kind']): ParsedBlock | undefined;
  /** Results of another block (analysed on demand, cached). */
  resultsOf(block: ParsedBlock): Results;
  /** Blocks of a kind that refer to a given id by a key (e.g. ramps whose film is D-17). */
  referrers(kind: ParsedBlock['kind'], key: string, id: string): readonly ParsedBlock[];
}

/** What a chart of a block shows, in the units of the results: data, fitted lines, markers. */
export interface FigureSeries {
  readonly name: string;
  /** 'data' points, a fitted 'line', a 'baseline' or 'tangent' construction, an 'area' (x, y, y2). */
  readonly role: 'data' | 'line' | 'baseline' | 'tangent' | 'area';
  readonly points: ReadonlyArray<readonly number[]>;
}

export interface FigureMarker {
  readonly label: string;
  readonly x: number;
}

export interface FigureData {
  readonly xTitle: string;
  readonly yTitle: string;
  readonly series: readonly FigureSeries[];
  readonly markers: readonly FigureMarker[];
}

export interface Analysis {
  readonly results: Results;
  readonly diagnostics: readonly Diagnostic[];
  readonly figure?: FigureData;
}

export type Analyzer = (block: ParsedBlock, ctx: AnalysisContext) => Analysis;

export const NO_ANALYSIS: Analysis = { results: {}, diagnostics: [] };
