/**
 * Where a table's parts are, in the lines of an instrument export or an inline table:
 *
 * ```
 * Sample: film K-3                ┐ preamble: any text lines; `Key: value` and `Key<TAB>value`
 * Mass: 5.21 mg                   ┘ lines (also `# Key: value`) are kept
 *                                   blank lines and `#` lines are skipped everywhere
 * Temperature, Heat Flow (Endo Up)  header: the text line before the first data row that names
 *                                   the most recognised columns (locateTable says how)
 * °C, mW                            units line (optional): unit cells, or blank, -, 1, a.u.
 * 25.0, -0.112                      data: the first line that starts with a number or a clock
 * ```
 *
 * A line that starts with a number is a text line when all its cells are units (`1, K, nm`), or
 * when it holds words and the next line is not a row like it (`5.21 mg` in a preamble): data
 * rows come in runs, and a first row with a bad cell is still a row.
 * A table with no data row keeps its first text line as the header, so its cells are reported.
 * An inline table's first line that is not blank or a comment is its header: its preamble can only
 * be `# Key: value` comment lines.
 *
 * Policy: never throws; linear in the size of the lines (each line is split a bounded number of
 * times). Line numbers are 0-based indexes into the given lines.
 */
import { roleOfSymbol } from './columnRoles.js';
import { CLOCK_UNIT, detectDelimiter, headerCells, isUnitless, readHeader, splitCells, startsWithValue, stripBrackets, withoutTrailingEmpty, type Cell, type Delimiter } from './tableCells.js';
import { lookupUnit } from './units.js';
import type { TableLines } from './tableLines.js';

export interface PreambleEntry {
  readonly key: string;
  readonly value: string;
  /** 0-based line index into the table's lines. */
  readonly line: number;
}

export interface TableLayout {
  /** The header line, or -1 when every line is blank or a comment. */
  readonly headerIndex: number;
  /** The units line under the header, or -1. */
  readonly unitsIndex: number;
  readonly delimiter: Delimiter;
  readonly preamble: readonly PreambleEntry[];
}

