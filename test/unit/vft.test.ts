import assert from 'node:assert/strict';
import { vftFragility, vftLog10Tau, vftTg, vftDerivedUncertainty } from '../../extension/core/analysis/vft.js';

describe('VFT identities', () => {
  it('Tg, m and τ for (A, B, T0) = (−14, 700 K, 200 K)', () => {
    // Worked case, exact by algebra [computed]: decadic VFT with τ(Tg) = 100 s and the fragility
    // m = d log10 τ/d(Tg/T) at Tg of the IUPAC Gold Book (Pure Appl. Chem. 85, 1017 (2013)):
    // Tg = 243.75 K, m = 89.142857…, log10 τ(Tg + 10 K) = −0.9767441860465116.
    const p = { log10Tau0: -14, B: 700, T0: 200 };
    assert.ok(Math.abs(vftTg(p) - 243.75) < 1e-12);
    assert.ok(Math.abs(vftFragility(p) - 89.142857142857) < 1e-9);
    assert.ok(Math.abs(vftLog10Tau(p, 253.75) - -0.9767441860465116) < 1e-12);
  });

  it('Tg = 315 K and m = 80 for A = −14, T0 = 252 K, B = 1008 K', () => {
    // Exact by algebra [computed]: Tg = T0 + B/(2 − A) = 315 K, m = B·Tg/(Tg − T0)² = 80.
    const p = { log10Tau0: -14, B: 1008, T0: 252 };
    assert.ok(Math.abs(vftTg(p) - 315) < 1e-12);
    assert.ok(Math.abs(vftFragility(p) - 80) < 1e-12);
  });

  it('m = (2 − A)·Tg/(Tg − T0), the independent algebraic identity', () => {
    // From m = B·Tg/(Tg − T0)² and Tg − T0 = B/(2 − A) [computed, exact]; Böhmer, Ngai, Angell &
    // Plazek, J. Chem. Phys. 99, 4201 (1993) write it m = m_min·Tg/(Tg − T0) [from memory].
    const p = { log10Tau0: -12.3, B: 1234, T0: 201 };
    const tg = vftTg(p);
    assert.ok(Math.abs(vftFragility(p) - ((2 - p.log10Tau0) * tg) / (tg - p.T0)) < 1e-9);
  });

  it('gives NaN outside the domain', () => {
    assert.ok(Number.isNaN(vftTg({ log10Tau0: 3, B: 700, T0: 200 })));
    assert.ok(Number.isNaN(vftLog10Tau({ log10Tau0: -14, B: 700, T0: 200 }, 150)));
  });

  it('propagates an uncertainty of T0 to Tg one to one', () => {
    // dTg/dT0 = 1 exactly, so σ(Tg) = σ(T0) when only T0 is uncertain [computed].
    const u = vftDerivedUncertainty({ log10Tau0: -14, B: 700, T0: 200 }, [[0, 0, 0], [0, 0, 0], [0, 0, 4]]);
    assert.ok(Math.abs(u.tg - 2) < 1e-6);
  });
});
