import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { gaussian } from '../support/random.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

// Coverage of the stated uncertainties: over many seeded noise draws, the truth lies within ±2u
// in 90–99 % of runs (a correct standard uncertainty gives about 95 %), for a sharp and a broad
// transition, for every figure of a heat–cool cycle of a vapor-deposited film.
//
// The model, written here:
// - as-deposited glass h_VD = 99.9 + 0.020(T − 300) nm, supercooled liquid
//   h_SCL = 101.0 + 0.070(T − 315) nm, liquid-cooled glass h_LC = 101.0 + 0.020(T − 315) nm
//   (the worked case of the density gain over the liquid-cooled glass, Dalal & Ediger,
//   J. Phys. Chem. Lett. 3, 1229 (2012): Tf = 299 K, Δρ/ρ(300 K) = 100·(100.7/99.9 − 1) %);
// - first heating, 280 → 345 K at 1 K/min: the transformed fraction of Johnson–Mehl–Avrami–
//   Kolmogorov kinetics, x = 1 − exp(−((T − T₀)/θ)³) above T₀ (Avrami, J. Chem. Phys. 7, 1103
//   (1939)), h = h_VD + x·(h_SCL − h_VD);
// - cooling, 345 → 280 K: the ln-cosh form of Dalnoki-Veress et al., Phys. Rev. E 63, 031801
//   (2001), h = c + (T − Tg)(M + G)/2 + w(M − G)/2·ln cosh((T − Tg)/w), whose asymptotes are
//   h_SCL and h_LC and meet at Tg = 315 K (c = 101 + w(M − G)·ln 2/2);
// - Gaussian noise σ = 0.02 nm, the thermometer exact (temperature_calibration: 0 K, so the
//   budget holds only what the data can show).
//
// Truth, defined as each figure is: Tg = 315 K, the asymptotes' intersection; α = slope of the
// asymptote / h at their intersection (101 nm); Tf = 299 K; Δρ/ρ(300 K) = 0.8008 %; Tonset = the
// as-deposited line met by the least-squares line through the noise-free model points with
// 0.2 ≤ x ≤ 0.8 on the same temperature grid.

const G = 0.02;
const M = 0.07;
const vd = (T: number): number => 99.9 + G * (T - 300);
const scl = (T: number): number => 101.0 + M * (T - 315);
const STEP = 0.5;
const RUNS = 200;

interface Case {
  readonly name: string;
  /** ln-cosh width of the cooling transition, K. */
  readonly w: number;
  /** Avrami start and scale of the transformation on heating, K. */
  readonly t0: number;
  readonly theta: number;
}

const CASES: readonly Case[] = [
  { name: "sharp", w: 0.3, t0: 326, theta: 4 },
  { name: 'broad', w: 3, t0: 321, theta: 8 },
];

const fraction = (c: Case, T: number): number => (T <= c.t0 ? 0 : 1 - Math.exp(-(((T - c.t0) / c.theta) ** 3)));

function heatingT(): number[] {
  return Array.from({ length: Math.round((345 - 280) / STEP) + 1 }, (_, i) => 280 + i * STEP);
}

function coolingH(c: Case, T: number): number {
  const u = (T - 315) / c.w;
  // ln cosh u = |u| + ln(1 + e^(−2|u|)) − ln 2, written so that it does not overflow.
  const lncosh = Math.abs(u) + Math.log1p(Math.exp(-2 * Math.abs(u))) - Math.LN2;
  return 101 + (c.w * (M - G) * Math.LN2) / 2 + ((T - 315) * (M + G)) / 2 + ((c.w * (M - G)) / 2) * lncosh;
}

/** The extrapolated onset of the noise-free model, by the construction that defines it. */
function trueOnset(c: Case): number {
  const pts = heatingT().filter((T) => fraction(c, T) >= 0.2 && fraction(c, T) <= 0.8);
  const hs = pts.map((T) => vd(T) + fraction(c, T) * (scl(T) - vd(T)));
  const n = pts.length;
  const mt = pts.reduce((s, t) => s + t, 0) / n;
  const mh = hs.reduce((s, h) => s + h, 0) / n;
  const slope = pts.reduce((s, t, i) => s + (t - mt) * (hs[i] - mh), 0) / pts.reduce((s, t) => s + (t - mt) ** 2, 0);
  // mh + slope(T − mt) = vd(T)
  return (99.9 - 0.02 * 300 - mh + slope * mt) / (slope - G);
}

function cycle(c: Case, noise: () => number): number[][] {
  const rows: number[][] = [];
  let t = 0;
  for (const T of heatingT()) {
    rows.push([t, T, vd(T) + fraction(c, T) * (scl(T) - vd(T)) + 0.02 * noise()]);
    t += 30;
  }
  for (let k = 1; 345 - k * STEP >= 280 - 1e-9; k++) {
    const T = 345 - k * STEP;
    rows.push([t, T, coolingH(c, T) + 0.02 * noise()]);
    t += 30;
  }
  return rows;
}

