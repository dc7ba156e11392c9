import assert from 'node:assert/strict';
import fc from 'fast-check';
import { hashParts, hashText } from '../../extension/core/text/hash.js';

describe('cache-key hash', () => {
  it('hashes parts as the text they make joined by U+0000, without joining them', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'binary' }), { maxLength: 5 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), (parts, seed) => {
        assert.equal(hashParts(parts, seed), hashText(parts.join('\u0000'), seed));
      }),
      { seed: 20261202, numRuns: 500 },
    );
  });
});
