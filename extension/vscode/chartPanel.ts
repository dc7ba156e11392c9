/**
 * The chart preview beside the editor: one webview panel that follows the active notebook and
 * the cursor, renders the server's compiled Vega (in the webview), reveals a block when its chart
 * is clicked, and saves exported charts through a save dialog. Messages after the panel is
 * disposed are dropped; a response older than the latest request is dropped too.
 */
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import type { ChartsParams, ChartsResult, SummaryParams, SummaryResult } from '../protocol/server.js';
import type { FromWebview, ToWebview, WebviewState } from '../protocol/webview.js';
import { chartTheme, forceLight, serverTheme } from './theme.js';
import { webviewHtml, webviewOptions } from './webviewHtml.js';

export const CHARTS_VIEW = 'vitrine.charts';

export class ChartPanel implements vscode.Disposable {
  private panel: vscode.WebviewPanel | undefined;
  private ready = false;
  private queue: ToWebview[] = [];
  private uri: string | null = null;
  private view: WebviewState['view'] = 'charts';
  private request = 0;
  private readonly disposables: vscode.Disposable[] = [];

  constructor(
    private readonly context: vscode.ExtensionContext,
    private readonly client: LanguageClient,
    private readonly log: vscode.LogOutputChannel,
  ) {}

  get visible(): boolean {
    return this.panel !== undefined;
  }

  get shownUri(): string | null {
    return this.uri;
  }

  /** Opens (or reveals) the panel on a notebook file, at a block when a line is given. */
  async showFile(uri: vscode.Uri, line?: number): Promise<void> {
    this.ensurePanel('charts');
    this.uri = uri.toString();
    this.view = 'charts';
    await this.refresh();
    if (line !== undefined) this.post({ type: 'cursor', uri: this.uri, line });
  }

  async showSummary(): Promise<void> {
    this.ensurePanel('summary');
    this.view = 'summary';
    await this.refresh();
  }

  /** Takes over a panel VS Code restored after a reload. */
  async restore(panel: vscode.WebviewPanel, state: WebviewState | undefined): Promise<void> {
    this.adopt(panel);
    this.view = state?.view ?? 'charts';
    this.uri = state?.uri ?? null;
    await this.refresh();
  }

  /** Asks the server again for what the panel shows. */
  async refresh(): Promise<void> {
    if (!this.panel) return;
    const id = ++this.request;
    try {
      if (this.view === 'summary') {
        const params: SummaryParams = { theme: serverTheme() };
        const summary = await this.client.sendRequest<SummaryResult>('vitrine/summary', params);
        if (id === this.request) this.post({ type: 'summary', summary, theme: chartTheme(), forceLight: forceLight() });
      } else if (this.uri) {
        const params: ChartsParams = { uri: this.uri, theme: serverTheme() };
        const charts = await this.client.sendRequest<ChartsResult | null>('vitrine/charts', params);
        if (id !== this.request || !charts) return;
        const fileName = vscode.Uri.parse(charts.uri).path.split('/').pop() ?? '';
        this.post({ type: 'show', uri: charts.uri, fileName, version: charts.version, blocks: charts.blocks, theme: chartTheme(), forceLight: forceLight() });
        if (this.panel) this.panel.title = `Vitrine charts: ${fileName}`;
      }
    } catch (e) {
      this.log.warn(`chart preview: ${e instanceof Error ? e.message : String(e)}`);
    }
  }

  cursor(uri: vscode.Uri, line: number): void {
    if (this.view === 'charts' && this.uri === uri.toString()) this.post({ type: 'cursor', uri: this.uri, line });
  }

  themeChanged(): void {
    this.post({ type: 'theme', theme: chartTheme(), forceLight: forceLight() });
    void this.refresh();
  }

