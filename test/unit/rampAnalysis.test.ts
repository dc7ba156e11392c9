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
    // Known to one row (0.25 K): a rectangular distribution of that width, 0.25/√12 K (GUM §4.3.7).
    const resolution = b.results.tonset_deviation.budget?.find((t) => t.source === 'resolution');
    assert.ok(resolution && Math.abs(resolution.value - 0.25 / Math.sqrt(12)) < 1e-12, JSON.stringify(b.results.tonset_deviation.budget));
    // Exact lines: moving the windows changes nothing, so the budget has no window term.
    assert.ok(!(b.results.tfictive.budget ?? []).some((t) => t.source === 'window' && t.value > 1e-9), JSON.stringify(b.results.tfictive.budget));
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

/** The ln-cosh transition of Dalnoki-Veress et al., Phys. Rev. E 63, 031801 (2001), between the SCL and LC lines above, width w. */
function lnCosh(T: number, w: number): number {
  const u = Math.abs(T - 315) / w;
  return 101 + (w * 0.05 * Math.LN2) / 2 + ((T - 315) * 0.09) / 2 + ((w * 0.05) / 2) * (u + Math.log1p(Math.exp(-2 * u)) - Math.LN2);
}

describe('ramp edge cases', () => {
  it('gives no Tg, on the last row, when a broad cooling ends too close below Tg', () => {
    // Cooling 345 → 306 K through a transition 3 K wide (ln-cosh): the glass line cannot be placed.
    const g = gaussian(21);
    const rows: number[][] = [];
    for (let T = 345, t = 0; T >= 306 - 1e-9; T -= 0.5, t += 30) rows.push([t, T, lnCosh(T, 3) + 0.01 * g()]);
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cooling\n', 't/s, T/K, h/nm', rows, 6);
    const b = analyse(ramp);
    assert.equal(b.results.tg, undefined);
    assert.equal(b.results.alpha_glass, undefined);
    const d = b.diagnostics.find((x) => x.code === 'ramp.tg-at-edge');
    assert.ok(d, JSON.stringify(b.diagnostics));
    // The row where the data end on the glass side: the lowest temperature, the last row.
    assertOnRow(d, fileText(ramp), 't/s, T/K, h/nm', rows.length - 1);
  });

  it('warns, on the last row, when a broad cooling ends before the glass line can straighten', () => {
    // ln-cosh 3 K wide, cooling 345 → 296 K: 19 K below Tg, less than 2·(2·315/80) + 5 ≈ 20.8 K
    // [computed]; the glass gap shrinks and Tg is still given, with the warning.
    const g = gaussian(22);
    const rows: number[][] = [];
    for (let T = 345, t = 0; T >= 296 - 1e-9; T -= 0.25, t += 15) rows.push([t, T, lnCosh(T, 3) + 0.01 * g()]);
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cooling\n', 't/s, T/K, h/nm', rows, 6);
    const b = analyse(ramp);
    assert.ok(b.results.tg, JSON.stringify(b.diagnostics));
    const d = b.diagnostics.find((x) => x.code === 'ramp.short-glass');
    assert.ok(d, JSON.stringify(b.diagnostics));
    assertOnRow(d, fileText(ramp), 't/s, T/K, h/nm', rows.length - 1);
  });

  it('reports no onset when the extrapolated onset lies below the first heating point', () => {
    // A liquid only a little steeper than the glass (VD h = 99.9 + 0.020(T − 300), SCL
    // h = 100.5 + 0.025(T − 300)) and first-order kinetics from 304 K (Avrami exponent 1,
    // x = 1 − exp(−(T − 304)/20), Avrami, J. Chem. Phys. 7, 1103 (1939)): the line through
    // 0.2 ≤ x ≤ 0.8 meets the as-deposited line at 299.1 K [computed], below the first point at 300 K.
    const vdLine = (T: number): number => 99.9 + 0.02 * (T - 300);
    const sclLine = (T: number): number => 100.5 + 0.025 * (T - 300);
    const lcLine = (T: number): number => sclLine(315) + 0.02 * (T - 315);
    const rows: number[][] = [];
    let t = 0;
    for (let T = 300; T <= 345 + 1e-9; T += 0.5, t += 30) {
      const x = T <= 304 ? 0 : 1 - Math.exp(-(T - 304) / 20);
      rows.push([t, T, vdLine(T) + x * (sclLine(T) - vdLine(T))]);
    }
    for (let T = 344.5; T >= 280 - 1e-9; T -= 0.5, t += 30) rows.push([t, T, T >= 315 ? sclLine(T) : lcLine(T)]);
    // The as-deposited part is named, since only 8 points precede the transformation.
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\nwindows:\n  deposited: [300 K, 303.5 K]\n', 't/s, T/K, h/nm', rows, 9);
    const b = analyse(ramp);
    assert.equal(b.results.tonset, undefined, JSON.stringify(b.results.tonset));
    const d = b.diagnostics.find((x) => x.code === 'ramp.onset-outside-data');
    assert.ok(d, JSON.stringify(b.diagnostics));
    assertOnRow(d, fileText(ramp), 't/s, T/K, h/nm', 0);
    // The other figures are still computed (Tf = 300 − 0.6/0.005 = 180 K [computed], far below the data, and flagged so).
    assert.ok(b.results.tfictive && b.results.tg);
  });

  it('flags a density gain evaluated more than 20 K outside the measured lines and does not report it', () => {
    // Both glass lines start at 280 K; 250 K is 30 K below.
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 250 K\n', 't/s, T/K, h/nm', cycleRows(), 9);
    const b = analyse(ramp);
    assert.equal(b.results.density_gain, undefined);
    const d = b.diagnostics.find((x) => x.code === 'ramp.density-gain-extrapolated');
    assert.ok(d);
    assert.equal(d.line, fileText(ramp).split('\n').findIndex((l) => l.startsWith('reference_temperature')) + 1);
    // 265 K, 15 K outside, is still reported (the fitted lines' variances carry the extrapolation).
    const near = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 265 K\n', 't/s, T/K, h/nm', cycleRows(), 9));
    assert.ok(near.results.density_gain);
  });

  it('leaves out exact duplicate rows with a warning, so they do not shrink the uncertainty', () => {
    const g = gaussian(5);
    const rows = cycleRows(g, 0.01);
    const doubled = rows.flatMap((r, i) => (i >= 100 && i < 200 ? [r, r] : [r]));
    const once = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, h/nm', rows, 6));
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, h/nm', doubled, 6);
    const twice = analyse(ramp);
    const d = twice.diagnostics.find((x) => x.code === 'ramp.duplicate-rows');
    assert.ok(d);
    // The first repeat is row 101 of the doubled table (row 100 written again).
    assertOnRow(d, fileText(ramp), 't/s, T/K, h/nm', 101);
    for (const name of ['tg', 'tfictive', 'tonset', 'density_gain']) {
      assert.equal(twice.results[name].value, once.results[name].value, name);
      assert.equal(twice.results[name].uncertainty, once.results[name].uncertainty, name);
    }
  });

  it('rejects a non-positive thickness with an error on its row and computes nothing', () => {
    const rows = cycleRows();
    rows[40][2] = -5;
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', rows, 9);
    const b = analyse(ramp);
    assert.deepEqual(b.results, {});
    const d = b.diagnostics.find((x) => x.code === 'ramp.thickness-not-positive');
    assert.ok(d && d.severity === 'error');
    assertOnRow(d, fileText(ramp), 't/s, T/K, h/nm', 40);
  });

  it('rejects an all-isothermal ramp with an error, not numbers', () => {
    const rows = Array.from({ length: 60 }, (_, i) => [30 * i, 300, 100 + 0.001 * (i % 3)]);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', rows, 9));
    assert.deepEqual(b.results, {});
    const d = b.diagnostics.find((x) => x.code === 'ramp.no-temperature-change');
    assert.ok(d && d.severity === 'error', JSON.stringify(b.diagnostics));
    assert.ok(!b.diagnostics.some((x) => x.code === 'ramp.no-cooling'));
  });

  it('rejects an as-deposited window that holds no data with an error on the window', () => {
    const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nwindows:\n  deposited: [200 K, 210 K]\n', 't/s, T/K, h/nm', cycleRows(), 9);
    const b = analyse(ramp);
    const d = b.diagnostics.find((x) => x.code === 'ramp.empty-window');
    assert.ok(d && d.severity === 'error', JSON.stringify(b.diagnostics));
    assert.equal(d.line, fileText(ramp).split('\n').findIndex((l) => l.includes('deposited:')) + 1);
    assert.equal(b.results.tfictive, undefined);
  });
});

