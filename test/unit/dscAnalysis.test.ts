import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { moynihanTf } from '../../extension/core/analysis/dscAnalysis.js';
import { equivalentAgingTime } from '../../extension/core/analysis/agingTime.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

type Block = ReturnType<typeof toJsonReport>['files'][number]['blocks'][number];

function scan(rows: number[][], meta: string, extra = ''): Block[] {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('m.md', MATERIAL_BLOCK(315));
  nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 270) + tableBlock('dsc', 'C-1', `film: D-1\nrate: 10 K/min\n${meta}`, 'T/K, Cp/(J/(g*K))', rows, 12) + extra);
  return toJsonReport(nb.analyze(['d.md'])).files[0].blocks;
}

const grid = (a: number, b: number, step: number): number[] => Array.from({ length: Math.round((b - a) / step) + 1 }, (_, i) => a + i * step);

describe('dsc analysis', () => {
  // Area matching of Moynihan, Easteal, DeBolt & Tucker, J. Am. Ceram. Soc. 59, 12 (1976)
  // [definition from memory, answers exact by algebra]: Cp,g = 1.20 + 0.0030(T − 300),
  // Cp,l = Cp,g + 0.40; area 300→340 K; Tf = 340 − area/0.40.
  const cpg = (T: number) => 1.2 + 0.003 * (T - 300);
  const caseA = (T: number) => cpg(T) + (T < 310 ? 0 : T < 320 ? (0.4 * (T - 310)) / 10 : 0.4);
  const caseB = (T: number) => cpg(T) + (T < 310 ? 0 : T < 320 ? (0.8 * (T - 310)) / 10 : T < 325 ? 0.8 - (0.4 * (T - 320)) / 5 : 0.4);
  const windows = 'windows:\n  glass: [300 K, 308 K]\n  liquid: [328 K, 340 K]\n';

  it('Moynihan et al. (1976) area matching without overshoot: Tf = 315.0 K, the ramp midpoint', () => {
    const b = scan(grid(300, 340, 0.05).map((T) => [T, caseA(T)]), windows)[1];
    assert.ok(Math.abs(b.results.tfictive.value - 315.0) < 1e-6, `${b.results.tfictive.value}`);
    assert.ok(Math.abs(b.results.tg_midpoint.value - 315.0) < 1e-6);
    assert.ok(Math.abs(b.results.step_height.value - 0.4) < 1e-9);
  });

  it('Moynihan et al. (1976) area matching with an overshoot: Tf = 307.5 K, below the onset', () => {
    const b = scan(grid(300, 340, 0.05).map((T) => [T, caseB(T)]), windows)[1];
    assert.ok(Math.abs(b.results.tfictive.value - 307.5) < 1e-6, `${b.results.tfictive.value}`);
  });

  it('gives the enthalpy gap against the reference scan: 0.40 × (315 − 307.5) = 3.0 J/g', () => {
    const reference = tableBlock('dsc', 'C-LC', 'film: D-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))', grid(300, 340, 0.05).map((T) => [T, caseA(T)]), 12);
    const b = scan(grid(300, 340, 0.05).map((T) => [T, caseB(T)]), windows + 'reference: C-LC\n', reference)[1];
    assert.ok(Math.abs(b.results.enthalpy_gap.value - 3.0) < 1e-6, `${b.results.enthalpy_gap.value}`);
  });

  it('turns 8 J/g into a 20 K fictive-temperature shift with ΔCp = 0.40 J/(g K) (Kearns et al., J. Chem. Phys. 2007)', () => {
    // ∫_{Tf}^{T2} 0.4 dT = A ⇒ two areas 8 J/g apart give fictive temperatures 20 K apart.
    assert.ok(Math.abs(moynihanTf(0.4, 0, 340, 10) - moynihanTf(0.4, 0, 340, 18) - 20) < 1e-12);
  });

  it('places the ASTM E1356 / ISO 11357-2 onset, midpoint and inflection of a logistic step', () => {
    // Logistic step Tc = 315 K, w = 1.5 K, ΔCp = 0.40, a = 1.2, b = 0.003: onset Tc − 2w = 312.000 K,
    // midpoint and inflection 315.000 K [computed, exact by algebra].
    const rows = grid(290, 340, 0.02).map((T) => [T, 1.2 + 0.003 * (T - 300) + 0.4 / (1 + Math.exp(-(T - 315) / 1.5))]);
    const b = scan(rows, 'windows:\n  glass: [290 K, 302 K]\n  liquid: [328 K, 340 K]\n')[1];
    assert.ok(Math.abs(b.results.tonset.value - 312.0) < 0.02, `onset ${b.results.tonset.value}`);
    assert.ok(Math.abs(b.results.tg_midpoint.value - 315.0) < 0.01, `mid ${b.results.tg_midpoint.value}`);
    assert.ok(Math.abs(b.results.tinflection.value - 315.0) < 0.03);
  });

  it('places the ASTM E1356 onset of an error-function step at Tc − σ·√(2π)/2', () => {
    // [computed, exact by algebra]: σ = 2 K gives onset 312.4933717 K for Tc = 315 K. erf by
    // Abramowitz & Stegun 7.1.26 (absolute error below 1.5e-7, ample for a 0.02 K check).
    const erf = (x: number): number => {
      const t = 1 / (1 + 0.3275911 * Math.abs(x));
      const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
      return x >= 0 ? y : -y;
    };
    const rows = grid(290, 340, 0.02).map((T) => [T, 1.2 + 0.003 * (T - 300) + 0.4 * 0.5 * (1 + erf((T - 315) / (Math.SQRT2 * 2)))]);
    const b = scan(rows, 'windows:\n  glass: [290 K, 302 K]\n  liquid: [328 K, 340 K]\n')[1];
    assert.ok(Math.abs(b.results.tonset.value - 312.4933717) < 0.02, `onset ${b.results.tonset.value}`);
  });

  it('Moynihan et al. (1976) area matching: Tf′ = 309.18 K for a logistic step with a 4 J/g overshoot', () => {
    // [computed]: Cp,g = 1.2 + 0.004(T − 300), Cp,l = 1.6 + 0.002(T − 300), logistic at 320 K (width 2 K),
    // plus a Gaussian of area 4 J/g (its position and width do not change Tf′), T1 = 285, T2 = 355.
    const rows = grid(285, 355, 0.05).map((T) => {
      const g = 1.2 + 0.004 * (T - 300);
      const l = 1.6 + 0.002 * (T - 300);
      const s = 1 / (1 + Math.exp(-(T - 320) / 2));
      const peak = (4 / (1.5 * Math.sqrt(2 * Math.PI))) * Math.exp(-0.5 * ((T - 323) / 1.5) ** 2);
      return [T, g + (l - g) * s + peak];
    });
    const b = scan(rows, 'windows:\n  glass: [285 K, 297 K]\n  liquid: [343 K, 355 K]\n')[1];
    assert.ok(Math.abs(b.results.tfictive.value - 309.18) < 0.02, `${b.results.tfictive.value}`);
  });

  it('converts heat flow with mass and rate', () => {
    // Cp = Φ/(m·q): 1 mW on 5 mg at 12 K/min (0.2 K/s) is 1 J/(g K) [computed].
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK(315));
    const rows = grid(300, 340, 0.05).map((T) => [T, caseA(T) * 5 * 0.2]);
    nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 270) + tableBlock('dsc', 'C-1', `film: D-1\nrate: 12 K/min\nquantity: heat flow\nmass: 5 mg\n${windows}`, 'T/K, Phi/mW', rows, 12));
    const b = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
    assert.ok(Math.abs(b.results.tfictive.value - 315.0) < 1e-6);
  });

  it('converts a heat flow per mass with the rate alone, no sample mass given', () => {
    // Cp = φ/q: 0.2 W/g at 12 K/min (0.2 K/s) is 1 J/(g K) [computed].
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK(315));
    const rows = grid(300, 340, 0.05).map((T) => [T, caseA(T) * 0.2]);
    const meta = `film: D-1\nrate: 12 K/min\nquantity: heat flow\n${windows}`;
    assert.doesNotMatch(meta, /mass/);
    nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 270) + tableBlock('dsc', 'C-1', meta, 'T/K, Phi/(W/g)', rows, 12));
    const b = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
    assert.ok(!b.diagnostics.some((d) => d.code === 'dsc.no-mass'), JSON.stringify(b.diagnostics));
    // Case A in J/(g K) again: Tf = 315.0 K and a step of 0.40 J/(g K).
    assert.ok(b.results.tfictive, JSON.stringify(b.diagnostics));
    assert.ok(Math.abs(b.results.tfictive.value - 315.0) < 1e-6, `${b.results.tfictive.value}`);
    assert.ok(Math.abs(b.results.step_height.value - 0.4) < 1e-9, `${b.results.step_height.value}`);
    assert.equal(b.results.step_height.unit, 'J/(g*K)');
  });

  it('refuses baseline windows that reach into the step', () => {
    const b = scan(grid(300, 340, 0.05).map((T) => [T, caseA(T)]), 'windows:\n  glass: [300 K, 318 K]\n  liquid: [328 K, 340 K]\n')[1];
    assert.ok(b.diagnostics.some((d) => d.code === 'dsc.window-overlap'));
  });
});

describe('equivalent aging time', () => {
  it('brackets Tf = Tg − 20 K between log τ 9.4 (VFT) and 7.4 (constant slope)', () => {
    // [computed] for Tg = 315 K, m = 80, A = −14 (T0 = 252 K, B = 1008 K). A bracket, not one
    // number: such estimates disagree widely (Berthier & Ediger, J. Chem. Phys., 2020).
    const r = equivalentAgingTime(295, { log10Tau0: -14, B: 1008, T0: 252 }, 315)!;
    assert.ok(Math.abs(Math.log10(r.interval![1]) - 9.44) < 0.01);
    assert.ok(Math.abs(Math.log10(r.interval![0]) - 7.42) < 0.01);
    assert.match(r.method, /VFT extrapolation/);
    assert.match(r.method, /constant slope/);
  });
});
