import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { gaussian } from '../support/random.js';
import { assertOnRow } from '../support/rowRange.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

// Worked case, exact by algebra [computed], decadic VFT: (A, B, T0) = (−14, 700 K, 200 K), Tg = 243.75 K;
// at Tg + 10 K τ = 0.10550081484 s, and a 1.0e4 s transformation gives t/τα = 94786.0.
const VFT = 'vft:\n  log10_tau0: -14\n  B: 700 K\n  T0: 200 K\n';

const fileText = (rows: number[][], meta = ''): string => DEPOSITION_BLOCK('D-1', 210) + tableBlock('isotherm', 'I-1', `film: D-1\ntemperature: 253.75 K\n${meta}`, 't/s, T/K, h/nm', rows, 9);

function isotherm(rows: number[][], meta = ''): ReturnType<typeof toJsonReport>['files'][number]['blocks'][number] {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('m.md', MATERIAL_BLOCK(243.75, VFT));
  nb.setFile('d.md', fileText(rows, meta));
  return toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
}

/** 300 nm as deposited, transforming linearly from 7000 s to 10000 s, then a plateau. */
function hold(noise: () => number = () => 0, sigma = 0, end = 14000): number[][] {
  const rows: number[][] = [];
  for (let t = 0; t <= end; t += 20) {
    const x = Math.min(1, Math.max(0, (t - 7000) / 3000));
    rows.push([t, 253.75, 300 + 6 * x + sigma * noise()]);
  }
  return rows;
}

describe('isotherm analysis', () => {
  it('finds the transformation and the stability ratio of the worked case', () => {
    const b = isotherm(hold());
    assert.ok(Math.abs(b.results.onset_time.value - 7000) < 1e-3, `t1 ${b.results.onset_time.value}`);
    assert.ok(Math.abs(b.results.transformation_time.value - 10000) < 1e-3);
    // A front of constant velocity (Swallen et al., Phys. Rev. Lett. 102, 065503 (2009)): a 300 nm
    // film transforming over 3000 s gives v = 0.1 nm/s [computed].
    assert.ok(Math.abs(b.results.front_velocity.value - 0.1) < 1e-7);
    assert.ok(Math.abs(b.results.tau_alpha.value - 0.10550081484) < 1e-9);
    assert.ok(Math.abs(b.results.stability_ratio.value - 94786.0) < 0.5, `S ${b.results.stability_ratio.value}`);
    assert.deepEqual(b.diagnostics, []);
  });

  it('carries the hold thermometer into the relaxation time and the stability ratio', () => {
    // d log10 τ / dT = −B/(T − T0)² for the decadic VFT law (Böhmer, Ngai, Angell & Plazek,
    // J. Chem. Phys. 99, 4201 (1993)): at T − T0 = 53.75 K and B = 700 K, a 0.5 K uncertainty of the
    // hold temperature is 700·0.5/53.75² = 0.1211 decade [computed], i.e. u(τ)/τ = ln 10 · 0.1211.
    const relative = (Math.LN10 * 700 * 0.5) / (53.75 * 53.75);
    const b = isotherm(hold());
    const tau = b.results.tau_alpha;
    const term = tau.budget?.find((t) => t.source === 'calibration');
    assert.ok(term, JSON.stringify(tau.budget));
    assert.ok(Math.abs(term.value / tau.value - relative) < 1e-9, `${term.value / tau.value}`);
    const s = b.results.stability_ratio;
    assert.ok(Math.abs(s.budget!.find((t) => t.source === 'calibration')!.value / s.value - relative) < 1e-9);
    // A better thermometer, written: the term scales with it.
    const better = isotherm(hold(), 'temperature_calibration: 0.1 K\n').results.tau_alpha;
    const t2 = better.budget!.find((t) => t.source === 'calibration')!;
    assert.ok(Math.abs(t2.value / better.value - relative / 5) < 1e-9);
  });

  it('halves the front velocity with two fronts', () => {
    const b = isotherm(hold(), 'fronts: 2\n');
    assert.ok(Math.abs(b.results.front_velocity.value - 0.05) < 1e-7);
  });

  it('gives uncertainties that cover the truth with noise', () => {
    const b = isotherm(hold(gaussian(4), 0.05));
    for (const [name, truth] of [['onset_time', 7000], ['transformation_time', 10000]] as const) {
      const r = b.results[name];
      assert.ok(r.uncertainty! > 0 && Math.abs(r.value - truth) < 4 * r.uncertainty!, `${name} ${r.value} ± ${r.uncertainty}`);
    }
  });

  it('warns when there is no final plateau', () => {
    const b = isotherm(hold(() => 0, 0, 9900));
    assert.ok(b.diagnostics.some((d) => d.code === 'isotherm.no-final-plateau'), JSON.stringify(b.diagnostics));
    assert.match(b.results.transformation_time.method, /lower bound/);
  });

  it('flags a drifting hold temperature on its row', () => {
    const rows = hold();
    rows[100][1] = 254.5;
    const b = isotherm(rows);
    const d = b.diagnostics.find((x) => x.code === 'isotherm.temperature-drift');
    assert.ok(d);
    assertOnRow(d, fileText(rows), 't/s, T/K, h/nm', 100);
  });
});

describe('isotherm flags', () => {
  it('warns of a sigmoidal (non-linear) transformation', () => {
    const g = gaussian(12);
    const rows: number[][] = [];
    for (let t = 0; t <= 14000; t += 20) {
      const x = 1 - Math.exp(-Math.pow(Math.max(0, t - 3000) / 3000, 3));
      rows.push([t, 253.75, 300 + 6 * x + 0.01 * g()]);
    }
    const b = isotherm(rows);
    assert.ok(b.diagnostics.some((d) => d.code === 'isotherm.sigmoidal'), JSON.stringify(b.diagnostics.map((d) => d.code)));
  });

  it('warns of evaporation after the plateau and of an abrupt drop', () => {
    const rows = hold().map(([t, T, h]) => [t, T, t > 10000 ? h - 0.0002 * (t - 10000) : h]);
    const b = isotherm(rows);
    assert.ok(b.diagnostics.some((d) => d.code === 'isotherm.evaporation'), JSON.stringify(b.diagnostics.map((d) => d.code)));
    const dropped = hold().map(([t, T, h]) => [t, T, t >= 12000 ? h - 3 : h]);
    assert.ok(isotherm(dropped).diagnostics.some((d) => d.code === 'isotherm.abrupt-drop'));
  });
});
