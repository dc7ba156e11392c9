/**
 * The notebook engine: files in, results and diagnostics out.
 *
 * ```
 * setFile(text) ─► scan fences ─► data blocks ─► parse (cached by block text + data file)
 * analyze()     ─► index ids ─► references ─► analyses (cached, dependencies recorded and replayed)
 *               ─► reports: per file, per block, absolute spans, severity overrides applied
 * ```
 *
 * Caching: a parse is keyed by the file path and the block's source text (plus the data file's
 * stamp), with spans relative to the block, so typing elsewhere reuses it. An analysis records
 * every lookup it makes through its context (ids, referrers) with the parse keys it saw; a cached
 * analysis is reused only when replaying those lookups gives the same keys. So an edit re-does
 * only the blocks it touches and those that depend on them. No markdown tree is ever built.
 *
 * Policy: nothing throws out of the engine; a failing analysis becomes an `internal.error`
 * diagnostic on its block and the rest of the notebook is still analysed.
 */
import { ANALYZERS } from '../analysis/analyzers.js';
import { plausibilityWarnings } from '../analysis/plausibility.js';
import type { Analysis, AnalysisContext } from '../analysis/context.js';
import type { BlockReport, FileReport, NotebookReport } from '../model/report.js';
import { applyOverrides, at, type Diagnostic, type SeverityOverrides } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { NotebookHost } from '../model/host.js';
import { readBlockHeader, type BlockKind } from '../scan/blockHeader.js';
import { scanFencedBlocks } from '../scan/fenceScanner.js';
import { hashParts } from '../text/hash.js';
import { LineIndex, stripBom, toOneBasedPoint, type Span } from '../text/positions.js';
import { blockTextKey, parseBlock, type ParsedBlock } from '../block/parseBlock.js';

export type { BlockReport, FileReport, NotebookReport };

export interface NotebookOptions {
  readonly severity?: SeverityOverrides;
  /** Data files larger than this many bytes are refused (default MAX_DATA_FILE_BYTES). */
  readonly maxDataFileBytes?: number;
}

interface FileEntry {
  readonly text: string;
  readonly lines: LineIndex;
  readonly blocks: readonly ParsedBlock[];
  readonly starts: readonly number[];
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

const MAX_CACHE = 5000;

export class Notebook {
  private readonly files = new Map<string, FileEntry>();
  private readonly parseCache = new Map<string, ParsedBlock>();
  private readonly analysisCache = new Map<string, AnalysisEntry>();
  /** Counters for tests and the benchmark: how much work the last calls did. */
  readonly stats = { parsed: 0, analysed: 0 };

  constructor(private readonly host: NotebookHost, private readonly options: NotebookOptions = {}) {}

  /** Adds or replaces a file (root-relative path). Cheap: a line scan and cached parses. */
  setFile(path: string, rawText: string): void {
    const text = stripBom(rawText);
    const blocks: ParsedBlock[] = [];
    const starts: number[] = [];
    const diagnostics: Diagnostic[] = [];
    try {
      for (const fence of scanFencedBlocks(text)) {
        const header = readBlockHeader(fence);
        if (!header) continue;
        const source = text.slice(fence.span.start, fence.span.end);
        const key = blockTextKey(path, source);
        let parsed = this.parseCache.get(key);
        if (!parsed || parsed.tableOrigin?.source === 'file') {
          const fresh = this.safeParse(path, fence, header, source, diagnostics);
          if (!fresh) continue;
          parsed = fresh;
          this.remember(this.parseCache, key, parsed);
        }
        blocks.push(parsed);
        starts.push(fence.span.start);
      }
    } catch (e) {
      diagnostics.push(at(messages.internalError(e instanceof Error ? e.message : String(e)), { start: 0, end: Math.min(1, text.length) }));
    }
    this.files.set(path, { text, lines: new LineIndex(text), blocks, starts, diagnostics });
  }

