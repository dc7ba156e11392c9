/**
 * `vitrine init [DIR]`: a small starting notebook that passes `vitrine check` — a material, a
 * deposition and a heat–cool ramp reading a data file — so that a new user starts from something
 * that works and edits it into their own.
 *
 * The material and the film are placeholders, and the data file is synthetic: an as-deposited
 * glass line that transforms into the supercooled liquid on heating, then the liquid-cooled glass
 * on cooling, with seeded noise (the two-line picture of a glass transition; the thickness
 * analogue of Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)).
 *
 * Nothing existing is ever written over: when any of the files is already there, nothing is
 * written and the command says which.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';

/** The files of the starting notebook, relative to its folder. */
export const STARTER_FILES = ['notebook.md', 'data/F-01-cycle.csv'] as const;

const NOTEBOOK = `# My glass notebook

This notebook was written by \`vitrine init\` as a starting point. The material, the film and the
data are placeholders with synthetic numbers: replace them with your own. Each fenced block below
is read by Vitrine; everything else is ordinary markdown.

## The material

The standard Tg is the glass transition on cooling at 10 K/min; the VFT parameters (decadic,
τ in s) give the relaxation time of the liquid and its fragility.

\`\`\`material example-glass
name: example glass former (placeholder)
tg: 315 K
tg_source: replace with a citation or the id of a block that measured it
vft:
  log10_tau0: -14
  B: 1008 K
  T0: 252 K
\`\`\`

## A film

\`\`\`deposition F-01
material: example-glass
substrate_temperature: 270 K
rate: 0.2 nm/s
thickness: 400 nm
base_pressure: 2e-6 Pa
substrate: silicon, native oxide
date: 2026-01-15
\`\`\`

## Heating through Tg and cooling back

Heated at 1 K/min from the substrate temperature to 345 K, then cooled back at 1 K/min. Vitrine
finds the onset of transformation, the fictive temperature, the density gained over the
liquid-cooled glass and Tg of the cooling segment.

\`\`\`ramp R-01
film: F-01
rate: 1 K/min
direction: cycle
data: data/F-01-cycle.csv
instrument: ellipsometer (placeholder)
\`\`\`
`;

/** Deterministic standard normal numbers (a 32-bit mixing generator and the Box–Muller transform). */
function normals(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(uniform() + 1e-300)) * Math.cos(2 * Math.PI * uniform());
}

/** The synthetic heat–cool cycle: `t/s, T/K, h/nm`, 0.5 K steps at 1 K/min. */
export function starterCycle(): string {
  const tsub = 270, tg = 315, onset = 333, tmax = 345, h0 = 400, gain = 0.01, ag = 1.6e-4, al = 6.5e-4, width = 1.5;
  const softplus = (x: number): number => width * Math.log1p(Math.exp(x / width));
  const hLcTg = h0 * (1 + gain) * (1 + ag * (tg - tsub));
  const vd = (T: number): number => h0 * (1 + ag * (T - tsub));
  const lc = (T: number): number => hLcTg * (1 + ag * (T - tg)) + hLcTg * (al - ag) * softplus(T - tg);
  const fraction = (T: number): number => 1 / (1 + Math.exp(-(T - onset) / 1.2));
  const noise = normals(17);
  const lines = ['t/s, T/K, h/nm'];
  let t = 0;
  const row = (T: number, h: number): void => {
    lines.push(`${t}, ${T.toFixed(2)}, ${(h + 0.03 * noise()).toFixed(3)}`);
    t += 30;
  };
  for (let i = 0; tsub + 0.5 * i <= tmax; i++) {
    const T = tsub + 0.5 * i;
    const x = fraction(T);
    row(T, vd(T) * (1 - x) + lc(T) * x);
  }
  for (let i = 1; tmax - 0.5 * i >= tsub; i++) row(tmax - 0.5 * i, lc(tmax - 0.5 * i));
  return lines.join('\n') + '\n';
}

export class InitRefused extends Error {}

/**
 * Writes the starting notebook into `dir` (created when missing) and returns the paths written.
 * Throws InitRefused, having written nothing, when a file is already there or `dir` is a file.
 */
export function writeStarter(dir: string): string[] {
  if (fs.existsSync(dir) && !fs.statSync(dir).isDirectory()) throw new InitRefused(`${dir} is a file, not a folder.`);
  const targets = STARTER_FILES.map((f) => path.join(dir, ...f.split('/')));
  const present = targets.filter((t) => {
    try {
      fs.lstatSync(t);
      return true;
    } catch {
      return false;
    }
  });
  if (present.length > 0) throw new InitRefused(`${present.join(', ')} already exist${present.length === 1 ? 's' : ''}; nothing was written. Choose an empty folder: vitrine init DIR`);
  const contents = [NOTEBOOK, starterCycle()];
  fs.mkdirSync(path.join(dir, 'data'), { recursive: true });
  // 'wx': never over a file that appeared meanwhile, never through a link.
  targets.forEach((t, i) => fs.writeFileSync(t, contents[i], { flag: 'wx' }));
  return targets;
}
