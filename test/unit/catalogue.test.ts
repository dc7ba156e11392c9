import assert from 'node:assert/strict';
import { BLOCK_KINDS } from '../../extension/core/index.js';
import { RESULT_CATALOGUE, RESULT_NAMES, catalogueEntry } from '../../extension/core/model/catalogue.js';
import { loadNotebook } from '../support/loadNotebook.js';

// The result names and units of DESIGN.md's results contract.
const CONTRACT: ReadonlyArray<[string, string]> = [
  ['tg_vft', 'K'],
  ['fragility', '1'],
  ['vft_log10_tau0', '1'],
  ['vft_B', 'K'],
  ['vft_T0', 'K'],
  ['tsub_over_tg', '1'],
  ['expected_thickness', 'nm'],
  ['tg', 'K'],
  ['alpha_glass', '1/K'],
  ['alpha_liquid', '1/K'],
  ['tonset', 'K'],
  ['tfictive', 'K'],
  ['density_gain', '%'],
  ['reference_temperature', 'K'],
  ['onset_time', 's'],
  ['transformation_time', 's'],
  ['front_velocity', 'nm/s'],
  ['tau_alpha', 's'],
  ['stability_ratio', '1'],
  ['tg_midpoint', 'K'],
  ['enthalpy_gap', 'J/g'],
  ['standard_tg', 'K'],
];

describe('results catalogue', () => {
  it('has every result name of the results contract, with its unit', () => {
    for (const [name, unit] of CONTRACT) {
      const e = catalogueEntry(name);
      assert.ok(e, `${name} is catalogued`);
      assert.equal(e.unit, unit, name);
    }
  });

  it('gives each entry a label, a meaning, a source, kinds and display hints', () => {
    for (const name of RESULT_NAMES) {
      const e = RESULT_CATALOGUE[name];
      assert.equal(e.name, name);
      for (const field of ['label', 'unit', 'meaning', 'source'] as const) assert.ok(e[field].trim().length > 0, `${name}.${field}`);
      assert.ok(e.kinds.length > 0 && e.kinds.every((k) => (BLOCK_KINDS as readonly string[]).includes(k)), `${name}.kinds`);
      assert.ok(Number.isInteger(e.digits) && e.digits >= 2 && e.digits <= 6, `${name}.digits`);
      assert.ok(e.notation === 'fixed' || e.notation === 'exponential', `${name}.notation`);
    }
    assert.equal(new Set(RESULT_NAMES).size, RESULT_NAMES.length, 'names are unique');
  });

  it('uses the practitioner labels and exponential notation for figures that span decades', () => {
    assert.equal(RESULT_CATALOGUE.tg.label, 'Tg');
    assert.equal(RESULT_CATALOGUE.tfictive.label, 'Tf');
    assert.equal(RESULT_CATALOGUE.tonset.label, 'T_onset');
    assert.equal(RESULT_CATALOGUE.density_gain.label, 'Δρ/ρ');
    assert.equal(RESULT_CATALOGUE.fragility.label, 'm');
    for (const name of ['stability_ratio', 'tau_alpha', 'equivalent_aging_time'] as const) assert.equal(RESULT_CATALOGUE[name].notation, 'exponential', name);
  });

  it('knows nothing of names it does not list, inherited ones included', () => {
    assert.equal(catalogueEntry('no_such_result'), undefined);
    assert.equal(catalogueEntry('toString'), undefined);
    assert.equal(catalogueEntry('__proto__'), undefined);
  });

  it('has an entry for every result the engine emits on the demo notebook, with its kind and unit', () => {
    const { notebook } = loadNotebook('fixtures/demo');
    const seen = new Map<string, Set<string>>();
    for (const file of notebook.analyze().files) {
      for (const block of file.blocks) {
        for (const [name, r] of Object.entries(block.results)) {
          seen.set(name, (seen.get(name) ?? new Set()).add(block.kind));
          const e = catalogueEntry(name);
          assert.ok(e, `${file.path} ${block.kind} ${block.id ?? ''}: ${name} has no catalogue entry`);
          assert.ok((e.kinds as readonly string[]).includes(block.kind), `${name} is listed for ${block.kind}`);
          assert.equal(r.unit, e.unit, `${name} unit`);
        }
      }
    }
    // The demo exercises every catalogued result from every kind listed for it, so the catalogue
    // holds no name (or kind) that nothing emits.
    assert.deepEqual([...seen.keys()].sort(), [...RESULT_NAMES].sort());
    for (const name of RESULT_NAMES) assert.deepEqual([...seen.get(name)!].sort(), [...RESULT_CATALOGUE[name].kinds].sort(), name);
  });
});
