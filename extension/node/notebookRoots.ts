/**
 * Notebook roots on disk: which folder is the root of the notebook a path belongs to, and how a
 * root is read into an engine. Shared by the CLI and the language server.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { Notebook, type NotebookReport } from '../core/index.js';
import { markdownFiles } from './discovery.js';
import { FileHost } from './fileHost.js';

/** A path argument that names no notebook (missing, or outside the given root). */
export class RootError extends Error {}

export interface RootRun {
  readonly root: string;
  readonly report: NotebookReport;
}

export interface LoadProgress {
  update(done: number, total: number, label: string): void;
  done(): void;
}

export function loadRoot(root: string, only: readonly string[] | null, progress?: LoadProgress): RootRun {
  const host = new FileHost(root);
  const notebook = new Notebook(host);
  const files = markdownFiles(root);
  for (const [i, rel] of files.entries()) {
    progress?.update(i, files.length, rel);
    try {
      notebook.setFile(rel, fs.readFileSync(path.join(root, ...rel.split('/')), 'utf8'));
    } catch (e) {
      notebook.setUnreadable(rel, e instanceof Error ? e.message : String(e));
    }
  }
  progress?.done();
  return { root, report: notebook.analyze(only ?? undefined) };
}

/**
 * Groups paths into notebook roots: a folder is a root; a file belongs to its own folder as root,
 * unless `rootOption` names the notebook folder, which then holds every path.
 */
export function rootsOf(paths: readonly string[], cwd: string, rootOption?: string): Array<{ readonly root: string; readonly only: string[] | null }> {
  const byRoot = new Map<string, string[] | null>();
  const explicitRoot = rootOption ? path.resolve(cwd, rootOption) : null;
  if (explicitRoot && !fs.existsSync(explicitRoot)) throw new RootError(`--root ${rootOption}: no such folder`);
  for (const p of paths) {
    const abs = path.resolve(cwd, p);
    let stat: fs.Stats;
    try {
      stat = fs.statSync(abs);
    } catch {
      throw new RootError(`${p}: no such file or folder`);
    }
    if (explicitRoot) {
      const rel = path.relative(explicitRoot, abs).split(path.sep).join('/');
      if (rel.startsWith('..') || path.isAbsolute(rel)) throw new RootError(`${p} is not inside --root ${rootOption}`);
      const list = byRoot.get(explicitRoot);
      if (list === null) continue;
      if (stat.isDirectory() && rel === '') {
        byRoot.set(explicitRoot, null);
      } else {
        const chosen = stat.isDirectory() ? markdownFiles(abs).map((f) => `${rel}/${f}`) : [rel];
        byRoot.set(explicitRoot, [...(list ?? []), ...chosen]);
      }
    } else if (stat.isDirectory()) {
      byRoot.set(abs, null);
    } else {
      const root = path.dirname(abs);
      const rel = path.basename(abs);
      const list = byRoot.get(root);
      if (list === null) continue;
      byRoot.set(root, [...(list ?? []), rel]);
    }
  }
  return [...byRoot.entries()].map(([root, only]) => ({ root, only }));
}

