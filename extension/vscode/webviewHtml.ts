/**
 * The HTML shell of Vitrine's webviews: a strict Content Security Policy with a nonce from a
 * cryptographic source, scripts and styles only from the webview bundle, nothing interpolated
 * that is not escaped.
 */
import { randomBytes } from 'node:crypto';
import * as vscode from 'vscode';

export function webviewRoot(extensionUri: vscode.Uri): vscode.Uri {
  return vscode.Uri.joinPath(extensionUri, 'dist', 'webview');
}

/** Options for a Vitrine webview: scripts on, forms off, and only the bundle's folder readable. */
export function webviewOptions(extensionUri: vscode.Uri): vscode.WebviewOptions & vscode.WebviewPanelOptions {
  return { enableScripts: true, enableForms: false, localResourceRoots: [webviewRoot(extensionUri)], retainContextWhenHidden: false };
}

function escapeAttribute(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function webviewHtml(webview: vscode.Webview, extensionUri: vscode.Uri, title: string): string {
  const nonce = randomBytes(18).toString('base64');
  const root = webviewRoot(extensionUri);
  const script = webview.asWebviewUri(vscode.Uri.joinPath(root, 'webview.js')).toString();
  const style = webview.asWebviewUri(vscode.Uri.joinPath(root, 'webview.css')).toString();
  const csp = [`default-src 'none'`, `img-src data:`, `style-src ${webview.cspSource}`, `font-src ${webview.cspSource}`, `script-src 'nonce-${nonce}'`].join('; ');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeAttribute(csp)}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeAttribute(title)}</title>
<link rel="stylesheet" href="${escapeAttribute(style)}">
</head>
<body>
<main id="vitrine-root"></main>
<script nonce="${escapeAttribute(nonce)}" src="${escapeAttribute(script)}"></script>
</body>
</html>`;
}
