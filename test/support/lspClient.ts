/**
 * A real LSP client for protocol tests: starts the built server (`dist/server.cjs --stdio`) and
 * talks JSON-RPC to it with vscode-jsonrpc, answering the server's own requests as an editor does.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import type { Diagnostic, PublishDiagnosticsParams } from 'vscode-languageserver-protocol';
import { REPO } from './loadNotebook.js';

export const SERVER = path.join(REPO, 'dist', 'server.cjs');

// A reply still being written when a stopped server's pipe closes is of no interest.
const CLOSED_PIPE = new Set(['ERR_STREAM_DESTROYED', 'EPIPE']);
process.on('unhandledRejection', (e) => {
  if (CLOSED_PIPE.has((e as { code?: string } | null)?.code ?? '')) return;
  throw e;
});

export interface Client {
  readonly connection: MessageConnection;
  readonly process: ChildProcess;
  /** The latest diagnostics published for each URI. */
  readonly diagnostics: Map<string, PublishDiagnosticsParams>;
  readonly log: string[];
  /** Resolves when diagnostics for `uri` satisfy `ok` (checked on each publication). */
  waitForDiagnostics(uri: string, ok: (d: readonly Diagnostic[], version?: number) => boolean, timeoutMs?: number): Promise<readonly Diagnostic[]>;
  open(uri: string, text: string, version?: number): void;
  change(uri: string, text: string, version: number): void;
  save(uri: string): void;
  stop(): Promise<void>;
}

export function uriOf(file: string): string {
  return pathToFileURL(file).href;
}

export async function startServer(root: string, settings: unknown = {}, capabilities: Record<string, unknown> = {}): Promise<Client> {
  if (!fs.existsSync(SERVER)) throw new Error('build the server first: npm run build');
  const proc = spawn(process.execPath, [SERVER, '--stdio'], { stdio: ['pipe', 'pipe', 'pipe'] });
  // A message still on its way when the server stops is of no interest: ignore broken pipes.
  proc.stdin!.on('error', () => undefined);
  const connection = createMessageConnection(new StreamMessageReader(proc.stdout!), new StreamMessageWriter(proc.stdin!));
  connection.onError(() => undefined);
  const diagnostics = new Map<string, PublishDiagnosticsParams>();
  const log: string[] = [];
  const waiters: Array<() => void> = [];
  proc.stdout!.on('error', () => undefined);
  connection.onNotification('textDocument/publishDiagnostics', (p: PublishDiagnosticsParams) => {
    diagnostics.set(p.uri, p);
    for (const w of waiters.splice(0)) w();
  });
  connection.onNotification('window/logMessage', (p: { message: string }) => void log.push(p.message));
  connection.onNotification('window/showMessage', (p: { message: string }) => void log.push(p.message));
  connection.onNotification('vitrine/resultsChanged', () => undefined);
  connection.onNotification('$/progress', () => undefined);
  connection.onRequest('workspace/configuration', (p: { items: unknown[] }) => p.items.map(() => settings));
  connection.onRequest('window/workDoneProgress/create', () => null);
  connection.onRequest('client/registerCapability', () => null);
  connection.onRequest('workspace/codeLens/refresh', () => null);
  connection.onRequest('window/showMessageRequest', () => null);
  connection.listen();
  await connection.sendRequest('initialize', {
    processId: process.pid,
    rootUri: uriOf(root),
    workspaceFolders: [{ uri: uriOf(root), name: path.basename(root) }],
    capabilities: {
      workspace: { configuration: true, didChangeWatchedFiles: { dynamicRegistration: true }, codeLens: { refreshSupport: true }, workspaceFolders: true },
      textDocument: { publishDiagnostics: { versionSupport: true, relatedInformation: true, codeDescriptionSupport: true }, codeLens: {}, hover: { contentFormat: ['markdown'] } },
      window: { workDoneProgress: true },
      ...capabilities,
    },
    initializationOptions: settings,
  });
  connection.sendNotification('initialized', {});
  const client: Client = {
    connection,
    process: proc,
    diagnostics,
    log,
    waitForDiagnostics(uri, ok, timeoutMs = 20000) {
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`no matching diagnostics for ${uri}; last: ${JSON.stringify(diagnostics.get(uri)?.diagnostics.map((d) => d.code))}\n${log.join('\n')}`)), timeoutMs);
        const check = () => {
          const p = diagnostics.get(uri);
          if (p && ok(p.diagnostics, p.version)) {
            clearTimeout(timer);
            resolve(p.diagnostics);
          } else waiters.push(check);
        };
        check();
      });
    },
    open(uri, text, version = 1) {
      connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'markdown', version, text } });
    },
    change(uri, text, version) {
      connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ text }] });
    },
    save(uri) {
      connection.sendNotification('textDocument/didSave', { textDocument: { uri } });
    },
    async stop() {
      try {
        await Promise.race([connection.sendRequest('shutdown'), new Promise((r) => setTimeout(r, 2000))]);
        connection.sendNotification('exit');
      } catch {
        // already gone
      }
      connection.dispose();
      proc.kill();
    },
  };
  return client;
}

/** A fresh notebook folder under the system's temporary folder, removed by the caller. */
export function tempNotebook(files: Record<string, string>): string {
  const root = fs.mkdtempSync(path.join(fs.realpathSync(process.env.TMPDIR ?? '/tmp'), 'vitrine-lsp-'));
  for (const [rel, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(root, rel)), { recursive: true });
    fs.writeFileSync(path.join(root, rel), text);
  }
  return root;
}
