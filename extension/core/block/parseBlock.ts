/**
 * Turns one fenced data block into a ParsedBlock: header, YAML metadata with ranges, schema
 * problems, quantities in canonical units, and the data table (inline or from a file).
 *
 * Every span in a ParsedBlock is **relative to the block's first fence character**, so a parse
 * can be cached by the block's text and reused when text above it moves the block.
 *
 * Policy: never throws; every problem becomes a diagnostic.
 */
import { at, type Diagnostic, type Message, type RelatedLocation } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import { escapePointer, parseMetadata, valueAt, type Metadata } from '../parse/metadata.js';
import { parseQuantity, parseTgMultiple, type Quantity } from '../parse/quantity.js';
import { parseTable, type Table } from '../parse/table.js';
import { linesOfArray, linesOfIndex, linesOfText, type TableLines } from '../parse/tableLines.js';
import { CANONICAL, dimensionWords, lookupUnit, suggestUnit } from '../parse/units.js';
import { ID_PATTERN, type BlockHeader, type BlockKind } from '../scan/blockHeader.js';
import type { FencedBlock } from '../scan/fenceScanner.js';
import { quantityFields, type QuantityField } from '../schema/quantityFields.js';
import { SCHEMAS } from '../schema/schemas.js';
import { recommendedKeys, validateMetadata } from '../schema/validator.js';
import { BodyMap, ContiguousLines } from '../text/bodyMap.js';
import { detached } from '../text/detached.js';
import { Hasher, hashText } from '../text/hash.js';
import { resolveNotebookPath } from '../text/notebookPath.js';
import { toOneBasedPoint, type Span } from '../text/positions.js';

/** Kinds whose blocks carry a data table. */
const KINDS_WITH_DATA: ReadonlySet<BlockKind> = new Set(['ramp', 'isotherm', 'dsc', 'relaxation']);

export interface Reference {
  readonly key: string;
  readonly id: string;
  /** Kinds the reference may name. */
  readonly expected: readonly BlockKind[];
  readonly span: Span;
}

/** A temperature written as `factor × Tg`, with the standard uncertainty of the factor. */
export interface TgMultiple {
  readonly factor: number;
  readonly uncertainty?: number;
}

export interface TableOrigin {
  readonly source: 'inline' | 'file';
  /** Root-relative path of the data file. */
  readonly path?: string;
  /** Hash of the data file text, part of every cache key that depends on it. */
  readonly fileHash?: string;
}

/** Lines of a block's table as read (decoded, before any parsing), to show beside its errors. */
export interface TableHead {
  /** Root-relative path of the data file, or null for an inline table. */
  readonly path: string | null;
  /** Of a data file: the 0-based line of the first excerpt line. Of an inline table: the offset of that line, relative to the block. */
  readonly at: number;
  readonly lines: readonly string[];
  /** Each line's length as read (a line in `lines` may be cut). */
  readonly lengths: readonly number[];
}

/** Lines of a table to show, from `first` (0-based, into the table's lines), each cut to a length a report can show, with its length as read. */
export interface TableHeadLines {
  readonly first: number;
  readonly lines: readonly string[];
  readonly lengths: readonly number[];
}

/** How many lines of a table are kept to show beside its errors, and how many characters of each. */
export const TABLE_HEAD_LINES = 8;
const TABLE_HEAD_CHARACTERS = 1000;

/**
 * The lines of a table to show beside its errors: from the header (and its units line), so that an
 * instrument's preamble does not fill the excerpt; from the first problem's line instead when that
 * lies further below the header than the excerpt reaches.
 */
export function tableHeadLines(lines: TableLines, table: Table): TableHeadLines {
  const header = table.columns.length > 0 ? table.columns[0].headerLine : 0;
  let firstProblem = Infinity;
  for (const p of table.problems) if (p.line >= header && p.line < firstProblem) firstProblem = p.line;
  const first = Math.min(firstProblem >= header + TABLE_HEAD_LINES ? firstProblem : header, Math.max(0, lines.length - 1));
  const shown: string[] = [];
  for (let i = first; i < Math.min(lines.length, first + TABLE_HEAD_LINES); i++) shown.push(lines.line(i));
  return {
    first,
    lines: shown.map((l) => (l.length > TABLE_HEAD_CHARACTERS ? `${l.slice(0, TABLE_HEAD_CHARACTERS)}…` : l)),
    lengths: shown.map((l) => l.length),
  };
}

