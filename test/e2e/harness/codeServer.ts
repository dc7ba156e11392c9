/**
 * A real VS Code (code-server, installed by test/e2e/install.sh) in a fresh run folder: its own
 * config, user settings, extensions, XDG folders and TMPDIR, a copy of the demo notebook as the
 * workspace, the extension under test installed from its .vsix, bound to 127.0.0.1 on a free port.
 * `stop()` ends the whole process group: code-server's file watcher and the language servers it
 * starts would outlive its main process otherwise.
 */
import { execFile, spawn, type ChildProcess } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync, closeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';

const run = promisify(execFile);

export const E2E_DIR = resolve(import.meta.dirname, '..');
export const REPO = resolve(E2E_DIR, '../..');
export const OUT_DIR = join(E2E_DIR, 'out');
const CODE_SERVER = join(E2E_DIR, 'code-server/node_modules/code-server/out/node/entry.js');

/** User settings: nothing reaches out, nothing opens by itself, typing is not second-guessed. */
const USER_SETTINGS = {
  'telemetry.telemetryLevel': 'off',
  'update.mode': 'none',
  'extensions.autoCheckUpdates': false,
  'extensions.autoUpdate': false,
  'extensions.ignoreRecommendations': true,
  'workbench.enableExperiments': false,
  'workbench.settings.enableNaturalLanguageSearch': false,
  'npm.fetchOnlinePackageInfo': false,
  'json.schemaDownload.enable': false,
  'workbench.startupEditor': 'none',
  'workbench.tips.enabled': false,
  'workbench.welcomePage.walkthroughs.openOnInstall': false,
  'git.enabled': false,
  'security.workspace.trust.enabled': false,
  'chat.disableAIFeatures': true,
  'window.restoreWindows': 'none',
  'files.hotExit': 'off',
  // The tests type whole blocks: no completion may swallow an Enter, no bracket may be doubled.
  'editor.quickSuggestions': { other: false, comments: false, strings: false },
  'editor.suggestOnTriggerCharacters': false,
  'editor.acceptSuggestionOnEnter': 'off',
  'editor.autoClosingBrackets': 'never',
  'editor.autoClosingQuotes': 'never',
  'editor.autoSurround': 'never',
  'editor.autoIndent': 'none',
  'editor.formatOnType': false,
  'editor.minimap.enabled': false,
  'workbench.colorTheme': 'Default Light Modern',
};

export interface CodeServerOptions {
  /** The .vsix to install. */
  vsix: string;
  /** Files to write into the workspace (relative path → text) before code-server starts. */
  extraFiles?: Record<string, string>;
}

export class CodeServer {
  readonly root: string;
  readonly workspace: string;
  readonly log: string;
  private proc: ChildProcess | undefined;
  port = 0;

  constructor(private readonly options: CodeServerOptions) {
    // The run folder lives in the system temp folder: code-server's sockets go into TMPDIR, and a
    // deep checkout path could push them past the length a socket path may have.
    this.root = mkdtempSync(join(tmpdir(), 'vitrine-e2e-'));
    this.workspace = join(this.root, 'workspace');
    this.log = join(this.root, 'code-server.log');
  }

  get url(): string {
    return `http://127.0.0.1:${this.port}/?folder=${encodeURIComponent(this.workspace)}`;
  }

  private get env(): NodeJS.ProcessEnv {
    const env: NodeJS.ProcessEnv = {};
    for (const [k, v] of Object.entries(process.env)) if (!k.startsWith('VSCODE_') && !k.startsWith('ELECTRON_')) env[k] = v;
    return {
      ...env,
      XDG_CONFIG_HOME: join(this.root, 'xdg/config'),
      XDG_DATA_HOME: join(this.root, 'xdg/data'),
      XDG_CACHE_HOME: join(this.root, 'xdg/cache'),
      XDG_STATE_HOME: join(this.root, 'xdg/state'),
      TMPDIR: join(this.root, 'tmp'),
      EXTENSIONS_GALLERY: '{}',
    };
  }

  /** For the browser: its own XDG folders and TMPDIR in the run folder too. */
  get browserEnv(): Record<string, string> {
    return {
      XDG_CONFIG_HOME: join(this.root, 'browser/config'),
      XDG_CACHE_HOME: join(this.root, 'browser/cache'),
      TMPDIR: join(this.root, 'tmp'),
    };
  }

  private get dirs(): string[] {
    return ['--config', join(this.root, 'config.yaml'), '--user-data-dir', join(this.root, 'ud'), '--extensions-dir', join(this.root, 'ext')];
  }