/**
 * Fictive temperature along a cooling at constant rate by the Tool–Narayanaswamy–Moynihan model
 * (Tool, J. Am. Ceram. Soc. 29, 240 (1946); Narayanaswamy, J. Am. Ceram. Soc. 54, 491 (1971);
 * Moynihan et al., Ann. N.Y. Acad. Sci. 279, 15 (1976)): τ = A·exp(xΔh/RT + (1 − x)Δh/RTf),
 * Tf(T) = T_start + Σ_k ΔT_k·(1 − exp(−(Σ_j Δt/τ_j)^β)) over the steps k since the start, with
 * Δh/R = ln 10·m·Tg and τ(Tg) = 100 s at equilibrium.
 */
function tnmCooling(q: number, top: number, bottom: number, step: number, x: number, beta: number, m: number, tg: number): { T: number[]; Tf: number[] } {
  const dhR = Math.LN10 * m * tg;
  const lnA = Math.log(100) - dhR / tg;
  const dt = step / q;
  const T: number[] = [];
  const Tf: number[] = [];
  const tau: number[] = [];
  let tf = top;
  for (let k = 0; top - k * step >= bottom - 1e-9; k++) {
    const Tk = top - k * step;
    tau.push(Math.exp(lnA + (x * dhR) / Tk + ((1 - x) * dhR) / tf));
    let sum = 0;
    let reduced = 0;
    for (let j = k; j >= 1; j--) {
      reduced += dt / tau[j];
      sum -= step * (1 - Math.exp(-(reduced ** beta)));
    }
    tf = top + sum;
    T.push(Tk);
    Tf.push(tf);
  }
  return { T, Tf };
}

const NAMES = ['tg', 'alpha_glass', 'alpha_liquid', 'tonset', 'tfictive', 'density_gain'] as const;

describe('coverage of the ramp uncertainties', function () {
  this.timeout(120000);
  for (const c of CASES) {
    it(`holds the truth within ±2u in 90–99 % of ${RUNS} runs, ${c.name} transition (ln-cosh w = ${c.w} K, Avrami θ = ${c.theta} K)`, () => {
      const truth: Record<(typeof NAMES)[number], number> = {
        tg: 315,
        alpha_glass: G / 101,
        alpha_liquid: M / 101,
        tonset: trueOnset(c),
        tfictive: 299,
        density_gain: 100 * (100.7 / 99.9 - 1),
      };
      const inside = Object.fromEntries(NAMES.map((n) => [n, 0])) as Record<(typeof NAMES)[number], number>;
      const missing: string[] = [];
      const nb = new Notebook(new InMemoryHost());
      nb.setFile('m.md', MATERIAL_BLOCK());
      for (let seed = 1; seed <= RUNS; seed++) {
        const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 300 K\ntemperature_calibration: 0 K\n', 't/s, T/K, h/nm', cycle(c, gaussian(seed)), 5);
        nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 270) + '\n' + ramp);
        const b = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
        for (const n of NAMES) {
          const r = b.results[n];
          if (!r || r.uncertainty === undefined) {
            missing.push(`${seed}:${n}`);
            continue;
          }
          if (Math.abs(r.value - truth[n]) <= 2 * r.uncertainty) inside[n]++;
        }
      }
      assert.deepEqual(missing, []);
      const report = NAMES.map((n) => `${n} ${((100 * inside[n]) / RUNS).toFixed(1)} %`).join(', ');
      for (const n of NAMES) assert.ok(inside[n] >= 0.9 * RUNS && inside[n] <= 0.99 * RUNS, report);
    });
  }

  it(`holds Tg and the expansivities within ±2u in 90–99 % of ${RUNS} runs, cooling by the Tool–Narayanaswamy–Moynihan model (x = 0.6, β = 0.6, m = 80)`, () => {
    // Cooling 350 → 270 K at 1 K/min: h = 100 + G(T − 315) + (M − G)(Tf − 315) nm. Truth: Tg = the
    // limiting fictive temperature Tf′ (where the glass asymptote meets the liquid line), α = slope /
    // h at that intersection.
    const { T, Tf } = tnmCooling(1 / 60, 350, 270, STEP, 0.6, 0.6, 80, 315);
    const limiting = Tf[Tf.length - 1];
    const hStar = 100 + M * (limiting - 315);
    const truth = { tg: limiting, alpha_glass: G / hStar, alpha_liquid: M / hStar };
    const inside = { tg: 0, alpha_glass: 0, alpha_liquid: 0 };
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK());
    for (let seed = 1; seed <= RUNS; seed++) {
      const noise = gaussian(1000 + seed);
      const rows = T.map((t, i) => [i * 30, t, 100 + G * (t - 315) + (M - G) * (Tf[i] - 315) + 0.02 * noise()]);
      nb.setFile('d.md', DEPOSITION_BLOCK('D-1', 270) + '\n' + tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\ntemperature_calibration: 0 K\n', 't/s, T/K, h/nm', rows, 5));
      const b = toJsonReport(nb.analyze(['d.md'])).files[0].blocks[1];
      for (const n of ['tg', 'alpha_glass', 'alpha_liquid'] as const) {
        const r = b.results[n];
        if (r?.uncertainty !== undefined && Math.abs(r.value - truth[n]) <= 2 * r.uncertainty) inside[n]++;
      }
    }
    const report = Object.entries(inside).map(([n, k]) => `${n} ${((100 * k) / RUNS).toFixed(1)} %`).join(', ');
    for (const k of Object.values(inside)) assert.ok(k >= 0.9 * RUNS && k <= 0.99 * RUNS, report);
  });
});