export interface ParsedBlock {
  readonly kind: BlockKind;
  readonly id: string | null;
  readonly header: BlockHeader;
  /** Root-relative path of the notebook file. */
  readonly file: string;
  /** Cache key of this parse: file, block text and data file text. */
  readonly key: string;
  readonly span: Span;
  readonly metadata: Metadata;
  readonly quantities: ReadonlyMap<string, Quantity>;
  /**
   * Temperatures written as a multiple of the material's Tg (`substrate_temperature: 0.85 Tg`),
   * by pointer; not in `quantities`, since only an analysis that reads the material resolves them.
   */
  readonly tgMultiples?: ReadonlyMap<string, TgMultiple>;
  readonly table: Table | null;
  readonly tableOrigin: TableOrigin | null;
  /** The first lines of the table as read, shown beside its errors. */
  readonly tableHead?: TableHead;
  /** Root-relative path of the data file the block names (read or not), for the engine's reverse index. */
  readonly dataPath: string | null;
  readonly references: readonly Reference[];
  readonly diagnostics: readonly Diagnostic[];
  /** Document span (relative) of a metadata value or key, by JSON pointer. */
  spanOf(pointer: string, atKey?: boolean): Span;
  /** Relative span of a table row (by row index into the table's kept rows). */
  rowSpan(row: number): Span;
}

const fieldCache = new Map<BlockKind, QuantityField[]>();
function fieldsOf(kind: BlockKind): QuantityField[] {
  let f = fieldCache.get(kind);
  if (!f) {
    f = quantityFields(SCHEMAS[kind]);
    fieldCache.set(kind, f);
  }
  return f;
}

/** Pointers in the data that match a field pattern ("*" for any array index). */
function matchingPointers(data: unknown, segments: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (node: unknown, i: number, pointer: string): void => {
    if (i === segments.length) {
      if (node !== undefined && node !== null) out.push(pointer);
      return;
    }
    if (node === null || typeof node !== 'object') return;
    const seg = segments[i];
    if (seg === '*' && Array.isArray(node)) {
      node.forEach((item, k) => walk(item, i + 1, `${pointer}/${k}`));
    } else if (seg !== '*') {
      walk((node as Record<string, unknown>)[seg], i + 1, `${pointer}/${seg}`);
    }
  };
  walk(data, 0, '');
  return out;
}

function keyLabel(pointer: string): string {
  return pointer.split('/').filter((p) => p.length > 0).join('.');
}

