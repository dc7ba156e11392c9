/**
 * The one coordinate convention of the core.
 *
 * - An **offset** is a 0-based index into the document text in UTF-16 code units (a JavaScript
 *   string index), counted after a leading byte-order mark has been removed (see `stripBom`).
 * - A **Span** is a pair of offsets, `start` inclusive and `end` exclusive.
 * - A **Position** is 0-based `line` and 0-based `character` (UTF-16 units within the line), the
 *   convention of the Language Server Protocol.
 * - The CLI and the JSON results print 1-based lines and columns; `toOneBased` is the only place
 *   that adds the 1.
 *
 * Line breaks are `\n`, `\r\n` or a lone `\r`, as in CommonMark.
 */

import type { Position, PositionRange, Span } from '../model/span.js';

export type { Position, PositionRange, Span };

/** 1-based, end-exclusive line and column, for printed output. */
export interface OneBasedRange {
  readonly line: number;
  readonly column: number;
  readonly endLine: number;
  readonly endColumn: number;
}

const BOM = '\uFEFF';

/** Removes one leading byte-order mark; every offset in the core is into the stripped text. */
export function stripBom(text: string): string {
  return text.startsWith(BOM) ? text.slice(1) : text;
}

/** Maps offsets to line/character and back for one text. Built once per document version. */
export class LineIndex {
  /** Offset where each line starts (16 bits a line for a text shorter than 65 536 characters). */
  private readonly lineStarts: Int32Array | Uint16Array;

  /** `known`: where the lines start, when already found (the first is 0). */
  constructor(
    readonly text: string,
    known?: Int32Array | Uint16Array,
  ) {
    if (known) {
      this.lineStarts = known;
      return;
    }
    if (text.indexOf('\r') < 0) {
      // Line feeds only (almost every file): counted, then placed, by the engine's own search.
      let count = 1;
      for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) count++;
      const starts = new Int32Array(count);
      let k = 1;
      for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) starts[k++] = i + 1;
      this.lineStarts = starts;
      return;
    }
    const starts = [0];
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (c === 13 /* \r */) {
        if (text.charCodeAt(i + 1) === 10) i++;
        starts.push(i + 1);
      } else if (c === 10 /* \n */) {
        starts.push(i + 1);
      }
    }
    this.lineStarts = Int32Array.from(starts);
  }

  get lineCount(): number {
    return this.lineStarts.length;
  }

  /** Offset of the first character of a 0-based line (clamped to the document). */
  lineStart(line: number): number {
    if (line <= 0) return 0;
    if (line >= this.lineStarts.length) return this.text.length;
    return this.lineStarts[line];
  }

  /** Offset just before the line break that ends a 0-based line. */
  lineEnd(line: number): number {
    if (line + 1 >= this.lineStarts.length) return this.text.length;
    let end = this.lineStarts[line + 1];
    if (end > 0 && this.text.charCodeAt(end - 1) === 10) end--;
    if (end > 0 && this.text.charCodeAt(end - 1) === 13) end--;
    return end;
  }

  /** The 0-based line holding an offset. */
  lineAt(offset: number): number {
    return lastAtOrBelow(this.lineStarts, offset);
  }

  positionAt(offset: number): Position {
    const clamped = Math.max(0, Math.min(offset, this.text.length));
    const line = this.lineAt(clamped);
    return { line, character: clamped - this.lineStarts[line] };
  }

  offsetAt(position: Position): number {
    const start = this.lineStart(position.line);
    return Math.min(start + Math.max(0, position.character), this.lineEnd(position.line));
  }

  rangeOf(span: Span): PositionRange {
    return { start: this.positionAt(span.start), end: this.positionAt(span.end) };
  }
}

/** The last index of an ascending array whose value is at or below `value` (0 when none is). */
export function lastAtOrBelow(ascending: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = ascending.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (ascending[mid] <= value) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** What turns offsets into positions: a `LineIndex`, or the lighter `sparsePositions`. */
export interface Positions {
  readonly text: string;
  positionAt(offset: number): Position;
  rangeOf(span: Span): PositionRange;
}

/** Lines between two kept starts of `SparseLines`. */
const SPARSE_STRIDE = 64;

/**
 * Positions in a text of line feeds only, keeping the start of every 64th line and counting the
 * rest when asked: for a report, which asks for a few hundred positions in megabytes of text.
 */
class SparseLines implements Positions {
  private readonly starts: Int32Array;

  constructor(readonly text: string) {
    const starts = [0];
    let line = 0;
    for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) if (++line % SPARSE_STRIDE === 0) starts.push(i + 1);
    this.starts = Int32Array.from(starts);
  }

  positionAt(offset: number): Position {
    const clamped = Math.max(0, Math.min(offset, this.text.length));
    const lo = lastAtOrBelow(this.starts, clamped);
    let line = lo * SPARSE_STRIDE;
    let start = this.starts[lo];
    for (let i = this.text.indexOf('\n', start); i >= 0 && i < clamped; i = this.text.indexOf('\n', i + 1)) {
      line++;
      start = i + 1;
    }
    return { line, character: clamped - start };
  }

  rangeOf(span: Span): PositionRange {
    return { start: this.positionAt(span.start), end: this.positionAt(span.end) };
  }
}

/** Positions for a few queries in a long text: `SparseLines` when it has line feeds only, else a `LineIndex`. */
export function sparsePositions(text: string): Positions {
  return text.indexOf('\r') < 0 ? new SparseLines(text) : new LineIndex(text);
}

/** The single place where 0-based positions become the 1-based lines and columns users read. */
export function toOneBased(range: PositionRange): OneBasedRange {
  return {
    line: range.start.line + 1,
    column: range.start.character + 1,
    endLine: range.end.line + 1,
    endColumn: range.end.character + 1,
  };
}

/** The same rule for one position: 1-based line and column. */
export function toOneBasedPoint(position: Position): { readonly line: number; readonly column: number } {
  const r = toOneBased({ start: position, end: position });
  return { line: r.line, column: r.column };
}

/** A span that covers at least one character where the text allows it, so no range is empty. */
export function visibleSpan(span: Span, textLength: number): Span {
  if (span.end > span.start) return span;
  if (span.start < textLength) return { start: span.start, end: span.start + 1 };
  return { start: Math.max(0, textLength - 1), end: textLength };
}
