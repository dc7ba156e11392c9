/**
 * What changed between two versions of a file, and whether the change can leave the file's block
 * structure alone: the engine then re-scans one block (or none) instead of the whole file.
 *
 * A change is *plain* when every line it touches, before and after, is one that cannot open,
 * close or end a block in CommonMark: no backtick or tilde run of three (a fence); no `<` or `>`
 * anywhere (HTML blocks start and end on them, and may swallow a fence); no block quote, list
 * marker, heading marker, setext underline or thematic break at the start; no indentation of four
 * spaces or a tab
 * (an indented code block); and no blank line (blank lines end HTML blocks and lists). Such lines
 * only ever form paragraph text.
 */

/** The changed region: offsets in the old text [start, oldEnd) became [start, newEnd) in the new one. */
export interface EditRegion {
  readonly start: number;
  readonly oldEnd: number;
  readonly newEnd: number;
}

/**
 * The region by the longest common prefix and suffix. Found by bisection on whole substrings,
 * whose comparison the engine does natively: a few dozen comparisons instead of one step per
 * character of a large file.
 */
export function editRegion(before: string, after: string): EditRegion | null {
  if (before === after) return null;
  const max = Math.min(before.length, after.length);
  let lo = 0;
  let hi = max;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (before.slice(0, mid) === after.slice(0, mid)) lo = mid;
    else hi = mid - 1;
  }
  const start = lo;
  lo = 0;
  hi = max - start;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (before.slice(before.length - mid) === after.slice(after.length - mid)) lo = mid;
    else hi = mid - 1;
  }
  return { start, oldEnd: before.length - lo, newEnd: after.length - lo };
}

function isBreak(c: number): boolean {
  return c === 10 || c === 13;
}

/** Offsets of the whole lines that hold [from, to) in a text. */
export function lineBounds(text: string, from: number, to: number): { start: number; end: number } {
  let start = from;
  while (start > 0 && !isBreak(text.charCodeAt(start - 1))) start--;
  let end = to;
  while (end < text.length && !isBreak(text.charCodeAt(end))) end++;
  return { start, end };
}

const BOUNDARY_LINE = /^(?: {0,3}(?:#|[-*+](?:[ \t]|$)|\d{1,9}[.)](?:[ \t]|$)|(?:[-*_=][ \t]*){3,}$|(?:=+|-+)[ \t]*$)| {4}| *\t|[ \t]*$)/;
const BOUNDARY_TEXT = /```|~~~|[<>]/;

/** True when the lines [start, end) of a text can change without changing any block boundary. */
export function plainLines(text: string, start: number, end: number): boolean {
  const slice = text.slice(start, end);
  if (BOUNDARY_TEXT.test(slice)) return false;
  for (const line of slice.split(/\r\n|\r|\n/)) if (BOUNDARY_LINE.test(line)) return false;
  return true;
}

/**
 * True when [from, to) holds no line break and starts after the first non-blank character of its
 * line: the line keeps its indentation and its first character, which decide what block it
 * belongs to (a list item's continuation, the end of a list).
 */
export function withinLineText(text: string, from: number, to: number): boolean {
  for (let i = from; i < to; i++) if (isBreak(text.charCodeAt(i))) return false;
  let i = from - 1;
  let sawText = false;
  for (; i >= 0 && !isBreak(text.charCodeAt(i)); i--) if (text[i] !== ' ' && text[i] !== '\t') sawText = true;
  return sawText;
}