  /** Records that a file could not be read, so that it still appears in the report. */
  setUnreadable(path: string, detail: string): void {
    this.files.set(path, { text: '', lines: new LineIndex(''), blocks: [], starts: [], diagnostics: [at(messages.fileUnreadable(detail), { start: 0, end: 0 })] });
  }

  deleteFile(path: string): void {
    this.files.delete(path);
  }

  hasFile(path: string): boolean {
    return this.files.has(path);
  }

  paths(): string[] {
    return [...this.files.keys()].sort();
  }

  private safeParse(path: string, fence: Parameters<typeof parseBlock>[0]['fence'], header: Parameters<typeof parseBlock>[0]['header'], source: string, out: Diagnostic[]): ParsedBlock | null {
    try {
      this.stats.parsed++;
      return parseBlock({ file: path, fence, header, source }, this.host, this.options.maxDataFileBytes);
    } catch (e) {
      out.push(at(messages.internalError(e instanceof Error ? e.message : String(e)), header.kindSpan));
      return null;
    }
  }

  private remember<V>(cache: Map<string, V>, key: string, value: V): void {
    if (cache.size >= MAX_CACHE) cache.clear();
    cache.set(key, value);
  }

  /** The hash a results block must carry to freeze the current results of a block. */
  inputsHashOf(id: string): string | undefined {
    const run = new AnalysisRun(this.files, this.analysisCache, this.stats, (k, v) => this.remember(this.analysisCache, k, v));
    return run.inputsHashOfId(id);
  }

  /** Analyses the notebook and reports the given files (all files when omitted). */
  analyze(only?: readonly string[]): NotebookReport {
    const run = new AnalysisRun(this.files, this.analysisCache, this.stats, (k, v) => this.remember(this.analysisCache, k, v));
    const paths = only ?? this.paths();
    const files: FileReport[] = [];
    for (const path of paths) {
      const entry = this.files.get(path);
      if (!entry) continue;
      const blocks: BlockReport[] = entry.blocks.map((parsed, i) => run.report(parsed, path, entry.starts[i], this.options.severity));
      files.push({
        path,
        text: entry.text,
        blocks,
        diagnostics: applyOverrides(entry.diagnostics, this.options.severity),
      });
    }
    return { files };
  }
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
    private readonly stats: { analysed: number },
    private readonly store: (key: string, entry: AnalysisEntry) => void,
  ) {
    for (const [file, entry] of [...files.entries()].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0))) {
      entry.blocks.forEach((block, i) => {
        if (block.id !== null) {
          const list = this.byId.get(block.id) ?? [];
          list.push({ block, file, start: entry.starts[i] });
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
    };
    let analysis: Analysis;
    try {
      this.stats.analysed++;
      const raw = ANALYZERS[block.kind](block, ctx);
      analysis = { ...raw, diagnostics: [...raw.diagnostics, ...plausibilityWarnings(raw.results, block.header.idSpan ?? block.header.kindSpan)] };
    } catch (e) {
      analysis = { results: {}, diagnostics: [at(messages.internalError(e instanceof Error ? e.message : String(e)), block.header.kindSpan)] };
    }
    this.inProgress.delete(block);
    const entry: AnalysisEntry = { analysis, deps };
    this.memo.set(block, entry);
    this.store(block.key, entry);
    return entry;
  }

  inputsHashOfId(id: string): string | undefined {
    const b = this.first(id);
    return b && b.kind !== 'results' ? this.inputsHash(b) : undefined;
  }

  /** Hash of everything a block's results depend on: what a results block freezes. */
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
    const lines = this.files.get(first.file)?.lines;
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
    return {
      kind: block.kind,
      id: block.id,
      span: { start: block.span.start + start, end: block.span.end + start },
      results: analysis.results,
      diagnostics: applyOverrides(absolute, severity),
      metadata: block.metadata.data,
      quantities: Object.fromEntries(block.quantities),
      ...(analysis.figure ? { figure: analysis.figure } : {}),
    };
  }
}
