/**
 * The notebook engine: files in, results and diagnostics out.
 *
 * ```
 * setFile(text)      ─► scan fences ─► data blocks ─► parse (reused by block text, per file)
 * setDataFile(text)  ─► store ─► re-parse only the blocks that read it (reverse index)
 * analyze()          ─► index ids ─► references ─► analyses (cached, dependencies recorded and replayed)
 *                    ─► plain reports: per file, per block, absolute 0-based spans, severity overrides
 * ```
 *
 * Caching: a parse is reused when its file still holds the same block text (key: file, text,
 * layout), with spans relative to the block, so typing elsewhere reuses it. An analysis records
 * every lookup it makes through its context (ids, referrers) with the parse keys it saw; a cached
 * analysis is reused only when replaying those lookups gives the same keys. So an edit re-does
 * only the blocks it touches and those that depend on them. No markdown tree is ever built.
 *
 * Memory: every cache entry belongs to a block that a file holds now. Replacing a file drops the
 * parses and analyses its new text no longer uses; deleting it drops them all.
 *
 * Policy: nothing throws out of the engine; a failing analysis becomes an `internal.error`
 * diagnostic on its block and the rest of the notebook is still analysed.
 */
import { ANALYZERS } from '../analysis/analyzers.js';
import { finiteFigure, finiteResults } from '../analysis/finiteResults.js';
import { plausibilityWarnings } from '../analysis/plausibility.js';
import { Cancelled, type Analysis, type AnalysisContext } from '../analysis/context.js';
import { blockTextKey, parseBlock, parseInputOf, type ParsedBlock, type ParseInput } from '../block/parseBlock.js';
import type { BlockKind } from '../model/blockKind.js';
import { applyOverrides, at, type Diagnostic, type SeverityOverrides } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { FigureData } from '../model/figure.js';
import type { BlockReport, FileReport, NotebookReport, TableExcerpt } from '../model/report.js';
import type { Span } from '../model/span.js';
import { valueAt } from '../parse/metadata.js';
import { nearBlockKind, readBlockHeader } from '../scan/blockHeader.js';
import { scanFencedBlocks } from '../scan/fenceScanner.js';
import { hashParts } from '../text/hash.js';
import { LineIndex, stripBom, toOneBasedPoint } from '../text/positions.js';
import { DataFiles, MAX_DATA_FILE_BYTES, type DataFileFailure } from './dataFiles.js';
import { editRegion, lineBounds, plainLines, withinLineText } from './editRegion.js';
import { MAX_NOTEBOOK_FILE_BYTES, type NotebookFileFailure, type NotebookHost } from './host.js';

export type { BlockReport, FileReport, NotebookReport };

export interface NotebookOptions {
  readonly severity?: SeverityOverrides;
  /** Data files larger than this many bytes are refused (default MAX_DATA_FILE_BYTES). */
  readonly maxDataFileBytes?: number;
}

/** Structural, so that any host's token fits (LSP, VS Code, a test's plain object). */
export interface CancellationToken {
  readonly isCancellationRequested: boolean;
}

/** The finite figure of an analysis, made once and only when first asked for when it is given as a function. */
function lazyFigure(figure: FigureData | (() => FigureData)): FigureData | (() => FigureData) {
  if (typeof figure !== 'function') return finiteFigure(figure);
  let made: FigureData | undefined;
  return () => (made ??= finiteFigure(figure()));
}

export interface AnalyzeOptions {
  /** Report only these files (all files when omitted); the whole notebook is still indexed. */
  readonly only?: readonly string[];
  readonly token?: CancellationToken;
}

/** Where a block is: its file, its whole span and the span of its id (0-based offsets). */
export interface BlockLocation {
  readonly path: string;
  readonly kind: BlockKind;
  readonly id: string | null;
  readonly span: Span;
  readonly idSpan: Span | null;
}

/** One `key: value` of a block's metadata, with 0-based spans. */
export interface MetadataEntry {
  readonly block: BlockLocation;
  /** JSON pointer of the entry: `/film`, `/vft/B`, `/windows/glass/0`. */
  readonly pointer: string;
  readonly keySpan: Span;
  readonly valueSpan: Span;
  /** The offset is on the key rather than the value. */
  readonly onKey: boolean;
  readonly value: unknown;
}

