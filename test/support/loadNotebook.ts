/** Loads a fixture notebook folder through the CLI's file host and reader, as `vitrine check` does. */
import * as path from 'node:path';
import { Notebook, type NotebookOptions } from '../../extension/core/index.js';
import { markdownFiles } from '../../extension/node/discovery.js';
import { FileHost } from '../../extension/node/fileHost.js';
import { readNotebookFile } from '../../extension/node/notebookText.js';

export const REPO = path.resolve(import.meta.dirname, '..', '..');

export function loadNotebook(folder: string, options?: NotebookOptions): { notebook: Notebook; root: string; texts: Map<string, string> } {
  const root = path.resolve(REPO, folder);
  const notebook = new Notebook(new FileHost(root), options);
  const texts = new Map<string, string>();
  for (const rel of markdownFiles(root)) {
    const read = readNotebookFile(path.join(root, rel));
    texts.set(rel, read.ok ? read.text : '');
    if (read.ok) notebook.setFile(rel, read.text);
    else notebook.setFileFailure(rel, read.failure);
  }
  return { notebook, root, texts };
}
