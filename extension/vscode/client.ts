/** Starts the bundled language server and keeps the settings it reads in step. */
import * as vscode from 'vscode';
import { LanguageClient, TransportKind, type LanguageClientOptions, type ServerOptions } from 'vscode-languageclient/node';

export function createClient(context: vscode.ExtensionContext): LanguageClient {
  const module = vscode.Uri.joinPath(context.extensionUri, 'dist', 'server.cjs').fsPath;
  const serverOptions: ServerOptions = {
    run: { module, transport: TransportKind.ipc },
    debug: { module, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--inspect=6019'] } },
  };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [
      { scheme: 'file', language: 'markdown' },
      { scheme: 'untitled', language: 'markdown' },
    ],
    // The server registers its own file watcher (notebooks and the data files they read).
    synchronize: { configurationSection: 'vitrine' },
    initializationOptions: vscode.workspace.getConfiguration('vitrine'),
    outputChannelName: 'Vitrine',
  };
  return new LanguageClient('vitrine', 'Vitrine', serverOptions, clientOptions);
}