/** A metadata value that names a block (`film: D-17`). */
export interface BlockReference {
  readonly path: string;
  /** The block that holds the reference. */
  readonly from: BlockLocation;
  readonly key: string;
  readonly span: Span;
}

interface BlockSlot {
  readonly parsed: ParsedBlock;
  readonly input: ParseInput;
  readonly start: number;
}

interface FileEntry {
  readonly text: string;
  readonly lines: () => LineIndex;
  readonly blocks: readonly BlockSlot[];
  readonly diagnostics: readonly Diagnostic[];
}

type Dependency =
  | { readonly type: 'lookup'; readonly id: string; readonly kind: BlockKind; readonly key: string | null }
  | { readonly type: 'referrers'; readonly kind: BlockKind; readonly refKey: string; readonly id: string; readonly keys: string }
  | { readonly type: 'results'; readonly key: string };

interface AnalysisEntry {
  readonly analysis: Analysis;
  readonly deps: readonly Dependency[];
}

export class Notebook {
  private readonly files = new Map<string, FileEntry>();
  private readonly analysisCache = new Map<string, AnalysisEntry>();
  /** How many current blocks have each parse key: an analysis is kept while its key lives. */
  private readonly liveKeys = new Map<string, number>();
  private readonly data: DataFiles;
  private options: NotebookOptions;
  /** Counters for tests and the benchmark: how much work the last calls did. */
  readonly stats = { parsed: 0, analysed: 0 };

  constructor(host: NotebookHost, options: NotebookOptions = {}) {
    this.options = options;
    this.data = new DataFiles(host, options.maxDataFileBytes ?? MAX_DATA_FILE_BYTES);
  }

  /** Changes the options; caches are kept (a new data file limit re-reads the data files). */
  setOptions(options: NotebookOptions): void {
    this.options = options;
    if (this.data.setLimit(options.maxDataFileBytes ?? MAX_DATA_FILE_BYTES)) {
      for (const path of [...this.files.keys()]) this.reparseData(path, () => true);
    }
  }

  /**
   * Adds or replaces a file (root-relative path). Cheap: a line scan and reused parses; when the
   * change leaves the block structure alone (typing inside one block, or in plain prose), only
   * the changed block is scanned again, or none.
   */
  setFile(path: string, rawText: string): void {
    if (rawText.length > MAX_NOTEBOOK_FILE_BYTES) {
      this.setFileFailure(path, { reason: 'too-large', size: rawText.length, limit: MAX_NOTEBOOK_FILE_BYTES });
      return;
    }
    const text = stripBom(rawText);
    const old = this.files.get(path);
    if (old && old.diagnostics.length === 0) {
      const quick = this.quickUpdate(path, old, text);
      if (quick) {
        this.replace(path, quick);
        return;
      }
    }
    // A block of the same text keeps its parse and what it was parsed from (its offsets are relative).
    const reusable = new Map<string, BlockSlot>();
    for (const slot of old?.blocks ?? []) reusable.set(slot.input.textKey, slot);
    const blocks: BlockSlot[] = [];
    const diagnostics: Diagnostic[] = [];
    try {
      for (const fence of scanFencedBlocks(text)) {
        const header = readBlockHeader(fence);
        if (!header) {
          // A near miss of a kind (`Deposition`, `ramps`): still ordinary markdown, but say why.
          const near = nearBlockKind(fence);
          if (near) diagnostics.push({ ...at(messages.blockKindTypo(near.written, near.kind), near.span), fix: { title: `Write "${near.kind}"`, span: near.span, newText: near.kind } });
          continue;
        }
        const textKey = blockTextKey(path, text.slice(fence.span.start, fence.span.end), fence);
        const kept = reusable.get(textKey);
        // Its container (whether it sits in a list or a quote) is not part of a block's text key.
        if (kept && kept.input.fence.nested === fence.nested && kept.input.fence.closed === fence.closed) {
          blocks.push({ ...kept, start: fence.span.start });
          continue;
        }
        // Once the file is being edited, a block read now may outlive this version of the text.
        const input = parseInputOf(path, textKey, fence, header, old !== undefined);
        const parsed = kept?.parsed ?? this.safeParse(input, diagnostics, fence.span.start);
        if (parsed) blocks.push({ parsed, input, start: fence.span.start });
      }
    } catch (e) {
      diagnostics.push(at(messages.internalError(errorText(e)), { start: 0, end: Math.min(1, text.length) }));
    }
    this.replace(path, { text, lines: lazyLines(text), blocks, diagnostics });
  }

