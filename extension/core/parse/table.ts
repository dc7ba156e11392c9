/**
 * Reads a data table: inline after a block's `---` line, or the text of a data file, as
 * instruments export them (tableLayout.ts finds the preamble, header and units line).
 *
 * - Each header cell names a quantity and its unit in the forms `T/K` (IUPAC quantity calculus),
 *   `T (K)` or `T [K]`; or the units stand on a line under the header (`K, nm`), where a blank
 *   cell, `-`, `1` or `a.u.` marks a column without unit. A units line wins over brackets in the
 *   header, which may then hold other words: `Heat Flow (Endo Up)` states the heat-flow sign
 *   convention, `n(632.8 nm)` a wavelength.
 * - The delimiter is found from the header: tab, then semicolon, then comma, else whitespace. A
 *   delimiter at the end of a row ends no column.
 * - A decimal comma (`1,25`) is read where the delimiter is not a comma.
 * - Every cell of a recognised column must be a finite number (a minus may be U+2212), in its
 *   column's unit too; a time may be a clock time (`1:05:30`, `05:30.5`), read as seconds, in a
 *   column whose unit is a clock unit, seconds or none. A bad cell is reported on its own line and
 *   column and its row is left out, so the remaining rows can still be analysed. A column with no
 *   role (a comment) may hold anything; its cells are not used.
 * - A temperature is absolute: rows at or below 0 K are left out, with one error on the first.
 *
 * Columns are recognised by their symbol (columnRoles.ts) or by the block's `columns:` map, and
 * converted to the canonical unit of their role; a log10 column (`log10(f_max/kHz)`) to the
 * decadic logarithm of the quantity in its canonical unit.
 *
 * Policy: never throws; linear in the size of the lines. Positions are (0-based line index into
 * the given lines, 0-based character start and end within that line).
 */
import { messages } from '../model/messages.js';
import type { Message } from '../model/diagnostic.js';
import { ALTERNATIVE_ROLE, LOG_OF, ROLE_DIMENSION, roleNeeds, roleOfSymbol, type ColumnRole } from './columnRoles.js';
import {
  CLOCK_UNIT,
  DECIMAL_COMMA,
  NON_FINITE,
  NUMBER,
  clockSeconds,
  headerCells,
  isUnitless,
  readConvention,
  readHeader,
  readLogHeader,
  splitCells,
  stripBrackets,
  withoutTrailingEmpty,
  type Cell,
  type Delimiter,
} from './tableCells.js';
import { isSkippedLine, locateTable, type PreambleEntry } from './tableLayout.js';
import { linesOfArray, type TableLines } from './tableLines.js';
import { CANONICAL, hasDimension, lookupUnit, toCanonical, suggestUnit } from './units.js';

export { ROLE_DIMENSION, ROLE_SYMBOLS, roleOfSymbol, type ColumnRole } from './columnRoles.js';
export { readHeader } from './tableCells.js';
export type { PreambleEntry } from './tableLayout.js';

export interface TableLine {
  readonly text: string;
}

export interface TableProblem {
  readonly message: Message;
  readonly line: number;
  readonly start: number;
  readonly end: number;
  /** Text that would mend the problem, written over its range (a near-miss unit). */
  readonly replacement?: string;
}

export interface TableColumn {
  readonly header: string;
  readonly symbol: string;
  /** The unit as written (in the header or on the units line); empty for a column without unit. */
  readonly writtenUnit: string;
  readonly role: ColumnRole | null;
  /** Canonical unit of the role (or the written unit for unrecognised columns). */
  readonly unit: string;
  readonly values: Float64Array;
  readonly headerLine: number;
  readonly headerStart: number;
  readonly headerEnd: number;
  /** The sign convention a heat-flow header states (`Heat Flow (Endo Up)`, `exo down`). */
  readonly convention?: 'endotherm-up' | 'endotherm-down';
}

