import assert from 'node:assert/strict';
import fc from 'fast-check';
import { LineIndex, sparsePositions } from '../../extension/core/text/positions.js';

describe('positions for a report', () => {
  it('gives every offset the line and character the full line index gives', () => {
    // Long runs of short lines, so that the kept starts (every 64th line) and the counting between them are both used.
    const pieces = (...p: string[]) => fc.array(fc.constantFrom(...p), { maxLength: 600 }).map((a) => a.join(''));
    const text = fc.oneof(pieces('a', '\n', 'bc', '\n\n', 'é'), pieces('a', '\n', 'bc', '\r\n', '\r'));
    fc.assert(
      fc.property(text, fc.array(fc.integer({ min: -2, max: 2000 }), { maxLength: 20 }), (t, offsets) => {
        const full = new LineIndex(t);
        const sparse = sparsePositions(t);
        for (const o of [0, t.length, ...offsets]) assert.deepEqual(sparse.positionAt(o), full.positionAt(o), `offset ${o}`);
      }),
      { seed: 20261208, numRuns: 500 },
    );
  });
});
