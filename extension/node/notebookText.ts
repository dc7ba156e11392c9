/**
 * Reads a notebook (markdown) file from disk: the one place where bytes become the text the
 * engine sees, shared by the CLI and the test loader (and meant for the language server's reads
 * from disk too).
 *
 * - UTF-8, with or without a byte-order mark; UTF-16 little- or big-endian with its BOM. A BOM
 *   written twice (an editor saving a file that already had one) is removed too.
 * - UTF-32 is refused by name (its BOM starts like UTF-16's).
 * - Only a regular file is read: a FIFO, socket or device is refused without waiting on it.
 * - A file larger than the limit is refused from its size, without reading it.
 */
import * as fs from 'node:fs';
import { MAX_NOTEBOOK_FILE_BYTES, type NotebookFileFailure } from '../core/index.js';
import { decodeTextBytes } from './textBytes.js';

export type NotebookTextRead = { readonly ok: true; readonly text: string } | { readonly ok: false; readonly failure: NotebookFileFailure };

/** The text of a notebook file's bytes (UTF-8, or UTF-16 with its byte-order mark), BOMs removed, or why it cannot be decoded. */
export function decodeNotebookBytes(bytes: Uint8Array): { readonly ok: true; readonly text: string } | { readonly ok: false; readonly detail: string } {
  const decoded = decodeTextBytes(bytes);
  return decoded.ok ? { ok: true, text: decoded.text } : decoded;
}

/** What an operating-system error means, in words: "permission denied", "the name is too long". */
export function ioErrorText(e: unknown): string {
  const code = (e as NodeJS.ErrnoException | undefined)?.code;
  switch (code) {
    case 'ENOENT':
      return 'no such file';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'ENAMETOOLONG':
      return 'the name is too long for the file system';
    case 'ELOOP':
      return 'too many levels of symbolic links';
    case 'EISDIR':
      return 'it is a folder';
    case 'ENOTDIR':
      return 'a part of the path is not a folder';
    case 'ENOSPC':
      return 'no space left on the device';
    case 'EROFS':
      return 'the file system is read-only';
    case 'EMFILE':
    case 'ENFILE':
      return 'too many open files';
    case 'EIO':
      return 'input/output error';
    default:
      return e instanceof Error ? e.message : String(e);
  }
}

/** Reads and decodes one notebook file (a full path), or says why it cannot be. */
export function readNotebookFile(file: string, maxBytes = MAX_NOTEBOOK_FILE_BYTES): NotebookTextRead {
  let fd: number;
  try {
    // Non-blocking, so that opening a FIFO returns at once (and is then refused) instead of waiting for a writer.
    fd = fs.openSync(file, fs.constants.O_RDONLY | (fs.constants.O_NONBLOCK ?? 0));
  } catch (e) {
    return { ok: false, failure: { reason: 'unreadable', detail: ioErrorText(e) } };
  }
  try {
    const stat = fs.fstatSync(fd);
    if (!stat.isFile()) return { ok: false, failure: { reason: 'unreadable', detail: `it is not a regular file (${fileTypeName(stat)})` } };
    if (stat.size > maxBytes) return { ok: false, failure: { reason: 'too-large', size: stat.size, limit: maxBytes } };
    const decoded = decodeNotebookBytes(fs.readFileSync(fd));
    return decoded.ok ? decoded : { ok: false, failure: { reason: 'unreadable', detail: decoded.detail } };
  } catch (e) {
    return { ok: false, failure: { reason: 'unreadable', detail: ioErrorText(e) } };
  } finally {
    fs.closeSync(fd);
  }
}

/** What kind of file a non-regular file is, in words. */
export function fileTypeName(stat: fs.Stats): string {
  if (stat.isDirectory()) return 'a folder';
  if (stat.isFIFO()) return 'a FIFO';
  if (stat.isSocket()) return 'a socket';
  if (stat.isCharacterDevice() || stat.isBlockDevice()) return 'a device';
  if (stat.isSymbolicLink()) return 'a symbolic link';
  return 'not a regular file';
}
