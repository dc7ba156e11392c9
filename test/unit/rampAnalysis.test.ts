import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport, type JsonReport } from '../../extension/core/index.js';
import { gaussian } from '../support/random.js';
import { assertOnRow } from '../support/rowRange.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

const fileText = (ramp: string, tsub = 270): string => DEPOSITION_BLOCK('D-1', tsub) + '\n' + ramp;

function analyse(ramp: string, tsub = 270): JsonReport['files'][number]['blocks'][number] {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('m.md', MATERIAL_BLOCK());
  nb.setFile('d.md', fileText(ramp, tsub));
  return toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
}

// Worked case, exact by algebra [computed]: VD h = 99.90 + 0.020(T − 300), SCL h = 101.0 + 0.070(T − 315),
// LC h = 101.0 + 0.020(T − 315): Tf (VD ∩ SCL) = 299.0 K and Δρ/ρ(300 K) = h_LC/h_VD − 1 = 0.801 %,
// the density gain over the liquid-cooled glass of Dalal & Ediger, J. Phys. Chem. Lett. 3, 1229 (2012).
const vd = (T: number) => 99.9 + 0.02 * (T - 300);
const scl = (T: number) => 101.0 + 0.07 * (T - 315);
const lc = (T: number) => 101.0 + 0.02 * (T - 315);

function cycleRows(noise: () => number = () => 0, sigma = 0): number[][] {
  const rows: number[][] = [];
  let t = 0;
  for (let T = 280; T <= 345 + 1e-9; T += 0.25) {
    // Linear transformation in x from 326 to 331 K.
    const x = Math.min(1, Math.max(0, (T - 326) / 5));
    rows.push([t, T, vd(T) + x * (scl(T) - vd(T)) + sigma * noise()]);
    t += 15;
  }
  for (let T = 344.75; T >= 280 - 1e-9; T -= 0.25) {
    rows.push([t, T, (T >= 315 ? scl(T) : lc(T)) + sigma * noise()]);
    t += 15;
  }
  return rows;
}

describe('ramp analysis', () => {
  it('gives Tf = 299.0 K, Δρ/ρ(300 K) = 0.801 % and Tg = 315 K for exact VD, SCL and LC lines', () => {
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, h/nm', cycleRows(), 9));
    assert.ok(Math.abs(b.results.tg.value - 315) < 1e-6, `tg ${b.results.tg.value}`);
    assert.ok(Math.abs(b.results.tfictive.value - 299.0) < 1e-6, `tf ${b.results.tfictive.value}`);
    // 100·(100.7/99.9 − 1) = 0.8008008… [computed]
    assert.ok(Math.abs(b.results.density_gain.value - 0.8008008008) < 1e-6, `gain ${b.results.density_gain.value}`);
    assert.equal(b.results.reference_temperature.value, 300);
    assert.ok(Math.abs(b.results.tonset.value - 326) < 0.3, `onset ${b.results.tonset.value}`);
    // The first point past 326 K leaves the exact VD line: 326.25 K.
    assert.equal(b.results.tonset_deviation.value, 326.25);
    // Exact lines: moving the windows changes nothing, and the method says so.
    const spread = Number(/window sensitivity ±(\S+) K$/.exec(b.results.tfictive.method)?.[1]);
    assert.ok(spread < 1e-9, b.results.tfictive.method);
    // α at Tg: 0.02/101 and 0.07/101 [computed].
    assert.ok(Math.abs(b.results.alpha_glass.value - 0.02 / 101) < 1e-10);
    assert.ok(Math.abs(b.results.alpha_liquid.value - 0.07 / 101) < 1e-10);
  });

  it('defaults the reference temperature to the substrate temperature', () => {
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', cycleRows(), 9), 290);
    assert.equal(b.results.reference_temperature.value, 290);
    const expected = 100 * (lc(290) / vd(290) - 1);
    assert.ok(Math.abs(b.results.density_gain.value - expected) < 1e-6);
  });

  it('puts the true values inside about two standard uncertainties with noise', () => {
    const g = gaussian(3);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, h/nm', cycleRows(g, 0.01)));
    for (const [name, truth] of [['tg', 315], ['tfictive', 299], ['density_gain', 0.8008008]] as const) {
      const r = b.results[name];
      assert.ok(r.uncertainty !== undefined && r.uncertainty > 0, name);
      assert.ok(Math.abs(r.value - truth) < 3 * r.uncertainty, `${name} ${r.value} ± ${r.uncertainty}`);
    }
  });

  it('uses Method B when glass and liquid windows are given', () => {
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nwindows:\n  glass: [282 K, 305 K]\n  liquid: [325 K, 344 K]\n', 't/s, T/K, h/nm', cycleRows(), 9));
    assert.ok(Math.abs(b.results.tg.value - 315) < 1e-6);
    assert.match(b.results.tg.method, /two windows/);
  });

  it('reports no transition for a straight line, and no Tg from heating only', () => {
    const g = gaussian(8);
    const line = Array.from({ length: 120 }, (_, i) => [345 - 0.5 * i, 100 + 0.03 * (345 - 0.5 * i - 315) + 0.01 * g()]);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cooling\n', 'T/K, h/nm', line, 9));
    assert.equal(b.results.tg, undefined);
    assert.ok(b.diagnostics.some((d) => d.code === 'ramp.no-transition' || d.code === 'ramp.weak-transition'), JSON.stringify(b.diagnostics));
    const heat = Array.from({ length: 120 }, (_, i) => [280 + 0.5 * i, vd(280 + 0.5 * i)]);
    const h = analyse(tableBlock('ramp', 'R-2', 'film: D-1\nrate: 1 K/min\n', 'T/K, h/nm', heat, 9));
    assert.equal(h.results.tg, undefined);
    assert.ok(h.diagnostics.some((d) => d.code === 'ramp.no-cooling'));
  });

  it('reports mixed heating and cooling without a time column on the row', () => {
    const rows = Array.from({ length: 60 }, (_, i) => [300 + 0.5 * i, 100]);
    rows[30] = [300 + 0.5 * 30 - 3, 100];
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 'T/K, h/nm', rows, 9);
    const d = analyse(ramp).diagnostics.find((x) => x.code === 'ramp.mixed-direction');
    assert.ok(d);
    // Row 30 (312 K after 314.5 K) steps back; row 24 reads the same, so the line tells them apart.
    assertOnRow(d, fileText(ramp), 'T/K, h/nm', 30);
  });
});

