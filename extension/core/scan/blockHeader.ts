/**
 * Reads a fenced block's info string as a data-block header: a block kind, then optionally the
 * block's id. A fence whose first word is not a kind is ordinary markdown and is left alone;
 * `nearBlockKind` says when that word is a near miss of a kind (`Deposition`, `ramps`,
 * `relaxtion`), so the writer can be hinted why the block is not analysed. A near miss is
 * narrow on purpose, since most fences are code in other languages and some words sit one
 * letter from a kind (`maternal`, `reposition`): see `nearMissOf`.
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

/** The shortest word read as a mistyped kind: shorter words sit one letter from common words (raml, css, rest). */
const MIN_TYPO_LENGTH = 7;

/**
 * Whether `a` becomes `b` by one letter left out, one added, or two neighbours swapped (a
 * restricted Damerau–Levenshtein distance of 1 without substitutions). A substituted letter is
 * not a near miss: it turns kinds into other words (material → maternal, deposition →
 * reposition), while the slips of a typist (relaxtion, depositon, isotehrm) drop, double or swap
 * letters.
 */
function oneSlipApart(a: string, b: string): boolean {
  if (a.length === b.length) {
    let i = 0;
    while (i < a.length && a[i] === b[i]) i++;
    return i + 1 < a.length && a[i] === b[i + 1] && a[i + 1] === b[i] && a[i] !== a[i + 1] && a.slice(i + 2) === b.slice(i + 2);
  }
  const [short, long] = a.length < b.length ? [a, b] : [b, a];
  if (long.length !== short.length + 1) return false;
  let i = 0;
  while (i < short.length && short[i] === long[i]) i++;
  return short.slice(i) === long.slice(i + 1);
}

/**
 * Whether `word` is a near miss of `kind`: the kind in another case (`Deposition`, `DSC`), in the
 * plural or, for `results`, the singular (`ramps`, `isotherms`, `result`), or, in a word of 7
 * letters or more, one slip of typing away (`relaxtion`, `depositon`; see `oneSlipApart`).
 */
function nearMissOf(word: string, kind: BlockKind): boolean {
  const w = word.toLowerCase();
  if (w === kind || w === `${kind}s` || w === `${kind}es` || (kind.endsWith('s') && w === kind.slice(0, -1))) return true;
  return w.length >= MIN_TYPO_LENGTH && oneSlipApart(w, kind);
}

/**
 * The block kind a fence's first word is a near miss of, with the word's span, or null: for a
 * word that is a kind, that is nothing like one (`python`, `yaml`, `json`, `mermaid`, `position`,
 * `relation`), that is near two kinds, or that was written with escapes or character references.
 */
export function nearBlockKind(block: FencedBlock): { readonly written: string; readonly kind: BlockKind; readonly span: Span } | null {
  const word = block.lang;
  if (word === null || isBlockKind(word) || word.length > 32) return null;
  const raw = /^[^ \t]+/.exec(block.rawInfo);
  if (!raw || raw[0] !== word) return null;
  const kinds = BLOCK_KINDS.filter((k) => nearMissOf(word, k));
  if (kinds.length !== 1) return null;
  const start = block.infoSpan.start;
  return { written: word, kind: kinds[0], span: { start, end: start + word.length } };
}
