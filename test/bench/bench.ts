/**
 * `npm run bench`: how much cheaper typing is than a cold analysis, and what typing costs in
 * memory. Every keystroke is a new text (no alternating between two cached texts). Machines are
 * shared and noisy, so this prints ratios; it asserts nothing.
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

// Real typing: every keystroke is a new text, so the edited block is parsed and analysed anew.
const nb = new Notebook(new InMemoryHost());
for (const [p, t] of texts) nb.setFile(p, t);
nb.analyze();
const target = 'days/day-7.md';
const original = texts.get(target)!;
const typed = 'grown at the new rate after the source was refilled';
let k = 0;
const edit = time(() => {
  k++;
  const note = typed.slice(0, 1 + (k % typed.length));
  nb.setFile(target, original.replace('substrate: silicon\n```\n\nProse about film 7-8', `substrate: silicon\nnotes: ${note}\n\`\`\`\n\nProse about film 7-8`));
  nb.analyze({ only: [target] });
}, 50);
const prose = time(() => {
  k++;
  nb.setFile(target, typed.slice(0, 1 + (k % typed.length)) + '\n' + original);
  nb.analyze({ only: [target] });
}, 50);

console.log(`cold analysis of 1000 blocks:            ${cold.toFixed(1)} ms`);
console.log(`type in one block, re-check its file:    ${edit.toFixed(2)} ms  (${(cold / edit).toFixed(0)}× faster than cold)`);
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
  const ramp = (note: string) => `\`\`\`ramp R-big\nfilm: D-0-0\nrate: 1 K/min\nnotes: ${note}\n---\nt/s, T/K, h/nm\n${rows.join('\n')}\n\`\`\`\n`;
  const big = new Notebook(new InMemoryHost());
  for (const [p, text] of texts) big.setFile(p, text);
  big.setFile('big.md', ramp(''));
  big.analyze();
  const heap = (): number => {
    globalThis.gc?.();
    return process.memoryUsage().heapUsed / 2 ** 20;
  };
  const before = heap();
  let note = '';
  const typing = time(() => {
    note += 'abcdefghij'[note.length % 10];
    big.setFile('big.md', ramp(note));
    big.analyze({ only: ['big.md'] });
  }, 200);
  const growth = heap() - before;
  console.log(`type in a ramp with 20 000 inline rows:  ${typing.toFixed(1)} ms per keystroke (200 keystrokes, each a new text)`);
  console.log(`heap growth over those 200 keystrokes:   ${globalThis.gc ? `${growth.toFixed(1)} MB after GC` : 'run with --expose-gc to measure'}`);

  // Typing prose in a file whose ramp reads a large data file: the file is parsed once, not per keystroke.
  const csv = 't/s, T/K, h/nm\n' + Array.from({ length: 8 }, () => rows.join('\n')).join('\n') + '\n';
  const withFile = new Notebook(new InMemoryHost(new Map([['data/big.csv', csv]])));
  for (const [p, text] of texts) withFile.setFile(p, text);
  const page = '```ramp R-file\nfilm: D-0-0\nrate: 1 K/min\ndata: data/big.csv\n```\n';
  withFile.setFile('file.md', page);
  const first = time(() => withFile.analyze({ only: ['file.md'] }), 1);
  let p = '';
  const proseTyping = time(() => {
    p += 'x';
    withFile.setFile('file.md', p + '\n' + page);
    withFile.analyze({ only: ['file.md'] });
  }, 50);
  console.log(`type prose beside a ${(csv.length / 2 ** 20).toFixed(1)} MB data file:     ${proseTyping.toFixed(2)} ms per keystroke (first analysis ${first.toFixed(0)} ms)`);
}

// The language server as an editor drives it: a 500-block notebook of 600-row inline ramps (about
// 5 MB) opened over stdio; the first lens request (cold) against the lenses after a one-character
// edit inside one block, and after one in prose. Needs the built server (npm run build).
{
  const { startServer, tempNotebook, uriOf } = await import('../support/lspClient.js');
  const fs = await import('node:fs');
  const path = await import('node:path');
  const ramp = (i: number): string => {
    const tg = 310 + (i % 17);
    const lines: string[] = [];
    for (let k = 0; k < 600; k++) {
      const T = tg + 40 - (80 * k) / 599;
      const h = T > tg ? 400 * (1 + 8e-4 * (T - tg)) : 400 * (1 + 2e-4 * (T - tg));
      lines.push(`${T.toFixed(3)}, ${(h + 0.01 * Math.sin(k * 7.3 + i)).toFixed(4)}`);
    }
    return `Cooling scan ${i} of film D-${i % 20}.\n\n\`\`\`ramp R-${i}\nfilm: D-${i % 20}\nrate: 10 K/min\ndirection: cooling\nnotes: \n---\nT/K, h/nm\n${lines.join('\n')}\n\`\`\`\n`;
  };
  const films = Array.from({ length: 20 }, (_, i) => `\`\`\`deposition D-${i}\nmaterial: M-1\nsubstrate_temperature: ${260 + i} K\nrate: 0.2 nm/s\nduration: 2000 s\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n\`\`\`\n`).join('\n');
  const notebook = `# A year of scans\n\n${MATERIAL}\n${films}\n${Array.from({ length: 500 }, (_, i) => ramp(i)).join('\n')}`;
  const root = tempNotebook({ 'year.md': notebook });
  const client = await startServer(root);
  try {
    const uri = uriOf(path.join(root, 'year.md'));
    client.open(uri, notebook);
    const lensTime = async (): Promise<number> => {
      const t0 = performance.now();
      await client.connection.sendRequest('textDocument/codeLens', { textDocument: { uri } });
      return performance.now() - t0;
    };
    const cold = await lensTime();
    // Real typing: each keystroke inserts one character into the text as it now is, sent as an
    // incremental change, as editors send it.
    let version = 1;
    let text = notebook;
    const type = (at: number, ch: string): void => {
      const before = text.slice(0, at);
      const position = { line: before.split('\n').length - 1, character: at - before.lastIndexOf('\n') - 1 };
      text = before + ch + text.slice(at);
      client.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version: ++version }, contentChanges: [{ range: { start: position, end: position }, text: ch }] });
    };
    const edits: number[] = [];
    const prose: number[] = [];
    const word = 'annealed';
    for (let k = 0; k < word.length; k++) {
      type(text.indexOf('\n---', text.indexOf('```ramp R-250')), word[k]);
      edits.push(await lensTime());
      type(text.indexOf(' of film', text.indexOf('Cooling scan 100')), word[k]);
      prose.push(await lensTime());
    }
    const median = (xs: number[]): number => xs.slice().sort((a, b) => a - b)[xs.length >> 1];
    console.log(`language server, ${(notebook.length / 2 ** 20).toFixed(1)} MB notebook, 500 ramps of 600 rows:`);
    console.log(`  first lens request (cold):              ${cold.toFixed(0)} ms`);
    console.log(`  lenses after a keystroke in a block:    ${median(edits).toFixed(0)} ms  (${((100 * median(edits)) / cold).toFixed(1)} % of cold; goal under 5 %)`);
    console.log(`  lenses after a keystroke in prose:      ${median(prose).toFixed(0)} ms  (${((100 * median(prose)) / cold).toFixed(1)} % of cold; goal under 5 %)`);
    if (process.env.VERBOSE) console.log(client.log.join('\n'));
  } finally {
    await client.stop();
    fs.rmSync(root, { recursive: true, force: true });
  }
}