  /** The new entry of a file after an edit that keeps its block boundaries, or null to scan it all. */
  private quickUpdate(path: string, old: FileEntry, text: string): FileEntry | null {
    const region = editRegion(old.text, text);
    if (!region) return old;
    const delta = region.newEnd - region.oldEnd;
    const oldLines = lineBounds(old.text, region.start, region.oldEnd);
    const newLines = lineBounds(text, region.start, region.newEnd);
    const index = old.blocks.findIndex((slot) => slot.start <= oldLines.end && oldLines.start < slot.start + slot.parsed.span.end);
    const shifted = (slot: BlockSlot): BlockSlot => (slot.start >= oldLines.end ? { ...slot, start: slot.start + delta } : slot);
    if (index < 0) {
      // Prose only: an edit within one line, after its indentation, on lines plain before and after.
      if (!withinLineText(old.text, region.start, region.oldEnd) || !withinLineText(text, region.start, region.newEnd)) return null;
      if (!plainLines(old.text, oldLines.start, oldLines.end) || !plainLines(text, newLines.start, newLines.end)) return null;
      return { text, lines: lazyLines(text), blocks: old.blocks.map(shifted), diagnostics: [] };
    }
    const slot = old.blocks[index];
    const fence = slot.input.fence;
    const openEnd = slot.start + (fence.infoSpan.end - fence.span.start);
    const end = slot.start + slot.parsed.span.end;
    // Inside the body of a closed block that sits directly in the document, and no fence run typed or removed.
    const closeStart = lineBounds(old.text, end, end).start;
    if (!fence.closed || fence.nested || oldLines.start <= openEnd || oldLines.end >= closeStart) return null;
    if (/```|~~~/.test(old.text.slice(oldLines.start, oldLines.end)) || /```|~~~/.test(text.slice(newLines.start, newLines.end))) return null;
    // Scan the block alone, from the start of its fence line (its indentation shapes its body).
    const lineStart = lineBounds(text, slot.start, slot.start).start;
    const blockText = text.slice(lineStart, end + delta);
    const scanned = scanFencedBlocks(blockText);
    const one = scanned.length === 1 && scanned[0].span.end === blockText.length && scanned[0].closed && lineStart + scanned[0].span.start === slot.start ? scanned[0] : null;
    const header = one ? readBlockHeader(one) : null;
    if (!one || !header) return null;
    const input = parseInputOf(path, blockTextKey(path, blockText.slice(one.span.start), one), one, header, true);
    const diagnostics: Diagnostic[] = [];
    const parsed = this.safeParse(input, diagnostics, slot.start);
    if (!parsed || diagnostics.length > 0) return null;
    const blocks = old.blocks.map((s, i) => (i === index ? { parsed, input, start: slot.start } : shifted(s)));
    return { text, lines: lazyLines(text), blocks, diagnostics: [] };
  }

  /** Records that a file could not be read, so that it still appears in the report. */
  setUnreadable(path: string, detail: string): void {
    this.setFileFailure(path, { reason: 'unreadable', detail });
  }

  /** Records why a file has no text (unreadable, too large), so that it still appears in the report. */
  setFileFailure(path: string, failure: NotebookFileFailure): void {
    const message = failure.reason === 'too-large' ? messages.fileTooLarge(failure.size, failure.limit) : messages.fileUnreadable(failure.detail);
    this.replace(path, { text: '', lines: lazyLines(''), blocks: [], diagnostics: [at(message, { start: 0, end: 0 })] });
  }

  deleteFile(path: string): void {
    this.replace(path, null);
  }

  /** Pushes a data file's text (or why it cannot be read); re-parses only the blocks that read it. */
  setDataFile(path: string, content: string | DataFileFailure): void {
    for (const file of this.data.set(path, content)) this.reparseData(file, (p) => p === path);
  }

  deleteDataFile(path: string): void {
    for (const file of this.data.delete(path)) this.reparseData(file, (p) => p === path);
  }

  hasFile(path: string): boolean {
    return this.files.has(path);
  }

  paths(): string[] {
    return [...this.files.keys()].sort();
  }

