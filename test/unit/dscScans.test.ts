import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { gaussian } from '../support/random.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

type Block = ReturnType<typeof toJsonReport>['files'][number]['blocks'][number];

/**
 * Heating scans from a step + baseline model: parallel glass and liquid baselines
 * Cp,g = 1.2 + 0.003(T − 300), Cp,l = Cp,g + ΔCp, joined by an error-function step of centre Tc
 * and width σ. With parallel baselines and a symmetric step the construction's answers are exact
 * by algebra [computed]: the ASTM E1356 / ISO 11357-2 extrapolated onset is Tc − σ·√(2π)/2 (the
 * tangent at the inflection has slope ΔCp/(σ√(2π))), the half-step midpoint is Tc, and Moynihan
 * area matching (Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)) gives Tf = Tc for windows far
 * from the step.
 *
 * The start-up transient is the heat flow settling with the instrument's time constant τ after
 * the heating starts: an exponential decay A·exp(−(T − T_start)/(q·τ)) added at the start of the
 * scan (common practice, no source).
 */
interface Scan {
  from: number;
  to: number;
  step: number;
  tc: number;
  width: number;
  dcp: number;
  noise: number;
  seed: number;
  hook: number;
  /** q·τ in K. */
  hookLength: number;
}

const BASE: Scan = { from: 250, to: 360, step: 0.1, tc: 315, width: 2.5, dcp: 0.4, noise: 0, seed: 1, hook: 0, hookLength: 10 / 3 };

/** erf by Abramowitz & Stegun 7.1.26 (absolute error below 1.5e-7). */
function erf(x: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(x));
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
  return x >= 0 ? y : -y;
}

function cpRows(p: Scan): number[][] {
  const g = gaussian(p.seed);
  const rows: number[][] = [];
  for (let T = p.from; T <= p.to + 1e-9; T += p.step) {
    const base = 1.2 + 0.003 * (T - 300);
    const stepPart = p.dcp * 0.5 * (1 + erf((T - p.tc) / (Math.SQRT2 * p.width)));
    const hook = p.hook * Math.exp(-(T - p.from) / p.hookLength);
    rows.push([Number(T.toFixed(4)), base + stepPart + hook + p.noise * g()]);
  }
  return rows;
}

const truth = (p: Scan) => ({ tonset: p.tc - (p.width * Math.sqrt(2 * Math.PI)) / 2, tg_midpoint: p.tc, tfictive: p.tc, tinflection: p.tc });

function analyse(text: string): Block {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('m.md', MATERIAL_BLOCK(315));
  nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 270) + text);
  return toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
}

const cpScan = (p: Scan, meta = ''): Block => analyse(tableBlock('dsc', 'C-1', `film: D-1\nrate: 10 K/min\n${meta}`, 'T/K, Cp/(J/(g*K))', cpRows(p), 9));
const codes = (b: Block): string[] => b.diagnostics.map((d) => d.code);
const TRANSITION = ['tonset', 'tg_midpoint', 'tinflection', 'step_height', 'tfictive'];

