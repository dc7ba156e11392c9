/* global console */
// Writes the demo notebook's data files (fixtures/demo/data/). The scenario is invented:
// fictional materials, synthetic curves from simple models plus seeded noise.
// Run: node scripts/demo-data.mjs
import { mkdirSync, writeFileSync } from 'node:fs';

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
mkdirSync(dir, { recursive: true });

// A heat-cool cycle of an as-deposited film, thickness by ellipsometry.
function cycle({ seed, tsub, tg, onset, h0, gain, ag = 1.6e-4, al = 6.5e-4, q = 1, tmax, noise = 0.03 }) {
  const n = rng(seed);
  const hLcAtTsub = h0 * (1 + gain / 100);
  const hLcAtTg = hLcAtTsub * (1 + ag * (tg - tsub));
  const lc = (T) => hLcAtTg * (1 + ag * (T - tg)) + hLcAtTg * (al - ag) * softplus(T - tg, 1.8);
  const vd = (T) => h0 * (1 + ag * (T - tsub));
  const rows = [];
  let t = 0;
  const dt = 30; // s
  const step = (q / 60) * dt;
  for (let T = tsub; T <= tmax + 1e-9; T += step) {
    const x = 1 / (1 + Math.exp(-(T - onset) / 1.2));
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

function write(name, header, rows, sep, digits) {
  const text = [header, ...rows.map((r) => r.map((v, i) => v.toFixed(digits[i])).join(sep))].join('\n') + '\n';
  writeFileSync(`${dir}/${name}`, text);
}

write('D-02-cycle.csv', 't/s, T/K, h/nm', cycle({ seed: 2, tsub: 270, tg: 314, onset: 334, h0: 412, gain: 1.1, tmax: 345 }), ', ', [0, 2, 3]);
write('Q-01-cycle.csv', 't/s, T/K, h/nm', cycle({ seed: 4, tsub: 245, tg: 284.5, onset: 300, h0: 360, gain: 1.35, ag: 1.8e-4, al: 7.0e-4, tmax: 312 }), ', ', [0, 2, 3]);
write('D-03-cycle.tsv', 't (s)\tT (K)\th (nm)', cycle({ seed: 3, tsub: 296, tg: 314, onset: 326, h0: 388, gain: 0.35, tmax: 345 }), '\t', [0, 2, 3]);

// Isothermal hold above Tg: plateau, linear front, plateau.
{
  const n = rng(11);
  const rows = [];
  const hVd = 405.2, hL = 411.9, t1 = 900, t2 = 5100;
  for (let t = 0; t <= 7200; t += 30) {
    const x = t < t1 ? 0 : t > t2 ? 1 : (t - t1) / (t2 - t1);
    rows.push([t, 326.0 + 0.02 * n(), hVd + (hL - hVd) * x + 0.04 * n()]);
  }
  write('D-01-hold.csv', 't/s; T/K; h/nm', rows, '; ', [0, 2, 3]);
}

// Dielectric relaxation times of the second material (VFT with scatter).
{
  const n = rng(21);
  const A = -13.8, B = 640, T0 = 248;
  const rows = [];
  for (let T = 290; T <= 350; T += 4) rows.push([T, Math.pow(10, A + B / (T - T0) + 0.03 * n())]);
  const text = ['# loss-peak times, tau = 1/(2 pi f_max)', 'T/K  tau/s', ...rows.map((r) => `${r[0].toFixed(1)}  ${r[1].toExponential(4)}`)].join('\n') + '\n';
  writeFileSync(`${dir}/quillite-dielectric.txt`, text);
}

// Calorimetry: heat capacity with a logistic step and a Gaussian overshoot on linear baselines.
function dscScan(file, { seed, step, width, peak, peakAt, peakWidth }) {
  const n = rng(seed);
  const rows = [];
  for (let T = 290; T <= 360; T += 0.5) {
    const cpg = 1.21 + 0.0031 * (T - 300);
    const cpl = 1.63 + 0.0018 * (T - 300);
    const s = 1 / (1 + Math.exp(-(T - step) / width));
    const overshoot = peak * Math.exp(-0.5 * ((T - peakAt) / peakWidth) ** 2);
    rows.push([T, cpg + (cpl - cpg) * s + overshoot + 0.003 * n()]);
  }
  write(file, 'T/K, Cp/(J g^-1 K^-1)', rows, ', ', [1, 4]);
}

// The as-deposited film: a delayed step with a large overshoot.
dscScan('D-01-dsc.csv', { seed: 31, step: 336, width: 1.3, peak: 3.7, peakAt: 337.5, peakWidth: 1.6 });
// The second heating of the same pan after cooling at 10 K/min: the liquid-cooled reference.
dscScan('D-01-dsc-second.csv', { seed: 32, step: 319, width: 1.6, peak: 0.12, peakAt: 321, peakWidth: 1.5 });
console.log('demo data written to', dir);