const UNIT_ROW_CELL = /^[([]?[A-Za-zµμÅ°℃%][^\d]*[)\]]?$|^[([]?1\/[A-Za-z].*$/;
const MAX_PREAMBLE = 1000;
const MAX_KEY_LENGTH = 200;

/** A line that holds nothing: blank, a `#` comment, or delimiters alone (`,,,`). */
export function isSkippedLine(text: string): boolean {
  const t = text.trim();
  return t.length === 0 || t.startsWith('#') || /^[,;\s]+$/.test(t);
}

/** What a units-line cell says: a unit, no unit (blank, -, 1, a.u.), or null when it is no unit at all. */
export function unitCell(text: string): 'unit' | 'unitless' | null {
  if (isUnitless(text)) return 'unitless';
  const inner = stripBrackets(text.trim());
  if (CLOCK_UNIT.test(inner)) return 'unit';
  return UNIT_ROW_CELL.test(text) && lookupUnit(inner) !== null ? 'unit' : null;
}

/**
 * Are these cells a units line? Every cell is a unit or unitless, and not every unit cell is
 * also a column symbol (`T, h` is a header, though tesla and hour are units; `h, nm` is units).
 */
function unitsLike(cells: readonly Cell[]): boolean {
  let units = 0;
  let symbols = 0;
  for (const c of cells) {
    const kind = unitCell(c.text);
    if (kind === null) return false;
    if (kind === 'unit') {
      units++;
      if (roleOfSymbol(readHeader(c.text).symbol) !== null) symbols++;
    }
  }
  return units > symbols;
}

function unitsLikeLine(text: string): boolean {
  const delimiter = detectDelimiter(text);
  return unitsLike(withoutTrailingEmpty(splitCells(text, delimiter), delimiter));
}

/** Is every cell of the line (split by its own delimiter) a value or empty? */
function allValues(text: string): boolean {
  const delimiter = detectDelimiter(text);
  return splitCells(text, delimiter).every((c) => c.text === '' || startsWithValue(c.text));
}

/** Is the next line that holds something a row like this one (a value first, the same delimiter and number of cells), or is there none? */
function nextIsLikeRow(lines: TableLines, i: number): boolean {
  let j = i + 1;
  while (j < lines.length && isSkippedLine(lines.line(j))) j++;
  if (j === lines.length) return true;
  const delimiter = detectDelimiter(lines.line(i));
  if (!startsWithValue(lines.line(j).trim()) || detectDelimiter(lines.line(j)) !== delimiter) return false;
  return withoutTrailingEmpty(splitCells(lines.line(j), delimiter), delimiter).length === withoutTrailingEmpty(splitCells(lines.line(i), delimiter), delimiter).length;
}

export interface LayoutOptions {
  /** An inline table (after a block's `---`): its first line that holds something is the header (a preamble only in `#` comments above it). */
  readonly inline?: boolean;
  /** Header texts or symbols the block's `columns:` map names: a cell that matches one counts as a recognised column. */
  readonly names?: ReadonlySet<string>;
}

/** How many cells of a line, split as a header, name a column role (or a name of the `columns:` map). */
function rolesIn(text: string, names: ReadonlySet<string> | undefined): number {
  let n = 0;
  for (const c of headerCells(text, detectDelimiter(text))) {
    const { symbol } = readHeader(c.text);
    if (roleOfSymbol(symbol) !== null || names?.has(c.text) || names?.has(symbol)) n++;
  }
  return n;
}

/** Is the line under the header a units line for it (a units line may stop before the last columns: a comment column without unit)? */
function isUnitsLineOf(lines: TableLines, header: number, next: number): boolean {
  const delimiter = detectDelimiter(lines.line(header));
  const cells = headerCells(lines.line(header), delimiter);
  const units = withoutTrailingEmpty(splitCells(lines.line(next), delimiter), delimiter);
  return cells.length > 0 && units.length <= cells.length && unitsLike(units);
}

function nextHolding(lines: TableLines, i: number): number {
  let j = i + 1;
  while (j < lines.length && isSkippedLine(lines.line(j))) j++;
  return j;
}

/**
 * The header of an inline table is its first line that holds something. In a file, the text lines
 * before the first data row are the preamble and the header: the header is the one that names the
 * most recognised columns, the later one at a tie (a preamble line naming one quantity, `Method:
 * heat from 16.85 °C`, loses to the header naming it and others; a first row that is not a number,
 * `3OO, 400`, names none and stays a row, so its bad cell is reported). When no line names a
 * recognised column, the header is the last text line (or the one above a units line).
 */
export function locateTable(lines: TableLines, options: LayoutOptions = {}): TableLayout {
  let firstText = -1;
  let last = -1;
  let beforeLast = -1;
  let firstData = -1;
  let best = -1;
  let bestRoles = 0;
  for (let i = 0; i < lines.length; i++) {
    if (isSkippedLine(lines.line(i))) continue;
    if (options.inline) {
      firstText = i;
      break;
    }
    if (startsWithValue(lines.line(i).trim()) && !unitsLikeLine(lines.line(i)) && (allValues(lines.line(i)) || nextIsLikeRow(lines, i))) {
      firstData = i;
      break;
    }
    if (firstText < 0) firstText = i;
    beforeLast = last;
    last = i;
    // A units line is no header (`h, °C`: hours and degrees, though `h` is also a symbol).
    if (beforeLast >= 0 && beforeLast === best && isUnitsLineOf(lines, beforeLast, i)) continue;
    const n = rolesIn(lines.line(i), options.names);
    if (n > 0 && n >= bestRoles) {
      best = i;
      bestRoles = n;
    }
  }
  let headerIndex: number;
  let unitsIndex = -1;
  if (options.inline) {
    headerIndex = firstText;
    const next = firstText >= 0 ? nextHolding(lines, firstText) : lines.length;
    if (next < lines.length && isUnitsLineOf(lines, firstText, next)) unitsIndex = next;
  } else if (firstData < 0 || last < 0) {
    headerIndex = firstText >= 0 ? firstText : firstData;
  } else if (best >= 0) {
    headerIndex = best;
    const next = nextHolding(lines, best);
    if (next < firstData && isUnitsLineOf(lines, best, next)) unitsIndex = next;
  } else {
    headerIndex = last;
    if (beforeLast >= 0 && isUnitsLineOf(lines, beforeLast, last)) {
      headerIndex = beforeLast;
      unitsIndex = last;
    }
  }
  const delimiter = headerIndex >= 0 ? detectDelimiter(lines.line(headerIndex)) : 'comma';
  return { headerIndex, unitsIndex, delimiter, preamble: headerIndex > 0 ? readPreamble(lines, headerIndex) : [] };
}

/** `Key: value`, `Key<TAB>value` (`;` and `,` too) lines above the header, `#` comments included. */
function readPreamble(lines: TableLines, end: number): PreambleEntry[] {
  const out: PreambleEntry[] = [];
  for (let i = 0; i < end && out.length < MAX_PREAMBLE; i++) {
    let t = lines.line(i).trim();
    if (t.startsWith('#')) t = t.replace(/^#+/, '').trim();
    if (t.length === 0) continue;
    let sep = t.indexOf(':');
    let separator = ':';
    if (sep < 0) {
      for (const s of ['\t', ';', ',']) {
        sep = t.indexOf(s);
        separator = s;
        if (sep >= 0) break;
      }
    }
    if (sep <= 0) continue;
    const key = t.slice(0, sep).trim();
    if (key.length === 0 || key.length > MAX_KEY_LENGTH) continue;
    const rest = t.slice(sep + 1);
    // `Mass<TAB>5.21<TAB>mg` → "5.21 mg".
    const value = separator === ':' ? rest.trim() : rest.split(separator).map((s) => s.trim()).filter((s) => s.length > 0).join(' ');
    out.push({ key, value, line: i });
  }
  return out;
}
