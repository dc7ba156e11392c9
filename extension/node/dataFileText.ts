/**
 * Decodes the bytes of a data file (an instrument export) into text, whatever encoding the
 * instrument's software wrote:
 *
 * - a byte-order mark decides: UTF-8, UTF-16 little- or big-endian (UTF-32 is refused by name);
 * - without one, UTF-16 is recognised by its zero bytes (text in a Latin script written in UTF-16
 *   has a zero high byte in nearly every character), else the bytes are read as UTF-8;
 * - bytes that are not valid UTF-8 are read as Windows-1252, the superset of Latin-1 that export
 *   software on Windows writes (° as 0xB0, µ as 0xB5), as the WHATWG Encoding Standard does for
 *   the label "latin1";
 * - text that still holds a NUL character is refused: it was read in the wrong encoding.
 *
 * The decoding rules shared with notebook files are in textBytes.ts. Windows-1252 is decoded
 * here from its table (Unicode's cp1252.txt mapping), so that a runtime built without full ICU
 * reads it too. Policy: never throws.
 */

import { decodeTextBytes, type TextEncodingName } from './textBytes.js';

export type DataFileEncoding = TextEncodingName;

export type DecodedDataFile = { readonly ok: true; readonly text: string; readonly encoding: DataFileEncoding } | { readonly ok: false; readonly detail: string };

/** Code points of the bytes 0x80–0x9F in Windows-1252 (the five unassigned bytes map to the C1 controls, as WHATWG does). */
const CP1252_HIGH = [
  0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152, 0x8d, 0x17d, 0x8f,
  0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122, 0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178,
];

/** Windows-1252 bytes as text: Latin-1 with printable characters in 0x80–0x9F. */
export function decodeWindows1252(bytes: Uint8Array): string {
  const parts: string[] = [];
  const CHUNK = 8192;
  const codes = new Array<number>(CHUNK);
  for (let at = 0; at < bytes.length; at += CHUNK) {
    const n = Math.min(CHUNK, bytes.length - at);
    codes.length = n;
    for (let i = 0; i < n; i++) {
      const b = bytes[at + i];
      codes[i] = b >= 0x80 && b <= 0x9f ? CP1252_HIGH[b - 0x80] : b;
    }
    parts.push(String.fromCharCode(...codes));
  }
  return parts.join('');
}

/** The text of a data file's bytes, byte-order marks removed, and the encoding it was read in. */
export function decodeDataBytes(bytes: Uint8Array): DecodedDataFile {
  const decoded = decodeTextBytes(bytes, { bomlessUtf16: true, fallback: { encoding: 'windows-1252', decode: decodeWindows1252 } });
  if (!decoded.ok) return decoded;
  // No export writes a NUL character in its text: here one is an encoding read wrongly (UTF-16
  // whose zero bytes were not recognised, UTF-32 without a mark) or a binary file.
  if (decoded.text.includes('\0')) {
    return { ok: false, detail: `it holds NUL characters when read as ${ENCODING_WORDS[decoded.encoding]}: it is probably UTF-16 or UTF-32 text without a byte-order mark, or not a text file; save it as UTF-8` };
  }
  return decoded;
}

const ENCODING_WORDS: Readonly<Record<DataFileEncoding, string>> = {
  'utf-8': 'UTF-8',
  'utf-16le': 'UTF-16 little-endian',
  'utf-16be': 'UTF-16 big-endian',
  'windows-1252': 'Windows-1252',
};
