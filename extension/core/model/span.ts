/**
 * Places in a markdown document. Everything in the model is 0-based: offsets are UTF-16 indices
 * into the BOM-stripped text, spans end-exclusive, positions line and character as in LSP.
 * Only the printed edges (CLI, JSON, HTML) convert to 1-based, through `toOneBased`.
 */

/** Offsets, 0-based, end-exclusive. */
export interface Span {
  readonly start: number;
  readonly end: number;
}

/** 0-based line and UTF-16 character, as in LSP. */
export interface Position {
  readonly line: number;
  readonly character: number;
}

/** 0-based, end-exclusive positions. */
export interface PositionRange {
  readonly start: Position;
  readonly end: Position;
}
