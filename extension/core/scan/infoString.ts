/**
 * Decodes a fenced block's info string as CommonMark does: backslash escapes of ASCII
 * punctuation and character references (named, decimal, hexadecimal) are replaced, and the
 * string splits at its first space or tab into `lang` and `meta`. As in remark, `meta` keeps
 * any trailing spaces or tabs of the line
 * (https://spec.commonmark.org/0.31.2/#info-string, #backslash-escapes, #entity-and-numeric-character-references).
 *
 * Input policy: any string; an empty info string gives `lang` and `meta` null. Never throws.
 */
import { decodeNamedCharacterReference } from 'decode-named-character-reference';

const ESCAPABLE = /[!"#$%&'()*+,\-./:;<=>?@[\\\]^_`{|}~]/;
const REFERENCE = /^&(?:#[xX]([0-9a-fA-F]{1,6});|#([0-9]{1,7});|([A-Za-z][A-Za-z0-9]{0,31});)/;

export function decodeInfoString(raw: string): { lang: string | null; meta: string | null } {
  if (raw.trim().length === 0) return { lang: null, meta: null };
  const split = /[ \t]/.exec(raw);
  if (!split) return { lang: unescapeCommonMark(raw), meta: null };
  const lang = raw.slice(0, split.index);
  const meta = raw.slice(split.index).replace(/^[ \t]+/, '');
  if (meta.replace(/[ \t]+$/, '').length === 0) return { lang: unescapeCommonMark(lang), meta: null };
  return { lang: unescapeCommonMark(lang), meta: meta.length > 0 ? unescapeCommonMark(meta) : null };
}

/** Replaces backslash escapes and character references. */
export function unescapeCommonMark(text: string): string {
  if (!text.includes('\\') && !text.includes('&')) return text;
  let out = '';
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '\\' && i + 1 < text.length && ESCAPABLE.test(text[i + 1])) {
      out += text[i + 1];
      i++;
      continue;
    }
    if (c === '&') {
      const m = REFERENCE.exec(text.slice(i));
      if (m) {
        const decoded = decodeReference(m);
        if (decoded !== null) {
          out += decoded;
          i += m[0].length - 1;
          continue;
        }
      }
    }
    out += c;
  }
  return out;
}

function decodeReference(m: RegExpExecArray): string | null {
  if (m[3] !== undefined) {
    const named = decodeNamedCharacterReference(m[3]);
    return named === false ? null : named;
  }
  const code = m[1] !== undefined ? parseInt(m[1], 16) : parseInt(m[2], 10);
  if (code === 0 || code > 0x10ffff || (code >= 0xd800 && code <= 0xdfff)) return '\uFFFD';
  return String.fromCodePoint(code);
}