describe('ramp flags', () => {
  it('warns of an abrupt drop on its row', () => {
    const rows = cycleRows();
    for (let i = 400; i < rows.length; i++) rows[i][2] -= 2;
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', rows, 9);
    const d = analyse(ramp).diagnostics.find((x) => x.code === 'ramp.abrupt-drop');
    assert.ok(d);
    // The first lowered point, row 400.
    assertOnRow(d, fileText(ramp), 't/s, T/K, h/nm', 400);
  });

  it('warns of evaporation during a hold above Tg', () => {
    const rows: number[][] = [];
    let t = 0;
    for (let T = 330; T <= 345; T += 0.25, t += 15) rows.push([t, T, scl(T)]);
    for (let k = 0; k < 40; k++, t += 15) rows.push([t, 345, scl(345) - 0.0002 * k * 15]);
    for (let T = 345; T >= 290; T -= 0.25, t += 15) rows.push([t, T, (T >= 315 ? scl(T) : lc(T)) - 0.12]);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, h/nm', rows, 9));
    assert.ok(b.diagnostics.some((d) => d.code === 'ramp.evaporation'), JSON.stringify(b.diagnostics.map((d) => d.code)));
  });
});

describe('ramp direction', () => {
  it('warns when the stated direction disagrees with the data', () => {
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cooling\n', 't/s, T/K, h/nm', cycleRows(), 9));
    assert.ok(b.diagnostics.some((d) => d.code === 'ramp.direction-mismatch'));
    const ok = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cycle\n', 't/s, T/K, h/nm', cycleRows(), 9));
    assert.ok(!ok.diagnostics.some((d) => d.code === 'ramp.direction-mismatch'));
  });
});

describe('ramp without a time column', () => {
  it('splits a heat–cool cycle by the temperature alone and gives the same figures', () => {
    const rows = cycleRows().map(([, T, h]) => [T, h]);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 'T/K, h/nm', rows, 9));
    assert.ok(Math.abs(b.results.tg.value - 315) < 1e-6, JSON.stringify(b.diagnostics));
    assert.ok(Math.abs(b.results.tfictive.value - 299.0) < 1e-6);
    assert.ok(Math.abs(b.results.density_gain.value - 0.8008008008) < 1e-6);
  });

  it('reads specific volume instead of thickness', () => {
    const rows = cycleRows().map(([t, T, h]) => [t, T, h / 100]);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, V/(cm^3/g)', rows, 12));
    assert.ok(Math.abs(b.results.tfictive.value - 299.0) < 1e-6);
    assert.ok(Math.abs(b.results.density_gain.value - 0.8008008008) < 1e-6);
  });
});
