import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { gaussian } from '../support/random.js';
import { MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

type Block = ReturnType<typeof toJsonReport>['files'][number]['blocks'][number];

function relaxation(rows: number[][]): Block {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('r.md', MATERIAL_BLOCK(315) + tableBlock('relaxation', 'R-1', 'material: M-1\nmethod: invented\n', 'T/K, log10_tau', rows, 9));
  return toJsonReport(nb.analyze(['r.md'])).files[0].blocks[1];
}

describe('relaxation fits: uncertainties and a non-physical T0', () => {
  it('covers the truth at ±2u in 90–99 % of noisy VFT data sets (A, B, T0, Tg, m)', () => {
    // Decadic VFT law log10 τ = A + B/(T − T0) (Böhmer, Ngai, Angell & Plazek, J. Chem. Phys. 99,
    // 4201 (1993)) with A = −14, B = 1008 K, T0 = 252 K: Tg(100 s) = 315 K and m = 80 [computed].
    // Twelve temperatures from 318 to 380 K, 0.05 decades of noise. Coverage of a standard
    // uncertainty at k = 2 (GUM, JCGM 100:2008, §6.2–6.3); with 9 degrees of freedom Student's t
    // puts ±2u at about 92 % [from memory].
    const truth = { vft_log10_tau0: -14, vft_B: 1008, vft_T0: 252, tg_vft: 315, fragility: 80 };
    const runs = 80;
    const hits: Record<string, number> = Object.fromEntries(Object.keys(truth).map((k) => [k, 0]));
    for (let seed = 1; seed <= runs; seed++) {
      const g = gaussian(900 + seed);
      const rows = Array.from({ length: 12 }, (_, i) => {
        const T = 318 + (62 * i) / 11;
        return [T, -14 + 1008 / (T - 252) + 0.05 * g()];
      });
      const b = relaxation(rows);
      for (const [k, want] of Object.entries(truth)) {
        const r = b.results[k];
        assert.ok(r && r.budget && r.uncertainty! > 0, `${k}: ${JSON.stringify(b.diagnostics.map((d) => d.code))}`);
        if (Math.abs(r.value - want) <= 2 * r.uncertainty!) hits[k]++;
      }
    }
    for (const [k, n] of Object.entries(hits)) assert.ok(n >= 0.9 * runs && n <= 0.99 * runs, `${k}: ${n}/${runs}`);
  });

  it('reports a fit with T0 ≤ 0 K as a diagnostic, not as VFT parameters', () => {
    // Arrhenius data, log10 τ = −16 + 5500/T (common practice, no source): the best VFT fit puts
    // T0 at or below 0 K, which is no divergence temperature.
    const rows = Array.from({ length: 10 }, (_, i) => {
      const T = 300 + 10 * i;
      return [T, -16 + 5500 / T + (i % 2 === 0 ? 0.01 : -0.01)];
    });
    const b = relaxation(rows);
    assert.ok(b.diagnostics.some((d) => d.code === 'relaxation.t0-not-physical'), JSON.stringify(b.diagnostics.map((d) => d.code)));
    for (const k of ['vft_T0', 'vft_B', 'vft_log10_tau0']) assert.equal(b.results[k], undefined, k);
  });
});