describe('dsc scans from a step + baseline model', () => {
  it('places onset, midpoint and Tf of a clean scan with automatic windows', () => {
    const p = { ...BASE };
    const b = cpScan(p);
    const want = truth(p);
    for (const k of ['tonset', 'tg_midpoint', 'tfictive', 'tinflection'] as const) assert.ok(Math.abs(b.results[k].value - want[k]) < 0.03, `${k} ${b.results[k].value} against ${want[k]}`);
    assert.ok(Math.abs(b.results.step_height.value - 0.4) < 1e-3);
    assert.deepEqual(codes(b), []);
  });

  it('reports no step for a scan without a glass transition', () => {
    // A straight Cp line with noise and a gently curved one (no step): nothing to construct.
    for (const curve of [(T: number) => 1.2 + 0.003 * (T - 300), (T: number) => 1.2 + 0.003 * (T - 300) + 2e-5 * (T - 300) ** 2]) {
      const g = gaussian(7);
      const rows: number[][] = [];
      for (let T = 250; T <= 360; T += 0.1) rows.push([Number(T.toFixed(4)), curve(T) + 0.004 * g()]);
      const b = analyse(tableBlock('dsc', 'C-1', 'film: D-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))', rows, 9));
      assert.ok(codes(b).includes('dsc.no-step'), JSON.stringify(codes(b)));
      for (const k of TRANSITION) assert.equal(b.results[k], undefined, k);
    }
  });

  it('keeps the automatic glass window out of a start-up transient', () => {
    // A 0.6 J/(g K) hook decaying over q·τ = 10 K/min × 20 s = 3.3 K at the start of the scan.
    const p = { ...BASE, hook: 0.6, noise: 0.002, seed: 3 };
    const b = cpScan(p);
    assert.ok(codes(b).includes('dsc.startup-transient'), JSON.stringify(codes(b)));
    const want = truth(p);
    for (const k of ['tonset', 'tg_midpoint', 'tfictive'] as const) {
      const r = b.results[k];
      assert.ok(r, `${k} missing: ${JSON.stringify(codes(b))}`);
      assert.ok(Math.abs(r.value - want[k]) < 0.3, `${k} ${r.value} against ${want[k]}`);
    }
    assert.ok(b.results.tg_midpoint.value > b.results.tonset.value);
    assert.match(b.results.tonset.method, /start-up transient/);
  });

  it('refuses a construction on a baseline window set over the start-up transient', () => {
    // The user's glass window lies on the hook: its baseline falls steeply and extrapolates below zero.
    const p = { ...BASE, hook: 1.5, hookLength: 8 };
    const b = cpScan(p, 'windows:\n  glass: [250 K, 262 K]\n  liquid: [340 K, 360 K]\n');
    assert.ok(codes(b).includes('dsc.inconsistent') || codes(b).includes('dsc.no-step'), JSON.stringify(codes(b)));
    for (const k of TRANSITION) assert.equal(b.results[k], undefined, k);
  });

  it('finds the onset of noisy scans without bias and covers the truth at ±2u in 90–99 % of them', () => {
    // Coverage of a standard uncertainty at k = 2 (GUM, JCGM 100:2008, §6.2–6.3: about 95 %).
    // The calibration term (a systematic error the model does not simulate) is set to 0 here.
    const runs = 80;
    const names = ['tonset', 'tg_midpoint', 'tfictive'] as const;
    const hits = { tonset: 0, tg_midpoint: 0, tfictive: 0 };
    let onsetSum = 0;
    const p0 = { ...BASE, noise: 0.004, step: 0.4 };
    const want = truth(p0);
    for (let seed = 1; seed <= runs; seed++) {
      const b = cpScan({ ...p0, seed: 500 + seed }, 'temperature_calibration: 0 K\n');
      for (const k of names) {
        const r = b.results[k];
        assert.ok(r && r.budget, `${k} ${JSON.stringify(codes(b))}`);
        if (Math.abs(r.value - want[k]) <= 2 * r.uncertainty!) hits[k]++;
      }
      onsetSum += b.results.tonset.value;
    }
    // The steepest slope over a short span gave the onset a bias of about +1.4 K at this noise.
    assert.ok(Math.abs(onsetSum / runs - want.tonset) < 0.15, `mean onset ${onsetSum / runs} against ${want.tonset}`);
    for (const [k, n] of Object.entries(hits)) assert.ok(n >= 0.9 * runs && n <= 0.99 * runs, `${k}: ${n}/${runs}`);
  });

  it('gives every figure a budget with the temperature calibration (default 0.5 K)', () => {
    const b = cpScan({ ...BASE, noise: 0.004 });
    for (const k of ['tonset', 'tg_midpoint', 'tfictive', 'tinflection'] as const) {
      const r = b.results[k];
      const sources = r.budget!.map((t) => t.source);
      assert.ok(sources.includes('calibration') && sources.includes('statistical'), `${k} ${sources}`);
      assert.equal(r.budget!.find((t) => t.source === 'calibration')!.value, 0.5);
      // GUM §5.1.2: the combined standard uncertainty is the root sum of squares of the terms.
      assert.ok(Math.abs(r.uncertainty! - Math.hypot(...r.budget!.map((t) => t.value))) < 1e-12);
      assert.match(r.method, /glass .* K.*liquid .* K/);
    }
    assert.ok(b.results.step_height.uncertainty! > 0);
  });
});

