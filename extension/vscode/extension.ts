/**
 * The Vitrine extension for VS Code: a thin client. Activation starts the bundled language
 * server and registers commands, the chart preview, the status bar and the markdown preview
 * plugin; it loads no analysis and no chart library (the server and the webview hold those).
 */
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import type { ResultsChangedParams, ShowChartArgs } from '../protocol/server.js';
import type { WebviewState } from '../protocol/webview.js';
import { CHARTS_VIEW, ChartPanel } from './chartPanel.js';
import { createClient } from './client.js';
import { PreviewCharts } from './markdownPreview.js';
import { createStatusBar } from './statusBar.js';

let client: LanguageClient | undefined;

export function activate(context: vscode.ExtensionContext): { extendMarkdownIt<M>(md: M): M } {
  const activationStart = performance.now();
  const log = vscode.window.createOutputChannel('Vitrine charts', { log: true });
  context.subscriptions.push(log);
  client = createClient(context);
  const charts = new ChartPanel(context, client, log);
  const preview = new PreviewCharts(() => client, log);
  context.subscriptions.push(charts);

  const started = client.start().then(
    () => {
      context.subscriptions.push(
        client!.onNotification('vitrine/resultsChanged', (p: ResultsChangedParams) => {
          preview.invalidate(p.uris);
          if (charts.visible) void charts.refresh();
        }),
      );
    },
    (e: unknown) => log.error(`the language server did not start: ${e instanceof Error ? e.message : String(e)}`),
  );

  const isNotebook = (editor: vscode.TextEditor | undefined): editor is vscode.TextEditor => editor?.document.languageId === 'markdown';

  context.subscriptions.push(
    vscode.commands.registerCommand('vitrine.showChart', async (args?: ShowChartArgs) => {
      await started;
      const editor = vscode.window.activeTextEditor;
      const uri = args?.uri ? vscode.Uri.parse(args.uri) : editor?.document.uri;
      if (!uri) return;
      await charts.showFile(uri, args?.line ?? (editor && editor.document.uri.toString() === uri.toString() ? editor.selection.active.line : undefined));
    }),
    vscode.commands.registerCommand('vitrine.openPreview', async (target?: vscode.Uri) => {
      await started;
      const editor = vscode.window.activeTextEditor;
      const uri = target instanceof vscode.Uri ? target : editor?.document.uri;
      if (!uri) {
        void vscode.window.showInformationMessage('Vitrine: open a notebook (a markdown file) first.');
        return;
      }
      await charts.showFile(uri, editor?.document.uri.toString() === uri.toString() ? editor.selection.active.line : undefined);
    }),
    vscode.commands.registerCommand('vitrine.openSummary', async () => {
      await started;
      await charts.showSummary();
    }),
    vscode.commands.registerCommand('vitrine.refreshResults', () => vscode.commands.executeCommand('editor.action.sourceAction', { kind: 'source.vitrine.refreshResults', apply: 'first' })),
    vscode.commands.registerCommand('vitrine.restartServer', async () => {
      await started;
      await client?.restart();
    }),
    vscode.window.registerWebviewPanelSerializer(CHARTS_VIEW, {
      deserializeWebviewPanel: async (panel, state: WebviewState | undefined) => {
        await started;
        await charts.restore(panel, state);
      },
    }),
    vscode.window.onDidChangeActiveTextEditor((editor) => {
      if (charts.visible && isNotebook(editor) && editor.document.uri.toString() !== charts.shownUri && followsCursor()) void charts.showFile(editor.document.uri, editor.selection.active.line);
    }),
    vscode.window.onDidChangeTextEditorSelection(
      throttle((e: vscode.TextEditorSelectionChangeEvent) => {
        if (charts.visible && isNotebook(e.textEditor) && followsCursor()) charts.cursor(e.textEditor.document.uri, e.selections[0].active.line);
      }, 120),
    ),
    vscode.window.onDidChangeActiveColorTheme(() => {
      charts.themeChanged();
      preview.invalidate();
    }),
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration('vitrine.preview')) {
        charts.themeChanged();
        preview.invalidate();
      }
    }),
  );
  createStatusBar(context);
  // Measured, so that the activation path stays free of analysis and chart code.
  log.info(`activated in ${(performance.now() - activationStart).toFixed(1)} ms`);
  return { extendMarkdownIt: (md) => preview.extendMarkdownIt(md) };
}

export async function deactivate(): Promise<void> {
  await client?.stop();
  client = undefined;
}

function followsCursor(): boolean {
  return vscode.workspace.getConfiguration('vitrine').get<boolean>('preview.followCursor', true);
}

function throttle<A extends unknown[]>(fn: (...args: A) => void, ms: number): (...args: A) => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  let last: A | undefined;
  return (...args: A) => {
    last = args;
    if (timer) return;
    timer = setTimeout(() => {
      timer = undefined;
      if (last) fn(...last);
    }, ms);
  };
}
