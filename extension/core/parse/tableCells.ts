/**
 * The cells of a table line: splitting by the delimiter, header cells and their units, and the
 * values a cell may hold (a number, a decimal-comma number, a clock time).
 *
 * Policy: never throws; every function is linear in the length of its text. Cell positions are
 * 0-based character offsets within the line, end-exclusive.
 */

export type Delimiter = 'tab' | 'semicolon' | 'comma' | 'whitespace';

export interface Cell {
  readonly text: string;
  readonly start: number;
  readonly end: number;
}

// Each digit can belong to one place only (no `\d+\.?\d*`), so a long bad cell fails in linear time.
export const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
export const DECIMAL_COMMA = /^[+-]?\d+,\d+(?:[eE][+-]?\d+)?$/;
export const NON_FINITE = /^[+-]?(?:nan|inf|infinity)$/i;
/** A clock time: `h:mm:ss`, `hh:mm:ss.s` or `mm:ss`, with an optional decimal fraction of the last part. */
const CLOCK = /^(\d{1,9}):([0-5]\d)(?::([0-5]\d))?(\.\d+)?$/;
/** A header unit that says its column holds clock times. */
export const CLOCK_UNIT = /^(?:h{1,2}:)?m{1,2}:s{1,2}(?:\.s+)?$/i;
/** A unit cell or bracketed header unit meaning "no unit" (a refractive index, a fit quality). */
const UNITLESS = /^(?:-|–|—|1|a\.?\s?u\.?|arb\.?\s?units?|arb\.?\s?u\.?|none|unitless|dimensionless)?$/i;

export function splitCells(text: string, delimiter: Delimiter): Cell[] {
  const cells: Cell[] = [];
  if (delimiter === 'whitespace') {
    const re = /\S+/g;
    let m: RegExpExecArray | null;
    while ((m = re.exec(text)) !== null) cells.push({ text: m[0], start: m.index, end: m.index + m[0].length });
    return cells;
  }
  const sep = delimiter === 'tab' ? '\t' : delimiter === 'semicolon' ? ';' : ',';
  let start = 0;
  for (let i = 0; i <= text.length; i++) {
    if (i === text.length || text[i] === sep) {
      let a = start;
      let b = i;
      while (a < b && (text[a] === ' ' || text[a] === '\t')) a++;
      while (b > a && (text[b - 1] === ' ' || text[b - 1] === '\t' || text[b - 1] === '\r')) b--;
      cells.push({ text: text.slice(a, b), start: a, end: b });
      start = i + 1;
    }
  }
  return cells;
}

/** The cells without one empty last cell: a delimiter at the end of every row ends no column. */
export function withoutTrailingEmpty(cells: Cell[], delimiter: Delimiter): Cell[] {
  if (delimiter !== 'whitespace' && cells.length > 1 && cells[cells.length - 1].text === '') cells.pop();
  return cells;
}

const WHITE = /\s/;
/** What `.` in a pattern does not match. */
const LINE_TERMINATOR = /[\n\r\u2028\u2029]/;
const isOpen = (c: string | undefined): boolean => c === '(' || c === '[';
const isClose = (c: string | undefined): boolean => c === ')' || c === ']';

/**
 * Header cells of a whitespace-delimited header: a word with an optional bracketed unit after
 * it (`T (K)`, `h[nm]`), or a bracketed group alone. The cells the pattern
 * /[^\s([]+(?:\s*[([][^)\]]*[)\]])?|[([][^)\]]*[)\]]/g finds, found in one pass: the next
 * closing bracket is looked up once, not again from every opening bracket.
 */
function whitespaceHeaderCells(text: string): Cell[] {
  const cells: Cell[] = [];
  const n = text.length;
  let closeAt = -1; // the first closing bracket at or after the last lookup, or n when none
  const nextClose = (from: number): number => {
    if (closeAt < from) {
      closeAt = from;
      while (closeAt < n && !isClose(text[closeAt])) closeAt++;
    }
    return closeAt;
  };
  let i = 0;
  while (i < n) {
    const c = text[i];
    if (!WHITE.test(c) && !isOpen(c)) {
      let end = i + 1;
      while (end < n && !WHITE.test(text[end]) && !isOpen(text[end])) end++;
      let j = end;
      while (j < n && WHITE.test(text[j])) j++;
      if (isOpen(text[j]) && nextClose(j + 1) < n) end = nextClose(j + 1) + 1;
      cells.push({ text: text.slice(i, end), start: i, end });
      i = end;
    } else if (isOpen(c) && nextClose(i + 1) < n) {
      const end = nextClose(i + 1) + 1;
      cells.push({ text: text.slice(i, end), start: i, end });
      i = end;
    } else {
      i++;
    }
  }
  return cells;
}

export function headerCells(text: string, delimiter: Delimiter): Cell[] {
  return delimiter === 'whitespace' ? whitespaceHeaderCells(text) : withoutTrailingEmpty(splitCells(text, delimiter), delimiter);
}

/**
 * A header cell split as /^(.+?)\s*[([](.*)[)\]]\s*$/ splits it, in one pass: the closing
 * bracket is the last character before trailing white space, and the symbol the shortest
 * prefix (one character at least) that white space separates from an opening bracket.
 */