  /** What the engine holds now: for tests and the benchmark (memory must follow the files, not the history). */
  holdings(): { readonly blocks: number; readonly analyses: number; readonly dataFiles: number } {
    let blocks = 0;
    for (const e of this.files.values()) blocks += e.blocks.length;
    return { blocks, analyses: this.analysisCache.size, dataFiles: this.data.paths().length };
  }

  /** Data files that some notebook file reads (whether or not they exist). */
  dataPathsRead(): string[] {
    return this.data.readPaths().sort();
  }

  /** Notebook files that read a data file. */
  readersOf(dataPath: string): string[] {
    return this.data.readersOf(dataPath).sort();
  }

  private replace(path: string, entry: FileEntry | null): void {
    const old = this.files.get(path);
    for (const slot of entry?.blocks ?? []) this.liveKeys.set(slot.parsed.key, (this.liveKeys.get(slot.parsed.key) ?? 0) + 1);
    for (const slot of old?.blocks ?? []) {
      const n = (this.liveKeys.get(slot.parsed.key) ?? 0) - 1;
      if (n > 0) this.liveKeys.set(slot.parsed.key, n);
      else {
        this.liveKeys.delete(slot.parsed.key);
        this.analysisCache.delete(slot.parsed.key);
      }
    }
    this.data.updateReaders(path, dataPathsOf(old), dataPathsOf(entry));
    if (entry) this.files.set(path, entry);
    else this.files.delete(path);
  }

  /** Re-parses the blocks of a file whose data path matches (after a data file changed). */
  private reparseData(path: string, matches: (dataPath: string) => boolean): void {
    const entry = this.files.get(path);
    if (!entry) return;
    const diagnostics = entry.diagnostics.slice();
    const blocks = entry.blocks.map((slot) => {
      if (slot.parsed.dataPath === null || !matches(slot.parsed.dataPath)) return slot;
      const parsed = this.safeParse(slot.input, diagnostics, slot.start);
      return parsed ? { ...slot, parsed } : slot;
    });
    this.replace(path, { ...entry, blocks, diagnostics });
  }

  /** `start`: where the block's fence starts in the file now (the input may come from an earlier version). */
  private safeParse(input: ParseInput, out: Diagnostic[], start: number): ParsedBlock | null {
    try {
      this.stats.parsed++;
      return parseBlock(input, this.data);
    } catch (e) {
      const d = start - input.fence.span.start;
      out.push(at(messages.internalError(errorText(e)), { start: input.header.kindSpan.start + d, end: input.header.kindSpan.end + d }));
      return null;
    }
  }

  private run(token?: CancellationToken): AnalysisRun {
    return new AnalysisRun(this.files, this.analysisCache, this.liveKeys, this.stats, token);
  }

  /** The hash a results block must carry to record the current figures of a block. */
  inputsHashOf(id: string): string | undefined {
    return this.run().inputsHashOfId(id);
  }

  /**
   * Analyses the notebook and reports the given files (all files when omitted). Returns
   * `undefined` when the token is cancelled: nothing half-done is cached or reported.
   */
  analyze(only?: readonly string[]): NotebookReport;
  analyze(options: AnalyzeOptions & { readonly token: CancellationToken }): NotebookReport | undefined;
  analyze(options: Omit<AnalyzeOptions, 'token'>): NotebookReport;
  analyze(options: AnalyzeOptions | readonly string[] = {}): NotebookReport | undefined {
    const { only, token } = Array.isArray(options) ? { only: options as readonly string[], token: undefined } : (options as AnalyzeOptions);
    const run = this.run(token);
    const files: FileReport[] = [];
    try {
      for (const path of only ?? this.paths()) {
        const entry = this.files.get(path);
        if (!entry) continue;
        const blocks: BlockReport[] = [];
        for (const slot of entry.blocks) {
          if (token?.isCancellationRequested) return undefined;
          blocks.push(run.report(slot.parsed, path, slot.start, this.options.severity));
        }
        files.push({ path, text: entry.text, blocks, diagnostics: applyOverrides(entry.diagnostics, this.options.severity) });
      }
    } catch (e) {
      if (e instanceof Cancelled) return undefined;
      throw e;
    }
    return { files };
  }

  // Queries over the current files (no analysis needed).

