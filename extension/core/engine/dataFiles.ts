/**
 * The engine's data files: pushed by the host (`set`, `delete`) or pulled from it once, decoded
 * and split into lines once per content, and parsed once per column map. A reverse index says
 * which notebook files read each data file, so that a change re-parses only those.
 *
 * Memory: a file is forgotten when no notebook file reads it any more (a pushed one too: a host
 * that watches files pushes only what blocks read, and is asked again when a block reads it).
 */
import { tableHeadLines, type DataTableRead, type DataTableSource, type TableHeadLines } from '../block/parseBlock.js';
import { parseTable, type Table } from '../parse/table.js';
import { linesOfText, type TableLines } from '../parse/tableLines.js';
import { hashText } from '../text/hash.js';
import type { DataFileRead, NotebookHost } from './host.js';

/** Data files larger than this are refused with a diagnostic. */
export const MAX_DATA_FILE_BYTES = 32 * 1024 * 1024;

/** Why a data file cannot be read. */
export type DataFileFailure = Extract<DataFileRead, { readonly ok: false }>;

interface Entry {
  readonly read: DataFileRead;
  readonly pushed: boolean;
  readonly stamp: string;
  lines?: TableLines;
  /** Per column map: the table, and the lines shown beside its errors. */
  readonly tables: Map<string, { readonly table: Table; readonly head: TableHeadLines }>;
}

export class DataFiles implements DataTableSource {
  private readonly entries = new Map<string, Entry>();
  /** Data path → notebook files that read it (with a count per file). */
  private readonly readers = new Map<string, Map<string, number>>();

  constructor(private readonly host: NotebookHost, private maxBytes: number) {}

  setLimit(maxBytes: number): boolean {
    if (maxBytes === this.maxBytes) return false;
    this.maxBytes = maxBytes;
    // Pulled files are asked for again; so is a pushed file refused as too large, whose text was
    // not kept (the host reads it again under the new limit).
    for (const [path, e] of this.entries) if (!e.pushed || (!e.read.ok && e.read.reason === 'too-large')) this.entries.delete(path);
    for (const [path, e] of this.entries) this.entries.set(path, entry(e.read.ok ? e.read.text : null, e.read, true, maxBytes));
    return true;
  }

  /** Stores a pushed file (its text, or why it cannot be read). Returns the notebook files that read it. */
  set(path: string, content: string | DataFileFailure): string[] {
    const read: DataFileRead = typeof content === 'string' ? { ok: true, text: content } : content;
    this.entries.set(path, entry(typeof content === 'string' ? content : null, read, true, this.maxBytes));
    return this.readersOf(path);
  }

  /** Forgets a file: its readers see it missing (without asking the host) until it is set again. */
  delete(path: string): string[] {
    this.entries.set(path, entry(null, { ok: false, reason: 'missing' }, false, this.maxBytes));
    return this.readersOf(path);
  }

  /** Paths that some notebook file reads. */
  readPaths(): string[] {
    return [...this.readers.keys()];
  }

  readersOf(path: string): string[] {
    return [...(this.readers.get(path)?.keys() ?? [])];
  }

  /** Paths with stored content (pushed or pulled). */
  paths(): string[] {
    return [...this.entries.keys()];
  }

  /** Records that a notebook file now reads these data paths instead of the ones it read before. */
  updateReaders(file: string, before: readonly string[], after: readonly string[]): void {
    for (const p of after) {
      const m = this.readers.get(p) ?? new Map<string, number>();
      m.set(file, (m.get(file) ?? 0) + 1);
      this.readers.set(p, m);
    }
    for (const p of before) {
      const m = this.readers.get(p);
      const n = (m?.get(file) ?? 0) - 1;
      if (!m) continue;
      if (n > 0) m.set(file, n);
      else m.delete(file);
      if (m.size === 0) {
        this.readers.delete(p);
        const e = this.entries.get(p);
        // Unread, a file is forgotten; the host pushes it again, or is asked, when a block reads it.
        if (e) this.entries.delete(p);
      }
    }
  }

  table(path: string, columns: Readonly<Record<string, string>>): DataTableRead {
    let e = this.entries.get(path);
    if (!e) {
      const read = this.host.readDataFile(path, this.maxBytes);
      e = entry(read.ok ? read.text : null, read, false, this.maxBytes);
      this.entries.set(path, e);
    }
    const read = e.read;
    if (!read.ok) return { ok: false, reason: read.reason, stamp: e.stamp, size: read.size, limit: this.maxBytes, detail: read.detail };
    const columnsKey = JSON.stringify(columns);
    const lines = (e.lines ??= splitLines(read.text));
    let parsed = e.tables.get(columnsKey);
    if (!parsed) {
      const table = parseTable(lines, columns);
      parsed = { table, head: tableHeadLines(lines, table) };
      e.tables.set(columnsKey, parsed);
    }
    return { ok: true, table: parsed.table, stamp: e.stamp, head: parsed.head };
  }
}

function entry(text: string | null, read: DataFileRead, pushed: boolean, maxBytes: number): Entry {
  if (text !== null && text.length > maxBytes) {
    const tooLarge: DataFileRead = { ok: false, reason: 'too-large', size: text.length };
    return { read: tooLarge, pushed, stamp: `!too-large:${text.length}`, tables: new Map() };
  }
  const stamp = read.ok ? hashText(read.text) : `!${read.reason}:${read.size ?? ''}:${read.detail ?? ''}`;
  return { read, pushed, stamp, tables: new Map() };
}

/** The lines of a data file (a byte-order mark left out), found once; a line is a string only when asked for. */
function splitLines(raw: string): TableLines {
  return linesOfText(raw.startsWith('\uFEFF') ? raw.slice(1) : raw);
}