/** Text as a YAML plain scalar where YAML reads it back unchanged, double-quoted otherwise. */
function yamlScalar(text: string): string {
  return /^[^\s#&*!|>'"%@`{}[\],?:-][^#]*$/.test(text) && !/:\s|\s$/.test(text) ? text : JSON.stringify(text);
}

/** Rebases a fenced block so that its first fence character is offset 0 (its body lines are read through a BodyMap that shifts them). */
function rebase(block: FencedBlock): FencedBlock {
  const d = block.span.start;
  const s = (x: Span): Span => ({ start: x.start - d, end: x.end - d });
  return { ...block, span: s(block.span), infoSpan: s(block.infoSpan) };
}

function rebaseHeader(header: BlockHeader, d: number): BlockHeader {
  const s = (x: Span): Span => ({ start: x.start - d, end: x.end - d });
  return {
    ...header,
    kindSpan: s(header.kindSpan),
    idSpan: header.idSpan ? s(header.idSpan) : null,
    extra: header.extra ? { text: header.extra.text, span: s(header.extra.span) } : null,
  };
}

/** Where a block's data file comes from: the engine's store of pushed or pulled files. */
export interface DataTableSource {
  /** The file's table read with the block's column map, or why it cannot be. */
  table(path: string, columns: Readonly<Record<string, string>>): DataTableRead;
}

export type DataTableRead =
  | { readonly ok: true; readonly table: Table; /** Changes whenever the file's content does. */ readonly stamp: string; /** The file's lines to show beside the table's errors. */ readonly head: TableHeadLines }
  | { readonly ok: false; readonly reason: 'missing' | 'too-large' | 'outside-root' | 'folder' | 'unreadable'; readonly stamp: string; readonly size?: number; readonly limit?: number; readonly detail?: string };

export interface ParseInput {
  readonly file: string;
  /** `blockTextKey` of the block. */
  readonly textKey: string;
  readonly fence: FencedBlock;
  readonly header: BlockHeader;
}

/**
 * The cache key of a block before its data file is read: its file, its text, and where each body
 * line starts relative to the fence, so that the same text indented differently (or inside a list
 * or quote) never shares a parse. It is the hash of `file NUL text NUL layout`, the layout being the
 * info string's offset and `start.pad` of each body line, joined by commas (results blocks keep it,
 * through the inputs hash, so it must not change); fed to the hash piece by piece.
 */
export function blockTextKey(file: string, source: string, fence: FencedBlock): string {
  const d = fence.span.start;
  const lines = fence.bodyLines;
  const h = new Hasher().text(file).char(0).text(source).char(0).integer(fence.infoSpan.start - d);
  if (lines instanceof ContiguousLines) h.lineLayout(lines.index, lines.base - d);
  else for (let i = 0; i < lines.length; i++) h.char(44).integer(lines.start(i) - d).char(46).integer(lines.pad(i));
  return h.digest();
}

/**
 * What a block is parsed from. `own`: the block may outlive its document's text (the document is
 * being edited), so it keeps copies of its strings and none of the document (see text/detached.ts).
 */
export function parseInputOf(file: string, textKey: string, fence: FencedBlock, header: BlockHeader, own: boolean): ParseInput {
  if (!own) return { file, textKey, fence, header };
  const owned: { -readonly [K in keyof FencedBlock]: FencedBlock[K] } = {
    ...fence,
    rawInfo: detached(fence.rawInfo),
    lang: fence.lang === null ? null : detached(fence.lang),
    meta: fence.meta === null ? null : detached(fence.meta),
    body: detached(fence.body),
  };
  if (fence.bodyLines instanceof ContiguousLines) owned.bodyLines = new ContiguousLines(owned.body, fence.bodyLines.base);
  const ownedHeader: BlockHeader = {
    ...header,
    kind: detached(header.kind) as BlockKind,
    id: header.id === null ? null : detached(header.id),
    extra: header.extra ? { text: detached(header.extra.text), span: header.extra.span } : null,
  };
  return { file, textKey, fence: owned, header: ownedHeader };
}

/** Does a pointer fit a field's segments ("*" for any array index)? */
function pointerFits(pointer: string, segments: readonly string[]): boolean {
  const parts = pointer.split('/').slice(1);
  return parts.length === segments.length && segments.every((seg, i) => (seg === '*' ? /^\d+$/.test(parts[i]) : seg === parts[i]));
}

/** Is body[start, end) the `---` line (three hyphens, then only spaces and tabs)? */
function isSeparator(body: string, start: number, end: number): boolean {
  if (end - start < 3 || body.charCodeAt(start) !== 45 || body.charCodeAt(start + 1) !== 45 || body.charCodeAt(start + 2) !== 45) return false;
  for (let i = start + 3; i < end; i++) {
    const c = body.charCodeAt(i);
    if (c !== 32 && c !== 9) return false;
  }
  return true;
}

/** `line:column` as people read it, from 0-based line and character. */
function oneBasedPlace(line: number, character: number): string {
  const p = toOneBasedPoint({ line, character });
  return `${p.line}:${p.column}`;
}

export function parseBlock(input: ParseInput, data: DataTableSource): ParsedBlock {
  const fence = rebase(input.fence);
  const header = rebaseHeader(input.header, input.fence.span.start);
  const { kind } = header;
  const diagnostics: Diagnostic[] = [];
  const headerSpan: Span = header.idSpan ?? header.kindSpan;
  const push = (m: Message, span: Span, related?: RelatedLocation[]): void => {
    diagnostics.push(at(m, span, related));
  };

  if (!fence.closed) push(messages.blockUnclosed(kind), { start: 0, end: fence.fenceLength });
  if (header.id !== null && !ID_PATTERN.test(header.id) && header.idSpan) push(messages.blockBadId(header.id), header.idSpan);
  if (header.id === null && (kind === 'material' || kind === 'deposition')) push(messages.blockNoId(kind), header.kindSpan);
  if (header.extra) push(messages.blockExtraInfo(header.extra.text), header.extra.span);

  // Body: metadata, then optionally `---` and a table.
  const map = new BodyMap(fence.bodyLines, fence.infoSpan.end, input.fence.span.start);
  const body = fence.body;
  // The `---` line that ends the metadata: its index, and where it starts and ends in the body.
  let separator = -1;
  let separatorStart = body.length;
  let separatorEnd = body.length;
  for (let i = 0, start = 0; start <= body.length; i++) {
    let end = body.indexOf('\n', start);
    if (end < 0) end = body.length;
    if (isSeparator(body, start, end)) {
      separator = i;
      separatorStart = start;
      separatorEnd = end;
      break;
    }
    start = end + 1;
  }
  const metaText = separator >= 0 ? body.slice(0, Math.max(0, separatorStart - 1)) : body;
  const metadata = parseMetadata(metaText);
  const toDoc = (s: Span): Span => map.spanToDocument(s);
  // `key: ?` (what the quick fix for missing keys writes): one error, with an example of the value.
  const placeholders = metadata.placeholders ?? [];
  const placeholderPointers = new Set(placeholders.map((p) => p.pointer));
  for (const p of placeholders) {
    const dimension = fieldsOf(kind).find((f) => pointerFits(p.pointer, f.segments))?.dimension;
    push(messages.metaPlaceholder(keyLabel(p.pointer), dimension ? CANONICAL[dimension].example : null), toDoc(p.span));
  }

  const isEmpty = fence.body.trim().length === 0;
  if (isEmpty) push(messages.blockEmpty(kind), headerSpan);
  for (const p of metadata.problems) push(messages.yamlSyntax(p.message), toDoc(p.span));
  if (metadata.notAMap) push(messages.yamlNotMap(), toDoc({ start: 0, end: metaText.length }));
  if (metadata.tooDeep !== undefined) push(messages.yamlTooDeep(metadata.tooDeep), toDoc({ start: 0, end: metaText.includes('\n') ? metaText.indexOf('\n') : metaText.length }));
  const unread = metadata.notAMap || metadata.tooDeep !== undefined;

  const spanOf = (pointer: string, atKey = false): Span => {
    const e = metadata.spans.get(pointer);
    if (!e) return headerSpan;
    return toDoc(atKey ? e.key : e.value);
  };

  // Schema.
  if (!isEmpty && !unread) {
    for (const p of validateMetadata(kind, metadata.data)) {
      // A placeholder was reported as one; its empty value is no second problem.
      if (placeholderPointers.has(p.pointer)) continue;
      const span = p.pointer === '' ? headerSpan : spanOf(p.pointer, p.atKey);
      const parent = p.pointer.slice(0, p.pointer.lastIndexOf('/'));
      // A near-miss key is renamed by its fix, unless the block already has the key it means.
      if (p.rename !== undefined && valueAt(metadata.data, `${parent}/${escapePointer(p.rename)}`) === undefined) {
        diagnostics.push({ ...at(p.message, span), fix: { title: `Rename the key to "${p.rename}"`, span, newText: p.rename } });
      } else push(p.message, span);
    }
    for (const [key, why] of Object.entries(recommendedKeys(kind))) {
      if (metadata.data[key] === undefined) push(messages.missingRecommended(key, kind, why), headerSpan);
    }
  }

  // Quantities.
  const quantities = new Map<string, Quantity>();
  const tgMultiples = new Map<string, TgMultiple>();
  for (const field of fieldsOf(kind)) {
    for (const pointer of matchingPointers(metadata.data, field.segments)) {
      const raw = valueAt(metadata.data, pointer);
      // Not text or a finite number: the schema reported it.
      if (typeof raw !== 'string' && !(typeof raw === 'number' && Number.isFinite(raw))) continue;
      const label = keyLabel(pointer);
      const c = CANONICAL[field.dimension];
      const span = spanOf(pointer);
      // `substrate_temperature: 0.85 Tg`: resolved by the deposition analysis, which knows the material.
      if (kind === 'deposition' && pointer === '/substrate_temperature') {
        const multiple = parseTgMultiple(raw);
        if (multiple) {
          // Beyond 10 Tg is no deposition, and would overflow once multiplied.
          if (multiple.factor > 0 && multiple.factor <= 10 && (multiple.uncertainty ?? 0) <= 10) tgMultiples.set(pointer, multiple);
          else push(messages.outOfRange(label, 'a multiple of Tg above 0 and at most 10 (e.g. "0.85 Tg")'), span);
          continue;
        }
      }
      const parsed = parseQuantity(raw, field.dimension);
      if (!parsed.ok) {
        const text = String(raw);
        if (parsed.reason === 'not-a-number') push(messages.quantityNotNumber(label, c.words, c.example), span);
        else if (parsed.reason === 'ambiguous-comma') push(messages.quantityAmbiguousComma(label, text), span);
        else if (parsed.reason === 'ambiguous-clock' && parsed.clock) push(messages.quantityAmbiguousClock(label, text, parsed.clock.first, parsed.clock.second), span);
        else if (parsed.reason === 'tg-multiple') push(kind === 'deposition' && pointer === '/substrate_temperature' ? messages.quantityTgMultipleForm(label) : messages.quantityTgMultiple(label), span);
        else if (parsed.reason === 'unknown-unit' || parsed.reason === 'wrong-dimension') {
          const suggestion = suggestUnit(parsed.unitText, field.dimension);
          const resolved = parsed.reason === 'wrong-dimension' ? lookupUnit(parsed.unitText) : null;
          const message =
            parsed.reason === 'unknown-unit'
              ? messages.quantityUnknownUnit(label, parsed.unitText, c.examples, suggestion)
              : messages.quantityWrongDimension(label, parsed.unitText, c.words, c.examples, resolved ? dimensionWords(resolved) : null, suggestion);
          // The suggestion replaces the unit where the parser found it: in the value, and in the
          // uncertainty too when it carries the same unit ("12 C ± 0.5 C").
          const places = parsed.unitSpans.filter((u) => text.slice(u.start, u.end) === parsed.unitText);
          if (suggestion && places.length > 0) {
            let fixed = '';
            let from = 0;
            for (const u of [...places].sort((a, b) => a.start - b.start)) {
              fixed += text.slice(from, u.start) + suggestion.unit;
              from = u.end;
            }
            fixed += text.slice(from);
            diagnostics.push({ ...at(message, span), fix: { title: `Write "${fixed}"`, span, newText: yamlScalar(fixed) } });
          } else push(message, span);
        } else push(messages.quantityNotFinite(label), span);
        continue;
      }
      if (parsed.quantity.bound !== undefined && !field.boundAllowed) {
        push(messages.quantityBound(label, String(raw)), span);
        continue;
      }
      if (parsed.assumedUnit) {
        const unit = c.unit === 'J/(g*K)' ? 'J/(g*K)' : c.unit;
        diagnostics.push({ ...at(messages.quantityBareNumber(label, c.unit), span), fix: { title: `Write the unit: ${raw} ${unit}`, span, newText: `${raw} ${unit}` } });
      }
      // Out of range: reported, and not used by any analysis.
      const value = parsed.quantity.value;
      // VFT's T0 may be 0 K exactly: the Arrhenius law is its limit.
      if (field.dimension === 'temperature' && !(value > 0) && !(pointer === '/vft/T0' && value === 0)) {
        push(messages.quantityNotAboveAbsoluteZero(label, value), span);
        continue;
      }
      if (field.exclusiveMinimum !== undefined && !(value > field.exclusiveMinimum)) {
        push(messages.quantityNotAbove(label, c.words, field.exclusiveMinimum, c.unit), span);
        continue;
      }
      quantities.set(pointer, parsed.quantity);
    }
  }

  // References to other blocks.
  const references: Reference[] = [];
  const ref = (key: string, expected: BlockKind[]): void => {
    const v = metadata.data[key];
    if (typeof v === 'string' && ID_PATTERN.test(v)) references.push({ key, id: v, expected, span: spanOf(`/${key}`) });
  };
  if (kind === 'deposition' || kind === 'relaxation' || kind === 'dsc') ref('material', ['material']);
  if (kind === 'ramp' || kind === 'isotherm' || kind === 'dsc') ref('film', ['deposition']);
  if (kind === 'dsc') ref('reference', ['dsc']);
  if (kind === 'results') ref('of', ['material', 'deposition', 'ramp', 'isotherm', 'dsc', 'relaxation']);

  // Table.
  let table: Table | null = null;
  let tableOrigin: TableOrigin | null = null;
  let tableHead: TableHead | undefined;
  let dataPath: string | null = null;
  let dataStamp = '';
  let rowLineToDoc: (line: number) => Span = () => headerSpan;
  const columnsMap = (typeof metadata.data.columns === 'object' && metadata.data.columns !== null ? metadata.data.columns : {}) as Record<string, string>;
  // The lines below `---`, read in place (a plain row never becomes a string of its own).
  // (A body that is one piece of the document has its lines found already.)
  const whole = fence.bodyLines instanceof ContiguousLines ? fence.bodyLines : null;
  const inlineLines = separator < 0 ? null : separatorEnd >= body.length ? linesOfArray([]) : whole ? linesOfIndex(whole.index, separator + 1) : linesOfText(body.slice(separatorEnd + 1));
  const dataValue = metadata.data.data;
  if (KINDS_WITH_DATA.has(kind) && !isEmpty) {
    if (inlineLines && typeof dataValue === 'string') {
      push(messages.tableBothData(), spanOf('/data', true));
    }
    if (inlineLines) {
      table = parseTable(inlineLines, columnsMap, { inline: true });
      tableOrigin = { source: 'inline' };
      const first = separator + 1;
      const shown = tableHeadLines(inlineLines, table);
      tableHead = { path: null, at: map.lineSpan(first + shown.first).start, lines: shown.lines, lengths: shown.lengths };
      rowLineToDoc = (line) => map.lineSpan(first + line);
      for (const p of table.problems) {
        const lineSpan = map.lineSpan(first + p.line);
        const start = Math.min(lineSpan.start + p.start, lineSpan.end);
        const span = { start, end: Math.min(Math.max(start, lineSpan.start + p.end), lineSpan.end) };
        if (p.replacement !== undefined && span.end - span.start === p.end - p.start) {
          diagnostics.push({ ...at(p.message, span), fix: { title: `Write "${p.replacement}"`, span, newText: p.replacement } });
        } else push(p.message, span);
      }
    } else if (typeof dataValue === 'string') {
      const valueSpan = spanOf('/data');
      const resolved = resolveNotebookPath(input.file, dataValue);
      if (!resolved.ok) {
        if (resolved.reason === 'absolute') push(messages.dataAbsolute(dataValue), valueSpan);
        else if (resolved.reason === 'folder') push(messages.dataIsFolder(dataValue), valueSpan);
        else if (resolved.reason === 'outside') push(messages.dataOutsideRoot(dataValue), valueSpan);
        else if (dataValue.length > 0) push(messages.badPattern('data', 'a file path, not blank'), valueSpan);
      } else {
        dataPath = resolved.path;
        const read = data.table(resolved.path, columnsMap);
        dataStamp = read.stamp;
        if (!read.ok) {
          if (read.reason === 'missing') push(messages.dataMissing(dataValue), valueSpan);
          else if (read.reason === 'too-large') push(messages.dataTooLarge(dataValue, read.size ?? 0, read.limit ?? 0), valueSpan);
          else if (read.reason === 'outside-root') push(messages.dataOutsideRoot(dataValue), valueSpan);
          else if (read.reason === 'folder') push(messages.dataIsFolder(dataValue), valueSpan);
          else push(messages.dataUnreadable(dataValue, read.detail ?? 'unknown error'), valueSpan);
        } else {
          table = read.table;
          tableOrigin = { source: 'file', path: resolved.path, fileHash: read.stamp };
          tableHead = { path: resolved.path, at: read.head.first, lines: read.head.lines, lengths: read.head.lengths };
          rowLineToDoc = () => valueSpan;
          const first = table.problems[0];
          if (first) {
            const related: RelatedLocation[] = table.problems.slice(0, 100).map((p) => ({
              path: resolved.path,
              line: p.line,
              character: p.start,
              message: p.message.message,
            }));
            push(
              { ...first.message, message: `${resolved.path}:${oneBasedPlace(first.line, first.start)}: ${first.message.message}${table.problems.length > 1 ? ` (and ${table.problems.length - 1} more)` : ''}` },
              valueSpan,
              related,
            );
          }
        }
      }
    } else if (!(metadata.problems.length > 0) && metadata.tooDeep === undefined) {
      push(messages.tableNoData(kind), headerSpan);
    }
  }

  const rowSpan = (row: number): Span => {
    if (!table || row < 0 || row >= table.rowCount) return headerSpan;
    return rowLineToDoc(table.rowLines[row]);
  };

  const key = hashText(`${input.textKey}\u0000${dataStamp}`);
  return {
    kind,
    id: header.id,
    header,
    file: input.file,
    key,
    span: fence.span,
    metadata,
    quantities,
    ...(tgMultiples.size > 0 ? { tgMultiples } : {}),
    table,
    tableOrigin,
    ...(tableHead ? { tableHead } : {}),
    dataPath,
    references,
    diagnostics,
    spanOf,
    rowSpan,
  };
}