export interface Table {
  readonly columns: readonly TableColumn[];
  readonly rowCount: number;
  /**
   * Line index (into the given lines) of each kept row. Read only: rows on consecutive lines get a
   * view of one array that every such table shares, and a column's values are a view of the table's
   * one store.
   */
  readonly rowLines: Int32Array;
  readonly problems: readonly TableProblem[];
  readonly delimiter: Delimiter;
  readonly byRole: ReadonlyMap<ColumnRole, TableColumn>;
  /** `Key: value` lines above the header (an instrument's preamble: sample, mass, method, date). */
  readonly preamble: readonly PreambleEntry[];
  /** Line index of the units line under the header, or null. */
  readonly unitsLine: number | null;
}

const MAX_PROBLEMS = 200;

/** A column's header as read: symbol, unit (from the header or the units line) and where the unit was written. */
interface ColumnHeader {
  readonly cell: Cell;
  readonly symbol: string;
  readonly unit: string;
  readonly unitLine: number;
  readonly unitStart: number;
  readonly unitEnd: number;
  readonly convention?: 'endotherm-up' | 'endotherm-down';
  /** Written as a logarithm, `log10(x/unit)`: the unit is that of the quantity under the logarithm. */
  readonly log: boolean;
}

/** A header cell's symbol, unit and sign convention. A bracketed group that is no unit but starts with a digit (`n(632.8 nm)`) qualifies the symbol. */
function readColumnHeader(cell: Cell, line: number): ColumnHeader {
  const { text, convention } = readConvention(cell.text);
  const logHeader = readLogHeader(text);
  const { symbol, unit: written } = logHeader ?? readHeader(text);
  const unit = isUnitless(written) || (/^\d/.test(written) && lookupUnit(written) === null) ? '' : written;
  return { cell, symbol, unit, unitLine: line, unitStart: cell.start, unitEnd: cell.end, log: logHeader !== null, ...(convention ? { convention } : {}) };
}

/** U+2212 MINUS SIGN, as typeset text and some exports write a negative number. */
const MINUS_SIGN = /\u2212/g;

const SPACE = 32;
const TAB = 9;
const CR = 13;
const SEPARATOR: Readonly<Record<Delimiter, number>> = { tab: TAB, semicolon: 59, comma: 44, whitespace: -1 };

/** A character a plain number is written with: digits, sign, point, exponent. */
function numberChar(c: number): boolean {
  return (c >= 48 && c <= 57) || c === 43 || c === 45 || c === 46 || c === 69 || c === 101;
}

/** Exact powers of ten as doubles (10²² is the largest). */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/**
 * A decimal number written in text[start, end) (`NUMBER`'s grammar), without a string: when its
 * digits, leading zeros aside, are at most 15 and its power of ten at most 22 either way, the
 * digits form an exact integer and one division or multiplication by an exact power of ten rounds
 * correctly (Clinger, "How to read floating point numbers accurately", PLDI 1990), so the value is
 * the one `Number` reads. NaN for anything else: the caller reads the cell with `Number`.
 */
export function plainNumber(text: string, start: number, end: number): number {
  return readPlainNumber(text, start, end, ONE, 0) ? ONE[0] : NaN;
}

const ONE = new Float64Array(1);

/**
 * `plainNumber` written to out[at] (a double returned from a call that is not inlined becomes a
 * new heap number, and this runs for every cell); false when the cell is left to `Number`.
 */
