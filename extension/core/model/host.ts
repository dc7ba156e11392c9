/**
 * What the core needs from its host (the CLI, the language server, a test), as small
 * interfaces. The core itself never touches a file system.
 *
 * Paths are notebook-root-relative, `/`-separated, never starting with `/` or containing `..`.
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
  constructor(private readonly files: ReadonlyMap<string, string> = new Map()) {}

  readDataFile(path: string, maxBytes: number): DataFileRead {
    const text = this.files.get(path);
    if (text === undefined) return { ok: false, reason: 'missing' };
    if (text.length > maxBytes) return { ok: false, reason: 'too-large', size: text.length };
    return { ok: true, text };
  }
}
