// Writes the demo notebook's data files (fixtures/demo/data/). The scenario is invented:
// fictional materials, synthetic curves from simple models plus seeded noise.
// Run: node scripts/demo-data.mjs
// Imported (test/golden/demoTruth.test.ts), it writes nothing and gives the generating
// parameters and the noise-free models, so that tests can hold the results to them.
import { mkdirSync, writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

function rng(seed) {
  let a = seed >>> 0;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(uniform() + 1e-300)) * Math.cos(2 * Math.PI * uniform());
}

const softplus = (x, w) => w * Math.log1p(Math.exp(x / w));
const dir = 'fixtures/demo/data';

/** Width of the rounded glass transition of the liquid-cooled line (softplus), K. */
export const CORNER_WIDTH = 1.8;
/** Width of the logistic transformation of the as-deposited film on heating, K. */
export const ONSET_WIDTH = 1.2;
/** Time between points of a cycle, s. */
export const CYCLE_DT = 30;

/**
 * The heat-cool cycles, by data file: substrate temperature tsub (K), Tg of the liquid-cooled
 * line (K), logistic onset (K), as-deposited thickness h0 at tsub (nm), density gain (%) at tsub,
 * glass and liquid expansion coefficients ag, al (1/K), rate q (K/min), top temperature (K) and
 * the standard deviation of the thickness noise (nm).
 */
export const CYCLES = {
  'D-02-cycle.csv': { seed: 2, tsub: 270, tg: 314, onset: 334, h0: 412, gain: 1.1, ag: 1.6e-4, al: 6.5e-4, q: 1, tmax: 345, noise: 0.03 },
  'Q-01-cycle.csv': { seed: 4, tsub: 245, tg: 284.5, onset: 300, h0: 360, gain: 1.35, ag: 1.8e-4, al: 7.0e-4, q: 1, tmax: 312, noise: 0.03 },
  'D-03-cycle.tsv': { seed: 3, tsub: 296, tg: 314, onset: 326, h0: 388, gain: 0.35, ag: 1.6e-4, al: 6.5e-4, q: 1, tmax: 345, noise: 0.03 },
};

/**
 * The noise-free lines of a cycle: the as-deposited line vd, the liquid-cooled line lc (rounded at
 * tg), its glass and liquid asymptotes, and the transformed fraction x on first heating.
 */
export function cycleModel({ tsub, tg, onset, h0, gain, ag, al }) {
  const hLcAtTsub = h0 * (1 + gain / 100);
  const hLcAtTg = hLcAtTsub * (1 + ag * (tg - tsub));
  return {
    vd: (T) => h0 * (1 + ag * (T - tsub)),
    lc: (T) => hLcAtTg * (1 + ag * (T - tg)) + hLcAtTg * (al - ag) * softplus(T - tg, CORNER_WIDTH),
    glass: (T) => hLcAtTg * (1 + ag * (T - tg)),
    liquid: (T) => hLcAtTg * (1 + al * (T - tg)),
    x: (T) => 1 / (1 + Math.exp(-(T - onset) / ONSET_WIDTH)),
  };
}

/** A heat-cool cycle of an as-deposited film, thickness by ellipsometry: rows [t/s, T/K, h/nm]. */
export function cycle(p) {
  const { seed, tsub, q, tmax, noise } = p;
  const n = rng(seed);
  const { vd, lc, x: fraction } = cycleModel(p);
  const rows = [];
  let t = 0;
  const dt = CYCLE_DT;
  const step = (q / 60) * dt;
  for (let T = tsub; T <= tmax + 1e-9; T += step) {
    const x = fraction(T);
    const h = vd(T) * (1 - x) + lc(T) * x;
    rows.push([t, T, h + noise * n()]);
    t += dt;
  }
  for (let T = tmax - step; T >= tsub - 1e-9; T -= step) {
    rows.push([t, T, lc(T) + noise * n()]);
    t += dt;
  }
  return rows;
}

/**
 * Isothermal hold above Tg: plateau at hVd (nm), a linear front from t1 to t2 (s), plateau at hL;
 * temperature T (K) with noise Tnoise (K), thickness noise (nm).
 */
export const HOLD = { seed: 11, hVd: 405.2, hL: 411.9, t1: 900, t2: 5100, T: 326.0, Tnoise: 0.02, noise: 0.04 };