describe('dsc heat-flow sign convention', () => {
  // Φ = Cp·m·q with the endotherm-up convention (heat into the sample positive); endotherm down
  // flips the sign (common practice, no source). 5 mg at 12 K/min: Φ/mW = Cp × 1.0.
  const rows = (sign: number): number[][] => cpRows({ ...BASE, noise: 0.002, seed: 9 }).map(([T, cp]) => [T, sign * cp * 5 * 0.2]);
  const heatFlow = (header: string, meta: string, sign: number): Block =>
    analyse(tableBlock('dsc', 'C-1', `film: D-1\nrate: 12 K/min\nquantity: heat flow\n${meta}`, header, rows(sign), 9));

  it('reads endotherm-down data with endotherm: down', () => {
    const b = heatFlow('T/K, Phi/mW', 'mass: 5 mg\nendotherm: down\n', -1);
    assert.ok(Math.abs(b.results.tg_midpoint.value - 315) < 0.3, JSON.stringify(codes(b)));
  });

  it('says the step looks inverted when the data are endotherm down and the block says nothing', () => {
    const b = heatFlow('T/K, Phi/mW', 'mass: 5 mg\n', -1);
    assert.ok(codes(b).includes('dsc.inverted-step'), JSON.stringify(codes(b)));
    for (const k of TRANSITION) assert.equal(b.results[k], undefined, k);
  });

  it('takes the convention from the heat-flow header when no key is given', () => {
    const b = heatFlow('T/K, Heat Flow (Endo Down)/mW', 'mass: 5 mg\n', -1);
    assert.ok(!codes(b).includes('dsc.inverted-step'), JSON.stringify(codes(b)));
    assert.ok(Math.abs(b.results.tg_midpoint.value - 315) < 0.3);
  });

  it('reads the sample mass from the preamble of an export and says so', () => {
    const table = `\`\`\`dsc C-1\nfilm: D-1\nrate: 12 K/min\nquantity: heat flow\n---\n# Sample: film D-1\n# Sample Mass: 5.0 mg\nT/K, Phi/mW\n${rows(1).map((r) => r.map((v) => Number(v.toFixed(9))).join(', ')).join('\n')}\n\`\`\`\n`;
    const b = analyse(table);
    assert.ok(codes(b).includes('dsc.mass-from-preamble'), JSON.stringify(codes(b)));
    assert.ok(Math.abs(b.results.step_height.value - 0.4) < 0.01, `${b.results.step_height?.value}`);
  });
});

describe('dsc scans from a Tool–Narayanaswamy–Moynihan glass', () => {
  /**
   * Cooling at q, optional aging at T_a, heating at q, with the fictive temperature of the
   * Tool–Narayanaswamy–Moynihan model (Tool, J. Am. Ceram. Soc. 29, 240 (1946); Narayanaswamy,
   * J. Am. Ceram. Soc. 54, 491 (1971); Moynihan et al., Ann. N.Y. Acad. Sci. 279, 15 (1976)) with
   * a single relaxation time (β = 1): τ = A·exp[xΔh/(RT) + (1 − x)Δh/(R·Tf)], dTf/dt = (T − Tf)/τ,
   * integrated exactly over each step for frozen τ. On heating Cp = Cp,g + ΔCp·dTf/dT. With a
   * constant ΔCp the area matching of Moynihan et al. (1976) returns the fictive temperature the
   * glass had when the heating began [exact by algebra: ∫(Cp − Cp,g)dT = ΔCp·(T₂ − Tf′)].
   */
  function tnmScan(agingSeconds: number): { rows: number[][]; tfGlass: number } {
    const tg = 315;
    const dhR = 80 * Math.LN10 * tg; // Δh/R from m = 80 (Moynihan et al. 1976: Δh/R ≈ m·ln10·Tg)
    const x = 0.6;
    const lnA = Math.log(100) - dhR / tg; // τ(Tg, Tg) = 100 s
    const tau = (T: number, tf: number): number => Math.exp(lnA + (x * dhR) / T + ((1 - x) * dhR) / tf);
    const rate = 10 / 60;
    const dT = 0.05;
    let tf = 380;
    const relax = (T: number, dt: number): void => {
      tf = T + (tf - T) * Math.exp(-dt / tau(T, tf));
    };
    for (let T = 380; T > 250; T -= dT) relax(T, dT / rate);
    if (agingSeconds > 0) {
      for (let T = 250; T < 295; T += dT) relax(T, dT / rate);
      for (let k = 0; k < 1000; k++) relax(295, agingSeconds / 1000);
      for (let T = 295; T > 250; T -= dT) relax(T, dT / rate);
    }
    const tfGlass = tf;
    const rows: number[][] = [];
    let prev = tf;
    let i = 0;
    for (let T = 250; T <= 370 + 1e-9; T += dT, i++) {
      relax(T, dT / rate);
      const slope = (tf - prev) / dT;
      prev = tf;
      if (i % 2 === 0 && i > 0) rows.push([Number(T.toFixed(3)), 1.2 + 0.003 * (T - 300) + 0.4 * slope]);
    }
    return { rows, tfGlass };
  }

  for (const [what, aging] of [
    ['cooled at 10 K/min', 0],
    ['aged 30 days at 295 K (an enthalpy overshoot)', 30 * 86400],
  ] as const) {
    it(`recovers the glass's fictive temperature by area matching: ${what}`, () => {
      const { rows, tfGlass } = tnmScan(aging);
      const b = analyse(tableBlock('dsc', 'C-1', 'film: D-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))', rows, 9));
      const tf = b.results.tfictive;
      assert.ok(tf, JSON.stringify(codes(b)));
      assert.ok(Math.abs(tf.value - tfGlass) < 0.1, `Tf ${tf.value} against the model's ${tfGlass}`);
      // The construction holds together: onset < inflection, onset < midpoint.
      assert.ok(b.results.tonset.value < b.results.tinflection.value && b.results.tonset.value < b.results.tg_midpoint.value);
    });
  }
});
