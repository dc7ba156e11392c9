import assert from 'node:assert/strict';
import jstatModule from 'jstat';
import { linearRegression } from 'simple-statistics';
import { fisherFQuantile, studentTCdf, studentTQuantile } from '../../extension/core/numeric/distributions.js';
import { fitHinge } from '../../extension/core/numeric/hingeFit.js';
import { fitLine, interceptAtZero, intersect } from '../../extension/core/numeric/lineFit.js';
import { t95 } from '../../extension/core/numeric/distributions.js';
import { readNorris } from '../support/nist.js';
import { gaussian } from '../support/random.js';

const { jStat } = jstatModule as unknown as { jStat: { studentt: { inv(p: number, df: number): number; cdf(t: number, df: number): number }; centralF: { inv(p: number, a: number, b: number): number } } };
const lre = (est: number, cert: number): number => -Math.log10(Math.abs(est - cert) / Math.abs(cert));

describe('fitLine', () => {
  it('reproduces NIST StRD Norris to at least 12 digits', () => {
    // Source: NIST StRD Norris certified values (test/fixtures/nist/Norris.txt); LRE ≥ 12 for this
    // lower-difficulty set is common practice, no source (simple-statistics reaches about 13).
    const { x, y } = readNorris();
    const f = fitLine(x, y)!;
    const b0 = interceptAtZero(f);
    assert.ok(lre(f.slope, 1.00211681802045) >= 12);
    assert.ok(lre(b0.value, -0.262323073774029) >= 12);
    assert.ok(lre(b0.se, 0.232818234301152) >= 11);
    assert.ok(lre(Math.sqrt(f.varSlope), 0.429796848199937e-3) >= 11);
    assert.ok(lre(Math.sqrt(f.sigma2), 0.884796396144373) >= 12);
  });

  it('agrees with simple-statistics on the same data', () => {
    // Oracle: simple-statistics linearRegression (independent implementation).
    const { x, y } = readNorris();
    const f = fitLine(x, y)!;
    const ss = linearRegression(x.map((xi, i) => [xi, y[i]]));
    assert.ok(Math.abs(f.slope - ss.m) < 1e-12);
    assert.ok(Math.abs(interceptAtZero(f).value - ss.b) < 1e-10);
  });

  it('intersects two lines and gives the exact crossing for exact data', () => {
    // Two lines meeting at 315 K (common practice, no source: construction by algebra).
    const xa = [280, 290, 300, 310];
    const xb = [320, 330, 340, 350];
    const a = fitLine(xa, xa.map((t) => 100 + 0.02 * (t - 315)))!;
    const b = fitLine(xb, xb.map((t) => 100 + 0.07 * (t - 315)))!;
    const i = intersect(a, b, t95)!;
    assert.ok(Math.abs(i.x - 315) < 1e-9);
    assert.ok(i.se < 1e-9);
  });

  it('returns null without two distinct x', () => {
    assert.equal(fitLine([1], [1]), null);
    assert.equal(fitLine([2, 2, 2], [1, 2, 3]), null);
  });
});

describe('t and F quantiles', () => {
  it('match jstat to its own accuracy', () => {
    // Oracle: jstat 1.9 studentt.inv / studentt.cdf / centralF.inv (jstat's quantiles are good to
    // about 1e-7 relative); t(0.975, 34) = 2.0322444551273207 is jstat's studentt.inv.
    assert.ok(Math.abs(studentTQuantile(0.975, 34) - 2.0322444551273207) < 1e-7);
    for (const df of [1, 2, 3, 5, 10, 30, 137, 1000]) {
      const t = jStat.studentt.inv(0.975, df);
      assert.ok(Math.abs(studentTQuantile(0.975, df) - t) < 1e-7 * t, `t df=${df}`);
      assert.ok(Math.abs(studentTCdf(1.3, df) - jStat.studentt.cdf(1.3, df)) < 1e-8, `cdf df=${df}`);
      const f = jStat.centralF.inv(0.95, 1, df);
      assert.ok(Math.abs(fisherFQuantile(0.95, 1, df) - f) < 1e-6 * f, `F df=${df}`);
    }
  });

  it('match textbook values', () => {
    // From memory (standard t table, R's qt): t(0.975, 10) = 2.228138851964939, t(0.975, 30) = 2.042272456301238.
    assert.ok(Math.abs(studentTQuantile(0.975, 10) - 2.228138851964939) < 1e-9);
    assert.ok(Math.abs(studentTQuantile(0.975, 30) - 2.042272456301238) < 1e-9);
  });
});