function readPlainNumber(text: string, start: number, end: number, out: Float64Array, at: number): boolean {
  let i = start;
  let c = text.charCodeAt(i);
  const negative = c === 45;
  if (c === 43 || c === 45) c = text.charCodeAt(++i);
  let mantissa = 0;
  let digits = 0;
  let scale = 0;
  let seen = false;
  for (; i < end && c >= 48 && c <= 57; c = text.charCodeAt(++i)) {
    seen = true;
    if (mantissa === 0 && c === 48) continue;
    mantissa = mantissa * 10 + (c - 48);
    digits++;
  }
  if (i < end && c === 46) {
    for (c = text.charCodeAt(++i); i < end && c >= 48 && c <= 57; c = text.charCodeAt(++i)) {
      seen = true;
      scale--;
      if (mantissa === 0 && c === 48) continue;
      mantissa = mantissa * 10 + (c - 48);
      digits++;
    }
  }
  if (!seen || digits > 15) return false;
  if (i < end && (c === 101 || c === 69)) {
    c = text.charCodeAt(++i);
    const minus = c === 45;
    if (c === 43 || c === 45) c = text.charCodeAt(++i);
    let exponent = 0;
    let any = false;
    for (; i < end && c >= 48 && c <= 57 && exponent < 1000; c = text.charCodeAt(++i)) {
      exponent = exponent * 10 + (c - 48);
      any = true;
    }
    if (!any) return false;
    scale += minus ? -exponent : exponent;
  }
  if (i !== end || scale < -22 || scale > 22) return false;
  const value = scale < 0 ? mantissa / POWERS_OF_TEN[-scale] : mantissa * POWERS_OF_TEN[scale];
  out[at] = negative ? -value : value;
  return true;
}

/**
 * The common row, read without a string or an object per cell: exactly `ncol` plain numbers
 * (`NUMBER`, then one more empty cell at the end for a trailing delimiter) separated by the
 * delimiter, with spaces and tabs around them. Writes them to `out` and returns true; returns
 * false for anything else (a word, an empty cell, a decimal comma, a clock time, U+2212, a ragged
 * row), which the general reader then takes cell by cell, with its findings.
 */
function readPlainRow(text: string, from: number, to: number, delimiter: Delimiter, ncol: number, out: Float64Array): boolean {
  const sep = SEPARATOR[delimiter];
  const n = to;
  let i = from;
  let j = 0;
  for (;;) {
    while (i < n && (text.charCodeAt(i) === SPACE || (text.charCodeAt(i) === TAB && sep !== TAB))) i++;
    const start = i;
    while (i < n && numberChar(text.charCodeAt(i))) i++;
    const end = i;
    while (i < n && (text.charCodeAt(i) === SPACE || (text.charCodeAt(i) === TAB && sep !== TAB) || text.charCodeAt(i) === CR)) i++;
    if (end === start) {
      // Only an empty last cell after a trailing delimiter, or the end of a whitespace row.
      return i === n && j === ncol && (sep === -1 || j > 0);
    }
    if (j === ncol) return false;
    if (!readPlainNumber(text, start, end, out, j)) {
      const cell = text.slice(start, end);
      if (!NUMBER.test(cell)) return false;
      out[j] = Number(cell);
    }
    j++;
    if (i === n) return j === ncol;
    if (sep === -1) continue;
    if (text.charCodeAt(i) !== sep) return false;
    i++;
    if (i === n) return j === ncol;
  }
}

function isLineArray(lines: readonly string[] | TableLines): lines is readonly string[] {
  return Array.isArray(lines);
}

/** A unit conversion v ↦ v·factor + offset, its coefficients beside it for the plain-row reader. */
interface Conversion {
  (v: number): number;
  readonly factor: number;
  readonly offset: number;
  readonly identity: boolean;
}

function conversion(factor: number, offset: number): Conversion {
  if (factor === 1 && offset === 0) return IDENTITY;
  return Object.assign((v: number) => v * factor + offset, { factor, offset, identity: false });
}

const IDENTITY: Conversion = Object.assign((v: number) => v, { factor: 1, offset: 0, identity: true });

