/**
 * Bytes to text, the one decoder of notebook files and data files:
 *
 * - a byte-order mark decides: UTF-8, UTF-16 little- or big-endian; UTF-32 is refused by name
 *   (its little-endian mark starts like UTF-16's);
 * - without one, the bytes are UTF-8, unless the caller allows more (data files: UTF-16 without a
 *   mark, recognised by its zero bytes, and a fallback for bytes that are not valid UTF-8);
 * - byte-order marks left at the start (a mark written twice) are removed too.
 *
 * TextDecoder is a web standard: the decoding is the same in any host. Policy: never throws.
 */
import * as nodeBuffer from 'node:buffer';

export type TextEncodingName = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export type DecodedText = { readonly ok: true; readonly text: string; readonly encoding: TextEncodingName } | { readonly ok: false; readonly detail: string };

export interface DecodeRules {
  /** Recognise UTF-16 without a byte-order mark by its zero bytes. */
  readonly bomlessUtf16?: boolean;
  /** Decoding of bytes that are neither marked nor valid UTF-8; without it they are decoded as UTF-8 with replacement characters. */
  readonly fallback?: { readonly encoding: TextEncodingName; readonly decode: (bytes: Uint8Array) => string };
}

const BOM = '\uFEFF';
/** Bytes looked at to recognise UTF-16 without a byte-order mark. */
const SNIFF_BYTES = 4096;
/**
 * Share of the high bytes that must be zero for UTF-16 without a mark: text in a Latin script has a
 * zero high byte in almost every character, and one character beyond U+00FF (Ā, €, −) must not
 * turn detection off.
 */
const ZERO_SHARE = 0.9;
/** Share of the low bytes that may be zero at most (a file of zero bytes is no text). */
const LOW_ZERO_SHARE = 0.1;

/** Which encoding a byte-order mark names, or null without one. */
function markedEncoding(b: Uint8Array): TextEncodingName | 'utf-32' | null {
  if ((b[0] === 0xff && b[1] === 0xfe && b[2] === 0 && b[3] === 0) || (b[0] === 0 && b[1] === 0 && b[2] === 0xfe && b[3] === 0xff)) return 'utf-32';
  if (b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) return 'utf-8';
  if (b[0] === 0xff && b[1] === 0xfe) return 'utf-16le';
  if (b[0] === 0xfe && b[1] === 0xff) return 'utf-16be';
  return null;
}

/** UTF-16 without a byte-order mark, from the share of zero bytes in the even and odd places of the first bytes; null when neither fits. */
export function sniffUtf16(b: Uint8Array): 'utf-16le' | 'utf-16be' | null {
  const n = Math.min(b.length, SNIFF_BYTES) & ~1;
  if (n < 4) return null;
  let zeroEven = 0;
  let zeroOdd = 0;
  for (let i = 0; i < n; i += 2) {
    if (b[i] === 0) zeroEven++;
    if (b[i + 1] === 0) zeroOdd++;
  }
  const pairs = n / 2;
  if (zeroOdd >= ZERO_SHARE * pairs && zeroEven <= LOW_ZERO_SHARE * pairs) return 'utf-16le';
  if (zeroEven >= ZERO_SHARE * pairs && zeroOdd <= LOW_ZERO_SHARE * pairs) return 'utf-16be';
  return null;
}

/** Are all bytes below 0x80? (Node's own check where it has one.) */
function isAsciiBytes(bytes: Uint8Array): boolean {
  if (typeof nodeBuffer.isAscii === 'function') return nodeBuffer.isAscii(bytes);
  for (let i = 0; i < bytes.length; i++) if (bytes[i] >= 0x80) return false;
  return true;
}

/** The text of the bytes under the rules, byte-order marks removed, and the encoding it was read in. */
export function decodeTextBytes(bytes: Uint8Array, rules: DecodeRules = {}): DecodedText {
  const found = markedEncoding(bytes) ?? (rules.bomlessUtf16 ? sniffUtf16(bytes) : null);
  if (found === 'utf-32') return { ok: false, detail: 'it is encoded as UTF-32; save it as UTF-8' };
  let encoding: TextEncodingName = found ?? 'utf-8';
  let text: string;
  if (found === null && isAsciiBytes(bytes)) {
    // Plain ASCII (most notebooks and exports): every reading gives the same text, latin1 the fastest.
    text = nodeBuffer.Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1');
  } else if (found !== null || !rules.fallback) {
    text = new TextDecoder(encoding).decode(bytes);
  } else {
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      encoding = rules.fallback.encoding;
      text = rules.fallback.decode(bytes);
    }
  }
  // TextDecoder drops one BOM; any further one is not text either.
  let start = 0;
  while (text.startsWith(BOM, start)) start++;
  return { ok: true, text: start > 0 ? text.slice(start) : text, encoding };
}
