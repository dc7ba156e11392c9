/** The status bar item: the notebook's Vitrine errors and warnings; a click opens Problems. */
import * as vscode from 'vscode';

export function createStatusBar(context: vscode.ExtensionContext): void {
  const item = vscode.window.createStatusBarItem('vitrine.status', vscode.StatusBarAlignment.Left, 50);
  item.name = 'Vitrine';
  item.command = 'workbench.actions.view.problems';
  const update = (): void => {
    let errors = 0;
    let warnings = 0;
    for (const [, list] of vscode.languages.getDiagnostics()) {
      for (const d of list) {
        if (d.source !== 'vitrine') continue;
        if (d.severity === vscode.DiagnosticSeverity.Error) errors++;
        else if (d.severity === vscode.DiagnosticSeverity.Warning) warnings++;
      }
    }
    const editor = vscode.window.activeTextEditor;
    if (!editor || editor.document.languageId !== 'markdown') {
      item.hide();
      return;
    }
    item.text = `Vitrine $(error) ${errors} $(warning) ${warnings}`;
    item.tooltip = `Vitrine: ${errors} error${errors === 1 ? '' : 's'} and ${warnings} warning${warnings === 1 ? '' : 's'} in the notebook. Click to open Problems.`;
    item.show();
  };
  context.subscriptions.push(item, vscode.languages.onDidChangeDiagnostics(update), vscode.window.onDidChangeActiveTextEditor(update));
  update();
}
