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

  it('flags extrapolation and few rates', () => {
    const b = materialResults(MATERIAL_BLOCK(315), [[0.1, 308.0], [1, 311.3]]);
    const codes = b.diagnostics.map((d) => d.code);
    assert.ok(codes.includes('material.tg-extrapolated'));
    assert.ok(codes.includes('material.few-rates'));
  });
});
