/**
 * The lines of a table, as the table reader takes them: each line as a string when asked for
 * one (the header, a units line, a row that needs the general reader), and where it lies in its
 * text, so that a plain row of numbers is read in place, without a string per line.
 *
 * Policy: lines split at LF, CR LF and CR, as `split(/\r\n|\r|\n/)` splits them. Never throws.
 */
export interface TableLines {
  readonly length: number;
  /** Line i as a string. */
  line(i: number): string;
  /** The text line i lies in. */
  text(i: number): string;
  /** Where line i starts and ends (before its break) in `text(i)`. */
  start(i: number): number;
  end(i: number): number;
}

/** Lines already split. */
export function linesOfArray(lines: readonly string[]): TableLines {
  return {
    length: lines.length,
    line: (i) => lines[i],
    text: (i) => lines[i],
    start: () => 0,
    end: (i) => lines[i].length,
  };
}

/** The lines of a text, found in one pass; a line becomes a string only when asked for. */
export function linesOfText(text: string): TableLines {
  return new TextLines(text);
}

class TextLines implements TableLines {
  /** Where each line starts and ends (before its break). */
  private readonly starts: Int32Array;
  private readonly ends: Int32Array;
  readonly length: number;

  constructor(private readonly source: string) {
    if (source.indexOf('\r') < 0) {
      // Line feeds only (almost every table): counted, then placed, by the engine's own search.
      let count = 1;
      for (let i = source.indexOf('\n'); i >= 0; i = source.indexOf('\n', i + 1)) count++;
      this.length = count;
      this.starts = new Int32Array(count);
      this.ends = new Int32Array(count);
      let k = 0;
      for (let i = source.indexOf('\n'); i >= 0; i = source.indexOf('\n', i + 1)) {
        this.ends[k] = i;
        this.starts[++k] = i + 1;
      }
      this.ends[k] = source.length;
      return;
    }
    let count = 1;
    for (let i = 0; i < source.length; i++) {
      const c = source.charCodeAt(i);
      if (c === 10 || c === 13) {
        count++;
        if (c === 13 && source.charCodeAt(i + 1) === 10) i++;
      }
    }
    this.length = count;
    this.starts = new Int32Array(count);
    this.ends = new Int32Array(count);
    let k = 0;
    let start = 0;
    for (let i = 0; i < source.length; i++) {
      const c = source.charCodeAt(i);
      if (c === 10 || c === 13) {
        this.starts[k] = start;
        this.ends[k++] = i;
        if (c === 13 && source.charCodeAt(i + 1) === 10) i++;
        start = i + 1;
      }
    }
    this.starts[k] = start;
    this.ends[k] = source.length;
  }

  line(i: number): string {
    return this.source.slice(this.starts[i], this.ends[i]);
  }

  text(): string {
    return this.source;
  }

  start(i: number): number {
    return this.starts[i];
  }

  end(i: number): number {
    return this.ends[i];
  }
}
