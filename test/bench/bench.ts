/**
 * `npm run bench`: how much cheaper an edit is than a cold analysis. Machines are shared and
 * noisy, so this prints ratios; it asserts nothing.
 *
 * Notebook: 40 files × 25 deposition blocks + 1 material file (1000 data blocks).
 */
import { InMemoryHost, Notebook } from '../../extension/core/index.js';
import { fitHinge } from '../../extension/core/numeric/hingeFit.js';

const MATERIAL = '```material M-1\nname: bench glass\ntg: 300 K\ntg_source: bench\n```\n';
const block = (f: number, i: number): string =>
  `Prose about film ${f}-${i}.\n\n\`\`\`deposition D-${f}-${i}\nmaterial: M-1\nsubstrate_temperature: ${250 + (i % 20)} K\nrate: 0.2 nm/s\nduration: 1000 s\nthickness: 200 nm\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n\`\`\`\n`;

function files(): Map<string, string> {
  const m = new Map<string, string>([['materials.md', MATERIAL]]);
  for (let f = 0; f < 40; f++) m.set(`days/day-${f}.md`, Array.from({ length: 25 }, (_, i) => block(f, i)).join('\n'));
  return m;
}

function time(fn: () => void, repeat: number): number {
  const t0 = performance.now();
  for (let i = 0; i < repeat; i++) fn();
  return (performance.now() - t0) / repeat;
}

const texts = files();
const cold = time(() => {
  const nb = new Notebook(new InMemoryHost());
  for (const [p, t] of texts) nb.setFile(p, t);
  nb.analyze();
}, 5);

const nb = new Notebook(new InMemoryHost());
for (const [p, t] of texts) nb.setFile(p, t);
nb.analyze();
const target = 'days/day-7.md';
const original = texts.get(target)!;
let k = 0;
const edit = time(() => {
  k++;
  const edited = original.replace('substrate_temperature: 257 K', `substrate_temperature: ${257 + (k % 2)} K`);
  nb.setFile(target, edited);
  nb.analyze([target]);
}, 50);
const prose = time(() => {
  k++;
  nb.setFile(target, `Typing ${k}\n` + original);
  nb.analyze([target]);
}, 50);

console.log(`cold analysis of 1000 blocks:            ${cold.toFixed(1)} ms`);
console.log(`edit one value, re-check its file:       ${edit.toFixed(2)} ms  (${(cold / edit).toFixed(0)}× faster than cold)`);
console.log(`type prose above 25 blocks, re-check:    ${prose.toFixed(2)} ms  (${(cold / prose).toFixed(0)}× faster than cold)`);

// A 100 000-row cooling scan through the hinge fit, against a 1 000-row one (O(n log n)).
function scan(n: number): [number[], number[]] {
  const T: number[] = [];
  const h: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = 280 + (70 * i) / (n - 1);
    T.push(t);
    h.push((t < 315 ? 100 + 0.02 * (t - 315) : 100 + 0.07 * (t - 315)) + 0.02 * Math.sin(i * 12.9898));
  }
  return [T, h];
}
const [T1, h1] = scan(1000);
const [T2, h2] = scan(100000);
const small = time(() => fitHinge(T1, h1), 20);
const large = time(() => fitHinge(T2, h2), 3);
console.log(`hinge fit, 1 000 rows:                   ${small.toFixed(2)} ms`);
console.log(`hinge fit, 100 000 rows:                 ${large.toFixed(1)} ms  (${(large / small).toFixed(0)}× the 1 000-row time for 100× the rows)`);

// Typing in the metadata of a ramp with a 20 000-row inline table: the block is re-parsed and
// re-analysed (hinge fit and its window-sensitivity variants), the rest of the notebook is not.
{
  const rows: string[] = [];
  let t = 0;
  for (let i = 0; i < 10000; i++, t += 6) rows.push(`${t}, ${(280 + 0.007 * i).toFixed(3)}, ${(400 + 0.008 * i * 0.007 + 0.02 * Math.sin(i)).toFixed(4)}`);
  for (let i = 10000; i > 0; i--, t += 6) {
    const T = 280 + 0.007 * i;
    rows.push(`${t}, ${T.toFixed(3)}, ${(T < 315 ? 400 + 0.008 * (T - 315) : 400 + 0.028 * (T - 315) + 0.02 * Math.sin(i)).toFixed(4)}`);
  }
  const ramp = (rate: number) => `\`\`\`ramp R-big\nfilm: D-0-0\nrate: ${rate} K/min\n---\nt/s, T/K, h/nm\n${rows.join('\n')}\n\`\`\`\n`;
  const big = new Notebook(new InMemoryHost());
  for (const [p, text] of texts) big.setFile(p, text);
  big.setFile('big.md', ramp(1));
  big.analyze();
  let r = 0;
  const typing = time(() => {
    r++;
    big.setFile('big.md', ramp(1 + (r % 2) * 0.001));
    big.analyze(['big.md']);
  }, 5);
  console.log(`edit a ramp with 20 000 inline rows:     ${typing.toFixed(1)} ms per keystroke`);
}
