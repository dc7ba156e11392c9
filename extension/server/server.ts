/**
 * The Vitrine language server: the engine behind any LSP editor.
 *
 * ```
 * didOpen/didChange ─► engine.setFile (scan, reuse parses) ─► debounce ─► analyze the file ─► publish
 *                                                                      └► the rest of the folder, in slices
 * didSave           ─► save-phase findings shown ─► publish
 * watched files     ─► markdown: setFile / deleteFile; data files: setDataFile for their readers
 * requests          ─► lenses, hovers, definition, references, rename, symbols, completion, code actions,
 *                      vitrine/charts, vitrine/summary
 * ```
 *
 * Policy: the server never exits on bad input or a failing analysis. Every handler catches, logs
 * and answers with what it has (an empty list, no hover); the engine itself never throws.
 */
import {
  type CodeLens,
  ErrorCodes,
  ResponseError,
  DidChangeWatchedFilesNotification,
  FileChangeType,
  TextDocumentSyncKind,
  type CancellationToken,
  type ClientCapabilities,
  type Connection,
  type Diagnostic as LspDiagnostic,
  type InitializeParams,
  type InitializeResult,
} from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { BlockReport, FileReport } from '../core/index.js';
import type { ChartsParams, ChartsResult, ResultsChangedParams, ShowChartArgs, SummaryParams, SummaryResult, VitrineSettings } from '../protocol/server.js';
import { codeActions } from './codeActions.js';
import { completions } from './completion.js';
import { toLspDiagnostic } from './diagnostics.js';
import { fileCharts, workspaceSummary } from './charts.js';
import { hover } from './hover.js';
import { lensText } from './figures.js';
import { definition, documentSymbols, references, rename, prepareRename, workspaceSymbols } from './navigation.js';
import { DEFAULT_SETTINGS, readSettings } from './settings.js';
import { Workspace, canonicalUri, pathToUri, uriToPath, type Place } from './workspace.js';

const DEBOUNCE_MS = 250;
/** Handlers slower than this are logged, to find what makes typing slow. */
const SLOW_MS = 200;

interface PublishedState {
  /** Key of the last published diagnostics, to skip identical republishing. */
  readonly key: string;
}

export class VitrineServer {
  readonly workspace: Workspace;
  private settings: VitrineSettings = DEFAULT_SETTINGS;
  private capabilities: ClientCapabilities = {};
  private readonly documents = new Map<string, TextDocument>();
  private readonly timers = new Map<string, ReturnType<typeof setTimeout>>();
  /** Each change bumps its folder's generation; a background pass over a folder stops when it moves on. */
  private readonly generations = new Map<string, number>();
  private readonly published = new Map<string, PublishedState>();
  /** Save-phase findings (`code|message`) seen at the last save of each open document. */
  private readonly savedFindings = new Map<string, Set<string>>();
  /** The last lens text with figures of each block (`uri#block key`), kept while the block is edited. */
  private readonly lastGood = new Map<string, string>();
  /** Documents changed since their last diagnostics run (the figures may be updating). */
  private readonly pending = new Set<string>();
  /** Open documents changed since they were opened or saved. */
  private readonly dirty = new Set<string>();

  constructor(private readonly connection: Connection) {
    this.workspace = new Workspace((m) => this.log(m));
    this.ready = new Promise((resolve) => (this.markReady = resolve));
  }

  log(message: string): void {
    try {
      this.connection.console.log(message);
    } catch {
      // The connection is gone; nothing to tell.
    }
  }

  /** Resolves once the workspace folders are read; every handler but the start-up ones waits for it. */
  private ready: Promise<void>;
  private markReady: () => void = () => undefined;