  /** The block with this id (the first one, if the id is duplicated). */
  definitionOf(id: string): BlockLocation | undefined {
    for (const path of this.paths()) {
      for (const slot of this.files.get(path)!.blocks) if (slot.parsed.id === id) return locationOf(path, slot);
    }
    return undefined;
  }

  /** Every metadata value that names this id, in notebook order. */
  referencesTo(id: string): BlockReference[] {
    const out: BlockReference[] = [];
    for (const path of this.paths()) {
      for (const slot of this.files.get(path)!.blocks) {
        for (const ref of slot.parsed.references) {
          if (ref.id === id) out.push({ path, from: locationOf(path, slot), key: ref.key, span: shift(ref.span, slot.start) });
        }
      }
    }
    return out;
  }

  /** Every block with an id, of one kind or all, in notebook order. */
  ids(kind?: BlockKind): BlockLocation[] {
    const out: BlockLocation[] = [];
    for (const path of this.paths()) {
      for (const slot of this.files.get(path)!.blocks) {
        if (slot.parsed.id !== null && (kind === undefined || slot.parsed.kind === kind)) out.push(locationOf(path, slot));
      }
    }
    return out;
  }

  /** The data blocks of a file, in order. */
  blocksOf(path: string): BlockLocation[] {
    return (this.files.get(path)?.blocks ?? []).map((slot) => locationOf(path, slot));
  }

  /**
   * The metadata entry under an offset: its JSON pointer (`/vft/B`), the spans of its key and
   * value, and the value as written. Undefined outside any entry.
   */
  entryAt(path: string, offset: number): MetadataEntry | undefined {
    const entry = this.files.get(path);
    if (!entry) return undefined;
    for (const slot of entry.blocks) {
      const span = shift(slot.parsed.span, slot.start);
      if (offset < span.start || offset > span.end) continue;
      let best: MetadataEntry | undefined;
      for (const pointer of slot.parsed.metadata.spans.keys()) {
        const keySpan = shift(slot.parsed.spanOf(pointer, true), slot.start);
        const valueSpan = shift(slot.parsed.spanOf(pointer), slot.start);
        const inside = (s: Span) => offset >= s.start && offset <= s.end;
        if (!inside(keySpan) && !inside(valueSpan)) continue;
        const candidate: MetadataEntry = { block: locationOf(path, slot), pointer, keySpan, valueSpan, onKey: inside(keySpan), value: valueAt(slot.parsed.metadata.data, pointer) };
        // The innermost entry wins (`/vft/B` over `/vft`).
        if (!best || pointer.length > best.pointer.length) best = candidate;
      }
      return best;
    }
    return undefined;
  }

  /** The data block whose span holds the offset (its end included, so a cursor after the fence counts). */
  blockAt(path: string, offset: number): BlockLocation | undefined {
    const entry = this.files.get(path);
    if (!entry) return undefined;
    for (const slot of entry.blocks) {
      const span = shift(slot.parsed.span, slot.start);
      if (offset >= span.start && offset <= span.end) return locationOf(path, slot);
    }
    return undefined;
  }
}

function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

function shift(s: Span, by: number): Span {
  return { start: s.start + by, end: s.end + by };
}

function locationOf(path: string, slot: BlockSlot): BlockLocation {
  const p = slot.parsed;
  return { path, kind: p.kind, id: p.id, span: shift(p.span, slot.start), idSpan: p.header.idSpan ? shift(p.header.idSpan, slot.start) : null };
}

/** A line index made on first use: most edits never need one. */
function lazyLines(text: string): () => LineIndex {
  let lines: LineIndex | undefined;
  return () => (lines ??= new LineIndex(text));
}

function dataPathsOf(entry: FileEntry | null | undefined): string[] {
  const out: string[] = [];
  for (const slot of entry?.blocks ?? []) if (slot.parsed.dataPath !== null) out.push(slot.parsed.dataPath);
  return out;
}

/** One pass of analysis over a fixed set of files: the index, memoised results. */
class AnalysisRun {
  private readonly byId = new Map<string, Array<{ block: ParsedBlock; file: string; start: number }>>();
  private readonly referrerIndex = new Map<string, ParsedBlock[]>();
  private readonly memo = new Map<ParsedBlock, AnalysisEntry>();
  private readonly inProgress = new Set<ParsedBlock>();

