/**
 * Reads a data table: inline after a block's `---` line, or the text of a data file.
 *
 * - Lines that are blank or start with `#` are skipped.
 * - The first other line is the header. Each header cell names a quantity and its unit in the
 *   forms `T/K` (IUPAC quantity calculus), `T (K)` or `T [K]`.
 * - The delimiter is found from the header: tab, then semicolon, then comma, else whitespace.
 * - A decimal comma (`1,25`) is read where the delimiter is not a comma.
 * - Every cell must be a finite number, in its column's unit too; a bad cell is reported on its
 *   own line and column and its row is left out, so the remaining rows can still be analysed.
 * - A temperature is absolute: rows at or below 0 K are left out, with one error on the first.
 *
 * Columns are recognised by their symbol (`t`, `T`, `h`, `V`/`v`, `Cp`, `Phi`, `tau`) or by the
 * block's `columns:` map, and converted to the canonical unit of their role.
 *
 * Policy: never throws. Positions are (0-based line index into the given lines, 0-based
 * character start and end within that line).
 */
import { messages } from '../model/messages.js';
import type { Message } from '../model/diagnostic.js';
import { CANONICAL, hasDimension, lookupUnit, toCanonical, type Dimension } from './units.js';

export type ColumnRole = 'time' | 'temperature' | 'thickness' | 'volume' | 'heat_capacity' | 'heat_flow' | 'specific_heat_flow' | 'tau' | 'log10_tau';

export const ROLE_DIMENSION: Readonly<Record<ColumnRole, Dimension>> = {
  time: 'time',
  temperature: 'temperature',
  thickness: 'length',
  volume: 'specific_volume',
  heat_capacity: 'heat_capacity',
  heat_flow: 'heat_flow',
  tau: 'time',
  log10_tau: 'dimensionless',
  specific_heat_flow: 'specific_heat_flow',
};

/** A column whose unit fits another dimension takes that role instead (heat flow per mass). */
const ALTERNATIVE_ROLE: Partial<Record<ColumnRole, ColumnRole>> = { heat_flow: 'specific_heat_flow' };

export const ROLE_SYMBOLS: Readonly<Record<ColumnRole, readonly string[]>> = {
  time: ['t', 'time'],
  temperature: ['T', 'temperature', 'Temp'],
  thickness: ['h', 'd', 'thickness'],
  volume: ['V', 'v', 'volume'],
  heat_capacity: ['Cp', 'cp', 'C_p', 'c_p', 'heat_capacity'],
  heat_flow: ['Phi', 'phi', 'Φ', 'heat_flow', 'HF'],
  tau: ['tau', 'τ', 'tau_alpha'],
  log10_tau: ['log10_tau', 'log_tau', 'logtau', 'lg_tau'],
  specific_heat_flow: [],
};

const SYMBOL_ROLE = new Map<string, ColumnRole>();
for (const [role, symbols] of Object.entries(ROLE_SYMBOLS) as Array<[ColumnRole, readonly string[]]>) {
  for (const s of symbols) SYMBOL_ROLE.set(s, role);
}

/** The role of a header symbol: exact first (t and T differ), then words in any case. */
export function roleOfSymbol(symbol: string): ColumnRole | null {
  const exact = SYMBOL_ROLE.get(symbol);
  if (exact) return exact;
  if (symbol.length < 3) return null;
  const lower = symbol.toLowerCase().replace(/[\s-]+/g, '_');
  for (const [s, role] of SYMBOL_ROLE) if (s.length >= 3 && s.toLowerCase() === lower) return role;
  return null;
}