describe('fitHinge', () => {
  const grid = (): number[] => Array.from({ length: 141 }, (_, i) => 280 + 0.5 * i);
  const twoLines = (t: number, tg = 315): number => (t < tg ? 100 + 0.02 * (t - tg) : 100 + 0.07 * (t - tg));

  it('recovers Tg and both slopes of exact two-line data to machine precision', () => {
    // Exact data from two lines meeting at Tg: the continuous two-line model of Hudson,
    // J. Am. Stat. Assoc. 61, 1097 (1966) holds them exactly [computed].
    const T = grid();
    const r = fitHinge(T, T.map((t) => twoLines(t, 315.37)));
    assert.ok(r.ok);
    assert.ok(Math.abs(r.fit.breakpoint - 315.37) < 1e-9);
    assert.ok(Math.abs(r.fit.slopeLow - 0.02) < 1e-12);
    assert.ok(Math.abs(r.fit.slopeHigh - 0.07) < 1e-12);
  });

  it('gives Tg ≈ 315 K with a Lerman (1980) profile-likelihood interval a few tenths of a kelvin wide', () => {
    // [computed]: 95 % interval about 314.7–315.1 K for σ = 0.02 nm (Lerman, Appl. Stat. 29, 77 (1980)).
    const T = grid();
    const g = gaussian(11);
    const r = fitHinge(T, T.map((t) => twoLines(t) + 0.02 * g()));
    assert.ok(r.ok);
    assert.ok(Math.abs(r.fit.breakpoint - 315) < 0.4);
    const width = r.fit.interval[1] - r.fit.interval[0];
    assert.ok(width > 0.2 && width < 0.8, `width ${width}`);
    assert.ok(r.fit.pTransition < 1e-6);
  });

  it('its 95 % intervals cover the true Tg in 92.5–97.5 % of noise draws', () => {
    // Coverage over 2000 seeded draws: the binomial standard error for p = 0.95, n = 2000 is
    // √(0.95·0.05/2000) = 0.0049, so 0.925–0.975 is ±5 standard errors: a calibrated interval
    // falls outside with probability below 1e-6, one that covers only 91 % lands inside about 1 % of
    // the time.
    const T = grid();
    let covered = 0;
    const draws = 2000;
    for (let s = 0; s < draws; s++) {
      const g = gaussian(1000 + s);
      const r = fitHinge(T, T.map((t) => twoLines(t) + 0.02 * g()));
      if (r.ok && r.fit.interval[0] <= 315 && 315 <= r.fit.interval[1]) covered++;
    }
    const rate = covered / draws;
    assert.ok(rate >= 0.925 && rate <= 0.975, `coverage ${rate}`);
  });

  it('finds no transition in a straight line', () => {
    const T = grid();
    const g = gaussian(5);
    const r = fitHinge(T, T.map((t) => 100 + 0.03 * (t - 315) + 0.02 * g()));
    assert.ok(r.ok);
    assert.ok(r.fit.pTransition > 0.001 || Math.abs(r.fit.slopeHigh / r.fit.slopeLow - 1) < 0.2);
  });

  it('refuses too few points or too short a span', () => {
    assert.deepEqual(fitHinge([1, 2, 3], [1, 2, 3]), { ok: false, reason: 'too-few-points' });
    const T = Array.from({ length: 40 }, (_, i) => 300 + 0.25 * i);
    assert.equal(fitHinge(T, T).ok, false);
  });
});