  constructor(
    private readonly files: ReadonlyMap<string, FileEntry>,
    private readonly cache: Map<string, AnalysisEntry>,
    private readonly liveKeys: ReadonlyMap<string, number>,
    private readonly stats: { analysed: number },
    private readonly token: CancellationToken | undefined,
  ) {
    for (const [file, entry] of [...files.entries()].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0))) {
      entry.blocks.forEach(({ parsed: block, start }) => {
        if (block.id !== null) {
          const list = this.byId.get(block.id) ?? [];
          list.push({ block, file, start });
          this.byId.set(block.id, list);
        }
        for (const [key, value] of Object.entries(block.metadata.data)) {
          if (typeof value !== 'string') continue;
          const k = `${block.kind}\u0000${key}\u0000${value}`;
          const list = this.referrerIndex.get(k) ?? [];
          list.push(block);
          this.referrerIndex.set(k, list);
        }
      });
    }
  }

  private first(id: string): ParsedBlock | undefined {
    return this.byId.get(id)?.[0]?.block;
  }

  private lookupNow(id: string, kind: BlockKind): ParsedBlock | undefined {
    const b = this.first(id);
    return b && b.kind === kind ? b : undefined;
  }

  private referrersNow(kind: BlockKind, refKey: string, id: string): ParsedBlock[] {
    return this.referrerIndex.get(`${kind}\u0000${refKey}\u0000${id}`) ?? [];
  }

  private stillValid(deps: readonly Dependency[]): boolean {
    for (const d of deps) {
      if (d.type === 'lookup') {
        if ((this.lookupNow(d.id, d.kind)?.key ?? null) !== d.key) return false;
      } else if (d.type === 'referrers') {
        if (this.referrersNow(d.kind, d.refKey, d.id).map((b) => b.key).join(',') !== d.keys) return false;
      }
    }
    return true;
  }

  /** The analysis of a block, from the memo, the cache, or computed now. */
  analysisOf(block: ParsedBlock): AnalysisEntry {
    const memo = this.memo.get(block);
    if (memo) return memo;
    const cached = this.cache.get(block.key);
    if (cached && this.stillValid(cached.deps)) {
      this.memo.set(block, cached);
      return cached;
    }
    if (this.inProgress.has(block)) return { analysis: { results: {}, diagnostics: [] }, deps: [] };
    this.inProgress.add(block);
    const deps: Dependency[] = [];
    const ctx: AnalysisContext = {
      lookup: (id, kind) => {
        const b = this.lookupNow(id, kind);
        deps.push({ type: 'lookup', id, kind, key: b?.key ?? null });
        return b;
      },
      referrers: (kind, refKey, id) => {
        const list = this.referrersNow(kind, refKey, id);
        deps.push({ type: 'referrers', kind, refKey, id, keys: list.map((b) => b.key).join(',') });
        return list;
      },
      resultsOf: (other) => {
        const entry = this.analysisOf(other);
        deps.push({ type: 'results', key: other.key }, ...entry.deps);
        return entry.analysis.results;
      },
      checkCancelled: () => {
        if (this.token?.isCancellationRequested) throw new Cancelled();
      },
    };
    let analysis: Analysis;
    try {
      this.stats.analysed++;
      const raw = ANALYZERS[block.kind](block, ctx);
      // Only finite figures leave the engine (finiteResults.ts), checked here once for every kind.
      const span = block.header.idSpan ?? block.header.kindSpan;
      const finite = finiteResults(raw.results, span);
      analysis = {
        ...raw,
        results: finite.results,
        diagnostics: [...raw.diagnostics, ...finite.diagnostics, ...plausibilityWarnings(finite.results, span)],
        ...(raw.figure ? { figure: lazyFigure(raw.figure) } : {}),
      };
    } catch (e) {
      this.inProgress.delete(block);
      if (e instanceof Cancelled) throw e;
      analysis = { results: {}, diagnostics: [at(messages.internalError(errorText(e)), block.header.kindSpan)] };
    }
    this.inProgress.delete(block);
    const entry: AnalysisEntry = { analysis, deps };
    this.memo.set(block, entry);
    if (this.liveKeys.has(block.key)) this.cache.set(block.key, entry);
    return entry;
  }

  inputsHashOfId(id: string): string | undefined {
    const b = this.first(id);
    return b && b.kind !== 'results' ? this.inputsHash(b) : undefined;
  }

  /** Hash of everything a block's results depend on: what a results block records. */
  inputsHash(block: ParsedBlock): string {
    const entry = this.analysisOf(block);
    const depKeys = entry.deps.map((d) => (d.type === 'lookup' ? `${d.id}=${d.key}` : d.type === 'referrers' ? `${d.refKey}=${d.keys}` : d.key));
    return hashParts([block.key, ...depKeys]);
  }

  private referenceDiagnostics(block: ParsedBlock): Diagnostic[] {
    const out: Diagnostic[] = [];
    for (const ref of block.references) {
      const target = this.first(ref.id);
      if (!target) out.push(at(messages.refDangling(ref.key, ref.id, ref.expected.join(' or ')), ref.span));
      else if (!ref.expected.includes(target.kind)) out.push(at(messages.refWrongKind(ref.key, ref.id, ref.expected.join(' or '), target.kind), ref.span));
    }
    return out;
  }

  private duplicateDiagnostics(block: ParsedBlock, file: string, start: number): Diagnostic[] {
    if (block.id === null || !block.header.idSpan) return [];
    const list = this.byId.get(block.id);
    if (!list || list.length < 2 || (list[0].file === file && list[0].start === start)) return [];
    const first = list[0];
    const lines = this.files.get(first.file)?.lines();
    const line = toOneBasedPoint(lines ? lines.positionAt(first.start) : { line: 0, character: 0 }).line;
    return [at(messages.duplicateId(block.id, `${first.file}:${line}`), block.header.idSpan)];
  }

  private staleDiagnostics(block: ParsedBlock): Diagnostic[] {
    if (block.kind !== 'results') return [];
    const of = block.metadata.data.of;
    const inputs = block.metadata.data.inputs;
    if (typeof of !== 'string' || typeof inputs !== 'string') return [];
    const target = this.first(of);
    if (!target || target.kind === 'results') return [];
    return this.inputsHash(target) === inputs ? [] : [at(messages.resultsStale(of), block.spanOf('/inputs'))];
  }

  report(block: ParsedBlock, file: string, start: number, severity: SeverityOverrides | undefined): BlockReport {
    const { analysis } = this.analysisOf(block);
    const relative = [
      ...block.diagnostics,
      ...this.duplicateDiagnostics(block, file, start),
      ...this.referenceDiagnostics(block),
      ...this.staleDiagnostics(block),
      ...analysis.diagnostics,
    ];
    const shift = (s: Span): Span => ({ start: s.start + start, end: s.end + start });
    const absolute = relative.map((d) => ({ ...d, span: shift(d.span), ...(d.fix ? { fix: { ...d.fix, span: shift(d.fix.span) } } : {}) }));
    absolute.sort((a, b) => a.span.start - b.span.start || a.span.end - b.span.end);
    const report: BlockReport = {
      kind: block.kind,
      id: block.id,
      span: { start: block.span.start + start, end: block.span.end + start },
      results: analysis.results,
      diagnostics: applyOverrides(absolute, severity),
      metadata: block.metadata.data as Readonly<Record<string, unknown>>,
      quantities: analysis.quantities ? { ...Object.fromEntries(block.quantities), ...analysis.quantities } : Object.fromEntries(block.quantities),
      ...this.tableExcerpt(block, file, start),
    };
    const figure = analysis.figure;
    if (figure === undefined) return report;
    if (typeof figure !== 'function') return { ...report, figure };
    // The chart's data is made on first reading (a chart, a report, a copy), then kept; an
    // ordinary enumerable property to everything that reads it, JSON included.
    Object.defineProperty(report, 'figure', { enumerable: true, configurable: true, get: figure });
    return report;
  }

  /** Lines of a block's table as read, when the table has errors. */
  private tableExcerpt(block: ParsedBlock, file: string, start: number): { tableExcerpt?: TableExcerpt } {
    const head = block.tableHead;
    if (!head || !block.table || block.table.problems.length === 0) return {};
    const firstLine = head.path !== null ? head.at : (this.files.get(file)?.lines().positionAt(start + head.at).line ?? 0);
    return { tableExcerpt: { path: head.path, firstLine, lines: head.lines, lengths: head.lengths } };
  }
}
