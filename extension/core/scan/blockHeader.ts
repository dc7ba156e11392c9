/**
 * Reads a fenced block's info string as a data-block header: a block kind, then optionally the
 * block's id. A fence whose first word is not a kind is ordinary markdown and is left alone.
 */
import type { FencedBlock } from './fenceScanner.js';
import type { Span } from '../text/positions.js';

import { BLOCK_KINDS, ID_PATTERN, type BlockKind } from '../model/blockKind.js';

export { BLOCK_KINDS, ID_PATTERN, type BlockKind };

const KIND_SET: ReadonlySet<string> = new Set(BLOCK_KINDS);

export interface BlockHeader {
  readonly kind: BlockKind;
  readonly kindSpan: Span;
  readonly id: string | null;
  readonly idSpan: Span | null;
  /** Words after the id, which mean nothing. */
  readonly extra: { readonly text: string; readonly span: Span } | null;
}

export function isBlockKind(word: string | null): word is BlockKind {
  return word !== null && KIND_SET.has(word);
}

export function readBlockHeader(block: FencedBlock): BlockHeader | null {
  if (!isBlockKind(block.lang)) return null;
  const raw = block.rawInfo;
  const base = block.infoSpan.start;
  const words: Array<{ text: string; start: number }> = [];
  const re = /[^ \t]+/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(raw)) !== null) words.push({ text: m[0], start: base + m.index });
  const kindWord = words[0];
  const kindSpan = { start: kindWord.start, end: kindWord.start + kindWord.text.length };
  const idWord = words[1];
  const extraWords = words.slice(2);
  const extra =
    extraWords.length > 0
      ? {
          text: raw.slice(extraWords[0].start - base),
          span: { start: extraWords[0].start, end: block.infoSpan.end },
        }
      : null;
  return {
    kind: block.lang,
    kindSpan,
    id: idWord ? idWord.text : null,
    idSpan: idWord ? { start: idWord.start, end: idWord.start + idWord.text.length } : null,
    extra,
  };
}
