/**
 * What an analysis sees: its own parsed block and the blocks it refers to, resolved through the
 * notebook index. Analyses return results and diagnostics with spans relative to their block.
 */
import type { Diagnostic } from '../model/diagnostic.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import type { FigureData } from '../model/figure.js';
import type { Quantity } from '../model/quantity.js';
import type { Results } from '../model/result.js';


export interface AnalysisContext {
  /** The block with this id, if it exists and has the expected kind. */
  lookup(id: string, kind: ParsedBlock['kind']): ParsedBlock | undefined;
  /** Results of another block (analysed on demand, cached). */
  resultsOf(block: ParsedBlock): Results;
  /** Blocks of a kind that refer to a given id by a key (e.g. ramps whose film is D-17). */
  referrers(kind: ParsedBlock['kind'], key: string, id: string): readonly ParsedBlock[];
  /** Throws `Cancelled` when the host no longer wants the result; long analyses call it between steps. */
  checkCancelled(): void;
}

/** Thrown through an analysis when its run is cancelled; the engine catches it and caches nothing. */
export class Cancelled extends Error {
  constructor() {
    super('cancelled');
  }
}


export interface Analysis {
  readonly results: Results;
  readonly diagnostics: readonly Diagnostic[];
  /** The chart's data, or how to make it: built only when a chart is asked for. */
  readonly figure?: FigureData | (() => FigureData);
  /**
   * Quantities the analysis resolved from other blocks (a substrate temperature written as
   * `0.85 Tg`), by pointer, in canonical units: reported beside the block's own quantities.
   */
  readonly quantities?: Readonly<Record<string, Quantity>>;
}

export type Analyzer = (block: ParsedBlock, ctx: AnalysisContext) => Analysis;

export const NO_ANALYSIS: Analysis = { results: {}, diagnostics: [] };
