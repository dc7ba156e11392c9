import assert from 'node:assert/strict';
import { coolingTg } from '../../extension/core/analysis/coolingTg.js';
import { gaussian } from '../support/random.js';

// The ramp analysis runs on every keystroke, and chooses its construction by fitting several
// (hinge, trimmed hinge, iterated windows, curvature tests): its cost must still grow linearly
// with the rows. As in linearCost.test.ts: n against 4n in the same run, the least of three runs
// each, a ratio (linear ≈ 4, quadratic ≈ 16) and never a time.

function broadCooling(n: number): { T: Float64Array; h: Float64Array } {
  // ln-cosh transition 3 K wide (Dalnoki-Veress et al., Phys. Rev. E 63, 031801 (2001)), 350 → 270 K.
  const g = gaussian(7);
  const T = Float64Array.from({ length: n }, (_, i) => 350 - (80 * i) / (n - 1));
  const h = T.map((t) => {
    const u = Math.abs(t - 315) / 3;
    return 100 + ((t - 315) * 0.09) / 2 + 0.075 * (u + Math.log1p(Math.exp(-2 * u)) - Math.LN2) + 0.02 * g();
  });
  return { T, h };
}

function least(run: () => unknown): number {
  let best = Infinity;
  for (let r = 0; r < 3; r++) {
    const start = performance.now();
    run();
    best = Math.min(best, performance.now() - start);
  }
  return best;
}

describe('ramp construction cost', () => {
  it('chooses and fits the cooling construction in time linear in the rows', () => {
    const small = broadCooling(20000);
    const large = broadCooling(80000);
    const run = (c: { T: Float64Array; h: Float64Array }) => () => coolingTg({ T: c.T, h: c.h, glassWindow: null, liquidWindow: null, fragility: null });
    // Both are broad, so both take the longest path.
    const a = coolingTg({ T: small.T, h: small.h, glassWindow: null, liquidWindow: null, fragility: null });
    const b = coolingTg({ T: large.T, h: large.h, glassWindow: null, liquidWindow: null, fragility: null });
    assert.ok(a.ok && b.ok && a.construction === 'windows' && b.construction === 'windows');
    let ratio = least(run(large)) / least(run(small));
    if (ratio >= 10) ratio = least(run(large)) / least(run(small));
    assert.ok(ratio < 10, `ratio ${ratio.toFixed(1)} (linear ≈ 4, quadratic ≈ 16)`);
  });
});