describe('ramp uncertainty budget', () => {
  it('lists statistical, window and calibration terms whose quadrature sum is the uncertainty', () => {
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\n', 't/s, T/K, h/nm', cycleRows(gaussian(9), 0.01), 6));
    const tg = b.results.tg;
    const sources = (tg.budget ?? []).map((t) => t.source);
    assert.ok(sources.includes('statistical') && sources.includes('calibration'), JSON.stringify(tg.budget));
    // The default thermometer calibration, 0.5 K standard uncertainty, as the note says.
    assert.equal(tg.budget!.find((t) => t.source === 'calibration')!.value, 0.5);
    // GUM, JCGM 100:2008 §5.1.2: independent terms add in quadrature.
    assert.ok(Math.abs(Math.hypot(...tg.budget!.map((t) => t.value)) - tg.uncertainty!) < 1e-9);
    const written = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\ntemperature_calibration: 0.2 K\n', 't/s, T/K, h/nm', cycleRows(gaussian(9), 0.01), 6));
    assert.equal(written.results.tfictive.budget!.find((t) => t.source === 'calibration')!.value, 0.2);
    // Expansivities carry no calibration term (an offset of the thermometer leaves slopes alone).
    assert.ok(!(b.results.alpha_glass.budget ?? []).some((t) => t.source === 'calibration'));
  });

  it('switches to two windows for a broad transition and says which windows', () => {
    // ln-cosh cooling 3 K wide: a hinge bends both slopes; the method names the windows in K.
    const g = gaussian(4);
    const rows: number[][] = [];
    for (let T = 350, t = 0; T >= 270 - 1e-9; T -= 0.25, t += 15) rows.push([t, T, lnCosh(T, 3) + 0.02 * g()]);
    const b = analyse(tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ndirection: cooling\n', 't/s, T/K, h/nm', rows, 6));
    assert.match(b.results.tg.method, /two windows iterated from the hinge fit \(glass 270–[0-9.]+ K, liquid [0-9.]+–350 K/);
    assert.ok(Math.abs(b.results.tg.value - 315) < 2 * b.results.tg.uncertainty!);
    assert.match(b.results.alpha_glass.method, /out-of-plane/);
  });
});