const UNIT_ROW_CELL = /^[([]?[A-Za-zµμÅ°℃%][^\d]*[)\]]?$|^[([]?1\/[A-Za-z].*$/;

export interface TableLine {
  readonly text: string;
}

export interface TableProblem {
  readonly message: Message;
  readonly line: number;
  readonly start: number;
  readonly end: number;
}

export interface TableColumn {
  readonly header: string;
  readonly symbol: string;
  readonly writtenUnit: string;
  readonly role: ColumnRole | null;
  /** Canonical unit of the role (or the written unit for unrecognised columns). */
  readonly unit: string;
  readonly values: Float64Array;
  readonly headerLine: number;
  readonly headerStart: number;
  readonly headerEnd: number;
}

export interface Table {
  readonly columns: readonly TableColumn[];
  readonly rowCount: number;
  /** Line index (into the given lines) of each kept row. */
  readonly rowLines: Int32Array;
  readonly problems: readonly TableProblem[];
  readonly delimiter: 'tab' | 'semicolon' | 'comma' | 'whitespace';
  readonly byRole: ReadonlyMap<ColumnRole, TableColumn>;
}

interface Cell {
  readonly text: string;
  readonly start: number;
  readonly end: number;
}

// Each digit can belong to one place only (no `\d+\.?\d*`), so a long bad cell fails in linear time.
const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?\d+,\d+(?:[eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(?:nan|inf|infinity)$/i;
const MAX_PROBLEMS = 200;

function splitCells(text: string, delimiter: Table['delimiter']): Cell[] {
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

function headerCells(text: string, delimiter: Table['delimiter']): Cell[] {
  return delimiter === 'whitespace' ? whitespaceHeaderCells(text) : splitCells(text, delimiter);
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

/** Splits a header cell into its symbol and unit. */
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

function detectDelimiter(header: string): Table['delimiter'] {
  if (header.includes('\t')) return 'tab';
  if (header.includes(';')) return 'semicolon';
  if (header.includes(',')) return 'comma';
  return 'whitespace';
}

/**
 * Parses a table. `columnsMap` is the block's `columns:` metadata (role → header text or symbol).
 */
export function parseTable(lines: readonly string[], columnsMap: Readonly<Record<string, string>> = {}): Table {
  const problems: TableProblem[] = [];
  const report = (message: Message, line: number, start: number, end: number): void => {
    if (problems.length < MAX_PROBLEMS) problems.push({ message, line, start, end: Math.max(end, start + 1) });
  };
  let headerIndex = -1;
  for (let i = 0; i < lines.length; i++) {
    const t = lines[i].trim();
    if (t.length === 0 || t.startsWith('#')) continue;
    headerIndex = i;
    break;
  }
  const empty: Table = { columns: [], rowCount: 0, rowLines: new Int32Array(0), problems, delimiter: 'comma', byRole: new Map() };
  if (headerIndex < 0) {
    report(messages.tableNoHeader(), 0, 0, lines[0]?.length ?? 0);
    return empty;
  }
  const headerText = lines[headerIndex];
  const delimiter = detectDelimiter(headerText);
  const hcells = headerCells(headerText, delimiter);
  const headers = hcells.map((c) => readHeader(c.text));
  // Instrument exports often put the units on a second header line: "T, h" then "K, nm".
  let firstRow = headerIndex + 1;
  if (headers.every((h) => h.unit === '')) {
    let next = firstRow;
    while (next < lines.length && (lines[next].trim() === '' || lines[next].trim().startsWith('#'))) next++;
    const unitCells = next < lines.length ? splitCells(lines[next], delimiter) : [];
    if (unitCells.length === hcells.length && unitCells.every((u) => UNIT_ROW_CELL.test(u.text) && lookupUnit(u.text.replace(/^[([]|[)\]]$/g, '')) !== null)) {
      unitCells.forEach((u, i) => (headers[i] = { symbol: headers[i].symbol, unit: u.text.replace(/^[([]|[)\]]$/g, '') }));
      firstRow = next + 1;
    }
  }

  // Which role does each column have? `columns:` first, then symbols.
  const explicit = new Map<number, ColumnRole>();
  for (const [role, name] of Object.entries(columnsMap)) {
    const idx = hcells.findIndex((c, i) => c.text === name || headers[i].symbol === name);
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
  const seen = new Set<ColumnRole>();
  roles.forEach((r, i) => {
    if (!r) return;
    if (seen.has(r)) {
      report(messages.tableDuplicateColumn(r), headerIndex, hcells[i].start, hcells[i].end);
      roles[i] = null;
    }
    seen.add(r);
  });

  // Conversions per column.
  const convert: Array<((v: number) => number) | null> = [];
  const units: string[] = [];
  hcells.forEach((c, i) => {
    const { unit } = headers[i];
    const role = roles[i];
    if (!role) {
      convert.push(null);
      units.push(unit);
      return;
    }
    const dimension = ROLE_DIMENSION[role];
    units.push(CANONICAL[dimension].unit);
    if (unit === '' && dimension === 'dimensionless') {
      convert.push((v) => v);
      return;
    }
    if (unit === '') {
      report(messages.tableNoUnit(headers[i].symbol), headerIndex, c.start, c.end);
      convert.push(null);
      roles[i] = null;
      return;
    }
    const resolved = lookupUnit(unit);
    if (!resolved) {
      report(messages.tableUnknownUnit(c.text, unit), headerIndex, c.start, c.end);
      convert.push(null);
      roles[i] = null;
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
      report(messages.tableWrongDimension(c.text, unit, CANONICAL[dimension].words), headerIndex, c.start, c.end);
      convert.push(null);
      roles[i] = null;
      return;
    }
    const factor = toCanonical(1, resolved, dim) - toCanonical(0, resolved, dim);
    const offset = toCanonical(0, resolved, dim);
    convert.push(factor === 1 && offset === 0 ? (v) => v : (v) => v * factor + offset);
  });

  const ncol = hcells.length;
  const rows: number[][] = [];
  const rowLines: number[] = [];
  let cold: { line: number; start: number; end: number; text: string; header: string } | null = null;
  let coldRows = 0;
  for (let i = firstRow; i < lines.length; i++) {
    const text = lines[i];
    const trimmed = text.trim();
    if (trimmed.length === 0 || trimmed.startsWith('#')) continue;
    const cells = splitCells(text, delimiter);
    if (cells.length !== ncol) {
      report(messages.tableRagged(cells.length, ncol), i, 0, text.length);
      continue;
    }
    const row = new Array<number>(ncol);
    let ok = true;
    for (let j = 0; j < ncol; j++) {
      const cell = cells[j];
      let t = cell.text;
      if (t.length === 0) {
        report(messages.tableEmptyCell(hcells[j].text), i, cell.start, cell.start + 1);
        ok = false;
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
      rowLines.push(i);
    }
  }
  if (cold) report(messages.tableTemperatureNotPositive(cold.text, cold.header, coldRows), cold.line, cold.start, cold.end);
  if (rows.length === 0 && problems.length === 0) report(messages.tableNoRows(), headerIndex, 0, headerText.length);

  const columns: TableColumn[] = hcells.map((c, j) => {
    const values = new Float64Array(rows.length);
    for (let r = 0; r < rows.length; r++) values[r] = rows[r][j];
    const { symbol, unit } = headers[j];
    return {
      header: c.text,
      symbol,
      writtenUnit: unit,
      role: roles[j],
      unit: units[j],
      values,
      headerLine: headerIndex,
      headerStart: c.start,
      headerEnd: c.end,
    };
  });
  const byRole = new Map<ColumnRole, TableColumn>();
  for (const col of columns) if (col.role) byRole.set(col.role, col);
  return { columns, rowCount: rows.length, rowLines: Int32Array.from(rowLines), problems, delimiter, byRole };
}