  private ensurePanel(view: WebviewState['view']): void {
    if (this.panel) {
      this.panel.reveal(undefined, true);
      return;
    }
    const title = view === 'summary' ? 'Vitrine notebook summary' : 'Vitrine charts';
    this.adopt(vscode.window.createWebviewPanel(CHARTS_VIEW, title, { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, webviewOptions(this.context.extensionUri)));
  }

  private adopt(panel: vscode.WebviewPanel): void {
    // One panel at a time: a panel restored while another is open replaces it.
    if (this.panel && this.panel !== panel) this.panel.dispose();
    this.panel = panel;
    this.ready = false;
    this.queue = [];
    panel.webview.options = webviewOptions(this.context.extensionUri);
    panel.webview.html = webviewHtml(panel.webview, this.context.extensionUri, panel.title);
    this.disposables.push(
      panel.webview.onDidReceiveMessage((m: FromWebview) => void this.receive(m)),
      panel.onDidChangeViewState((e) => {
        // A hidden webview is unloaded; it says 'ready' again when shown, and is sent its view then.
        if (!e.webviewPanel.visible && e.webviewPanel === this.panel) this.ready = false;
      }),
      panel.onDidDispose(() => {
        if (panel !== this.panel) return;
        this.panel = undefined;
        this.ready = false;
        this.queue = [];
        for (const d of this.disposables.splice(0)) d.dispose();
      }),
    );
  }

  private post(message: ToWebview): void {
    if (!this.panel) return;
    if (!this.ready) {
      // Only the latest of each kind matters while the webview loads.
      this.queue = [...this.queue.filter((m) => m.type !== message.type), message];
      return;
    }
    void this.panel.webview.postMessage(message);
  }

  private async receive(message: FromWebview): Promise<void> {
    if (!this.panel || typeof message !== 'object' || message === null) return;
    switch (message.type) {
      case 'ready':
        // The page (re)loaded: after a reveal the webview starts afresh, so send the view again.
        this.ready = true;
        for (const m of this.queue.splice(0)) void this.panel.webview.postMessage(m);
        void this.refresh();
        return;
      case 'reveal': {
        try {
          const uri = vscode.Uri.parse(message.uri);
          const line = Number.isFinite(message.line) ? Math.max(0, Math.floor(message.line)) : 0;
          const editor = await vscode.window.showTextDocument(uri, { viewColumn: vscode.ViewColumn.One, preserveFocus: false });
          const position = editor.document.validatePosition(new vscode.Position(line, 0));
          editor.selection = new vscode.Selection(position, position);
          editor.revealRange(new vscode.Range(position, position), vscode.TextEditorRevealType.InCenterIfOutsideViewport);
        } catch (e) {
          this.log.warn(`chart preview: cannot show the block: ${e instanceof Error ? e.message : String(e)}`);
        }
        return;
      }
      case 'export':
        try {
          await this.export(message.name, message.format, message.data);
        } catch (e) {
          void vscode.window.showErrorMessage(`Vitrine: the chart could not be saved: ${e instanceof Error ? e.message : String(e)}`);
        }
        return;
      case 'error':
        this.log.warn(`chart preview: ${message.message}`);
        return;
      default:
        return;
    }
  }

  private async export(name: string, format: 'svg' | 'png', data: string): Promise<void> {
    const safe = name.replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 80) || 'chart';
    const folder = vscode.workspace.workspaceFolders?.[0]?.uri;
    const target = await vscode.window.showSaveDialog({
      defaultUri: folder ? vscode.Uri.joinPath(folder, `${safe}.${format}`) : undefined,
      filters: format === 'svg' ? { 'SVG image': ['svg'] } : { 'PNG image': ['png'] },
      title: `Export the chart as ${format.toUpperCase()}`,
    });
    if (!target) return;
    let bytes: Uint8Array;
    if (format === 'svg') bytes = new TextEncoder().encode(data);
    else {
      const base64 = /^data:image\/png;base64,([A-Za-z0-9+/=]+)$/.exec(data)?.[1];
      if (!base64) {
        void vscode.window.showErrorMessage('Vitrine: the chart could not be exported as PNG.');
        return;
      }
      bytes = Buffer.from(base64, 'base64');
    }
    await vscode.workspace.fs.writeFile(target, bytes);
    void vscode.window.showInformationMessage(`Vitrine: chart saved to ${vscode.workspace.asRelativePath(target)}`);
  }

  dispose(): void {
    this.panel?.dispose();
    for (const d of this.disposables.splice(0)) d.dispose();
  }
}
