/**
 * Finds fenced code blocks in markdown by the CommonMark 0.31 block-structure rules, without
 * building a syntax tree.
 *
 * Method: the two-phase line algorithm of the CommonMark specification, appendix "A parsing
 * strategy" (https://spec.commonmark.org/0.31.2/#appendix-a-parsing-strategy): each line is
 * matched against the open containers (block quotes, lists, list items), then new block starts
 * are tried. Only what decides where a fence can open or close is modelled: containers, fenced
 * and indented code, HTML blocks, paragraphs (lazy continuation, interruption rules), headings
 * and thematic breaks. Tabs count to the next multiple of 4 columns; a tab partly used by a
 * container marker contributes spaces to the content, as the specification requires.
 *
 * Cost: linear in the length of the text, however deep the nesting (the tests time the shapes of
 * cmark's pathological-input tests). A line is matched against the open
 * containers it continues, each of which takes at least one of its characters, except on a blank
 * line, which continues them all in one step; and no test on a line starts over for every
 * container marker on it: patterns run from a position in the line, the next non-space character
 * is remembered, and a line's thematic-break shape is worked out once.
 *
 * Input policy: any string; an empty string has no blocks. The text must already have its BOM
 * removed (`stripBom`). Never throws.
 *
 * Positions follow mdast: a block starts at its first fence character and ends after its
 * closing fence, or after its last content line when a container closes it, or at the end of
 * the document when it is never closed.
 */
import { decodeInfoString } from './infoString.js';
import { BodyLines, ContiguousLines, type BodyLine, type BodyLineList } from '../text/bodyMap.js';
import type { Span } from '../text/positions.js';

/** One line of a block's body as it maps back into the source. */
export type { BodyLine, BodyLineList };

export interface FencedBlock {
  /** From the first fence character to the end of the block (see the file comment). */
  readonly span: Span;
  /** The raw info string, trimmed, as written (before escapes are decoded). */
  readonly rawInfo: string;
  /** Offsets of the raw info string in the source (empty span after the fence when absent). */
  readonly infoSpan: Span;
  /** First word of the decoded info string, or null. */
  readonly lang: string | null;
  /** The rest of the decoded info string, or null. */
  readonly meta: string | null;
  readonly fenceChar: '`' | '~';
  readonly fenceLength: number;
  readonly bodyLines: BodyLineList;
  /** The body text: body lines joined by `\n`. */
  readonly body: string;
  readonly closed: boolean;
  /** The fence lies inside a block quote or a list item (not directly in the document). */
  readonly nested: boolean;
}

/** Why an open fence is being closed by its container: a new container, or anything else. */
type CloseCause = 'container' | 'leaf';

type ContainerKind = 'document' | 'quote' | 'list' | 'item';
type LeafKind = 'paragraph' | 'fenced' | 'indented' | 'html';

interface ListData {
  readonly bullet: string;
  readonly ordered: boolean;
  readonly delimiter: string;
  readonly markerOffset: number;
  readonly padding: number;
}

interface Container {
  readonly kind: ContainerKind;
  readonly list?: ListData;
  /** An item that began with a blank line and still has no content cannot take more lines. */
  hasContent: boolean;
  /** Index of the innermost item among this container and those it sits in, or -1. */
  readonly itemIndex: number;
  /** Total width (marker offset and padding) of the items among this container and those it sits in. */
  readonly itemWidths: number;
}

interface OpenFence {
  readonly start: number;
  readonly fenceChar: '`' | '~';
  readonly fenceLength: number;
  readonly fenceIndent: number;
  readonly rawInfo: string;
  readonly untrimmedInfo: string;
  readonly infoSpan: Span;
  /** Where its lines begin in the scanner's line store (the open fence's lines are its tail). */
  readonly first: number;
  /** Every line so far starts right after the line break ending the one before, with no pad: the body is one slice of the text. */
  contiguous: boolean;
  readonly nested: boolean;
  /** End of the opening fence line. */
  readonly openEnd: number;
  /** End of the last line that belongs to the block. */
  lastEnd: number;
}

interface Leaf {
  readonly kind: LeafKind;
  readonly htmlType?: number;
  readonly fence?: OpenFence;
}

