import assert from 'node:assert/strict';
import { parseMetadata } from '../../extension/core/parse/metadata.js';

/** Runs `f` with process warnings and console output recorded instead of printed. */
function silenced<T>(f: () => T): { value: T; printed: string[] } {
  const printed: string[] = [];
  const saved = { emitWarning: process.emitWarning, warn: console.warn, log: console.log, error: console.error };
  const record = (...args: unknown[]): void => void printed.push(args.map(String).join(' '));
  process.emitWarning = record as typeof process.emitWarning;
  console.warn = console.log = console.error = record;
  try {
    return { value: f(), printed };
  } finally {
    Object.assign(process, { emitWarning: saved.emitWarning });
    Object.assign(console, { warn: saved.warn, log: saved.log, error: saved.error });
  }
}

describe('parseMetadata', () => {
  it('reports a list, map or alias used as a key at the key, and prints nothing', () => {
    for (const [text, key] of [
      ['rate: 1 K/min\n[a, b]: 1\n', '[a, b]'],
      ['? {a: 1}\n: 2\n', '{a: 1}'],
      ['x: &m {a: 1}\n*m : 3\n', '*m'],
    ] as const) {
      const { value: m, printed } = silenced(() => parseMetadata(text));
      assert.deepEqual(printed, [], text);
      assert.equal(m.problems.length, 1, text);
      assert.match(m.problems[0].message, /key is a list, a map or an alias/);
      assert.equal(text.slice(m.problems[0].span.start, m.problems[0].span.end).trim(), key);
    }
  });

  it('keeps the plain keys of a map with a collection key', () => {
    const m = parseMetadata('rate: 1 K/min\n[a, b]: 1\n');
    assert.equal(m.data.rate, '1 K/min');
    assert.ok(m.spans.has('/rate'));
  });
});