  /** Wraps a handler: it waits for the workspace, and any exception is logged and answered with the fallback. */
  private guard<P extends unknown[], R>(name: string, fallback: R, fn: (...args: P) => R | Promise<R>): (...args: P) => Promise<R> {
    return async (...args: P) => {
      try {
        if (name !== 'initialized' && name !== 'configuration') await this.ready;
        const start = performance.now();
        const result = await fn(...args);
        const ms = performance.now() - start;
        if (ms > SLOW_MS) this.log(`${name} took ${ms.toFixed(0)} ms`);
        return result;
      } catch (e) {
        if (e instanceof ResponseError) throw e;
        this.log(`${name} failed: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
        return fallback;
      }
    };
  }

  listen(): void {
    const c = this.connection;
    c.onInitialize((params) => this.initialize(params));
    c.onInitialized(this.guard('initialized', undefined, () => this.initialized()));
    c.onDidChangeConfiguration(this.guard('configuration', undefined, (p: { settings: unknown }) => this.configure(p.settings)));
    c.onDidOpenTextDocument(this.guard('didOpen', undefined, (p) => {
      const doc = TextDocument.create(p.textDocument.uri, p.textDocument.languageId, p.textDocument.version, p.textDocument.text);
      this.documents.set(p.textDocument.uri, doc);
      this.workspace.didOpen(p.textDocument.uri, p.textDocument.text, p.textDocument.version, doc);
      this.markSaved(p.textDocument.uri);
      this.schedule(p.textDocument.uri, 0);
    }));
    c.onDidChangeTextDocument(this.guard('didChange', undefined, (p) => {
      const doc = this.documents.get(p.textDocument.uri);
      if (!doc) return;
      const next = TextDocument.update(doc, p.contentChanges, p.textDocument.version);
      this.documents.set(p.textDocument.uri, next);
      this.workspace.didChange(p.textDocument.uri, next.getText(), next.version, next);
      this.pending.add(p.textDocument.uri);
      this.dirty.add(p.textDocument.uri);
      if (this.settings.diagnostics.run === 'onType') this.schedule(p.textDocument.uri, DEBOUNCE_MS);
    }));
    c.onDidSaveTextDocument(this.guard('didSave', undefined, (p) => {
      this.markSaved(p.textDocument.uri);
      this.schedule(p.textDocument.uri, 0);
    }));
    c.onDidCloseTextDocument(this.guard('didClose', undefined, (p) => {
      this.documents.delete(p.textDocument.uri);
      const prefix = `${canonicalUri(p.textDocument.uri)}#`;
      for (const key of [...this.lastGood.keys()]) if (key.startsWith(prefix)) this.lastGood.delete(key);
      this.savedFindings.delete(p.textDocument.uri);
      this.dirty.delete(p.textDocument.uri);
      this.pending.delete(p.textDocument.uri);
      this.workspace.didClose(p.textDocument.uri);
      this.schedule(p.textDocument.uri, 0);
    }));
    c.onDidChangeWatchedFiles(this.guard('watchedFiles', undefined, (p) => {
      const touched: Place[] = [];
      for (const change of p.changes) touched.push(...this.workspace.diskChanged(change.uri, change.type === FileChangeType.Deleted));
      const uris = new Set(touched.map((t) => this.workspace.uriOf(t.folder, t.rel)));
      for (const uri of uris) this.schedule(this.openUriOf(uri), DEBOUNCE_MS);
    }));
    c.onCodeLens(this.guard('codeLens', [] as CodeLens[], (p, token: CancellationToken) => this.codeLenses(p.textDocument.uri, token)));
    c.onHover(this.guard('hover', null, (p) => hover(this.workspace, p.textDocument.uri, p.position)));
    c.onDefinition(this.guard('definition', null, (p) => definition(this.workspace, p.textDocument.uri, p.position)));
    c.onReferences(this.guard('references', [], (p) => references(this.workspace, p.textDocument.uri, p.position, p.context.includeDeclaration)));
    c.onPrepareRename(this.guard('prepareRename', null, (p) => prepareRename(this.workspace, p.textDocument.uri, p.position)));
    c.onRenameRequest(this.guard('rename', null, (p) => rename(this.workspace, p.textDocument.uri, p.position, p.newName)));
    c.onDocumentSymbol(this.guard('documentSymbol', [], (p) => documentSymbols(this.workspace, p.textDocument.uri)));
    c.onWorkspaceSymbol(this.guard('workspaceSymbol', [], (p) => workspaceSymbols(this.workspace, p.query)));
    c.onCompletion(this.guard('completion', [], (p) => completions(this.workspace, p.textDocument.uri, p.position)));
    c.onCodeAction(this.guard('codeAction', [], (p) => codeActions(this.workspace, p)));
    c.onRequest('vitrine/charts', this.guard('charts', null as ChartsResult | null, (p: ChartsParams) => fileCharts(this.workspace, checked(p, isChartsParams, 'vitrine/charts'))));
    c.onRequest('vitrine/summary', this.guard('summary', { columns: [], rows: [], maps: [] } as SummaryResult, (p: SummaryParams) => workspaceSummary(this.workspace, checked(p, isSummaryParams, 'vitrine/summary'))));
  }