/** Columns of numbers that grow as rows are read. */
class ColumnBuffers {
  /** Column j holds rows [j·capacity, j·capacity + length) of one store (one allocation per table). */
  private store: Float64Array;
  private capacity: number;
  length = 0;
  /** `capacity`: the rows expected at most (the lines below the header), so that the store is made once. */
  constructor(
    private readonly ncol: number,
    capacity: number,
  ) {
    this.capacity = Math.max(8, capacity);
    this.store = new Float64Array(ncol * this.capacity);
  }
  push(row: ArrayLike<number>): void {
    if (this.length === this.capacity) {
      const bigger = new Float64Array(this.ncol * this.capacity * 2);
      for (let j = 0; j < this.ncol; j++) bigger.set(this.store.subarray(j * this.capacity, (j + 1) * this.capacity), j * this.capacity * 2);
      this.store = bigger;
      this.capacity *= 2;
    }
    for (let j = 0; j < this.ncol; j++) this.store[j * this.capacity + this.length] = row[j];
    this.length++;
  }
  column(j: number): Float64Array {
    return this.store.subarray(j * this.capacity, j * this.capacity + this.length);
  }
}

/** 0, 1, 2, … up to 65 535 (made on first use): rows on consecutive lines (almost every table) share a view of it for their lines. */
let counting: Int32Array | null = null;
const COUNTING_LENGTH = 65536;

/** The first `n` row lines, kept as a view of `counting` when they are consecutive (nothing writes to them). */
function compactRowLines(rowLines: Int32Array, n: number): Int32Array {
  const first = n > 0 ? rowLines[0] : 0;
  let consecutive = first + n <= COUNTING_LENGTH;
  for (let i = 1; i < n && consecutive; i++) consecutive = rowLines[i] === first + i;
  if (!consecutive) return n === rowLines.length ? rowLines : rowLines.slice(0, n);
  if (!counting) {
    counting = new Int32Array(COUNTING_LENGTH);
    for (let i = 0; i < COUNTING_LENGTH; i++) counting[i] = i;
  }
  return counting.subarray(first, first + n);
}

/**
 * Reads plain rows (numbers and delimiters only) where they lie in their text, from line `i` on,
 * into `rows`: up to the first line that is not one (or the units line), which it returns. (A loop
 * of its own, compiled early: the table reader around it is compiled late in a run.)
 */
function readPlainRows(lines: TableLines, i: number, unitsIndex: number, delimiter: Delimiter, plain: Float64Array, convertPlain: () => boolean, rows: ColumnBuffers, rowLines: Int32Array): number {
  const ncol = plain.length;
  for (; i < lines.length; i++) {
    if (i === unitsIndex) return i;
    const source = lines.text(i);
    const from = lines.start(i);
    const to = lines.end(i);
    const first = from < to ? source.charCodeAt(from) : NaN;
    const startsLikeNumber = (first >= 48 && first <= 57) || first === 45 || first === 43 || first === 46 || first === SPACE || first === TAB;
    if (!(startsLikeNumber && readPlainRow(source, from, to, delimiter, ncol, plain) && convertPlain())) return i;
    rows.push(plain);
    rowLines[rows.length - 1] = i;
  }
  return i;
}

/**
 * Parses a table. `columnsMap` is the block's `columns:` metadata (role → header text or symbol);
 * `inline` says the lines are an inline table (its first line that is not a comment is the header).
 */