  /** Lays out the run folder and installs the extension; throws with code-server's output if that fails. */
  async prepare(): Promise<void> {
    if (!existsSync(CODE_SERVER)) throw new Error(`code-server is not installed: run test/e2e/install.sh (looked for ${CODE_SERVER})`);
    if (!existsSync(this.options.vsix)) throw new Error(`no extension package at ${this.options.vsix}: run \`npm run package\` first`);
    for (const d of ['xdg/config', 'xdg/data', 'xdg/cache', 'xdg/state', 'tmp', 'ud/User', 'ext', 'browser/config', 'browser/cache']) mkdirSync(join(this.root, d), { recursive: true });
    writeFileSync(join(this.root, 'config.yaml'), 'bind-addr: 127.0.0.1:0\nauth: none\ncert: false\n');
    writeFileSync(join(this.root, 'ud/User/settings.json'), JSON.stringify(USER_SETTINGS, null, 2));
    cpSync(join(REPO, 'fixtures/demo'), this.workspace, { recursive: true });
    for (const [path, text] of Object.entries(this.options.extraFiles ?? {})) writeFileSync(join(this.workspace, path), text);
    try {
      await run(process.execPath, [CODE_SERVER, ...this.dirs, '--install-extension', this.options.vsix], { env: this.env, timeout: 120_000 });
    } catch (e) {
      const err = e as { stdout?: string; stderr?: string; message: string };
      throw new Error(`code-server --install-extension failed: ${err.message}\n${err.stdout ?? ''}${err.stderr ?? ''}`, { cause: e });
    }
  }

  /** Starts code-server in a session of its own (setsid, so it leads its process group) and waits for its port. */
  async start(timeoutMs = 60_000): Promise<void> {
    const fd = openSync(this.log, 'a');
    const args = [
      CODE_SERVER,
      ...this.dirs,
      '--disable-telemetry',
      '--disable-update-check',
      '--disable-workspace-trust',
      '--disable-getting-started-override',
      '--ignore-last-opened',
      this.workspace,
    ];
    // detached: the child calls setsid(), so its pid is the id of a new process group.
    this.proc = spawn(process.execPath, args, { env: this.env, detached: true, stdio: ['ignore', fd, fd] });
    closeSync(fd);
    liveGroups.add(this.proc.pid!);
    const exited = new Promise<never>((_, reject) => this.proc!.once('exit', (code, signal) => reject(new Error(`code-server exited (${code ?? signal}) before listening; see ${this.log}`))));
    exited.catch(() => undefined);
    this.port = await Promise.race([this.waitForPort(timeoutMs), exited]);
  }

  private async waitForPort(timeoutMs: number): Promise<number> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const m = /HTTP server listening on http:\/\/127\.0\.0\.1:(\d+)/.exec(readFileSync(this.log, 'utf8'));
      if (m) return Number(m[1]);
      if (Date.now() > deadline) throw new Error(`code-server did not report its port within ${timeoutMs / 1000} s; see ${this.log}`);
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  /** Ends the process group: TERM, then KILL after 10 s. */
  async stop(): Promise<void> {
    const pid = this.proc?.pid;
    if (pid === undefined) return;
    this.proc = undefined;
    signalGroup(pid, 'SIGTERM');
    const deadline = Date.now() + 10_000;
    while (groupAlive(pid) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
    if (groupAlive(pid)) signalGroup(pid, 'SIGKILL');
    liveGroups.delete(pid);
  }

  /** Copies the logs (code-server's and VS Code's) into `dir`, for reading after the run. */
  keepLogs(dir: string): void {
    mkdirSync(dir, { recursive: true });
    if (existsSync(this.log)) cpSync(this.log, join(dir, 'code-server.log'));
    const logs = join(this.root, 'ud/logs');
    if (existsSync(logs)) cpSync(logs, join(dir, 'vscode-logs'), { recursive: true });
  }

  remove(): void {
    rmSync(this.root, { recursive: true, force: true, maxRetries: 3 });
  }
}

function signalGroup(pid: number, signal: NodeJS.Signals): void {
  try {
    process.kill(-pid, signal);
  } catch {
    // already gone
  }
}

function groupAlive(pid: number): boolean {
  try {
    process.kill(-pid, 0);
    return true;
  } catch {
    return false;
  }
}

// Whatever ends this process (an error, Ctrl+C, the CI's timeout), no code-server outlives it.
const liveGroups = new Set<number>();
process.on('exit', () => {
  for (const pid of liveGroups) signalGroup(pid, 'SIGKILL');
});
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
  process.once(signal, () => {
    for (const pid of liveGroups) signalGroup(pid, 'SIGKILL');
    process.exit(128 + (signal === 'SIGINT' ? 2 : signal === 'SIGTERM' ? 15 : 1));
  });
}
