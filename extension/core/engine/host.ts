/**
 * What the engine may ask of its host (the CLI, the language server, a test), as one small
 * interface. The core itself never touches a file system.
 *
 * Paths are notebook-root-relative, `/`-separated, never starting with `/` or containing `..`.
 * A host that watches files pushes data files to the engine instead (`Notebook.setDataFile`);
 * the engine asks the host only for a data file it has never been given.
 */

export type DataFileRead =
  | { readonly ok: true; readonly text: string }
  | { readonly ok: false; readonly reason: 'missing' | 'too-large' | 'outside-root' | 'unreadable'; readonly size?: number; readonly detail?: string };

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
