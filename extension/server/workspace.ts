/**
 * The server's view of the notebooks: one engine per workspace folder (a file outside every
 * folder uses its own folder), the texts of open documents (which win over the disk), and the
 * files on disk, followed through watched-file events.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { URI } from 'vscode-uri';
import { MAX_DATA_FILE_BYTES, Notebook, type NotebookOptions } from '../core/index.js';
import { markdownFiles } from '../node/discovery.js';
import { FileHost } from '../node/fileHost.js';
import { readNotebookFile } from '../node/notebookText.js';
import { DocumentText, type PositionSource } from './documentText.js';

export interface Folder {
  /** Absolute path of the notebook root. */
  readonly root: string;
  readonly engine: Notebook;
  /** A folder made for files outside every workspace folder: only its own markdown files are read. */
  readonly lone: boolean;
}

/** A notebook file, located: its folder and its root-relative path. */
export interface Place {
  readonly folder: Folder;
  readonly rel: string;
}

export interface OpenDocument {
  readonly text: DocumentText;
  readonly version: number;
}

const MARKDOWN = /\.(md|markdown)$/i;

export function uriToPath(uri: string): string | null {
  if (!uri.startsWith('file:')) return null;
  try {
    return URI.parse(uri).fsPath;
  } catch {
    return null;
  }
}

/** A file URI written as VS Code writes it (every reserved character escaped), so that strings compare. */
export function pathToUri(p: string): string {
  return URI.file(p).toString();
}

/** The canonical spelling of a document URI. */
export function canonicalUri(uri: string): string {
  const p = uriToPath(uri);
  return p === null ? uri : pathToUri(p);
}

export class Workspace {
  private readonly folders: Folder[] = [];
  private readonly lone = new Map<string, Folder>();
  private readonly open = new Map<string, OpenDocument>();
  /** Texts of files read from disk (for positions in files that are not open). */
  private readonly disk = new Map<string, DocumentText>();
  private options: NotebookOptions = {};

  constructor(private readonly log: (message: string) => void) {}

  setOptions(options: NotebookOptions): void {
    this.options = options;
    for (const f of this.allFolders()) f.engine.setOptions(options);
  }

  allFolders(): Folder[] {
    return [...this.folders, ...this.lone.values()];
  }

  /** Adds a workspace folder and reads its notebook files; `progress` hears of each file. */
  addFolder(root: string, progress?: (done: number, total: number) => void): Folder {
    const folder: Folder = { root, engine: new Notebook(new FileHost(root), this.options), lone: false };
    this.folders.push(folder);
    // Files opened before their folder was known were given a folder of their own: it goes.
    for (const dir of [...this.lone.keys()]) {
      const rel = path.relative(root, dir);
      if (rel === '' || (!rel.startsWith('..') && !path.isAbsolute(rel))) this.lone.delete(dir);
    }
    this.folders.sort((a, b) => b.root.length - a.root.length);
    const files = markdownFiles(root);
    files.forEach((rel, i) => {
      progress?.(i, files.length);
      this.loadFromDisk(folder, rel);
    });
    // Documents open in the editor belong to the new folder now, with the editor's text.
    for (const [uri, doc] of this.open) {
      const place = this.placeOf(uri);
      if (place?.folder === folder) folder.engine.setFile(place.rel, doc.text.raw);
    }
    return folder;
  }

  removeFolder(root: string): void {
    const i = this.folders.findIndex((f) => f.root === root);
    if (i >= 0) this.folders.splice(i, 1);
  }

  /** The folder and relative path of a file URI (creating a folder for a lone file). */
  placeOf(uri: string): Place | null {
    const p = uriToPath(uri);
    if (p === null) return null;
    for (const folder of this.folders) {
      const rel = path.relative(folder.root, p);
      if (rel !== '' && !rel.startsWith('..') && !path.isAbsolute(rel)) return { folder, rel: rel.split(path.sep).join('/') };
    }
    const dir = path.dirname(p);
    let folder = this.lone.get(dir);
    if (!folder) {
      folder = { root: dir, engine: new Notebook(new FileHost(dir), this.options), lone: true };
      this.lone.set(dir, folder);
      for (const rel of this.siblingsOf(dir)) this.loadFromDisk(folder, rel);
    }
    return { folder, rel: path.basename(p) };
  }

  uriOf(folder: Folder, rel: string): string {
    return pathToUri(path.join(folder.root, ...rel.split('/')));
  }