/** Dielectric relaxation times of the second material: decadic VFT law, scatter in decades. */
export const RELAXATION = { seed: 21, A: -13.8, B: 640, T0: 248, noise: 0.03 };

/**
 * Calorimetry scans, by data file: a logistic step (centre, width, K) from the glass to the liquid
 * baseline, a Gaussian overshoot (height J/(g K), centre and width K) and noise (J/(g K)).
 */
export const DSC_SCANS = {
  // The as-deposited film: a delayed step with a large overshoot.
  'D-01-dsc.csv': { seed: 31, step: 336, width: 1.3, peak: 3.7, peakAt: 337.5, peakWidth: 1.6, noise: 0.003 },
  // The second heating of the same pan after cooling at 10 K/min: the liquid-cooled reference.
  'D-01-dsc-second.csv': { seed: 32, step: 319, width: 1.6, peak: 0.12, peakAt: 321, peakWidth: 1.5, noise: 0.003 },
};

/** The glass and liquid heat-capacity baselines of the scans, J/(g K). */
export const cpGlass = (T) => 1.21 + 0.0031 * (T - 300);
export const cpLiquid = (T) => 1.63 + 0.0018 * (T - 300);

/** Heat capacity with a logistic step and a Gaussian overshoot on linear baselines: rows [T/K, Cp]. */
export function dscRows({ seed, step, width, peak, peakAt, peakWidth, noise }) {
  const n = rng(seed);
  const rows = [];
  for (let T = 290; T <= 360; T += 0.5) {
    const cpg = cpGlass(T);
    const cpl = cpLiquid(T);
    const s = 1 / (1 + Math.exp(-(T - step) / width));
    const overshoot = peak * Math.exp(-0.5 * ((T - peakAt) / peakWidth) ** 2);
    rows.push([T, cpg + (cpl - cpg) * s + overshoot + noise * n()]);
  }
  return rows;
}

function write(name, header, rows, sep, digits) {
  const text = [header, ...rows.map((r) => r.map((v, i) => v.toFixed(digits[i])).join(sep))].join('\n') + '\n';
  writeFileSync(`${dir}/${name}`, text);
}

function main() {
  mkdirSync(dir, { recursive: true });
  write('D-02-cycle.csv', 't/s, T/K, h/nm', cycle(CYCLES['D-02-cycle.csv']), ', ', [0, 2, 3]);
  write('Q-01-cycle.csv', 't/s, T/K, h/nm', cycle(CYCLES['Q-01-cycle.csv']), ', ', [0, 2, 3]);
  write('D-03-cycle.tsv', 't (s)\tT (K)\th (nm)', cycle(CYCLES['D-03-cycle.tsv']), '\t', [0, 2, 3]);

  // Isothermal hold above Tg: plateau, linear front, plateau.
  {
    const { seed, hVd, hL, t1, t2, T: hold, Tnoise, noise } = HOLD;
    const n = rng(seed);
    const rows = [];
    for (let t = 0; t <= 7200; t += 30) {
      const x = t < t1 ? 0 : t > t2 ? 1 : (t - t1) / (t2 - t1);
      rows.push([t, hold + Tnoise * n(), hVd + (hL - hVd) * x + noise * n()]);
    }
    write('D-01-hold.csv', 't/s; T/K; h/nm', rows, '; ', [0, 2, 3]);
  }

  // Dielectric relaxation times of the second material (VFT with scatter).
  {
    const { seed, A, B, T0, noise } = RELAXATION;
    const n = rng(seed);
    const rows = [];
    for (let T = 290; T <= 350; T += 4) rows.push([T, Math.pow(10, A + B / (T - T0) + noise * n())]);
    const text = ['# loss-peak times, tau = 1/(2 pi f_max)', 'T/K  tau/s', ...rows.map((r) => `${r[0].toFixed(1)}  ${r[1].toExponential(4)}`)].join('\n') + '\n';
    writeFileSync(`${dir}/quillite-dielectric.txt`, text);
  }

  for (const [file, scan] of Object.entries(DSC_SCANS)) write(file, 'T/K, Cp/(J g^-1 K^-1)', dscRows(scan), ', ', [1, 4]);
  console.log('demo data written to', dir);
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) main();