function bracketed(text: string): { symbol: string; unit: string } | null {
  let last = text.length - 1;
  while (last >= 0 && WHITE.test(text[last])) last--;
  if (last < 2 || !isClose(text[last])) return null;
  // Neither the symbol nor the unit holds a line break: the unit's opening bracket must come
  // after the last break before the closing one.
  let lastBreak = -1;
  for (let i = 0; i < last; i++) if (LINE_TERMINATOR.test(text[i])) lastBreak = i;
  let open = 1;
  for (let s = 1; s < last; s++) {
    if (LINE_TERMINATOR.test(text[s - 1])) return null;
    if (open < s) open = s;
    while (open < last && WHITE.test(text[open])) open++;
    if (open >= last) return null;
    if (isOpen(text[open]) && open > lastBreak) return { symbol: text.slice(0, s), unit: text.slice(open + 1, last) };
  }
  return null;
}

/** Splits a header cell into its symbol and unit: `T/K`, `T (K)`, `T [K]`. */
export function readHeader(text: string): { symbol: string; unit: string } {
  const bracket = bracketed(text);
  const slash = text.indexOf('/');
  if (slash > 0 && (!bracket || slash < text.indexOf(bracket.unit))) {
    let unit = text.slice(slash + 1).trim();
    if (/^\(.*\)$/.test(unit)) unit = unit.slice(1, -1).trim();
    return { symbol: text.slice(0, slash).trim(), unit };
  }
  if (bracket) return { symbol: bracket.symbol.trim(), unit: bracket.unit.trim() };
  return { symbol: text.trim(), unit: '' };
}

const LOG_PREFIX = /^(log10|log|lg)\s{0,8}[([]/i;

/**
 * A logarithm header, `log10(f_max/Hz)` or `log(tau/s)`: the symbol `log10_<inner symbol>`
 * and the unit of the quantity under the logarithm; null for any other header.
 */
export function readLogHeader(text: string): { symbol: string; unit: string } | null {
  const t = text.trim();
  const m = LOG_PREFIX.exec(t);
  if (!m || !isClose(t[t.length - 1])) return null;
  const inner = t.slice(m[0].length, -1);
  const slash = inner.indexOf('/');
  const symbol = (slash < 0 ? inner : inner.slice(0, slash)).trim().replace(/\s+/g, '_');
  if (symbol.length === 0 || /[()[\]]/.test(symbol)) return null;
  return { symbol: `log10_${symbol}`, unit: slash < 0 ? '' : inner.slice(slash + 1).trim() };
}

/** The heat-flow sign convention a header states (`Heat Flow (Endo Up)`, `exo down`), and the header without it. */
export function readConvention(text: string): { text: string; convention?: 'endotherm-up' | 'endotherm-down' } {
  const words = /([([]\s*)?\b(endo|exo)(?:therm(?:ic)?)?\s{0,3}(up|down)\b(\s*[)\]])?/i.exec(text);
  if (!words) return { text };
  const endo = words[2].toLowerCase() === 'endo';
  const up = words[3].toLowerCase() === 'up';
  const whole = words[1] !== undefined && words[4] !== undefined;
  const cut = whole ? words[0] : words[0].slice(words[1]?.length ?? 0, words[0].length - (words[4]?.length ?? 0));
  const at = whole ? words.index : words.index + (words[1]?.length ?? 0);
  return { text: text.slice(0, at) + text.slice(at + cut.length), convention: endo === up ? 'endotherm-up' : 'endotherm-down' };
}

/** Is this unit text (a units-line cell, or a bracketed header unit) a way of writing "no unit"? */
export function isUnitless(unit: string): boolean {
  return UNITLESS.test(stripBrackets(unit).trim());
}

/** `(K)` → `K`, `[nm]` → `nm`. */
export function stripBrackets(text: string): string {
  return isOpen(text[0]) && isClose(text[text.length - 1]) ? text.slice(1, -1).trim() : text;
}

/** Seconds of a clock time (`1:05:30`, `05:30.5`), or null when the text is not one. */
export function clockSeconds(text: string): number | null {
  const m = CLOCK.exec(text);
  if (!m) return null;
  const fraction = m[4] ? Number(m[4]) : 0;
  if (m[3] !== undefined) return Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3]) + fraction;
  return Number(m[1]) * 60 + Number(m[2]) + fraction;
}

/** The first token of a line (up to white space, a comma or a semicolon). */
const FIRST_TOKEN = /^[^\s,;]*/;

/** Does the line start with a number or a clock time, as a data row does? */
export function startsWithValue(trimmed: string): boolean {
  // U+2212 MINUS SIGN counts as a minus, as the cells are read.
  const token = (FIRST_TOKEN.exec(trimmed)?.[0] ?? '').replace(/\u2212/g, '-');
  return NUMBER.test(token) || CLOCK.test(token) || NON_FINITE.test(token);
}

export function detectDelimiter(header: string): Delimiter {
  if (header.includes('\t')) return 'tab';
  if (header.includes(';')) return 'semicolon';
  if (header.includes(',')) return 'comma';
  return 'whitespace';
}