  private initialize(params: InitializeParams): InitializeResult {
    this.capabilities = params.capabilities;
    if (params.initializationOptions !== undefined) this.configure(params.initializationOptions);
    const roots = params.workspaceFolders?.map((f) => f.uri) ?? (params.rootUri ? [params.rootUri] : []);
    this.rootsToLoad = roots.map(uriToPath).filter((p): p is string => p !== null);
    return {
      capabilities: {
        textDocumentSync: { openClose: true, change: TextDocumentSyncKind.Incremental, save: { includeText: false } },
        codeLensProvider: { resolveProvider: false },
        hoverProvider: true,
        definitionProvider: true,
        referencesProvider: true,
        renameProvider: { prepareProvider: true },
        documentSymbolProvider: true,
        workspaceSymbolProvider: true,
        completionProvider: { triggerCharacters: ['`', '~', ':', ' ', '/'] },
        codeActionProvider: { codeActionKinds: ['quickfix', 'source.vitrine.refreshResults', 'refactor.rewrite'] },
        workspace: { workspaceFolders: { supported: true, changeNotifications: true } },
      },
      serverInfo: { name: 'vitrine-language-server', version: '0.1.0' },
    };
  }

  private rootsToLoad: string[] = [];

  private async initialized(): Promise<void> {
    try {
      await this.start();
    } finally {
      this.markReady();
    }
  }

  private async start(): Promise<void> {
    if (this.capabilities.workspace?.didChangeWatchedFiles?.dynamicRegistration) {
      await this.connection.client.register(DidChangeWatchedFilesNotification.type, { watchers: [{ globPattern: '**/*' }] });
    }
    if (this.capabilities.workspace?.configuration) {
      const s = await this.connection.workspace.getConfiguration('vitrine');
      this.configure(s);
    }
    if (this.capabilities.workspace?.workspaceFolders) {
      this.connection.workspace.onDidChangeWorkspaceFolders((e) => {
        for (const f of e.removed) {
          const p = uriToPath(f.uri);
          if (p) this.workspace.removeFolder(p);
        }
        for (const f of e.added) {
          const p = uriToPath(f.uri);
          if (p) this.workspace.addFolder(p);
        }
        this.scheduleAll();
      });
    }
    await this.loadRoots();
  }

  private async loadRoots(): Promise<void> {
    const roots = this.rootsToLoad;
    this.rootsToLoad = [];
    const progress = this.capabilities.window?.workDoneProgress ? await this.connection.window.createWorkDoneProgress() : null;
    progress?.begin('Vitrine: reading notebooks', 0, undefined, false);
    for (const root of roots) {
      this.workspace.addFolder(root, (done, total) => progress?.report(Math.round((100 * done) / Math.max(1, total)), `${done}/${total} files`));
      // Files opened before their folder was read belong to it now.
      for (const uri of this.workspace.openUris()) {
        const text = this.documents.get(uri);
        if (text) this.workspace.didOpen(uri, text.getText(), text.version, text);
      }
    }
    progress?.done();
    this.scheduleAll();
  }

