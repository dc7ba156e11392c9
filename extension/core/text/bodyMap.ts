/**
 * Maps offsets in a block's body text (its lines joined by `\n`, container prefixes removed)
 * back to offsets in the markdown document. Body offsets are 0-based; so are document offsets.
 */
import type { Span } from './positions.js';

/** One line of a fenced block's body, as the scanner found it. */
export interface BodyLine {
  /** Offset of the first source character of the content (after container prefixes). */
  readonly start: number;
  /** Offset of the end of the content, before the line break. */
  readonly end: number;
  /** Spaces that stand for a tab partly used by the prefix (0 in almost every document). */
  readonly pad: number;
}

export class BodyMap {
  /** Body offset where each line starts. */
  private readonly starts: number[] = [];

  constructor(private readonly lines: readonly BodyLine[], private readonly fallback: number) {
    let at = 0;
    for (const line of lines) {
      this.starts.push(at);
      at += line.pad + (line.end - line.start) + 1;
    }
  }

  get lineCount(): number {
    return this.lines.length;
  }

  /** Document offset of a body offset; offsets past a line's end clamp to that line's end. */
  toDocument(bodyOffset: number): number {
    if (this.lines.length === 0) return this.fallback;
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid] <= bodyOffset) lo = mid;
      else hi = mid - 1;
    }
    const line = this.lines[lo];
    const column = bodyOffset - this.starts[lo] - line.pad;
    return Math.min(line.start + Math.max(0, column), line.end);
  }

  spanToDocument(span: Span): Span {
    const start = this.toDocument(span.start);
    const end = Math.max(start, this.toDocument(span.end));
    return { start, end };
  }

  /** Document span of a whole body line (0-based index). */
  lineSpan(index: number): Span {
    const line = this.lines[Math.max(0, Math.min(index, this.lines.length - 1))];
    return line ? { start: line.start, end: line.end } : { start: this.fallback, end: this.fallback };
  }
}
