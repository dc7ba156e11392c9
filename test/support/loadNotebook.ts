/** Loads a fixture notebook folder through the CLI's file host, as `vitrine check` does. */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { Notebook, type NotebookOptions } from '../../extension/core/index.js';
import { markdownFiles } from '../../extension/node/discovery.js';
import { FileHost } from '../../extension/node/fileHost.js';

export const REPO = path.resolve(import.meta.dirname, '..', '..');

export function loadNotebook(folder: string, options?: NotebookOptions): { notebook: Notebook; root: string; texts: Map<string, string> } {
  const root = path.join(REPO, folder);
  const notebook = new Notebook(new FileHost(root), options);
  const texts = new Map<string, string>();
  for (const rel of markdownFiles(root)) {
    const text = fs.readFileSync(path.join(root, rel), 'utf8');
    texts.set(rel, text);
    notebook.setFile(rel, text);
  }
  return { notebook, root, texts };
}
