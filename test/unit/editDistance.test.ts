import assert from 'node:assert/strict';
import { abbreviates, boundedDamerauLevenshtein, nearest } from '../../extension/core/text/editDistance.js';
import { suggest } from '../../extension/core/schema/validator.js';

describe('boundedDamerauLevenshtein', () => {
  it('counts the four single-error classes of Damerau (1964) as one edit each', () => {
    // Damerau, Comm. ACM 7(3), 1964: insertion, deletion, substitution, adjacent transposition.
    assert.equal(boundedDamerauLevenshtein('rate', 'rates', 2), 1);
    assert.equal(boundedDamerauLevenshtein('rate', 'rte', 2), 1);
    assert.equal(boundedDamerauLevenshtein('rate', 'rote', 2), 1);
    assert.equal(boundedDamerauLevenshtein('relaxtion', 'relaxation', 2), 1);
    assert.equal(boundedDamerauLevenshtein('subtrate', 'substrate', 2), 1);
    assert.equal(boundedDamerauLevenshtein('rmap', 'ramp', 2), 1);
  });

  it('gives the textbook values of the restricted distance', () => {
    // kitten → sitting: 3 (two substitutions and an insertion; the usual worked example, from memory).
    assert.equal(boundedDamerauLevenshtein('kitten', 'sitting', 3), 3);
    // CA → ABC: 3 for the restricted (optimal string alignment) distance, 2 for the unrestricted
    // one (the usual counter-example, from memory): a transposed pair is not edited again.
    assert.equal(boundedDamerauLevenshtein('CA', 'ABC', 3), 3);
    assert.equal(boundedDamerauLevenshtein('', 'abc', 3), 3);
    assert.equal(boundedDamerauLevenshtein('same', 'same', 0), 0);
  });

  it('returns limit + 1 beyond the limit, and is symmetric', () => {
    assert.equal(boundedDamerauLevenshtein('kitten', 'sitting', 2), 3);
    assert.equal(boundedDamerauLevenshtein('python', 'deposition', 2), 3);
    assert.equal(boundedDamerauLevenshtein('a'.repeat(100), 'a'.repeat(99), 2), 3);
    for (const [a, b] of [['substrate_temp', 'substrate_temperature'], ['isoterm', 'isotherm'], ['dcs', 'dsc']]) {
      assert.equal(boundedDamerauLevenshtein(a, b, 8), boundedDamerauLevenshtein(b, a, 8), `${a} ${b}`);
    }
  });
});

describe('near-miss keys', () => {
  const deposition = ['material', 'substrate_temperature', 'rate', 'thickness', 'duration', 'base_pressure', 'substrate', 'source_temperature', 'sensor', 'date', 'operator', 'chamber', 'notes'];

  it('finds a key mistyped, in another case, or abbreviated', () => {
    assert.equal(suggest('subtrate_temperature', deposition), 'substrate_temperature');
    assert.equal(suggest('Rate', deposition), 'rate');
    assert.equal(suggest('substrate_temp', deposition), 'substrate_temperature');
    assert.equal(suggest('base_press', deposition), 'base_pressure');
    assert.equal(suggest('thicknes', deposition), 'thickness');
  });

  it('offers nothing for a word far from every key, or equally near two', () => {
    assert.equal(suggest('colour', deposition), null);
    assert.equal(suggest('xy', deposition), null);
    assert.equal(nearest('ab', ['ac', 'ad'], 1), null);
    assert.equal(abbreviates('s', 'substrate'), false);
    assert.equal(abbreviates('sub_temp', 'substrate_temperature'), true);
  });
});
