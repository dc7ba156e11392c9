/**
 * What the engine reports: plain, serialisable data (no classes, no closures). Spans are 0-based
 * offsets into the file's BOM-stripped text, end-exclusive; hosts convert them at their edge.
 */
import type { BlockKind } from './blockKind.js';
import type { Diagnostic } from './diagnostic.js';
import type { FigureData } from './figure.js';
import type { Quantity } from './quantity.js';
import type { Results } from './result.js';
import type { Span } from './span.js';

export interface BlockReport {
  readonly kind: BlockKind;
  readonly id: string | null;
  /** Absolute span of the block in its file, from the first fence character to the end of the closing fence. */
  readonly span: Span;
  /** The block's metadata as written (YAML turned into plain JSON values). */
  readonly metadata: Readonly<Record<string, unknown>>;
  /** Quantities found in the metadata, by JSON pointer (`/rate`), in canonical units. */
  readonly quantities: Readonly<Record<string, Quantity>>;
  readonly results: Results;
  readonly diagnostics: readonly Diagnostic[];
  /** What the block's chart shows, when its analysis produced one. */
  readonly figure?: FigureData;
  /** When the block's data table had errors: its first lines as they were read, to show beside the findings. */
  readonly tableExcerpt?: TableExcerpt;
}

/** Lines of a data table as read (decoded, before any parsing): from its header, or from its first problem when that lies further down. */
export interface TableExcerpt {
  /** The data file's path relative to the notebook root, or null for an inline table. */
  readonly path: string | null;
  /** 0-based line of the first excerpt line: in the data file, or in the notebook file for an inline table. */
  readonly firstLine: number;
  /** The lines, a very long one cut (ending in "…"). */
  readonly lines: readonly string[];
  /** Each line's length as read, in UTF-16 code units, for a line that was cut. */
  readonly lengths?: readonly number[];
}

export interface FileReport {
  readonly path: string;
  /**
   * The notebook folder `path` is relative to, set only where one report joins several folders
   * (the CLI's report): ids are unique within a folder, so a film is known by folder and id.
   */
  readonly root?: string;
  /** The file's text, BOM removed: the text every span points into. */
  readonly text: string;
  readonly blocks: readonly BlockReport[];
  /** Diagnostics that belong to no block. */
  readonly diagnostics: readonly Diagnostic[];
}

export interface NotebookReport {
  readonly files: readonly FileReport[];
}
