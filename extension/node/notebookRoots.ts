/**
 * Notebook roots on disk: which folder is the root of the notebook a path belongs to, and how a
 * root is read into an engine. Shared by the CLI and the language server.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { Notebook, type NotebookReport } from '../core/index.js';
import { markdownFiles } from './discovery.js';
import { FileHost } from './fileHost.js';
import { isInside } from './insidePath.js';
import { fileTypeName, ioErrorText, readNotebookFile } from './notebookText.js';

/** A path argument that names no notebook (missing, outside the given root, not a file or folder). */
export class RootError extends Error {}

export interface RootRun {
  readonly root: string;
  readonly report: NotebookReport;
  /** Tool folders (hidden ones, node_modules) skipped when looking for notebook files, root-relative. */
  readonly skipped: readonly string[];
}

export interface LoadProgress {
  update(done: number, total: number, label: string): void;
  done(): void;
}

/**
 * Reads a root into an engine and analyses it: every markdown file below it, and the files named
 * in `only` whatever their name (an explicit `.txt`, a symbolic link checked by `rootsOf`).
 */
export function loadRoot(root: string, only: readonly string[] | null, progress?: LoadProgress): RootRun {
  const host = new FileHost(root);
  const notebook = new Notebook(host);
  const skipped: string[] = [];
  const found = markdownFiles(root, skipped);
  const known = new Set(found);
  const files = [...found, ...[...new Set(only ?? [])].filter((rel) => !known.has(rel))];
  for (const [i, rel] of files.entries()) {
    progress?.update(i, files.length, rel);
    const read = readNotebookFile(path.join(root, ...rel.split('/')));
    if (read.ok) notebook.setFile(rel, read.text);
    else notebook.setFileFailure(rel, read.failure);
  }
  progress?.done();
  return { root, report: notebook.analyze(only ? [...new Set(only)] : undefined), skipped };
}

/** The file or folder a path argument names, checked: it exists, and it is a regular file or a folder. */
function statArgument(p: string, abs: string): fs.Stats {
  try {
    const stat = fs.statSync(abs);
    if (!stat.isFile() && !stat.isDirectory()) throw new RootError(`${p} is ${fileTypeName(stat)}, not a notebook file or folder; name a markdown file or a folder`);
    return stat;
  } catch (e) {
    if (e instanceof RootError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'ENOTDIR') {
      let dangling = false;
      try {
        dangling = fs.lstatSync(abs).isSymbolicLink();
      } catch {
        // not there at all
      }
      throw new RootError(dangling ? `${p}: a symbolic link to a file that does not exist` : `${p}: no such file or folder`);
    }
    throw new RootError(`${p}: ${ioErrorText(e)}`);
  }
}

/** Refuses a path whose real location (after symbolic links) lies outside its notebook root. */
function checkInsideRoot(p: string, abs: string, root: string): void {
  let real: string;
  let realRoot: string;
  try {
    real = fs.realpathSync(abs);
    realRoot = fs.realpathSync(root);
  } catch (e) {
    throw new RootError(`${p}: ${ioErrorText(e)}`);
  }
  if (!isInside(realRoot, real)) throw new RootError(`${p} is a symbolic link that leads outside its notebook folder (${root}); name the file where it lies`);
}

/**
 * Groups paths into notebook roots: a folder is a root; a file belongs to its own folder as root,
 * unless `rootOption` names the notebook folder, which then holds every path. A file named here
 * is read whatever its extension; a symbolic link is followed when it stays inside the root; a
 * FIFO, socket or device is refused.
 */
export function rootsOf(paths: readonly string[], cwd: string, rootOption?: string): Array<{ readonly root: string; readonly only: string[] | null }> {
  const byRoot = new Map<string, string[] | null>();
  const explicitRoot = rootOption ? path.resolve(cwd, rootOption) : null;
  if (explicitRoot && !fs.existsSync(explicitRoot)) throw new RootError(`--root ${rootOption}: no such folder`);
  if (explicitRoot && !fs.statSync(explicitRoot).isDirectory()) throw new RootError(`--root ${rootOption}: not a folder`);
  for (const p of paths) {
    const abs = path.resolve(cwd, p);
    const stat = statArgument(p, abs);
    if (explicitRoot) {
      if (!isInside(explicitRoot, abs)) throw new RootError(`${p} is not inside --root ${rootOption}`);
      checkInsideRoot(p, abs, explicitRoot);
      const rel = path.relative(explicitRoot, abs).split(path.sep).join('/');
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
      checkInsideRoot(p, abs, root);
      const rel = path.basename(abs);
      const list = byRoot.get(root);
      if (list === null) continue;
      byRoot.set(root, [...(list ?? []), rel]);
    }
  }
  return [...byRoot.entries()].map(([root, only]) => ({ root, only }));
}
