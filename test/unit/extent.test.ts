import assert from 'node:assert/strict';
import { extent } from '../../extension/core/numeric/extent.js';
import { uniform } from '../support/random.js';

describe('extent', () => {
  it('gives the least and greatest value, as Math.min and Math.max do on short input', () => {
    const u = uniform(5);
    for (let k = 0; k < 50; k++) {
      const xs = Array.from({ length: 1 + Math.floor(u() * 20) }, () => (u() - 0.5) * 1e3);
      assert.deepEqual(extent(xs), [Math.min(...xs), Math.max(...xs)]);
    }
  });

  it('takes a 200 000-value column in one loop (a spread into Math.min overflows the stack there)', () => {
    const xs = Float64Array.from({ length: 200_000 }, (_, i) => 300 + Math.sin(i));
    const [lo, hi] = extent(xs);
    assert.ok(lo >= 299 && lo < 299.001 && hi <= 301 && hi > 300.999, `${lo} ${hi}`);
  });

  it('skips NaN, as d3-array skips missing values, and keeps infinities', () => {
    assert.deepEqual(extent([NaN, 3, NaN, -2, 7]), [-2, 7]);
    assert.deepEqual(extent([2, -Infinity, Infinity]), [-Infinity, Infinity]);
  });

  it('gives [NaN, NaN] for an empty sequence or one of NaN only', () => {
    assert.deepEqual(extent([]), [NaN, NaN]);
    assert.deepEqual(extent(new Float64Array(0)), [NaN, NaN]);
    assert.deepEqual(extent([NaN, NaN]), [NaN, NaN]);
  });
});
