import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

/** An exact two-line cooling scan with its breakpoint at tg. */
function coolingRamp(id: string, film: string, rate: number, tg: number): string {
  const rows: number[][] = [];
  for (let T = tg + 30; T >= tg - 30 - 1e-9; T -= 0.5) rows.push([T, T >= tg ? 100 + 0.07 * (T - tg) : 100 + 0.02 * (T - tg)]);
  return tableBlock('ramp', id, `film: ${film}\nrate: ${rate} K/min\ndirection: cooling\n`, 'T/K, h/nm', rows, 9);
}

function materialResults(material: string, ramps: Array<[number, number]>) {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('m.md', material);
  nb.setFile('d.md', ramps.map(([q, tg], i) => DEPOSITION_BLOCK(`D-${i}`, 270) + coolingRamp(`R-${i}`, `D-${i}`, q, tg)).join('\n'));
  const b = toJsonReport(nb.analyze(['m.md'])).files[0].blocks[0];
  return b;
}

describe('standard Tg of a material', () => {
  it('interpolates Tg against log q to 10 K/min', () => {
    // q·τ(Tg) held constant, as in Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976) [from memory];
    // computed for a VFT liquid with Tg(10 K/min) = 315 K, m = 80, log10 τ∞ = −14 [computed]:
    // Tg = 308.0, 311.3, 315.0, 319.2 K at 0.1, 1, 10 and 100 K/min.
    const b = materialResults(MATERIAL_BLOCK(315), [[0.1, 308.0], [1, 311.3], [10, 315.0], [100, 319.2]]);
    const r = b.results.standard_tg;
    assert.ok(Math.abs(r.value - 315) < 0.3, `standard_tg ${r.value}`);
    assert.ok(r.uncertainty! > 0 && r.interval);
    assert.deepEqual(b.diagnostics.map((d) => d.code), []);
  });

  it('converts a single rate with the fragility and flags it', () => {
    // Tg(10) ≈ Tg(1) + (Tg/m)·1 = 311.3 + 311.3/80 = 315.19 K [computed], within 0.3 K of 315 K.
    const vft = 'vft:\n  log10_tau0: -14\n  B: 1008 K\n  T0: 252 K\n';
    const b = materialResults(MATERIAL_BLOCK(315, vft), [[1, 311.3]]);
    assert.ok(Math.abs(b.results.standard_tg.value - 315.19125) < 1e-6, `${b.results.standard_tg.value}`);
    assert.ok(b.diagnostics.some((d) => d.code === 'material.fragility-conversion'));
  });

  it('carries the uncertainty of the fragility into a single-rate conversion', () => {
    // Tg(10) = Tg(q) + (Tg/m)·log10(10/q), so |∂Tg(10)/∂m| = (Tg/m²)·log10(10/q) (first-order
    // propagation, GUM, JCGM 100:2008, §5.1.3) [computed]: at Tg(1) = 311.3 K the term is
    // 311.3/m²·u(m) for the m and u(m) the material reports.
    const vft = 'vft:\n  log10_tau0: -14\n  B: 1008 ± 40 K\n  T0: 252 ± 3 K\n';
    const b = materialResults(MATERIAL_BLOCK(315, vft), [[1, 311.3]]);
    const m = b.results.fragility;
    assert.ok(m.uncertainty! > 0, 'the stated ± give the fragility an uncertainty');
    const term = b.results.standard_tg.budget?.find((t) => t.source === 'fragility');
    assert.ok(term, JSON.stringify(b.results.standard_tg.budget));
    assert.ok(Math.abs(term.value - (311.3 / m.value ** 2) * m.uncertainty!) < 1e-6 * term.value, `${term.value}`);
  });

  it('flags extrapolation and few rates', () => {
    const b = materialResults(MATERIAL_BLOCK(315), [[0.1, 308.0], [1, 311.3]]);
    const codes = b.diagnostics.map((d) => d.code);
    assert.ok(codes.includes('material.tg-extrapolated'));
    assert.ok(codes.includes('material.few-rates'));
  });

  it('carries the scatter of replicate ramps that disagree by 15 K, and flags them', () => {
    // Two ramps of one material at 10 K/min, Tg 310 and 325 K. Their mean is 317.5 K; the standard
    // uncertainty of a mean of two is s/√2 = 7.5 K (GUM, JCGM 100:2008 §4.2.3), not the ramps'
    // own ±0.5 K, and with one degree of freedom the 95 % factor is t₀.₉₇₅(1) = 12.706 (GUM, table
    // G.2): the term is 7.5 × 12.706/1.96 = 48.6 K, so that ±2u is the 95 % interval. The Birge
    // ratio (Birge, Phys. Rev. 40, 207 (1932)) says they disagree.
    const b = materialResults(MATERIAL_BLOCK(315), [[10, 310], [10, 325]]);
    const r = b.results.standard_tg;
    assert.ok(Math.abs(r.value - 317.5) < 1e-6, `${r.value}`);
    const replicates = r.budget!.find((t) => t.source === 'replicates')!;
    assert.ok(Math.abs(replicates.value - (Math.sqrt(7.5 ** 2 - 0) * 12.706) / 1.96) < 0.1, `replicates ${replicates.value}`);
    assert.ok(r.uncertainty! > 48, `u ${r.uncertainty}`);
    assert.ok(b.diagnostics.some((d) => d.code === 'material.tg-replicates-disagree'), JSON.stringify(b.diagnostics));
  });

  it('does not flag replicate ramps that agree, and keeps the calibration term whole', () => {
    // Identical ramps: no scatter; the thermometer's 0.5 K is common to both and is not divided by √2.
    const b = materialResults(MATERIAL_BLOCK(315), [[10, 315], [10, 315]]);
    const r = b.results.standard_tg;
    assert.ok(!b.diagnostics.some((d) => d.code === 'material.tg-replicates-disagree'));
    assert.equal(r.budget!.find((t) => t.source === 'calibration')!.value, 0.5);
    assert.ok(r.uncertainty! < 0.55, `u ${r.uncertainty}`);
  });
});

