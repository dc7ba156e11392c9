/**
 * The lines of a table, as the table reader takes them: each line as a string when asked for
 * one (the header, a units line, a row that needs the general reader), and where it lies in its
 * text, so that a plain row of numbers is read in place, without a string per line.
 *
 * Policy: lines split at LF, CR LF and CR, as `split(/\r\n|\r|\n/)` splits them. Never throws.
 */
import { LineIndex } from '../text/positions.js';

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

/** The lines of a text, found once (text/positions.ts); a line becomes a string only when asked for. */
export function linesOfText(text: string): TableLines {
  return linesOfIndex(new LineIndex(text), 0);
}

/** Lines `first` on of a text whose lines are already found. */
export function linesOfIndex(index: LineIndex, first: number): TableLines {
  const text = index.text;
  return {
    length: Math.max(0, index.lineCount - first),
    line: (i) => text.slice(index.lineStart(first + i), index.lineEnd(first + i)),
    text: () => text,
    start: (i) => index.lineStart(first + i),
    end: (i) => index.lineEnd(first + i),
  };
}
