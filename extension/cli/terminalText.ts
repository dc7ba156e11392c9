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
import { JsonList } from '../core/index.js';

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
  return escapedJson(JSON.stringify(value, null, 2));
}

function escapedJson(json: string): string {
  return ANY_UNSAFE.test(json) ? json.replace(UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`) : json;
}

/** Characters gathered for one write of the JSON report. */
const GATHERING = 16384;

/**
 * A value as JSON.stringify takes it under a key: its `toJSON(key)` applied (not a JsonList's,
 * which is written an item at a time), a Number, String or Boolean object as its primitive.
 */
function asStringified(key: string, v: unknown): unknown {
  if (v !== null && typeof v === 'object' && !(v instanceof JsonList)) {
    const toJSON = (v as { toJSON?: unknown }).toJSON;
    if (typeof toJSON === 'function') v = (toJSON as (k: string) => unknown).call(v, key);
  }
  if (v instanceof Number) return Number(v);
  if (v instanceof String) return String(v);
  if (v instanceof Boolean) return v.valueOf();
  return v;
}

/** Is this a value JSON.stringify leaves out of an object (and writes as null in an array)? */
const omitted = (v: unknown): boolean => v === undefined || typeof v === 'function' || typeof v === 'symbol';

/**
 * The text of `terminalJson(value)`, handed to `write` in pieces: the objects and arrays of the
 * first `depth` levels are written part by part (a JsonList at any of them an item at a time),
 * deeper values whole. A report of megabytes is then never one string (nor its copy, nor its
 * bytes), and the text is the same, character for character: `JSON.stringify` with an indent of 2
 * writes a nested value as it writes it alone, its lines indented by its depth.
 */
export function writeTerminalJson(value: unknown, out: (piece: string) => void, depth = 4): void {
  // Pieces gathered up to about 16 K characters a write: a write to a terminal or a file is a system
  // call, and a larger gathering (a string, then a buffer of its bytes) no longer fits the memory
  // that short-lived values reuse, so that every write takes fresh pages (measured on a report of
  // 1 MB: with 64 K a write, its writing took half as long again).
  let pending: string[] = [];
  let size = 0;
  const write = (text: string): void => {
    pending.push(text);
    size += text.length;
    if (size < GATHERING) return;
    // Escaped a gathering at a time: escapes are of single characters.
    out(escapedJson(pending.join('')));
    pending = [];
    size = 0;
  };
  // A value at depth L, as JSON.stringify writes it there: the value wrapped in L arrays, whose
  // brackets and the indentation before the value are then cut off (L² + 3L characters before it,
  // L² + L after it). No pass over the value's text to indent it.
  const piece = (v: unknown, indent: string): string => {
    const L = indent.length / 2;
    if (L === 0) return JSON.stringify(v, null, 2);
    let wrapped: unknown = v;
    for (let k = 0; k < L; k++) wrapped = [wrapped];
    const json = JSON.stringify(wrapped, null, 2);
    return json.slice(L * L + 3 * L, json.length - (L * L + L));
  };
  // `v` as asStringified gives it.
  const walk = (v: unknown, indent: string, level: number): void => {
    if (v === null || typeof v !== 'object') return write(piece(v, indent));
    // A toJSON that gave an object with a toJSON of its own: JSON.stringify does not call the
    // second, which a piece would (under another key); such an object is written part by part.
    const again = !(v instanceof JsonList) && typeof (v as { toJSON?: unknown }).toJSON === 'function';
    if (level >= depth && !again) return write(piece(v, indent));
    const inner = `${indent}  `;
    if (v instanceof JsonList || Array.isArray(v)) {
      const items = v as JsonList<unknown> | unknown[];
      if (items.length === 0) return write('[]');
      write('[');
      for (let i = 0; i < items.length; i++) {
        const item = asStringified(String(i), items instanceof JsonList ? items.at(i) : items[i]);
        write(`${i > 0 ? ',' : ''}\n${inner}`);
        // As JSON.stringify writes them in an array (a hole too): undefined, a function or a symbol as null.
        if (omitted(item)) write('null');
        else walk(item, inner, level + 1);
      }
      write(`\n${indent}]`);
      return;
    }
    // As JSON.stringify writes an object: its own enumerable string keys, without the values it omits.
    const entries: Array<[string, unknown]> = [];
    for (const key of Object.keys(v)) {
      const x = asStringified(key, (v as Record<string, unknown>)[key]);
      if (!omitted(x)) entries.push([key, x]);
    }
    if (entries.length === 0) return write('{}');
    write('{');
    entries.forEach(([key, x], i) => {
      write(`${i > 0 ? ',' : ''}\n${inner}${piece(key, '')}: `);
      walk(x, inner, level + 1);
    });
    write(`\n${indent}}`);
  };
  // A value that JSON.stringify gives no text for (undefined, a function) writes nothing.
  const top = asStringified('', value);
  if (!omitted(top)) walk(top, '', 0);
  if (size > 0) out(escapedJson(pending.join('')));
}
