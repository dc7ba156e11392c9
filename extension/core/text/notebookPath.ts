/**
 * Notebook paths: root-relative and `/`-separated. Resolving a data path written in a notebook
 * file is purely lexical here; symbolic links are the host's to check.
 */

/** Why a path is refused: absolute, leading outside the root, blank, or naming a folder (`.`, `sub/..`). */
export type PathResolution = { readonly ok: true; readonly path: string } | { readonly ok: false; readonly reason: 'absolute' | 'outside' | 'empty' | 'folder' };

/** The folder part of a root-relative file path ('' for a file at the root). */
export function dirnameOf(path: string): string {
  const i = path.lastIndexOf('/');
  return i < 0 ? '' : path.slice(0, i);
}

/**
 * Resolves `written` against the folder of `fromFile`; refuses absolute paths and escapes. Only a
 * whole `..` segment leads up: `..x.csv` is a file name like any other.
 */
export function resolveNotebookPath(fromFile: string, written: string): PathResolution {
  const w = written.trim().replace(/\\/g, '/');
  if (w.length === 0) return { ok: false, reason: 'empty' };
  if (w.startsWith('/') || /^[A-Za-z]:\//.test(w) || /^[a-z][a-z0-9+.-]*:/i.test(w)) return { ok: false, reason: 'absolute' };
  const parts: string[] = dirnameOf(fromFile).split('/').filter((p) => p.length > 0);
  for (const seg of w.split('/')) {
    if (seg === '' || seg === '.') continue;
    if (seg === '..') {
      if (parts.length === 0) return { ok: false, reason: 'outside' };
      parts.pop();
    } else {
      parts.push(seg);
    }
  }
  if (parts.length === 0) return { ok: false, reason: 'folder' };
  return { ok: true, path: parts.join('/') };
}
