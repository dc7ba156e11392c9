import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { gaussian } from '../support/random.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

type Block = ReturnType<typeof toJsonReport>['files'][number]['blocks'][number];

/**
 * A hold written by a growth-front model: the liquid grows into the stable glass from the free
 * surface as a sharp front at constant velocity (Swallen et al., Phys. Rev. Lett. 102, 065503
 * (2009)), so the transformed fraction rises linearly in time, x = v·(t − t_on)/h₀, and the
 * thickness is h₀·(1 + ε·x) with ε the glass-to-liquid expansion at the hold temperature.
 * The ramp-in is linear heating at `rate` K/s from `rampFrom` K below the hold temperature, the
 * glass expanding with α_g on the way (thermal expansion of the glass, common practice, no
 * source); t₀ is when T reaches the hold minus 0.5 K.
 */
interface Hold {
  h0: number;
  epsilon: number;
  velocity: number;
  /** Onset after t₀ (s). */
  onset: number;
  end: number;
  dt: number;
  rampFrom: number;
  rate: number;
  alphaG: number;
  sigma: number;
  /** Thickness loss after the transformation (nm/s): an evaporating liquid. */
  evaporation: number;
  seed: number;
}

const HOLD_T = 253.75;
const BASE: Hold = { h0: 313, epsilon: 0.015, velocity: 0.2, onset: 170, end: 3600, dt: 5, rampFrom: 30, rate: 0.5, alphaG: 1e-4, sigma: 0.03, evaporation: 0, seed: 1 };

function truth(p: Hold): { t0: number; onset: number; trans: number; v: number } {
  const t0 = (p.rampFrom - 0.5) / p.rate;
  return { t0, onset: p.onset, trans: p.onset + p.h0 / p.velocity, v: p.velocity };
}

function holdRows(p: Hold): number[][] {
  const g = gaussian(p.seed);
  const { t0 } = truth(p);
  const rows: number[][] = [];
  for (let t = 0; t <= p.end + 1e-9; t += p.dt) {
    const T = Math.min(HOLD_T, HOLD_T - p.rampFrom + p.rate * t);
    const tOn = t0 + p.onset;
    const x = Math.min(1, Math.max(0, (p.velocity * (t - tOn)) / p.h0));
    const tDone = tOn + p.h0 / p.velocity;
    const h = p.h0 * (1 + p.alphaG * (T - HOLD_T)) * (1 + p.epsilon * x) - p.evaporation * Math.max(0, t - tDone);
    rows.push([t, T, h + p.sigma * g()]);
  }
  return rows;
}

function analyse(rows: number[][], meta = ''): Block {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('m.md', MATERIAL_BLOCK(243.75));
  nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 210) + tableBlock('isotherm', 'I-1', `film: D-1\ntemperature: ${HOLD_T} K\n${meta}`, 't/s, T/K, h/nm', rows, 9));
  return toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
}

const codes = (b: Block): string[] => b.diagnostics.map((d) => d.code);

