/**
 * Maps offsets in a block's body text (its lines joined by `\n`, container prefixes removed)
 * back to offsets in the markdown document. Body offsets are 0-based; so are document offsets.
 */
import { lastAtOrBelow, LineIndex, type Span } from './positions.js';

/** One line of a fenced block's body, as the scanner found it. */
export interface BodyLine {
  /** Offset of the first source character of the content (after container prefixes). */
  readonly start: number;
  /** Offset of the end of the content, before the line break. */
  readonly end: number;
  /** Spaces that stand for a tab partly used by the prefix (0 in almost every document). */
  readonly pad: number;
}

/**
 * The lines of a block's body, packed three integers to a line (no object per line): a 600-row
 * table keeps one array, not 600 objects. The scanner writes the lines of all its fences into one
 * growing store and gives each finished block an exact copy of its own, unless the block's body is
 * one piece of the document (`ContiguousLines`).
 */
export class BodyLines {
  private data: Int32Array;
  private count: number;

  /** `data` holds start, end and pad of each line; `count` lines of it are used. */
  constructor(data: Int32Array = new Int32Array(48), count = 0) {
    this.data = data;
    this.count = count;
  }

  get length(): number {
    return this.count;
  }

  push(start: number, end: number, pad: number): void {
    if (3 * this.count === this.data.length) {
      const bigger = new Int32Array(Math.max(48, this.data.length * 2));
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[3 * this.count] = start;
    this.data[3 * this.count + 1] = end;
    this.data[3 * this.count + 2] = pad;
    this.count++;
  }

  pop(): void {
    if (this.count > 0) this.count--;
  }

  /** Lines [from, length) as a store of their own, exactly their size. */
  copyFrom(from: number): BodyLines {
    return new BodyLines(this.data.slice(3 * from, 3 * this.count), this.count - from);
  }

  /** Where lines [from, length) start, less `base`: 16 bits each when they all fit (a body of under 64 K characters). */
  startsFrom(from: number, base: number): Int32Array | Uint16Array {
    const last = this.count > from ? this.data[3 * (this.count - 1)] - base : 0;
    const out = last < 65536 ? new Uint16Array(this.count - from) : new Int32Array(this.count - from);
    for (let i = 0; i < out.length; i++) out[i] = this.data[3 * (from + i)] - base;
    return out;
  }

  /** Forgets lines from `from` on. */
  truncate(from: number): void {
    this.count = Math.min(this.count, Math.max(0, from));
  }

  start(i: number): number {
    return this.data[3 * i];
  }

  end(i: number): number {
    return this.data[3 * i + 1];
  }

  pad(i: number): number {
    return this.data[3 * i + 2];
  }

  at(i: number): BodyLine | undefined {
    return i >= 0 && i < this.count ? { start: this.start(i), end: this.end(i), pad: this.pad(i) } : undefined;
  }
}

/** Read access to body lines (the scanner's store, or a plain list in tests). */
export type BodyLineList = Pick<BodyLines, 'length' | 'start' | 'end' | 'pad'>;

/**
 * The lines of a body that is one piece of its document (no container prefix, no tab padding,
 * line feeds only: almost every data block): found in the body text itself, which starts at
 * `base` in the document. Nothing per line is kept but the index of where lines start, which the
 * block's table reads too.
 */
export class ContiguousLines {
  readonly index: LineIndex;

  /** `body`: at least one line (the empty string is one empty line); `starts`: where they start in it, when known. */
  constructor(
    readonly body: string,
    readonly base: number,
    starts?: Int32Array | Uint16Array,
  ) {
    this.index = new LineIndex(body, starts);
  }

  get length(): number {
    return this.index.lineCount;
  }

  start(i: number): number {
    return this.base + this.index.lineStart(i);
  }

  end(i: number): number {
    return this.base + this.index.lineEnd(i);
  }

  pad(): number {
    return 0;
  }
}

export class BodyMap {
  /** Body offset where each line starts. */
  private readonly starts: Int32Array;

  /**
   * `shift` is subtracted from every document offset of `lines`: a block's lines are kept as the
   * scanner found them and read relative to the block's first fence character.
   */
  /** Set when the body is one piece of the document: a body offset is then the same distance in it. */
  private readonly contiguous: ContiguousLines | null;

  constructor(
    private readonly lines: BodyLineList,
    private readonly fallback: number,
    private readonly shift = 0,
  ) {
    this.contiguous = lines instanceof ContiguousLines ? lines : null;
    this.starts = new Int32Array(this.contiguous ? 0 : lines.length);
    if (this.contiguous) return;
    let at = 0;
    for (let i = 0; i < lines.length; i++) {
      this.starts[i] = at;
      at += lines.pad(i) + (lines.end(i) - lines.start(i)) + 1;
    }
  }

  get lineCount(): number {
    return this.lines.length;
  }

  /** Document offset of a body offset; offsets past a line's end clamp to that line's end. */
  toDocument(bodyOffset: number): number {
    const whole = this.contiguous;
    if (whole) return whole.base + Math.min(Math.max(bodyOffset, 0), whole.body.length) - this.shift;
    if (this.lines.length === 0) return this.fallback;
    const lo = lastAtOrBelow(this.starts, bodyOffset);
    const column = bodyOffset - this.starts[lo] - this.lines.pad(lo);
    return Math.min(this.lines.start(lo) + Math.max(0, column), this.lines.end(lo)) - this.shift;
  }

  spanToDocument(span: Span): Span {
    const start = this.toDocument(span.start);
    const end = Math.max(start, this.toDocument(span.end));
    return { start, end };
  }

  /** Document span of a whole body line (0-based index). */
  lineSpan(index: number): Span {
    if (this.lines.length === 0) return { start: this.fallback, end: this.fallback };
    const i = Math.max(0, Math.min(index, this.lines.length - 1));
    return { start: this.lines.start(i) - this.shift, end: this.lines.end(i) - this.shift };
  }
}