describe('standard Tg from three cooling rates: ±2u keeps its meaning with one degree of freedom', () => {
  it('covers the true Tg(10 K/min) at about 95 % over seeded scatter of the ramps', function () {
    this.timeout(60000);
    // Tg = a + b·log10 q (model M1, Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)) with
    // 1.5 K of ramp-to-ramp scatter; three rates leave n − 2 = 1 degree of freedom, where the
    // 95 % Student t factor is 12.71 (any table of t; GUM, JCGM 100:2008, table G.2).
    let seed = 7;
    const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
    const normal = () => Math.sqrt(-2 * Math.log(uniform() + 1e-12)) * Math.cos(2 * Math.PI * uniform());
    const truth = 315;
    const rates: Array<[number, number]> = [[0.3, truth - 3.9 * Math.log10(10 / 0.3)], [2, truth - 3.9 * Math.log10(5)], [30, truth + 3.9 * Math.log10(3)]];
    let covered = 0;
    const runs = 120;
    for (let i = 0; i < runs; i++) {
      const nb = new Notebook(new InMemoryHost());
      nb.setFile('m.md', MATERIAL_BLOCK(315));
      // An exact thermometer (no calibration term), so that only the scatter is tested.
      const ramps = rates.map(([q, tg], k) => DEPOSITION_BLOCK(`D-${k}`, 270) + coolingRamp(`R-${k}`, `D-${k}`, q, tg + 1.5 * normal()).replace('direction: cooling\n', 'direction: cooling\ntemperature_calibration: 0 K\n'));
      nb.setFile('d.md', ramps.join('\n'));
      const r = toJsonReport(nb.analyze(['m.md'])).files[0].blocks[0].results.standard_tg;
      if (Math.abs(r.value - truth) <= 1.96 * r.uncertainty!) covered++;
      assert.ok(Math.abs(r.interval![1] - r.value - 1.96 * r.uncertainty!) < 1e-9, 'the interval is ±1.96u');
    }
    // Exactly 95 % in expectation; 120 runs give a binomial spread of ±2 %.
    assert.ok(covered / runs >= 0.89 && covered / runs <= 0.99, `coverage ${covered}/${runs}`);
  });
});
