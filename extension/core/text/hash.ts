/**
 * A fast 53-bit string hash (cyrb53, public domain) used for cache keys. Not cryptographic:
 * a collision would only make the cache serve a stale result for an identical-looking key.
 *
 * Keys end up in notebooks (the `inputs:` of a results block), so the hash of a given text never
 * changes: `Hasher` feeds the same characters in pieces, without making the joined string.
 */
import type { LineIndex } from './positions.js';

export class Hasher {
  private h1: number;
  private h2: number;

  constructor(seed = 0) {
    this.h1 = 0xdeadbeef ^ seed;
    this.h2 = 0x41c6ce57 ^ seed;
  }

  /** Adds one UTF-16 code unit. */
  char(ch: number): this {
    this.h1 = Math.imul(this.h1 ^ ch, 2654435761);
    this.h2 = Math.imul(this.h2 ^ ch, 1597334677);
    return this;
  }

  text(text: string): this {
    let h1 = this.h1;
    let h2 = this.h2;
    for (let i = 0; i < text.length; i++) {
      const ch = text.charCodeAt(i);
      h1 = Math.imul(h1 ^ ch, 2654435761);
      h2 = Math.imul(h2 ^ ch, 1597334677);
    }
    this.h1 = h1;
    this.h2 = h2;
    return this;
  }

  /** Adds an integer as the characters of its decimal numeral (`String(n)`), without the string. */
  integer(n: number): this {
    if (!Number.isSafeInteger(n)) return this.text(String(n));
    if (n < 0) {
      this.char(45);
      n = -n;
    }
    if (n <= 0x7fffffff) {
      // (Offsets and counts, almost always.)
      for (let k = digitsOf(n); k > 0; ) this.char(48 + DIGITS[--k]);
      return this;
    }
    let scale = 1;
    while (scale * 10 <= n) scale *= 10;
    for (; scale >= 1; scale /= 10) {
      const digit = Math.floor(n / scale);
      this.char(48 + digit);
      n -= digit * scale;
    }
    return this;
  }

  /**
   * For each line of `index`, `,` then its start plus `shift` (as `integer` writes it), then
   * `.0`: the layout of a body without pads (`blockTextKey`), in one loop without a call per
   * character.
   */
  lineLayout(index: LineIndex, shift: number): this {
    let h1 = this.h1;
    let h2 = this.h2;
    for (let i = 0; i < index.lineCount; i++) {
      const n = index.lineStart(i) + shift;
      if (!(n >= 0 && n <= 0x7fffffff)) {
        this.h1 = h1;
        this.h2 = h2;
        this.char(44).integer(n).char(46).char(48);
        h1 = this.h1;
        h2 = this.h2;
        continue;
      }
      h1 = Math.imul(h1 ^ 44, 2654435761);
      h2 = Math.imul(h2 ^ 44, 1597334677);
      for (let k = digitsOf(n); k > 0; ) {
        const ch = 48 + DIGITS[--k];
        h1 = Math.imul(h1 ^ ch, 2654435761);
        h2 = Math.imul(h2 ^ ch, 1597334677);
      }
      h1 = Math.imul(Math.imul(h1 ^ 46, 2654435761) ^ 48, 2654435761);
      h2 = Math.imul(Math.imul(h2 ^ 46, 1597334677) ^ 48, 1597334677);
    }
    this.h1 = h1;
    this.h2 = h2;
    return this;
  }

  digest(): string {
    let h1 = this.h1;
    let h2 = this.h2;
    h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
    h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
    return (4294967296 * (2097151 & h2) + (h1 >>> 0)).toString(36);
  }
}

/** The decimal digits of an integer below 2³¹, last first (`digitsOf`). */
const DIGITS = new Int32Array(10);

/** Writes the decimal digits of 0 ≤ n < 2³¹ to DIGITS, last first (by integer division), and says how many. */
function digitsOf(n: number): number {
  let m = n | 0;
  let k = 0;
  do {
    const q = (m / 10) | 0;
    DIGITS[k++] = m - 10 * q;
    m = q;
  } while (m > 0);
  return k;
}

export function hashText(text: string, seed = 0): string {
  return new Hasher(seed).text(text).digest();
}

/** Hash of several parts, order-sensitive: the hash of the parts joined by U+0000, without joining them. */
export function hashParts(parts: readonly string[], seed = 0): string {
  const h = new Hasher(seed);
  parts.forEach((part, i) => (i > 0 ? h.char(0) : h).text(part));
  return h.digest();
}