export function parseTable(given: readonly string[] | TableLines, columnsMap: Readonly<Record<string, string>> = {}, options: { readonly inline?: boolean } = {}): Table {
  const problems: TableProblem[] = [];
  const report = (message: Message, line: number, start: number, end: number, replacement?: string): void => {
    if (problems.length < MAX_PROBLEMS) problems.push({ message, line, start, end: Math.max(end, start + 1), ...(replacement === undefined ? {} : { replacement }) });
  };
  const lines = isLineArray(given) ? linesOfArray(given) : given;
  const names = new Set(Object.values(columnsMap).filter((v): v is string => typeof v === 'string'));
  const layout = locateTable(lines, { inline: options.inline === true, names });
  const { headerIndex, unitsIndex, delimiter, preamble } = layout;
  const empty: Table = { columns: [], rowCount: 0, rowLines: new Int32Array(0), problems, delimiter: 'comma', byRole: new Map(), preamble, unitsLine: null };
  if (headerIndex < 0) {
    report(messages.tableNoHeader(), 0, 0, lines.length > 0 ? lines.end(0) - lines.start(0) : 0);
    return empty;
  }
  const headerText = lines.line(headerIndex);
  const hcells = headerCells(headerText, delimiter);
  const headers = hcells.map((c) => readColumnHeader(c, headerIndex));
  // A units line under the header wins over what the header's brackets hold.
  if (unitsIndex >= 0) {
    const unitCells = withoutTrailingEmpty(splitCells(lines.line(unitsIndex), delimiter), delimiter);
    unitCells.forEach((u, i) => {
      const unit = isUnitless(u.text) ? '' : stripBrackets(u.text);
      headers[i] = { ...headers[i], unit, unitLine: unitsIndex, unitStart: u.start, unitEnd: u.end };
    });
  }
  let firstRow = (unitsIndex >= 0 ? unitsIndex : headerIndex) + 1;
  while (firstRow < lines.length && isSkippedLine(lines.line(firstRow))) firstRow++;
  const firstCells = firstRow < lines.length ? splitCells(lines.line(firstRow), delimiter) : [];

  // Which role does each column have? `columns:` first, then symbols.
  const explicit = new Map<number, ColumnRole>();
  for (const [role, name] of Object.entries(columnsMap)) {
    const idx = hcells.findIndex((c, i) => c.text === name || headers[i].symbol === name);
    // A key that names no role is the schema's to report.
    if (!Object.hasOwn(ROLE_DIMENSION, role)) continue;
    if (idx >= 0) explicit.set(idx, role as ColumnRole);
    else report(messages.tableColumnsUnknownHeader(role, name), headerIndex, 0, headerText.length);
  }
  const explicitRoles = new Set(explicit.values());
  const roles: Array<ColumnRole | null> = hcells.map((_c, i) => {
    const e = explicit.get(i);
    if (e) return e;
    const r = roleOfSymbol(headers[i].symbol);
    return r && explicitRoles.has(r) ? null : r;
  });
  // Conversions per column.
  const convert: Array<Conversion | null> = [];
  const units: string[] = [];
  /**
   * Of each column: whether its cells may be clock times, read as seconds (`h:mm:ss`, `mm:ss`), or
   * the unit that forbids them. A clock cell is read so only in a time column whose unit is a clock
   * unit (`t (hh:mm:ss)`), seconds, or none: `1:30` under `t/h` could mean an hour and a half or
   * a minute and a half, and is reported rather than guessed.
   */
  const clock: Array<boolean | string> = [];
  hcells.forEach((c, i) => {
    const h = headers[i];
    const { unit } = h;
    const role = roles[i];
    const drop = (message: Message, suggested?: string): void => {
      // The fix writes the suggested unit in place of the written one, within the reported range.
      const range = (h.unitLine < lines.length ? lines.line(h.unitLine) : '').slice(h.unitStart, h.unitEnd);
      const at = suggested === undefined ? -1 : range.lastIndexOf(unit);
      const replacement = at < 0 ? undefined : range.slice(0, at) + suggested + range.slice(at + unit.length);
      report(message, h.unitLine, h.unitStart, h.unitEnd, replacement);
      convert.push(null);
      roles[i] = null;
    };
    clock.push(role === 'time' && unit !== '' && !CLOCK_UNIT.test(unit) ? unit : role === 'time');
    if (!role) {
      convert.push(null);
      // An unrecognised logarithm holds pure numbers, whatever unit is under the logarithm.
      units.push(h.log ? '' : unit);
      return;
    }
    const dimension = ROLE_DIMENSION[role];
    units.push(CANONICAL[dimension].unit);
    const needs = (): { words: string; examples: [string, string] } => roleNeeds(role, h.symbol);
    const inner = LOG_OF[role];
    if (unit === '' && (dimension === 'dimensionless' || (role === 'time' && clockSeconds(firstCells[i]?.text ?? '') !== null))) {
      convert.push(IDENTITY);
      return;
    }
    if (role === 'time' && CLOCK_UNIT.test(unit)) {
      convert.push(IDENTITY);
      return;
    }
    if (unit === '') {
      const n = needs();
      drop(messages.tableNoUnit(c.text, n.words, n.examples));
      return;
    }
    const resolved = lookupUnit(unit);
    const nearMiss = (): { unit: string; why: string } | null => suggestUnit(unit, inner ?? dimension);
    if (!resolved) {
      const suggestion = nearMiss();
      drop(messages.tableUnknownUnit(c.text, unit, suggestion), suggestion?.unit);
      return;
    }
    if (inner) {
      // log10 of the quantity in this unit: shift to log10 of it in the canonical unit.
      if (!hasDimension(resolved, inner)) {
        const n = needs();
        const suggestion = nearMiss();
        drop(messages.tableWrongDimension(c.text, unit, n.words, n.examples, suggestion), suggestion?.unit);
        return;
      }
      const shift = Math.log10(toCanonical(1, resolved, inner));
      convert.push(conversion(1, shift));
      return;
    }
    let dim = dimension;
    const alternative = ALTERNATIVE_ROLE[role];
    if (!hasDimension(resolved, dimension) && alternative && hasDimension(resolved, ROLE_DIMENSION[alternative])) {
      roles[i] = alternative;
      dim = ROLE_DIMENSION[alternative];
      units[units.length - 1] = CANONICAL[dim].unit;
    }
    if (!hasDimension(resolved, dim)) {
      const n = needs();
      const suggestion = nearMiss();
      drop(messages.tableWrongDimension(c.text, unit, n.words, n.examples, suggestion), suggestion?.unit);
      return;
    }
    const factor = toCanonical(1, resolved, dim) - toCanonical(0, resolved, dim);
    const offset = toCanonical(0, resolved, dim);
    if (role === 'time' && factor === 1 && offset === 0) clock[i] = true;
    convert.push(conversion(factor, offset));
  });

  // Two columns of one role: the first that kept its role (its unit checked) keeps it; a column
  // whose unit failed claims nothing (`T/Kelvn, Temperature/°C` keeps the °C column).
  const seen = new Set<ColumnRole>();
  roles.forEach((r, i) => {
    if (!r) return;
    if (seen.has(r)) {
      report(messages.tableDuplicateColumn(r), headerIndex, hcells[i].start, hcells[i].end);
      roles[i] = null;
      convert[i] = null;
      units[i] = headers[i].log ? '' : headers[i].unit;
      clock[i] = false;
    }
    seen.add(r);
  });

  const ncol = hcells.length;
  const rows = new ColumnBuffers(ncol, lines.length - headerIndex - 1);
  const rowLines = new Int32Array(Math.max(0, lines.length - headerIndex - 1));
  const plain = new Float64Array(ncol);
  const temperatureAt = roles.indexOf('temperature');
  /** Converts a plain row in place; false when a value is not finite or a temperature not above 0 K (the general reader reports it). */
  const convertPlain = (): boolean => {
    for (let j = 0; j < ncol; j++) {
      if (roles[j] === null) continue;
      const f = convert[j];
      // The coefficients, not a call: a double passed to a call becomes a new heap number.
      const v = f && !f.identity ? plain[j] * f.factor + f.offset : plain[j];
      if (!Number.isFinite(v)) return false;
      plain[j] = v;
    }
    return temperatureAt < 0 || plain[temperatureAt] > 0;
  };
  let cold: { line: number; start: number; end: number; text: string; header: string } | null = null;
  let coldRows = 0;
  for (let i = headerIndex + 1; i < lines.length; i++) {
    i = readPlainRows(lines, i, unitsIndex, delimiter, plain, convertPlain, rows, rowLines);
    if (i >= lines.length) break;
    if (i === unitsIndex) continue;
    const text = lines.line(i);
    if (isSkippedLine(text)) continue;
    const cells = splitCells(text, delimiter);
    if (cells.length === ncol + 1 && cells[ncol].text === '') cells.pop();
    if (cells.length !== ncol) {
      report(messages.tableRagged(cells.length, ncol), i, 0, text.length);
      continue;
    }
    const row = new Array<number>(ncol);
    let ok = true;
    for (let j = 0; j < ncol; j++) {
      const cell = cells[j];
      let t = cell.text.replace(MINUS_SIGN, '-');
      // A column with no role is not used: it may hold words (a comment column), kept as NaN.
      if (roles[j] === null) {
        row[j] = NUMBER.test(t) ? Number(t) : NaN;
        continue;
      }
      if (t.length === 0) {
        report(messages.tableEmptyCell(hcells[j].text), i, cell.start, cell.start + 1);
        ok = false;
        continue;
      }
      const readClock = clock[j];
      const seconds = readClock !== false ? clockSeconds(t) : null;
      if (seconds !== null) {
        if (typeof readClock === 'string') {
          report(messages.tableClockCellInUnit(cell.text, hcells[j].text, readClock), i, cell.start, cell.end);
          ok = false;
          continue;
        }
        row[j] = seconds;
        continue;
      }
      if (delimiter !== 'comma' && DECIMAL_COMMA.test(t)) t = t.replace(',', '.');
      if (!NUMBER.test(t)) {
        report(NON_FINITE.test(t) ? messages.tableNonFinite(cell.text, hcells[j].text) : messages.tableBadCell(cell.text, hcells[j].text), i, cell.start, cell.end);
        ok = false;
        continue;
      }
      const v = Number(t);
      if (!Number.isFinite(v)) {
        report(messages.tableNonFinite(cell.text, hcells[j].text), i, cell.start, cell.end);
        ok = false;
        continue;
      }
      const f = convert[j];
      const converted = f ? f(v) : v;
      if (!Number.isFinite(converted)) {
        report(messages.tableNonFinite(cell.text, hcells[j].text), i, cell.start, cell.end);
        ok = false;
        continue;
      }
      if (roles[j] === 'temperature' && !(converted > 0)) {
        if (ok && coldRows++ === 0) cold = { line: i, start: cell.start, end: cell.end, text: cell.text, header: hcells[j].text };
        ok = false;
        continue;
      }
      row[j] = converted;
    }
    if (ok) {
      rows.push(row);
      rowLines[rows.length - 1] = i;
    }
  }
  if (cold) report(messages.tableTemperatureNotPositive(cold.text, cold.header, coldRows), cold.line, cold.start, cold.end);
  if (rows.length === 0 && problems.length === 0) report(messages.tableNoRows(), headerIndex, 0, headerText.length);

  // Pushed in a loop, not mapped: the array a map returns has one elements kind when the parse runs
  // optimised and another when it does not, and the optimised parse then kept bailing out.
  const columns: TableColumn[] = [];
  const byRole = new Map<ColumnRole, TableColumn>();
  for (let j = 0; j < hcells.length; j++) {
    const c = hcells[j];
    const { symbol, unit, convention } = headers[j];
    const role = roles[j];
    const column: TableColumn = { header: c.text, symbol, writtenUnit: unit, role, unit: units[j], values: rows.column(j), headerLine: headerIndex, headerStart: c.start, headerEnd: c.end };
    // Added, not spread in: a spread makes a new shape for every table.
    columns.push(convention && (role === 'heat_flow' || role === 'specific_heat_flow') ? { ...column, convention } : column);
    if (role) byRole.set(role, columns[j]);
  }
  return { columns, rowCount: rows.length, rowLines: compactRowLines(rowLines, rows.length), problems, delimiter, byRole, preamble, unitsLine: unitsIndex >= 0 ? unitsIndex : null };
}
