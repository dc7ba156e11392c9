import assert from 'node:assert/strict';
import { InMemoryHost, Notebook } from '../../extension/core/index.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

// A results block keeps the inputs hash of the block it was written from, and is flagged stale when
// that hash changes; a new version of Vitrine must give the same hash for the same notebook, or
// every results block a lab has written turns stale. The values below are those the previous
// release computed for these notebooks (common practice, no source: a compatibility pin).

/** A heat–cool scan: glass, a transformation to the liquid from 326 to 331 K, cooling through Tg = 315 K. */
function heatCool(): string {
  const rows: number[][] = [];
  const tg = 315;
  const vd = (T: number): number => 99.9 + 0.02 * (T - 300);
  const scl = (T: number): number => 101 + 0.07 * (T - tg);
  const lc = (T: number): number => 101 + 0.02 * (T - tg);
  let seed = 1;
  const noise = (): number => {
    seed = (seed * 1103515245 + 12345) & 0x7fffffff;
    return seed / 0x80000000 - 0.5;
  };
  let t = 0;
  for (let T = 280; T <= 345; T += 0.25) {
    const x = Math.min(1, Math.max(0, (T - 326) / 5));
    rows.push([t, T, vd(T) + x * (scl(T) - vd(T)) + 0.01 * noise()]);
    t += 15;
  }
  for (let T = 344.75; T >= 280; T -= 0.25) {
    rows.push([t, T, (T >= tg ? scl(T) : lc(T)) + 0.01 * noise()]);
    t += 15;
  }
  return MATERIAL_BLOCK(315) + '\n' + DEPOSITION_BLOCK('D-1', 270) + '\n' + tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', rows, 9);
}

function hashes(text: string): string[] {
  const nb = new Notebook(new InMemoryHost());
  nb.setFile('a.md', text);
  nb.analyze(['a.md']);
  return ['M-1', 'D-1', 'R-1'].map((id) => nb.inputsHashOf(id) ?? '');
}

describe('inputs hashes kept in results blocks', () => {
  const lf = heatCool();
  it('are those of the previous release for a notebook with line feeds', () => {
    assert.deepEqual(hashes(lf), ['27hm7pmpk06', '18hndxxvk48', '8bdkv732um']);
  });
  it('and with CR LF line breaks', () => {
    assert.deepEqual(hashes(lf.replace(/\n/g, '\r\n')), ['26qn1lkcir2', '4d5ikbzbgb', '26d7c8pqx54']);
  });
  it('and with every block in a block quote', () => {
    assert.deepEqual(hashes(lf.replace(/^/gm, '> ')), ['11zr726nhdz', '1z1fggv7hxc', '19k5okf42cv']);
  });
});