  /** The text of a notebook file as the editor or the disk has it. */
  textOf(uri: string): DocumentText | undefined {
    const key = canonicalUri(uri);
    return this.open.get(key)?.text ?? this.disk.get(key);
  }

  versionOf(uri: string): number | null {
    return this.open.get(canonicalUri(uri))?.version ?? null;
  }

  isOpen(uri: string): boolean {
    return this.open.has(canonicalUri(uri));
  }

  openUris(): string[] {
    return [...this.open.keys()];
  }

  didOpen(uri: string, text: string, version: number, positions?: PositionSource): Place | null {
    this.open.set(canonicalUri(uri), { text: new DocumentText(text, positions), version });
    const place = this.placeOf(uri);
    place?.folder.engine.setFile(place.rel, text);
    return place;
  }

  didChange(uri: string, text: string, version: number, positions?: PositionSource): Place | null {
    return this.didOpen(uri, text, version, positions);
  }

  /** A closed document falls back to the disk's text (or leaves the notebook if it is gone). */
  didClose(uri: string): Place | null {
    this.open.delete(canonicalUri(uri));
    const place = this.placeOf(uri);
    if (place) this.loadFromDisk(place.folder, place.rel);
    return place;
  }

  /**
   * A file changed on disk. Markdown files are notebook files (unless open: the editor's text
   * wins); anything else may be a data file. Returns the notebook files whose results may change.
   */
  diskChanged(rawUri: string, deleted: boolean): Place[] {
    const uri = canonicalUri(rawUri);
    const p = uriToPath(uri);
    if (p === null) return [];
    const touched: Place[] = [];
    for (const folder of this.allFolders()) {
      const rel = path.relative(folder.root, p).split(path.sep).join('/');
      if (rel === '' || rel.startsWith('..') || path.isAbsolute(rel)) continue;
      if (MARKDOWN.test(rel)) {
        if (folder.lone && rel.includes('/')) continue;
        // Discovery never reads tool folders or hidden files; neither do file events.
        if (rel.split('/').some((seg) => seg.startsWith('.') || seg === 'node_modules')) continue;
        if (this.open.has(uri)) continue;
        if (deleted) {
          folder.engine.deleteFile(rel);
          this.disk.delete(uri);
        } else {
          this.loadFromDisk(folder, rel);
        }
        touched.push({ folder, rel });
      } else {
        if (deleted) {
          // A folder deleted on disk arrives as one event for the folder: what lay in it is gone too.
          const under = `${rel}/`;
          for (const file of folder.engine.paths()) {
            if (!file.startsWith(under) || this.open.has(this.uriOf(folder, file))) continue;
            folder.engine.deleteFile(file);
            this.disk.delete(this.uriOf(folder, file));
            touched.push({ folder, rel: file });
          }
          for (const dataPath of folder.engine.dataPathsRead()) {
            if (!dataPath.startsWith(under)) continue;
            const readers = folder.engine.readersOf(dataPath);
            folder.engine.deleteDataFile(dataPath);
            for (const r of readers) touched.push({ folder, rel: r });
          }
        }
        const readers = folder.engine.readersOf(rel);
        if (readers.length === 0) continue;
        if (deleted) folder.engine.deleteDataFile(rel);
        else {
          const read = new FileHost(folder.root).readDataFile(rel, this.options.maxDataFileBytes ?? MAX_DATA_FILE_BYTES);
          folder.engine.setDataFile(rel, read.ok ? read.text : read);
        }
        for (const r of readers) touched.push({ folder, rel: r });
      }
    }
    return touched;
  }

  private loadFromDisk(folder: Folder, rel: string): void {
    const uri = this.uriOf(folder, rel);
    if (this.open.has(uri)) return;
    // Decoded as notebooks are everywhere (UTF-8, UTF-16 with a BOM), size checked before reading.
    const read = readNotebookFile(path.join(folder.root, ...rel.split('/')));
    if (read.ok) {
      this.disk.set(uri, new DocumentText(read.text));
      folder.engine.setFile(rel, read.text);
    } else {
      this.log(`cannot read ${rel}: ${read.failure.reason}`);
      this.disk.delete(uri);
      folder.engine.setFileFailure(rel, read.failure);
    }
  }

  private siblingsOf(dir: string): string[] {
    try {
      return fs
        .readdirSync(dir, { withFileTypes: true })
        .filter((e) => e.isFile() && MARKDOWN.test(e.name))
        .map((e) => e.name)
        .sort();
    } catch {
      return [];
    }
  }
}
