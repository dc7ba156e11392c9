/**
 * A block's YAML metadata, parsed by the `yaml` package with source ranges, so that every
 * diagnostic points at the key or value it is about. Spans here are in **body offsets** (see
 * BodyMap); callers map them to the document.
 *
 * Policy: never throws and never logs: the library's own console warnings are off (`logLevel:
 * 'silent'`), and what it would warn about becomes a problem here. Empty text is an empty map.
 * YAML errors become diagnostics; whatever could still be read is kept. A key that is a list, a
 * map or an alias (`[a, b]: 1`, `? {a: 1}`) is a problem at the key; the data keep it as the
 * library stringifies it. Metadata nested deeper than MAX_METADATA_DEPTH maps and lists is not
 * read at all (`tooDeep`): nothing here or in the library may recurse without bound.
 */
import type { Node as YamlNode } from 'yaml';
import { yamlModule } from './yamlModule.js';
import type { Span } from '../text/positions.js';

/** Spans of a key and its value, body offsets. */
export interface EntrySpans {
  readonly key: Span;
  readonly value: Span;
}

export interface YamlProblem {
  readonly message: string;
  readonly span: Span;
}

export interface Metadata {
  /** Plain JSON-like data, as validated by the schemas. */
  readonly data: Record<string, unknown>;
  /** JSON pointer ("/vft/B", "/windows/glass/0") to spans. */
  readonly spans: ReadonlyMap<string, EntrySpans>;
  readonly problems: readonly YamlProblem[];
  /** The metadata is not a map at all (a list, a scalar). */
  readonly notAMap: boolean;
  /** Nested deeper than this many levels: none of it was read. */
  readonly tooDeep?: number;
  /** `key: ?` values (what the quick fix for missing keys writes), read as empty: the pointer and the `?` with any unit after it. */
  readonly placeholders?: ReadonlyArray<{ readonly pointer: string; readonly span: Span }>;
}

/** Levels of maps and lists that metadata may nest (real blocks use three). */
export const MAX_METADATA_DEPTH = 64;

/** Whether a YAML tree nests deeper than `limit` maps and lists, found without recursion. */
function nestsDeeperThan(root: YamlNode, limit: number): boolean {
  const { isMap, isSeq } = yamlModule();
  const stack: Array<{ node: unknown; depth: number }> = [{ node: root, depth: 1 }];
  while (stack.length > 0) {
    const { node, depth } = stack.pop()!;
    if (isMap(node)) {
      if (depth > limit) return true;
      for (const pair of node.items) {
        stack.push({ node: pair.key, depth: depth + 1 });
        stack.push({ node: pair.value, depth: depth + 1 });
      }
    } else if (isSeq(node)) {
      if (depth > limit) return true;
      for (const item of node.items) stack.push({ node: item, depth: depth + 1 });
    }
  }
  return false;
}

function spanOf(node: YamlNode | null | undefined, fallback: Span): Span {
  const r = node?.range;
  if (!r) return fallback;
  return { start: r[0], end: Math.max(r[0], r[1]) };
}

