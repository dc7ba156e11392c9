import assert from 'node:assert/strict';
import fc from 'fast-check';
import { Hasher, hashParts, hashText } from '../../extension/core/text/hash.js';
import { LineIndex } from '../../extension/core/text/positions.js';

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

  it('hashes the layout of lines as ",start.0" for each line, in one loop', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom('a', '\n', 'bc', '\n\n'), { maxLength: 40 }), fc.oneof(fc.integer({ min: -20, max: 20 }), fc.constantFrom(2 ** 31 - 3, -(2 ** 31))), (pieces, shift) => {
        const index = new LineIndex(pieces.join(''));
        const written = Array.from({ length: index.lineCount }, (_, i) => `,${index.lineStart(i) + shift}.0`).join('');
        assert.equal(new Hasher().text('x').lineLayout(index, shift).digest(), hashText(`x${written}`));
      }),
      { seed: 20261207, numRuns: 1000 },
    );
  });
});
