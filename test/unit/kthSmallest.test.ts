import assert from 'node:assert/strict';
import fc from 'fast-check';
import { kthSmallest } from '../../extension/core/numeric/abruptDrop.js';

describe('k-th smallest value', () => {
  it('is the value a sort puts at k, ties and repeats included', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.constantFrom(0, 1, 1, 2)), { minLength: 1, maxLength: 300 }),
        fc.nat(),
        (values, k0) => {
          const k = k0 % values.length;
          const sorted = Float64Array.from(values).sort();
          // (−0 and 0 count as equal, as the comparisons of the selection see them.)
          assert.ok(kthSmallest(Float64Array.from(values), k) === sorted[k], `k = ${k}`);
        },
      ),
      { seed: 20261202, numRuns: 2000 },
    );
  });
});
