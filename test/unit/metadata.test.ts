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

describe('decimal commas and YAML flow lists', () => {
  it('leaves a flow list split at its commas, and a plain value whole', () => {
    // YAML 1.2 (2009), 7.4: a comma separates the entries of a flow sequence.
    const m = parseMetadata('glass: [250,280]\ntsub: 12,5 °C\n');
    assert.deepEqual(m.data.glass, [250, 280]);
    assert.equal(m.data.tsub, '12,5 °C');
    assert.ok(m.spans.has('/glass/1'));
  });
});

describe('clock times in metadata', () => {
  it('keeps "1:10" as text, for the quantity reader to judge', () => {
    // YAML 1.2 (2009), 10.3.2: the core schema has no base-60 integers; YAML 1.1 read "1:10" as 70.
    const m = parseMetadata('duration: 1:10\nhold: 00:29:10\n');
    assert.equal(m.data.duration, '1:10');
    assert.equal(m.data.hold, '00:29:10');
  });
});
