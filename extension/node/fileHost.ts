/** The NotebookHost of the CLI and the server: data files from disk, confined to the notebook root (real paths). */
import * as fs from 'node:fs';
import * as path from 'node:path';
import type { DataFileRead, NotebookHost } from '../core/index.js';

export class FileHost implements NotebookHost {
  private readonly realRoot: string;

  constructor(readonly root: string) {
    this.realRoot = fs.realpathSync(root);
  }

  readDataFile(relative: string, maxBytes: number): DataFileRead {
    const full = path.join(this.root, ...relative.split('/'));
    let real: string;
    try {
      real = fs.realpathSync(full);
    } catch {
      return { ok: false, reason: 'missing' };
    }
    const rel = path.relative(this.realRoot, real);
    if (rel.startsWith('..') || path.isAbsolute(rel)) return { ok: false, reason: 'outside-root' };
    try {
      const stat = fs.statSync(real);
      if (!stat.isFile()) return { ok: false, reason: 'unreadable', detail: 'not a regular file' };
      if (stat.size > maxBytes) return { ok: false, reason: 'too-large', size: stat.size };
      return { ok: true, text: fs.readFileSync(real, 'utf8') };
    } catch (e) {
      return { ok: false, reason: 'unreadable', detail: e instanceof Error ? e.message : String(e) };
    }
  }
}
