import assert from 'node:assert/strict';
import { curvatureT } from '../../extension/core/numeric/curvature.js';
import { fitLine, fitLineInRange } from '../../extension/core/numeric/lineFit.js';
import { fitTwoWindows } from '../../extension/core/numeric/twoWindowFit.js';
import { gaussian } from '../support/random.js';

describe('fitLineInRange', () => {
  it('equals fitLine on the points inside the range (fitLine is checked against NIST StRD Norris)', () => {
    const g = gaussian(1);
    const x = Array.from({ length: 200 }, (_, i) => 280 + 0.37 * i);
    const y = x.map((t) => 100 + 0.03 * (t - 300) + 0.02 * g());
    const inside = x.map((_, i) => i).filter((i) => x[i] >= 300 && x[i] <= 320);
    const a = fitLineInRange(x, y, 300, 320)!;
    const b = fitLine(inside.map((i) => x[i]), inside.map((i) => y[i]))!;
    for (const k of ['n', 'xc', 'c', 'slope', 'sigma2', 'varC', 'varSlope', 'xmin', 'xmax'] as const) assert.ok(Math.abs(a[k] - b[k]) <= 1e-9 * Math.max(1, Math.abs(b[k])), k);
  });
});

describe('curvatureT', () => {
  it('finds the quadratic term of a parabola and none in a noisy line', () => {
    // Lack-of-fit test by a quadratic term (Draper & Smith, Applied Regression Analysis, 3rd ed., 1998).
    const g = gaussian(2);
    const x = Array.from({ length: 100 }, (_, i) => i * 0.5);
    const bent = x.map((t) => 1 + 0.01 * t + 0.001 * t * t + 0.01 * g());
    const straight = x.map((t) => 1 + 0.01 * t + 0.01 * g());
    assert.ok(curvatureT(x, bent, -Infinity, Infinity) > 10);
    assert.ok(Math.abs(curvatureT(x, straight, -Infinity, Infinity)) < 3);
    assert.equal(curvatureT(x, bent, -Infinity, 1.5), 0); // 4 points: no test
  });
});

describe('fitTwoWindows', () => {
  it('puts the windows 2δ below and δ above the intersection of two exact lines', () => {
    // Glass h = 100 + 0.02(T − 315), liquid h = 100 + 0.07(T − 315): they meet at 315 K [computed].
    const T = Array.from({ length: 321 }, (_, i) => 350 - 0.25 * i);
    const h = T.map((t) => 100 + (t < 315 ? 0.02 : 0.07) * (t - 315));
    const w = fitTwoWindows(T, h, 312, 7.5);
    assert.ok(w.ok);
    assert.ok(Math.abs(w.tg - 315) < 1e-6, `${w.tg}`);
    assert.ok(Math.abs(w.glassWindow[1] - (315 - 15)) < 1e-3 && Math.abs(w.liquidWindow[0] - (315 + 7.5)) < 1e-3);
    assert.ok(!w.glassShort);
  });

  it('fails on the side where the data end too close to Tg', () => {
    const T = Array.from({ length: 161 }, (_, i) => 350 - 0.25 * i); // down to 310 K
    const h = T.map((t) => 100 + (t < 315 ? 0.02 : 0.07) * (t - 315));
    const w = fitTwoWindows(T, h, 315, 7.5);
    assert.ok(!w.ok && w.end === 'low');
  });
});