export function escapePointer(key: string): string {
  return key.replace(/~/g, '~0').replace(/\//g, '~1');
}

/** A key the YAML core schema reads as text, and that is no property of every object. */
const PLAIN_KEY = /^([A-Za-z_][A-Za-z0-9_]*):( +)/;
const NOT_TEXT_KEY = /^(?:true|True|TRUE|false|False|FALSE|null|Null|NULL|__proto__)$/;

/**
 * Metadata that is one `key: text` line after another, read without the YAML parser: every line
 * a plain key at the margin, a colon, spaces and a value that the YAML core schema can only read as
 * text (it starts with a letter or a digit, holds no comment, colon-space or tab, and is no
 * number, boolean or null: a value without a space that starts with a digit, a sign or a point is
 * left to the parser); no key twice, none near YAML's limit of 1024 characters. Null for anything else: the parser reads it. What it returns
 * is what the parser gives for the same text (a property test holds them together).
 */
export function readFlatMetadata(text: string): Metadata | null {
  const data: Record<string, unknown> = {};
  const spans = new Map<string, EntrySpans>();
  let at = 0;
  while (at <= text.length) {
    let end = text.indexOf('\n', at);
    if (end < 0) end = text.length;
    if (end > at) {
      const line = text.slice(at, end);
      const m = PLAIN_KEY.exec(line);
      // (YAML refuses an implicit key of more than 1024 characters: the parser says so.)
      if (!m || m[0].length > 1000 || NOT_TEXT_KEY.test(m[1]) || Object.prototype.hasOwnProperty.call(data, m[1])) return null;
      const start = m[0].length;
      let stop = line.length;
      while (stop > start && line.charCodeAt(stop - 1) === 32) stop--;
      if (stop === start) return null;
      const value = line.slice(start, stop);
      const first = value.charCodeAt(0);
      const letter = (first >= 65 && first <= 90) || (first >= 97 && first <= 122);
      const digit = first >= 48 && first <= 57;
      if (!letter && !digit) return null;
      if (value.includes('#') || value.includes(': ') || value.endsWith(':') || value.includes('\t') || value.includes('\r')) return null;
      if (!value.includes(' ') && (digit || /^(?:true|True|TRUE|false|False|FALSE|null|Null|NULL)$/.test(value))) return null;
      data[m[1]] = value;
      spans.set(`/${m[1]}`, { key: { start: at, end: at + m[1].length }, value: { start: at + start, end: at + stop } });
    }
    at = end + 1;
  }
  return { data, spans, problems: [], notAMap: false };
}

/**
 * The metadata of a block. A `key: ?` placeholder is read as an empty value, so that the lines
 * after it still parse (YAML would read `? nm/s` as a mapping key and stop there), and listed.
 */
export function parseMetadata(text: string): Metadata {
  const found = findPlaceholders(text);
  const read = found.length > 0 ? blankPlaceholders(text, found) : text;
  const metadata = (read.trim().length > 0 ? readFlatMetadata(read) : null) ?? parseYamlMetadata(read);
  if (found.length === 0) return metadata;
  const placeholders: Array<{ pointer: string; span: Span }> = [];
  for (const [pointer, e] of metadata.spans) {
    const p = found.find((f) => f.keyStart === e.key.start);
    if (p) placeholders.push({ pointer, span: { start: p.valueStart, end: p.valueEnd } });
  }
  return { ...metadata, placeholders };
}

/** A `key: ?` line: where its key starts, and the `?` (with a unit after it) to fill in. */
interface Placeholder {
  readonly keyStart: number;
  readonly valueStart: number;
  readonly valueEnd: number;
}

const PLACEHOLDER_LINE = /^([ \t]*)([A-Za-z_][A-Za-z0-9_.-]*):[ \t]+(\?(?:[ \t]+[^\s#?][^#]*?)?)[ \t]*$/;

function findPlaceholders(text: string): Placeholder[] {
  if (!text.includes('?')) return [];
  const out: Placeholder[] = [];
  let start = 0;
  for (const line of text.split('\n')) {
    const m = PLACEHOLDER_LINE.exec(line);
    if (m) {
      const valueStart = start + line.indexOf(m[3], m[1].length + m[2].length + 1);
      out.push({ keyStart: start + m[1].length, valueStart, valueEnd: valueStart + m[3].length });
    }
    start += line.length + 1;
  }
  return out;
}

/** The text with each placeholder's value written over with spaces (offsets kept). */
function blankPlaceholders(text: string, placeholders: readonly Placeholder[]): string {
  let out = '';
  let from = 0;
  for (const p of placeholders) {
    out += text.slice(from, p.valueStart) + ' '.repeat(p.valueEnd - p.valueStart);
    from = p.valueEnd;
  }
  return out + text.slice(from);
}

/** The metadata as the YAML parser reads it. */
export function parseYamlMetadata(text: string): Metadata {
  const spans = new Map<string, EntrySpans>();
  const problems: YamlProblem[] = [];
  if (text.trim().length === 0) return { data: {}, spans, problems, notAMap: false };
  const { isMap, isScalar, isSeq, parseDocument } = yamlModule();
  const doc = parseDocument(text, { uniqueKeys: true, prettyErrors: false, strict: true, logLevel: 'silent' });
  for (const e of doc.errors) {
    const start = Math.min(e.pos[0], text.length);
    problems.push({ message: e.message.split('\n')[0], span: { start, end: Math.min(Math.max(start, e.pos[1]), text.length) } });
  }
  const contents = doc.contents as YamlNode | null;
  if (contents === null || (isScalar(contents) && (contents.value === null || contents.value === ''))) {
    return { data: {}, spans, problems, notAMap: false };
  }
  if (!isMap(contents)) {
    return { data: {}, spans, problems, notAMap: true };
  }
  if (nestsDeeperThan(contents, MAX_METADATA_DEPTH)) return { data: {}, spans, problems: [], notAMap: false, tooDeep: MAX_METADATA_DEPTH };
  const whole = { start: 0, end: text.length };
  const walk = (node: YamlNode, pointer: string): void => {
    if (isMap(node)) {
      for (const pair of node.items) {
        const keyNode = pair.key as YamlNode | null;
        const keyText = isScalar(keyNode) ? String(keyNode.value) : String(keyNode);
        const child = `${pointer}/${escapePointer(keyText)}`;
        const keySpan = spanOf(keyNode, whole);
        if (keyNode !== null && !isScalar(keyNode)) {
          problems.push({ message: 'a key is a list, a map or an alias; write a plain name before the colon', span: keySpan });
        }
        const valueNode = pair.value as YamlNode | null;
        spans.set(child, { key: keySpan, value: valueNode ? spanOf(valueNode, keySpan) : { start: keySpan.end, end: keySpan.end } });
        if (valueNode) walk(valueNode, child);
      }
    } else if (isSeq(node)) {
      node.items.forEach((item, i) => {
        const itemNode = item as YamlNode;
        const s = spanOf(itemNode, whole);
        spans.set(`${pointer}/${i}`, { key: s, value: s });
        walk(itemNode, `${pointer}/${i}`);
      });
    }
  };
  walk(contents, '');
  let data: Record<string, unknown> = {};
  try {
    const js = doc.toJS({ maxAliasCount: 50 }) as unknown;
    if (js && typeof js === 'object' && !Array.isArray(js)) data = js as Record<string, unknown>;
  } catch (e) {
    problems.push({ message: e instanceof Error ? e.message : String(e), span: whole });
  }
  return { data, spans, problems, notAMap: false };
}

/** The value at a JSON pointer, or undefined. */
export function valueAt(data: unknown, pointer: string): unknown {
  if (pointer === '') return data;
  let cur: unknown = data;
  for (const raw of pointer.slice(1).split('/')) {
    const key = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[key];
  }
  return cur;
}