  private configure(raw: unknown): void {
    const inner = typeof raw === 'object' && raw !== null && 'vitrine' in raw ? (raw as { vitrine: unknown }).vitrine : raw;
    const { settings, problems } = readSettings(inner);
    this.settings = settings;
    this.workspace.setOptions({ severity: settings.diagnostics.severity });
    for (const p of problems) {
      this.log(p);
      void this.connection.window.showWarningMessage(p);
    }
    this.scheduleAll();
  }

  private markSaved(uri: string): void {
    this.pending.delete(uri);
    this.dirty.delete(uri);
    const found = new Set<string>();
    const block = this.fileReport(uri);
    for (const d of [...(block?.diagnostics ?? []), ...(block?.blocks.flatMap((b) => b.diagnostics) ?? [])]) if (d.phase === 'save') found.add(`${d.code}|${d.message}`);
    this.savedFindings.set(uri, found);
  }

  private fileReport(uri: string, token?: CancellationToken): FileReport | undefined {
    const place = this.workspace.placeOf(uri);
    if (!place) return undefined;
    const report = token ? place.folder.engine.analyze({ only: [place.rel], token }) : place.folder.engine.analyze({ only: [place.rel] });
    return report?.files[0];
  }

  // ---- diagnostics --------------------------------------------------------------------------

  private generationOf(root: string): number {
    return this.generations.get(root) ?? 0;
  }

  private bump(uri: string): void {
    const root = this.workspace.placeOf(uri)?.folder.root;
    if (root !== undefined) this.generations.set(root, this.generationOf(root) + 1);
  }

  private schedule(uri: string, delay: number): void {
    clearTimeout(this.timers.get(uri));
    this.bump(uri);
    this.timers.set(
      uri,
      setTimeout(() => {
        this.timers.delete(uri);
        this.runDiagnostics(uri);
      }, delay),
    );
  }

  private scheduleAll(): void {
    clearTimeout(this.timers.get('*'));
    this.timers.set(
      '*',
      setTimeout(() => {
        this.timers.delete('*');
        void this.publishFolder(null);
      }, 0),
    );
  }