const CODE_INDENT = 4;
/** A character that may start a block other than a paragraph. */
const MAYBE_SPECIAL = /[#`~*+_=<>0-9-]/;
const FENCE_CLOSE = /^(?:`{3,}|~{3,})(?=[ \t]*$)/;
// Sticky patterns run at `lastIndex` in the whole line (`testAt`), so that the line is not
// sliced again for every container marker on it.
const ATX_HEADING = /#{1,6}(?:[ \t]+|$)/y;
const SETEXT_UNDERLINE = /(?:=+|-+)[ \t]*$/y;
const ORDERED_MARKER = /(\d{1,9})([.)])/y;

const HTML_BLOCK_OPEN: readonly RegExp[] = [
  /./, // unused: block types count from 1
  /^<(?:script|pre|textarea|style)(?:\s|>|$)/i,
  /^<!--/,
  /^<[?]/,
  /^<![A-Za-z]/,
  /^<!\[CDATA\[/,
  /^<[/]?(?:address|article|aside|base|basefont|blockquote|body|caption|center|col|colgroup|dd|details|dialog|dir|div|dl|dt|fieldset|figcaption|figure|footer|form|frame|frameset|h[123456]|head|header|hr|html|iframe|legend|li|link|main|menu|menuitem|nav|noframes|ol|optgroup|option|p|param|search|section|summary|table|tbody|td|tfoot|th|thead|title|tr|track|ul)(?:\s|[/]?[>]|$)/i,
  // eslint-disable-next-line no-control-regex -- CommonMark's unquoted attribute value excludes U+0000–U+0020
  /^(?:<[A-Za-z][A-Za-z0-9-]*(?:\s+[a-zA-Z_:][a-zA-Z0-9:._-]*(?:\s*=\s*(?:[^"'=<>`\x00-\x20]+|'[^']*'|"[^"]*"))?)*\s*\/?>|<\/[A-Za-z][A-Za-z0-9-]*\s*[>])\s*$/i,
];

const HTML_BLOCK_CLOSE: readonly (RegExp | null)[] = [
  null,
  /<\/(?:script|pre|textarea|style)>/i,
  /-->/,
  /\?>/,
  />/,
  /\]\]>/,
  null,
  null,
];

function isSpaceOrTab(c: string | undefined): boolean {
  return c === ' ' || c === '\t';
}

/** The text without leading and trailing spaces and tabs (other white space stays). */
function trimSpaceTab(text: string): string {
  let a = 0;
  let b = text.length;
  while (a < b && isSpaceOrTab(text[a])) a++;
  while (b > a && isSpaceOrTab(text[b - 1])) b--;
  return text.slice(a, b);
}

/** Runs a sticky pattern at a position of a line. */
function testAt(pattern: RegExp, line: string, at: number): RegExpExecArray | null {
  pattern.lastIndex = at;
  return pattern.exec(line);
}

/**
 * Where a thematic break made of `marker` may start on a line: from `from` on, the line holds
 * only the marker, spaces and tabs, and the marker at least three times when the break starts
 * at or before `third`.
 */
interface BreakShape {
  readonly from: number;
  readonly third: number;
}

function breakShape(line: string, marker: string): BreakShape {
  let count = 0;
  let third = -1;
  let i = line.length - 1;
  for (; i >= 0; i--) {
    const c = line[i];
    if (c === marker) {
      if (++count === 3) third = i;
    } else if (!isSpaceOrTab(c)) break;
  }
  return { from: i + 1, third };
}

/** Scans a document and returns its fenced code blocks in document order. */
export function scanFencedBlocks(text: string): FencedBlock[] {
  return new FenceScanner(text).run();
}

class FenceScanner {
  private readonly blocks: FencedBlock[] = [];
  private readonly containers: Container[] = [{ kind: 'document', list: undefined, hasContent: true, itemIndex: -1, itemWidths: 0 }];
  /** Indices of the containers a blank line cannot continue (block quotes, items without content), ascending. */
  private readonly blankStops: number[] = [];
  private leaf: Leaf | null = null;
  /** Lines of the open fence (the scanner's one store; a finished block takes a copy of its own). */
  private readonly lines = new BodyLines();

