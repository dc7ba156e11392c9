import assert from 'node:assert/strict';
import fc from 'fast-check';
import { Hasher, hashParts, hashText } from '../../extension/core/text/hash.js';

describe('cache-key hash', () => {
  it('hashes parts as the text they make joined by U+0000, without joining them', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'binary' }), { maxLength: 5 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), (parts, seed) => {
        assert.equal(hashParts(parts, seed), hashText(parts.join('\u0000'), seed));
      }),
      { seed: 20261202, numRuns: 500 },
    );
  });

  it('hashes an integer as the characters of its decimal numeral', () => {
    fc.assert(
      fc.property(fc.oneof(fc.integer(), fc.integer({ min: 0, max: 100 }), fc.constantFrom(0, -0, 9, 10, 99, 100, 2 ** 31 - 1, 2 ** 31, -(2 ** 31), 1e15, -1e15, 2 ** 53 - 1)), (n) => {
        assert.equal(new Hasher().text('a').integer(n).digest(), hashText(`a${n}`));
      }),
      { seed: 20261206, numRuns: 2000 },
    );
  });
});
