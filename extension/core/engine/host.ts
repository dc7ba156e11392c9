/**
 * What the engine may ask of its host (the CLI, the language server, a test), as one small
 * interface. The core itself never touches a file system.
 *
 * Paths are notebook-root-relative, `/`-separated, never starting with `/` or containing `..`.
 * A host that watches files pushes data files to the engine instead (`Notebook.setDataFile`);
 * the engine asks the host only for a data file it has never been given.
 */

/**
 * Notebook (markdown) files larger than this are refused with a `file.too-large` diagnostic:
 * a host checks the size before it reads the file, and the engine refuses longer text.
 */
export const MAX_NOTEBOOK_FILE_BYTES = 16 * 1024 * 1024;

/** Why a notebook file has no text: it cannot be read, or it is larger than the limit. */
export type NotebookFileFailure = { readonly reason: 'unreadable'; readonly detail: string } | { readonly reason: 'too-large'; readonly size: number; readonly limit: number };

export type DataFileRead =
  | { readonly ok: true; readonly text: string }
  | { readonly ok: false; readonly reason: 'missing' | 'too-large' | 'outside-root' | 'folder' | 'unreadable'; readonly size?: number; readonly detail?: string };

export interface NotebookHost {
  /**
   * Reads a data file. The host must refuse a file whose real location (after symbolic links)
   * lies outside the notebook root, and one larger than `maxBytes`, without reading it whole.
   */
  readDataFile(path: string, maxBytes: number): DataFileRead;
}

/** A host for notebooks whose data files live in memory (tests, untitled documents). */
export class InMemoryHost implements NotebookHost {
  /** Every path asked for, in order: a test can say "this edit read nothing". */
  readonly reads: string[] = [];

  constructor(private readonly files: ReadonlyMap<string, string> = new Map()) {}

  readDataFile(path: string, maxBytes: number): DataFileRead {
    this.reads.push(path);
    const text = this.files.get(path);
    if (text === undefined) return { ok: false, reason: 'missing' };
    if (text.length > maxBytes) return { ok: false, reason: 'too-large', size: text.length };
    return { ok: true, text };
  }
}

/** A host with no files: everything is pushed (`setDataFile`) or missing. */
export const NO_FILES: NotebookHost = { readDataFile: () => ({ ok: false, reason: 'missing' }) };