  // Per-line cursor, as in the specification's reference parser.
  private line = '';
  private lineStart = 0;
  private lineEnd = 0;
  private offset = 0;
  private column = 0;
  private partiallyConsumedTab = false;
  private nextNonspace = 0;
  private nextNonspaceColumn = 0;
  private indent = 0;
  private indented = false;
  private blank = false;
  /** The last findNextNonspace scanned [nonspaceFrom, nextNonspace) of this line; -1: none yet. */
  private nonspaceFrom = -1;
  /** Thematic-break shapes of the current line, by marker, worked out when first asked. */
  private breakShapes = new Map<string, BreakShape>();
  private pendingInfo = '';
  /** Containers were closed on the current line. */
  private closedThisLine = false;
  /** The open indented code began just after containers closed and has had only blank lines since. */
  private indentedAfterExit = false;
  /** The fence's own indentation was removed from the current line. */
  private fenceIndentRemoved = false;

  constructor(private readonly text: string) {}

  run(): FencedBlock[] {
    // Lines [start, end) without their break (LF, CR or CR LF).
    const text = this.text;
    // Line feeds only: the body of a fence that sits in the document unindented can be taken a
    // run of lines at a time (`bodyRun`).
    const feedsOnly = text.indexOf('\r') < 0;
    const lastLineStart = text.lastIndexOf('\n') + 1;
    let start = 0;
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (c === 10 || c === 13) {
        this.incorporateLine(start, i);
        if (c === 13 && text.charCodeAt(i + 1) === 10) i++;
        start = i + 1;
        if (feedsOnly && this.leaf?.kind === 'fenced' && this.containers.length === 1 && this.leaf.fence!.fenceIndent === 0) {
          const next = this.bodyRun(this.leaf.fence!, start, lastLineStart);
          if (next > start) {
            start = next;
            i = next - 1;
          }
        }
      }
    }
    if (start < text.length) this.incorporateLine(start, text.length);
    // A final line break leaves an empty last line: a block quote does not continue over it,
    // so a fence inside a quote ends with its last line, not at the end of the text.
    const lastChar = this.text.charCodeAt(this.text.length - 1);
    const endsWithBreak = lastChar === 10 || lastChar === 13;
    if (endsWithBreak && this.containers.some((c) => c.kind === 'quote')) this.closeLeaf(this.text.length, 'leaf', false);
    // A last line without a break that prefixes and the fence's indentation use up entirely is,
    // for remark, no line: it is not in the body; when container prefixes alone used it up,
    // the block ends where that line starts.
    const fence = this.leaf?.kind === 'fenced' ? this.leaf.fence! : null;
    const lines = this.lines;
    const last = fence ? lines.length - 1 : -1;
    if (fence && last >= fence.first && !endsWithBreak && lines.pad(last) === 0 && lines.start(last) === lines.end(last) && lines.end(last) === this.text.length && this.lineEnd > this.lineStart) {
      lines.pop();
      if (this.containers.length > 1 && !this.fenceIndentRemoved) {
        this.leaf = null;
        this.finishFence(fence, this.lineStart, false);
      }
    }
    this.closeContainersFrom(1, this.text.length, 'leaf');
    this.closeLeaf(this.text.length);
    return this.blocks;
  }

  private peek(at: number): string | undefined {
    return at < this.line.length ? this.line[at] : undefined;
  }

  /**
   * Finds the next non-space character from the cursor. Between the cursor and the one found
   * last time there are only spaces and tabs, and a tab ends on the same column from wherever
   * it is entered, so that one is reused: a run of spaces is scanned once, not once for each
   * container that takes part of it.
   */
  private findNextNonspace(): void {
    if (this.nonspaceFrom < 0 || this.offset < this.nonspaceFrom || this.offset > this.nextNonspace) {
      let i = this.offset;
      let cols = this.column;
      let c: string | undefined;
      while ((c = this.peek(i)) !== undefined) {
        if (c === ' ') {
          i++;
          cols++;
        } else if (c === '\t') {
          i++;
          cols += 4 - (cols % 4);
        } else {
          break;
        }
      }
      this.nonspaceFrom = this.offset;
      this.nextNonspace = i;
      this.nextNonspaceColumn = cols;
    }
    this.blank = this.nextNonspace >= this.line.length;
    this.indent = this.nextNonspaceColumn - this.column;
    this.indented = this.indent >= CODE_INDENT;
  }

  /** Is the rest of the line, from `at`, a thematic break? */
  private thematicBreakAt(at: number): boolean {
    const marker = this.line[at];
    if (marker !== '*' && marker !== '_' && marker !== '-') return false;
    let shape = this.breakShapes.get(marker);
    if (!shape) {
      shape = breakShape(this.line, marker);
      this.breakShapes.set(marker, shape);
    }
    return at >= shape.from && at <= shape.third;
  }

  /** The fence that opens at `at`: three or more backticks with none after them, or tildes. */
  private fenceAt(at: number): string | null {
    const c = this.line[at];
    if (c !== '`' && c !== '~') return null;
    let end = at;
    while (this.line[end] === c) end++;
    if (end - at < 3 || (c === '`' && this.line.indexOf('`', end) >= 0)) return null;
    return this.line.slice(at, end);
  }

  private advanceNextNonspace(): void {
    this.offset = this.nextNonspace;
    this.column = this.nextNonspaceColumn;
    this.partiallyConsumedTab = false;
  }

  private advanceOffset(count: number, columns: boolean): void {
    let c: string | undefined;
    while (count > 0 && (c = this.peek(this.offset)) !== undefined) {
      if (c === '\t') {
        const charsToTab = 4 - (this.column % 4);
        if (columns) {
          this.partiallyConsumedTab = charsToTab > count;
          const charsToAdvance = charsToTab > count ? count : charsToTab;
          this.column += charsToAdvance;
          this.offset += this.partiallyConsumedTab ? 0 : 1;
          count -= charsToAdvance;
        } else {
          this.partiallyConsumedTab = false;
          this.column += charsToTab;
          this.offset += 1;
          count -= 1;
        }
      } else {
        this.partiallyConsumedTab = false;
        this.offset += 1;
        this.column += 1;
        count -= 1;
      }
    }
  }

  /**
   * A line of a fence that sits directly in the document, read without slicing it: its closing
   * fence, or a content line with the fence's indentation removed. False when the line's
   * indentation holds a tab (the general path counts its columns).
   */
  private fenceLineInDocument(fence: OpenFence, start: number, end: number): boolean {
    const text = this.text;
    let i = start;
    while (i < end && text.charCodeAt(i) === 32) i++;
    if (i < end && text.charCodeAt(i) === 9) return false;
    this.lineStart = start;
    this.lineEnd = end;
    const indent = i - start;
    if (indent <= 3 && i < end && text[i] === fence.fenceChar) {
      let j = i;
      while (j < end && text[j] === fence.fenceChar) j++;
      let k = j;
      while (k < end && (text.charCodeAt(k) === 32 || text.charCodeAt(k) === 9)) k++;
      if (k === end && j - i >= fence.fenceLength) {
        this.finishFence(fence, end, true);
        this.leaf = null;
        return true;
      }
    }
    const removed = Math.min(indent, fence.fenceIndent);
    this.fenceIndentRemoved = removed > 0;
    this.addFenceLine(fence, start + removed, 0);
    return true;
  }

  /**
   * Lines from `start` on of a fence that sits directly in the document with no indentation, in
   * a text of line feeds only, added as they are, up to the first line that may close the fence
   * (a run of its fence characters after at most three spaces) or the text's last line: every
   * line between is a body line whole, and needs no look of its own. Returns where it stopped.
   */
  private bodyRun(fence: OpenFence, start: number, lastLineStart: number): number {
    const text = this.text;
    const run = fence.fenceChar.repeat(fence.fenceLength);
    let limit = lastLineStart;
    for (let p = text.indexOf(run, start); p >= 0 && p < limit; p = text.indexOf(run, p + 1)) {
      let q = p;
      while (q > start && p - q < 4 && text.charCodeAt(q - 1) === 32) q--;
      if ((q === start || text.charCodeAt(q - 1) === 10) && p - q <= 3) {
        limit = q;
        break;
      }
    }
    if (limit <= start) return start;
    const lines = this.lines;
    let end = start;
    for (let ls = start; ls < limit; ls = end + 1) {
      end = text.indexOf('\n', ls);
      lines.push(ls, end, 0);
    }
    this.lineStart = lines.start(lines.length - 1);
    this.lineEnd = end;
    this.fenceIndentRemoved = false;
    fence.lastEnd = end;
    return limit;
  }

  private incorporateLine(start: number, end: number): void {
    if (this.containers.length === 1 && this.leaf?.kind === 'fenced' && this.fenceLineInDocument(this.leaf.fence!, start, end)) return;
    this.line = this.text.slice(start, end);
    this.lineStart = start;
    this.lineEnd = end;
    this.offset = 0;
    this.column = 0;
    this.partiallyConsumedTab = false;
    this.blank = false;
    this.nonspaceFrom = -1;
    if (this.breakShapes.size > 0) this.breakShapes = new Map();
    const leafBefore = this.leaf?.kind ?? null;
    this.closedThisLine = false;

    // Phase 1: which open containers does this line continue?
    let matched = 1;
    this.findNextNonspace();
    if (this.blank && this.containers.length > 1) {
      // A blank line continues every list, and every item with content, up to the first block
      // quote or item without content; each item takes up to its width of the white space, so
      // together they take up to the sum of their widths, in one step however deep the nesting.
      matched = this.blankStops.length > 0 ? this.blankStops[0] : this.containers.length;
      this.advanceOffset(Math.min(this.indent, this.containers[matched - 1].itemWidths), true);
    } else {
      for (; matched < this.containers.length; matched++) {
        if (!this.continues(this.containers[matched])) break;
      }
    }
    const allContainersMatched = matched === this.containers.length;

    // The open leaf may consume the line (fenced code checks its closing fence here).
    if (allContainersMatched && this.leaf) {
      const consumed = this.continueLeaf();
      if (consumed === 'closed') return;
      if (consumed === 'line') {
        this.addLineToLeaf();
        return;
      }
    }

    let containerIndex = matched - 1;
    // (remark does not count indented code that began on the previous line just after a
    // container closed.)
    const freshIndented = leafBefore === 'indented' && this.indentedAfterExit;
    const interrupting = allContainersMatched && (leafBefore === 'paragraph' || (leafBefore === 'indented' && !freshIndented));

    // Phase 2: new block starts.
    for (;;) {
      this.findNextNonspace();
      const container = this.containers[containerIndex];
      const at = this.nextNonspace;
      const first = this.line[at];
      if (!this.indented && !(first !== undefined && MAYBE_SPECIAL.test(first))) {
        this.advanceNextNonspace();
        break;
      }
      const paragraphOpen = this.leaf?.kind === 'paragraph';
      // The paragraph is "the container" when it and every container above it matched.
      const inParagraph = paragraphOpen && containerIndex === this.containers.length - 1;

      if (!this.indented && first === '>') {
        this.advanceNextNonspace();
        this.advanceOffset(1, false);
        if (isSpaceOrTab(this.peek(this.offset))) this.advanceOffset(1, true);
        this.prepareChild(containerIndex, false, 'container');
        this.pushContainer('quote');
        containerIndex = this.containers.length - 1;
        continue;
      }
      if (!this.indented && first === '#' && testAt(ATX_HEADING, this.line, at)) {
        this.prepareChild(containerIndex, false);
        return;
      }
      const fence = !this.indented ? this.fenceAt(at) : null;
      if (fence) {
        this.prepareChild(containerIndex, false);
        this.openFence(fence);
        return;
      }
      if (!this.indented && first === '<') {
        // Once a line at most: an HTML block opens here, or no other block start can.
        const rest = this.line.slice(at);
        let htmlType = 0;
        for (let t = 1; t <= 7; t++) {
          if (HTML_BLOCK_OPEN[t].test(rest) && (t < 7 || !paragraphOpen)) {
            htmlType = t;
            break;
          }
        }
        if (htmlType > 0) {
          this.prepareChild(containerIndex, false);
          const close = HTML_BLOCK_CLOSE[htmlType];
          this.leaf = close && close.test(rest) ? null : { kind: 'html', htmlType };
          return;
        }
      }
      if (!this.indented && inParagraph && testAt(SETEXT_UNDERLINE, this.line, at)) {
        this.closeLeaf(this.lineStart);
        return;
      }
      if (!this.indented && this.thematicBreakAt(at)) {
        this.prepareChild(containerIndex, false);
        return;
      }
      if (!this.indented || container.kind === 'list') {
        // As in remark (micromark): on a line that continues every container of an open
        // paragraph or indented code, every list item obeys the interruption rules (ordered
        // lists start at 1, no empty item), whichever container it opens in.
        const listData = this.parseListMarker(interrupting);
        if (listData) {
          this.truncateTo(containerIndex, 'container');
          this.closeLeaf(this.lineStart);
          const parent = this.containers[this.containers.length - 1];
          if (parent.kind !== 'list' || !listsMatch(parent.list!, listData)) {
            if (parent.kind === 'list') this.popContainers(this.containers.length - 1);
            this.markContent();
            this.pushContainer('list', listData, true);
          }
          this.pushContainer('item', listData, false);
          containerIndex = this.containers.length - 1;
          continue;
        }
      }
      if (this.indented && !paragraphOpen && !this.blank) {
        this.advanceOffset(CODE_INDENT, true);
        this.prepareChild(containerIndex, false);
        this.leaf = { kind: 'indented' };
        this.indentedAfterExit = this.closedThisLine;
        return;
      }
      this.advanceNextNonspace();
      break;
    }

    // Lazy paragraph continuation: a paragraph line that no container claimed and that starts
    // no block of its own.
    const lazy = containerIndex < this.containers.length - 1 && containerIndex === matched - 1;
    if (lazy && !this.blank && this.leaf?.kind === 'paragraph') return;

    this.truncateTo(containerIndex);
    if (this.blank || this.leaf?.kind === 'paragraph') return;
    this.prepareChild(this.containers.length - 1, false);
    this.leaf = { kind: 'paragraph' };
  }

  /**
   * Makes room for a new child of containers[index], as adding a block does in the reference
   * parser: deeper containers and the open leaf close; a list, which holds only items, closes
   * when anything else arrives.
   */
  private prepareChild(index: number, isItem: boolean, cause: CloseCause = 'leaf'): void {
    this.truncateTo(index, cause);
    this.closeLeaf(this.lineStart);
    if (!isItem && this.containers.length > 1 && this.containers[this.containers.length - 1].kind === 'list') {
      this.popContainers(this.containers.length - 1);
      this.closedThisLine = true;
    }
    this.markContent();
  }

  private openFence(marker: string): void {
    const fenceIndent = this.indent;
    this.advanceNextNonspace();
    const fenceStart = this.lineStart + this.offset;
    this.advanceOffset(marker.length, false);
    const raw = this.line.slice(this.offset);
    let lead = 0;
    while (isSpaceOrTab(raw[lead])) lead++;
    this.pendingInfo = raw.slice(lead);
    const rawInfo = trimSpaceTab(raw);
    const infoStart = this.lineStart + this.offset + lead;
    this.leaf = {
      kind: 'fenced',
      fence: {
        start: fenceStart,
        fenceChar: marker[0] as '`' | '~',
        fenceLength: marker.length,
        fenceIndent,
        rawInfo,
        untrimmedInfo: this.pendingInfo,
        infoSpan: { start: infoStart, end: infoStart + rawInfo.length },
        first: this.lines.length,
        contiguous: true,
        nested: this.containers.length > 1,
        openEnd: this.lineEnd,
        lastEnd: this.lineEnd,
      },
    };
  }

  /** Phase-1 test of one open container against the current line. */
  private continues(container: Container): boolean {
    this.findNextNonspace();
    switch (container.kind) {
      case 'quote':
        if (!this.indented && this.peek(this.nextNonspace) === '>') {
          this.advanceNextNonspace();
          this.advanceOffset(1, false);
          if (isSpaceOrTab(this.peek(this.offset))) this.advanceOffset(1, true);
          return true;
        }
        return false;
      case 'list':
        return true;
      case 'item': {
        const list = container.list!;
        if (this.blank) {
          if (!container.hasContent) return false;
          // Only the item's own indentation is removed; spaces beyond it stay content (mdast).
          this.advanceOffset(Math.min(this.indent, list.markerOffset + list.padding), true);
          return true;
        }
        if (this.indent >= list.markerOffset + list.padding) {
          this.advanceOffset(list.markerOffset + list.padding, true);
          return true;
        }
        return false;
      }
      default:
        return true;
    }
  }

  /**
   * Lets the open leaf look at a line every container matched. Returns 'closed' when a closing
   * fence took the line, 'line' when the leaf takes the line as content without any new block
   * start being tried, or 'open' to go on with block starts.
   */
  private continueLeaf(): 'closed' | 'line' | 'open' {
    const leaf = this.leaf!;
    this.findNextNonspace();
    switch (leaf.kind) {
      case 'fenced': {
        const fence = leaf.fence!;
        const rest = this.line.slice(this.nextNonspace);
        const close = this.indent <= 3 && rest[0] === fence.fenceChar ? FENCE_CLOSE.exec(rest) : null;
        if (close && close[0].length >= fence.fenceLength) {
          const closeEnd = this.lineEnd; // trailing spaces after a closing fence belong to it
          this.finishFence(fence, closeEnd, true);
          this.leaf = null;
          return 'closed';
        }
        let i = fence.fenceIndent;
        while (i > 0 && isSpaceOrTab(this.peek(this.offset))) {
          this.advanceOffset(1, true);
          i--;
        }
        this.fenceIndentRemoved = i < fence.fenceIndent;
        return 'line';
      }
      case 'indented':
        if (this.indent >= CODE_INDENT) {
          if (!this.blank) this.indentedAfterExit = false;
          this.advanceOffset(CODE_INDENT, true);
          return 'line';
        }
        if (this.blank) {
          this.advanceNextNonspace();
          return 'line';
        }
        this.leaf = null;
        return 'open';
      case 'html':
        if (this.blank && (leaf.htmlType === 6 || leaf.htmlType === 7)) {
          this.leaf = null;
          return 'open';
        }
        {
          const close = HTML_BLOCK_CLOSE[leaf.htmlType ?? 0];
          if (close && close.test(this.line.slice(this.offset))) this.leaf = null;
        }
        return 'closed';
      case 'paragraph':
        if (this.blank) {
          this.leaf = null;
          return 'closed';
        }
        return 'open';
    }
  }

  private addLineToLeaf(): void {
    const leaf = this.leaf;
    if (!leaf) return;
    this.markContent();
    if (leaf.kind !== 'fenced') return;
    let pad = 0;
    if (this.partiallyConsumedTab) {
      this.offset += 1;
      pad = 4 - (this.column % 4);
    }
    this.addFenceLine(leaf.fence!, this.lineStart + Math.min(this.offset, this.line.length), pad);
  }

  /** Adds a body line that runs from `start` to the end of the current line. */
  private addFenceLine(fence: OpenFence, start: number, pad: number): void {
    const lines = this.lines;
    const n = lines.length;
    if (fence.contiguous && (pad !== 0 || (n > fence.first && (start !== lines.end(n - 1) + 1 || this.text.charCodeAt(start - 1) !== 10)))) fence.contiguous = false;
    lines.push(start, this.lineEnd, pad);
    fence.lastEnd = this.lineEnd;
  }

  /** Marks the innermost item as having content (an empty item closes at its first blank). */
  private markContent(): void {
    const item = this.containers[this.containers.length - 1].itemIndex;
    if (item < 1 || this.containers[item].hasContent) return;
    this.containers[item].hasContent = true;
    const stop = this.blankStops.lastIndexOf(item);
    if (stop === this.blankStops.length - 1) this.blankStops.pop();
    else if (stop >= 0) this.blankStops.splice(stop, 1);
  }

  private pushContainer(kind: ContainerKind, list?: ListData, hasContent = true): void {
    const index = this.containers.length;
    const below = this.containers[index - 1];
    const itemIndex = kind === 'item' ? index : below.itemIndex;
    const itemWidths = below.itemWidths + (kind === 'item' && list ? list.markerOffset + list.padding : 0);
    this.containers.push({ kind, list, hasContent, itemIndex, itemWidths });
    if (kind === 'quote' || (kind === 'item' && !hasContent)) this.blankStops.push(index);
  }

  /** Keeps the first `length` containers. */
  private popContainers(length: number): void {
    this.containers.length = length;
    while (this.blankStops.length > 0 && this.blankStops[this.blankStops.length - 1] >= length) this.blankStops.pop();
  }

  /** Keeps containers[0..index]; anything deeper is closed before the current line. */
  private truncateTo(index: number, cause: CloseCause = 'leaf'): void {
    if (index < this.containers.length - 1) {
      this.closeContainersFrom(index + 1, this.lineStart, cause);
    }
  }

  private closeContainersFrom(index: number, at: number, cause: CloseCause): void {
    if (index >= this.containers.length) return;
    this.closedThisLine = true;
    this.closeLeaf(at, cause);
    this.popContainers(Math.max(1, index));
  }

  /**
   * Ends the open leaf. A fenced block that its container closes ends, as in mdast, at the
   * start of the line when that line opens a new container (block quote, list item); otherwise
   * after its last line, and a final empty line then belongs to the container, not the body.
   * At the end of the document it ends at the end of the text.
   */
  private closeLeaf(at: number, cause: CloseCause = 'leaf', atEndOfText = at >= this.text.length): void {
    const leaf = this.leaf;
    this.leaf = null;
    if (!leaf || leaf.kind !== 'fenced') return;
    const fence = leaf.fence!;
    if (atEndOfText) {
      this.finishFence(fence, this.text.length, false);
    } else if (cause === 'container') {
      this.finishFence(fence, at, false);
    } else {
      const lines = this.lines;
      const last = lines.length - 1;
      if (last >= fence.first && lines.pad(last) === 0 && lines.start(last) === lines.end(last)) lines.pop();
      this.finishFence(fence, fence.lastEnd, false);
    }
  }

  private finishFence(fence: OpenFence, end: number, closed: boolean): void {
    const store = this.lines;
    let body = '';
    let lines: BodyLineList;
    if (store.length > fence.first && fence.contiguous) {
      const base = store.start(fence.first);
      body = this.text.slice(base, store.end(store.length - 1));
      lines = new ContiguousLines(body, base, store.startsFrom(fence.first, base));
    } else {
      lines = store.copyFrom(fence.first);
      for (let i = 0; i < lines.length; i++) body += (i > 0 ? '\n' : '') + ' '.repeat(lines.pad(i)) + this.text.slice(lines.start(i), lines.end(i));
    }
    store.truncate(fence.first);
    const { lang, meta } = decodeInfoString(fence.untrimmedInfo);
    this.blocks.push({
      nested: fence.nested,
      span: { start: fence.start, end },
      rawInfo: fence.rawInfo,
      infoSpan: fence.infoSpan,
      lang,
      meta,
      fenceChar: fence.fenceChar,
      fenceLength: fence.fenceLength,
      bodyLines: lines,
      body,
      closed,
    });
  }

  private parseListMarker(interruptsParagraph: boolean): ListData | null {
    if (this.indent >= CODE_INDENT) return null;
    const at = this.nextNonspace;
    let bullet = '';
    let ordered = false;
    let delimiter = '';
    let markerLength: number;
    const first = this.line[at];
    const b = first === '*' || first === '+' || first === '-';
    const o = b ? null : testAt(ORDERED_MARKER, this.line, at);
    if (b) {
      bullet = first;
      markerLength = 1;
    } else if (o && (!interruptsParagraph || o[1] === '1')) {
      ordered = true;
      delimiter = o[2];
      markerLength = o[0].length;
    } else {
      return null;
    }
    const next = this.peek(at + markerLength);
    if (next !== undefined && next !== ' ' && next !== '\t') return null;
    if (interruptsParagraph) {
      let i = at + markerLength;
      while (isSpaceOrTab(this.line[i])) i++;
      if (i >= this.line.length) return null;
    }

    const markerOffset = this.indent;
    this.advanceNextNonspace();
    this.advanceOffset(markerLength, true);
    const spacesStartCol = this.column;
    const spacesStartOffset = this.offset;
    let c: string | undefined;
    do {
      this.advanceOffset(1, true);
      c = this.peek(this.offset);
    } while (this.column - spacesStartCol < 5 && isSpaceOrTab(c));
    const blankItem = this.peek(this.offset) === undefined;
    const spacesAfterMarker = this.column - spacesStartCol;
    let padding: number;
    if (spacesAfterMarker >= 5 || spacesAfterMarker < 1 || blankItem) {
      padding = markerLength + 1;
      this.column = spacesStartCol;
      this.offset = spacesStartOffset;
      this.partiallyConsumedTab = false;
      if (isSpaceOrTab(this.peek(this.offset))) this.advanceOffset(1, true);
    } else {
      padding = markerLength + spacesAfterMarker;
    }
    return { bullet, ordered, delimiter, markerOffset, padding };
  }
}

function listsMatch(a: ListData, b: ListData): boolean {
  return a.ordered === b.ordered && a.bullet === b.bullet && a.delimiter === b.delimiter;
}
