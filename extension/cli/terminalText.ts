/**
 * What the CLI prints is shown, never obeyed: control characters that came from a notebook (a
 * key name, a path, a table cell) are written as escapes, so a file cannot move the cursor,
 * rewrite a line, change colours or set the window title of the terminal that checks it.
 *
 * Escaped: C0 controls but the line feed (tab `\t`, carriage return `\r`, the rest `\xHH`, so
 * ESC is `\x1b`), DEL and the C1 controls (`\x7f`–`\x9f`), the Unicode line and paragraph
 * separators and the bidirectional formatting characters (`\u202e`), which reorder what a
 * terminal shows.
 */
// eslint-disable-next-line no-control-regex -- these are the characters to find
const UNSAFE = /[\0-\x09\x0b-\x1f\x7f-\x9f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;
/** The same characters, to look for one without a copy of the text (most output has none). */
const ANY_UNSAFE = new RegExp(UNSAFE.source);

function escapeOne(c: string): string {
  if (c === '\t') return '\\t';
  if (c === '\r') return '\\r';
  const code = c.charCodeAt(0);
  return code <= 0xff ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
}

/** Text for a terminal: line feeds kept, every other control character escaped. */
export function terminalText(text: string): string {
  return ANY_UNSAFE.test(text) ? text.replace(UNSAFE, escapeOne) : text;
}

/**
 * A value as JSON that is also safe on a terminal: JSON.stringify escapes C0 controls but
 * leaves DEL, the C1 controls and the bidirectional characters raw; they are written as `\uHHHH`
 * escapes, which every JSON reader decodes to the same strings.
 */
export function terminalJson(value: unknown): string {
  const json = JSON.stringify(value, null, 2);
  return ANY_UNSAFE.test(json) ? json.replace(UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`) : json;
}
