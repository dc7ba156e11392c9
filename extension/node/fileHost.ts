/**
 * The NotebookHost of the CLI and the server: data files from disk, confined to the notebook root
 * (real paths), decoded from their bytes (dataFileText.ts: UTF-8, UTF-16, Windows-1252).
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import type { DataFileRead, NotebookHost } from '../core/index.js';
import { decodeDataBytes } from './dataFileText.js';
import { isInside } from './insidePath.js';
import { fileTypeName, ioErrorText } from './notebookText.js';

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
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      // A missing file, or a path through something that is not a folder: it does not exist.
      if (code === 'ENOENT' || code === 'ENOTDIR') return { ok: false, reason: 'missing' };
      return { ok: false, reason: 'unreadable', detail: ioErrorText(e) };
    }
    if (!isInside(this.realRoot, real)) return { ok: false, reason: 'outside-root' };
    try {
      const stat = fs.statSync(real);
      if (stat.isDirectory()) return { ok: false, reason: 'folder' };
      if (!stat.isFile()) return { ok: false, reason: 'unreadable', detail: `it is ${fileTypeName(stat)}, not a regular file` };
      if (stat.size > maxBytes) return { ok: false, reason: 'too-large', size: stat.size };
      // Instrument exports come in UTF-8, UTF-16 or Windows-1252: decoded by their bytes.
      const decoded = decodeDataBytes(fs.readFileSync(real));
      return decoded.ok ? { ok: true, text: decoded.text } : { ok: false, reason: 'unreadable', detail: decoded.detail };
    } catch (e) {
      return { ok: false, reason: 'unreadable', detail: ioErrorText(e) };
    }
  }
}
