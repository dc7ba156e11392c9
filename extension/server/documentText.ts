/**
 * A notebook file's text as the editor holds it, and the conversion between the engine's offsets
 * (0-based, into the text without its byte-order mark) and LSP positions (into the text as the
 * editor has it). The one place in the server where coordinates change convention.
 */
import type { Position, Range } from 'vscode-languageserver';
import { LineIndex, type Span } from '../core/index.js';

/** Positions of an open document, kept up to date by its incremental changes (`TextDocument`). */
export interface PositionSource {
  positionAt(offset: number): Position;
  offsetAt(position: Position): number;
}

export class DocumentText {
  /** 1 when the editor's text starts with a byte-order mark (the engine's offsets do not count it). */
  readonly bom: number;
  private index: LineIndex | undefined;

  constructor(
    readonly raw: string,
    private readonly source?: PositionSource,
  ) {
    this.bom = raw.charCodeAt(0) === 0xfeff ? 1 : 0;
  }

  /** Line starts, found on first use (a keystroke in a large file needs none until a request). */
  get lines(): LineIndex {
    return (this.index ??= new LineIndex(this.raw));
  }

  /** The text the engine sees. */
  get text(): string {
    return this.bom ? this.raw.slice(1) : this.raw;
  }

  /** The line break the file uses, for inserted text: `\r\n` when its first line ends so. */
  get eol(): string {
    const i = this.raw.indexOf('\n');
    return i > 0 && this.raw.charCodeAt(i - 1) === 13 ? '\r\n' : '\n';
  }

  position(offset: number): Position {
    return this.source ? this.source.positionAt(offset + this.bom) : this.lines.positionAt(offset + this.bom);
  }

  range(span: Span): Range {
    return { start: this.position(span.start), end: this.position(span.end) };
  }

  offset(position: Position): number {
    return Math.max(0, (this.source ? this.source.offsetAt(position) : this.lines.offsetAt(position)) - this.bom);
  }

  /** The text of a 0-based line, without its line break. */
  lineText(line: number): string {
    return this.raw.slice(this.lines.lineStart(line), this.lines.lineEnd(line));
  }
}
