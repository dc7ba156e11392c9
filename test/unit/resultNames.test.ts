import assert from 'node:assert/strict';
import { catalogueEntry, resultText } from '../../extension/core/index.js';
import { equivalentAgingTime } from '../../extension/core/analysis/agingTime.js';

describe('names that say which construction they are', () => {
  it('labels the DSC onset as the glass-transition onset, apart from the ramp onset', () => {
    // ASTM E1356 / ISO 11357-2 (extrapolated onset of the glass transition) against the onset of
    // the thickness transformation on heating a ramp: one result name, two constructions.
    assert.equal(catalogueEntry('tonset', 'dsc')?.label, 'T_g,onset');
    assert.equal(catalogueEntry('tonset', 'ramp')?.label, 'T_onset');
    assert.equal(catalogueEntry('tonset')?.label, 'T_onset');
    assert.match(catalogueEntry('tonset', 'dsc')!.meaning, /glass transition/);
    assert.notEqual(catalogueEntry('tonset', 'dsc')!.meaning, catalogueEntry('tonset', 'ramp')!.meaning);
  });

  it('prints the equivalent aging time as its bracket first, the central value only after it', () => {
    // Tg = 315 K, m = 80, A = −14 (T0 = 252 K, B = 1008 K) and Tf = Tg − 30 K: VFT gives
    // log τ = 16.5 and the constant slope log τ = 10.4 [computed]; six decades apart, so the
    // bracket is the figure (Berthier & Ediger, J. Chem. Phys. 152, 044501 (2020)).
    const r = equivalentAgingTime(285, { log10Tau0: -14, B: 1008, T0: 252 }, 315)!;
    const text = resultText('equivalent_aging_time', r);
    assert.match(text, /^\[/);
    assert.match(text, /bracket; geometric mean/);
    assert.ok(text.indexOf(']') < text.indexOf('geometric mean'));
    assert.equal(catalogueEntry('equivalent_aging_time')?.label, 't_eq (bracket)');
    assert.match(r.method, /^bracket \[/);
    assert.ok(Math.abs(Math.log10(r.interval![1] / r.interval![0]) - 6.1) < 0.1, `${r.interval}`);
  });
});