describe('isotherm holds from a growth-front model (Swallen et al., Phys. Rev. Lett. 2009)', () => {
  it('starts the hold where the temperature reaches the set point: the ramp-in is not fitted', () => {
    const p = { ...BASE };
    const b = analyse(holdRows(p));
    const tr = truth(p);
    const onset = b.results.onset_time;
    assert.ok(Math.abs(onset.value - tr.onset) < 3 * onset.uncertainty!, `onset ${onset.value} ± ${onset.uncertainty}, truth ${tr.onset}`);
    assert.ok(onset.value > 100, `${onset.value}`);
    assert.ok(!codes(b).includes('isotherm.transformed-during-ramp'), JSON.stringify(codes(b)));
    assert.ok(Math.abs(b.results.transformation_time.value - tr.trans) < 3 * b.results.transformation_time.uncertainty!);
    assert.ok(Math.abs(b.results.front_velocity.value - tr.v) < 3 * b.results.front_velocity.uncertainty!);
    assert.match(onset.method, /0\.5 K/);
    // The budget names the fit and the time origin (GUM, JCGM 100:2008, §5.1).
    assert.deepEqual(onset.budget!.map((t) => t.source).sort(), ['statistical', 'time origin']);
  });

  it('gives an unfinished hold an upper bound on the front velocity, at or above the truth', () => {
    // The log ends when 57 % of the film has transformed.
    const p = { ...BASE };
    const tr = truth(p);
    const end = tr.t0 + p.onset + (0.57 * p.h0) / p.velocity;
    const b = analyse(holdRows({ ...p, end }));
    assert.ok(codes(b).includes('isotherm.no-final-plateau'), JSON.stringify(codes(b)));
    const v = b.results.front_velocity;
    assert.match(v.method, /upper bound/);
    assert.doesNotMatch(v.method, /lower bound/);
    // A 57 % transformed front bounds v by v/0.57 [computed]: above the truth, and not the 1.75-fold of a fit whose end is the log's end.
    assert.ok(v.value >= tr.v * 0.97 && v.value <= (tr.v / 0.57) * 1.03, `v ${v.value}`);
    assert.match(b.results.transformation_time.method, /lower bound/);
    assert.ok(b.results.transformation_time.value <= tr.trans, `${b.results.transformation_time.value}`);
  });

  it('finds a clear 4.7 nm step when the liquid evaporates after the plateau', () => {
    const p = { ...BASE, evaporation: 0.002, end: 4200 };
    const b = analyse(holdRows(p));
    const tr = truth(p);
    assert.ok(!codes(b).includes('isotherm.no-transformation'), JSON.stringify(codes(b)));
    assert.ok(Math.abs(b.results.transformation_time.value - tr.trans) < 3 * b.results.transformation_time.uncertainty!, `${b.results.transformation_time.value} ± ${b.results.transformation_time.uncertainty}`);
    assert.ok(codes(b).includes('isotherm.evaporation'), JSON.stringify(codes(b)));
  });

  it('finds an early onset, 20 s into the hold', () => {
    const p = { ...BASE, onset: 20 };
    const b = analyse(holdRows(p));
    const tr = truth(p);
    assert.ok(!codes(b).includes('isotherm.no-transformation'), JSON.stringify(codes(b)));
    assert.ok(Math.abs(b.results.onset_time.value - tr.onset) < 3 * b.results.onset_time.uncertainty!, `${b.results.onset_time.value} ± ${b.results.onset_time.uncertainty}`);
    assert.ok(Math.abs(b.results.front_velocity.value - tr.v) < 3 * b.results.front_velocity.uncertainty!);
  });

  it('warns when the film transformed during the ramp-in', () => {
    // The front starts 200 s before the set point is reached.
    const p = { ...BASE, onset: -200 };
    const b = analyse(holdRows(p));
    assert.ok(codes(b).includes('isotherm.transformed-during-ramp'), JSON.stringify(codes(b)));
  });

  it('covers the truth at ±2u in 90–99 % of noisy holds (onset, transformation time, front velocity)', () => {
    // Coverage of a standard uncertainty at k = 2 (GUM, JCGM 100:2008, §6.2–6.3: about 95 %).
    const runs = 100;
    const hits = { onset_time: 0, transformation_time: 0, front_velocity: 0 };
    for (let seed = 1; seed <= runs; seed++) {
      const p = { ...BASE, seed: 100 + seed, sigma: 0.06, dt: 10, end: 2600 };
      const tr = truth(p);
      const b = analyse(holdRows(p));
      const want = { onset_time: tr.onset, transformation_time: tr.trans, front_velocity: tr.v };
      for (const k of Object.keys(hits) as (keyof typeof hits)[]) {
        const r = b.results[k];
        if (r && Math.abs(r.value - want[k]) <= 2 * r.uncertainty!) hits[k]++;
      }
    }
    for (const [k, n] of Object.entries(hits)) assert.ok(n >= 0.9 * runs && n <= 0.99 * runs + 1e-9, `${k}: ${n}/${runs}`);
  });

  it('carries the uncertainty of the VFT law into τα and the stability ratio', () => {
    // Decadic VFT law (Böhmer, Ngai, Angell & Plazek, J. Chem. Phys. 99, 4201 (1993)) with
    // B = 700 ± 10 K and T0 = 200 ± 2 K, uncorrelated, at 253.75 K: first-order propagation
    // (GUM, JCGM 100:2008, §5.1.2) gives u(log10 τ) = √((10/53.75)² + (700·2/53.75²)²) = 0.51907
    // decades [computed].
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK(243.75, 'vft:\n  log10_tau0: -14\n  B: 700 ± 10 K\n  T0: 200 ± 2 K\n'));
    nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 210) + tableBlock('isotherm', 'I-1', `film: D-1\ntemperature: ${HOLD_T} K\n`, 't/s, T/K, h/nm', holdRows({ ...BASE }), 9));
    const b = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
    const tau = b.results.tau_alpha;
    const uLog = Math.hypot(10 / 53.75, (700 * 2) / 53.75 ** 2);
    assert.ok(Math.abs(uLog - 0.51907) < 1e-5);
    const law = tau.budget!.find((t) => t.source === 'VFT law')!;
    assert.ok(Math.abs(law.value / (tau.value * Math.LN10) - uLog) < 1e-9, `${law.value}`);
    // Beside it, the hold thermometer's default 0.5 K: 700·0.5/53.75² decades [computed].
    const cal = tau.budget!.find((t) => t.source === 'calibration')!;
    assert.ok(Math.abs(tau.uncertainty! - Math.hypot(law.value, cal.value)) < 1e-9 * tau.uncertainty!);
    assert.ok(Math.abs(cal.value / (tau.value * Math.LN10) - (700 * 0.5) / 53.75 ** 2) < 1e-9);
    const s = b.results.stability_ratio;
    assert.ok(s.budget!.some((t) => t.source === 'VFT law'));
  });
});