  private runDiagnostics(uri: string): void {
    try {
      this.publish(uri);
      this.pending.delete(uri);
      void this.connection.sendNotification('vitrine/resultsChanged', { uris: [uri] } satisfies ResultsChangedParams);
      if (this.capabilities.workspace?.codeLens?.refreshSupport) void this.connection.sendRequest('workspace/codeLens/refresh');
      // The rest of the notebook may depend on this file (references, duplicate ids, Tg of films).
      void this.publishFolder(uri);
    } catch (e) {
      this.log(`diagnostics failed for ${uri}: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
    }
  }

  /** Publishes every file of the folder of `uri` (every folder when null), yielding between files. */
  private async publishFolder(uri: string | null): Promise<void> {
    const place = uri ? this.workspace.placeOf(uri) : null;
    const folders = place ? [place.folder] : this.workspace.allFolders();
    for (const folder of folders) {
      const generation = this.generationOf(folder.root);
      // One analysis of the whole folder (cached blocks cost nothing), then one file at a time.
      const report = folder.engine.analyze();
      const touched: string[] = [];
      for (const file of report.files) {
        if (generation !== this.generationOf(folder.root)) break;
        const other = this.openUriOf(this.workspace.uriOf(folder, file.path));
        if (uri !== null && canonicalUri(other) === canonicalUri(uri)) continue;
        this.publish(other, file);
        touched.push(other);
        await new Promise((r) => setImmediate(r));
      }
      // Figures of other files may follow from the change (a material's Tg, a film's substrate temperature).
      if (uri !== null && touched.length > 0) void this.connection.sendNotification('vitrine/resultsChanged', { uris: touched } satisfies ResultsChangedParams);
    }
  }

  private publish(uri: string, report?: FileReport): void {
    // In onSave mode an edited document keeps the diagnostics of its last save.
    if (this.settings.diagnostics.run === 'onSave' && this.dirty.has(uri)) return;
    const text = this.workspace.textOf(uri);
    const file = report ?? this.fileReport(uri);
    if (!text || !file) {
      if (this.published.has(uri)) {
        this.published.delete(uri);
        void this.connection.sendDiagnostics({ uri, diagnostics: [] });
      }
      return;
    }
    const saved = this.workspace.isOpen(uri) ? this.savedFindings.get(uri) : undefined;
    const showSave = (code: string, message: string) => saved === undefined || saved.has(`${code}|${message}`);
    const all = [...file.diagnostics, ...file.blocks.flatMap((b) => b.diagnostics)].filter((d) => d.phase !== 'save' || showSave(d.code, d.message));
    const diagnostics: LspDiagnostic[] = all.map((d) => toLspDiagnostic(d, text, (rel) => this.relatedUri(uri, rel)));
    const version = this.workspace.versionOf(uri);
    const key = `${version}:${JSON.stringify(diagnostics)}`;
    if (this.published.get(uri)?.key === key) return;
    this.published.set(uri, { key });
    void this.connection.sendDiagnostics({ uri, ...(version !== null ? { version } : {}), diagnostics });
  }

  /** The URI string the editor uses for a file it has open (diagnostics must carry that one). */
  private openUriOf(uri: string): string {
    const key = canonicalUri(uri);
    for (const open of this.documents.keys()) if (canonicalUri(open) === key) return open;
    return uri;
  }

  private relatedUri(uri: string, rel: string): string {
    const place = this.workspace.placeOf(uri);
    return place ? this.workspace.uriOf(place.folder, rel) : uri;
  }

  // ---- code lenses --------------------------------------------------------------------------

  private codeLenses(uri: string, token: CancellationToken): CodeLens[] {
    const text = this.workspace.textOf(uri);
    const file = this.fileReport(uri, token);
    if (!text || !file) return [];
    const updating = this.pending.has(uri);
    const counts = new Map<string, number>();
    return file.blocks.map((block) => {
      const key = this.blockKey(uri, block, counts);
      const line = text.position(block.span.start).line;
      const range = { start: { line, character: 0 }, end: { line, character: 0 } };
      let title = lensText(block);
      const hasFigures = Object.keys(block.results).length > 0;
      if (hasFigures) this.lastGood.set(key, title);
      else if (updating && this.lastGood.has(key)) title = `${this.lastGood.get(key)} (updating…)`;
      const args: ShowChartArgs = { uri, line };
      return { range, command: { title, command: 'vitrine.showChart', arguments: [args] } } satisfies CodeLens;
    });
  }

  /** A block's identity across edits: its id, or its kind and rank among the unnamed blocks of that kind. */
  private blockKey(uri: string, block: BlockReport, counts: Map<string, number>): string {
    if (block.id !== null) return `${uri}#${block.id}`;
    const n = counts.get(block.kind) ?? 0;
    counts.set(block.kind, n + 1);
    return `${uri}#${block.kind}:${n}`;
  }
}

export { pathToUri };

function checked<T>(params: unknown, valid: (p: unknown) => p is T, method: string): T {
  if (!valid(params)) throw new ResponseError(ErrorCodes.InvalidParams, `${method}: malformed parameters`);
  return params;
}

function isTheme(t: unknown): boolean {
  return t === 'light' || t === 'dark';
}

function isChartsParams(p: unknown): p is ChartsParams {
  const o = p as Partial<ChartsParams> | null;
  return typeof o === 'object' && o !== null && typeof o.uri === 'string' && isTheme(o.theme) && (o.line === undefined || (Number.isInteger(o.line) && o.line >= 0)) && (o.svg === undefined || typeof o.svg === 'boolean');
}

function isSummaryParams(p: unknown): p is SummaryParams {
  const o = p as Partial<SummaryParams> | null;
  return typeof o === 'object' && o !== null && isTheme(o.theme);
}
