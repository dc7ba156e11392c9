import assert from 'node:assert/strict';
import { decodeDataBytes, decodeWindows1252 } from '../../extension/node/dataFileText.js';

const TEXT = 'T/°C, h/µm\n25, 0.4\n';

function utf16(text: string, bigEndian: boolean, bom: boolean): Uint8Array {
  const units = (bom ? '\uFEFF' : '') + text;
  const out = new Uint8Array(units.length * 2);
  for (let i = 0; i < units.length; i++) {
    const c = units.charCodeAt(i);
    out[2 * i + (bigEndian ? 1 : 0)] = c & 0xff;
    out[2 * i + (bigEndian ? 0 : 1)] = c >> 8;
  }
  return out;
}

describe('decodeDataBytes', () => {
  // Byte sequences written by hand from the encodings' definitions (Unicode Standard ch. 3 for
  // UTF-8 and UTF-16; cp1252 as the WHATWG Encoding Standard's index-windows-1252 gives it).
  it('reads Latin-1 / Windows-1252 bytes: ° as 0xB0, µ as 0xB5', () => {
    const bytes = Uint8Array.from([...'T/', 0xb0, ...'C, h/', 0xb5, ...'m\n'].map((c) => (typeof c === 'number' ? c : c.charCodeAt(0))));
    const d = decodeDataBytes(bytes);
    assert.deepEqual(d, { ok: true, text: 'T/°C, h/µm\n', encoding: 'windows-1252' });
  });

  it('decodes all 256 Windows-1252 bytes as the WHATWG index-windows-1252 gives them', () => {
    // 0x80–0x9F from the index (the five unassigned bytes are the C1 controls); every other byte is
    // the code point of the same number (ISO/IEC 8859-1).
    const high = '€\u0081‚ƒ„…†‡ˆ‰Š‹Œ\u008DŽ\u008F\u0090‘’“”•–—˜™š›œ\u009DžŸ';
    const expected = Array.from({ length: 256 }, (_, i) => (i >= 0x80 && i <= 0x9f ? high[i - 0x80] : String.fromCharCode(i))).join('');
    const all = Uint8Array.from({ length: 256 }, (_, i) => i);
    assert.equal(decodeWindows1252(all), expected);
  });

  it('reads UTF-8 with and without a byte-order mark', () => {
    const utf8 = new TextEncoder().encode(TEXT);
    assert.deepEqual(decodeDataBytes(utf8), { ok: true, text: TEXT, encoding: 'utf-8' });
    const withBom = Uint8Array.from([0xef, 0xbb, 0xbf, ...utf8]);
    assert.deepEqual(decodeDataBytes(withBom), { ok: true, text: TEXT, encoding: 'utf-8' });
  });

  it('reads UTF-16 little- and big-endian with a byte-order mark, and without one', () => {
    assert.deepEqual(decodeDataBytes(utf16(TEXT, false, true)), { ok: true, text: TEXT, encoding: 'utf-16le' });
    assert.deepEqual(decodeDataBytes(utf16(TEXT, true, true)), { ok: true, text: TEXT, encoding: 'utf-16be' });
    assert.deepEqual(decodeDataBytes(utf16(TEXT, false, false)), { ok: true, text: TEXT, encoding: 'utf-16le' });
    assert.deepEqual(decodeDataBytes(utf16(TEXT, true, false)), { ok: true, text: TEXT, encoding: 'utf-16be' });
  });

  it('refuses UTF-32 by name, and reads empty input as empty text', () => {
    const d = decodeDataBytes(Uint8Array.from([0xff, 0xfe, 0, 0, 0x54, 0, 0, 0]));
    assert.equal(d.ok, false);
    assert.match(d.ok ? '' : d.detail, /UTF-32/);
    assert.deepEqual(decodeDataBytes(new Uint8Array(0)), { ok: true, text: '', encoding: 'utf-8' });
  });

  it('drops a byte-order mark written twice', () => {
    const twice = new TextEncoder().encode('\uFEFF\uFEFFT/K\n');
    assert.equal(decodeDataBytes(twice).ok && (decodeDataBytes(twice) as { text: string }).text, 'T/K\n');
  });
});

describe('decodeDataBytes on text in the wrong encoding', () => {
  // Byte patterns from the Unicode Standard's definition of UTF-16 (ch. 3): a character beyond
  // U+00FF has a non-zero high byte; common practice, no source, for the 90 % share.
  it('recognises UTF-16 without a byte-order mark when one character is beyond U+00FF', () => {
    const text = 'T/K, h/nm\n300, 400\n# sample \u0100-3\n';
    assert.deepEqual(decodeDataBytes(utf16(text, false, false)), { ok: true, text, encoding: 'utf-16le' });
    assert.deepEqual(decodeDataBytes(utf16(text, true, false)), { ok: true, text, encoding: 'utf-16be' });
  });

  it('refuses text that decodes with NUL characters, naming the encoding problem', () => {
    // UTF-32 little-endian without a mark: three zero bytes after each ASCII byte.
    const utf32 = Uint8Array.from([...'T/K\n300\n'].flatMap((c) => [c.charCodeAt(0), 0, 0, 0]));
    const d = decodeDataBytes(utf32);
    assert.equal(d.ok, false);
    assert.match(d.ok ? '' : d.detail, /NUL.*UTF-16 or UTF-32/);
    // A binary file of zero bytes is no text either.
    assert.equal(decodeDataBytes(new Uint8Array(64)).ok, false);
  });
});
