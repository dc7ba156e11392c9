/**
 * Identities of the decadic Vogel–Fulcher–Tammann law log10 τ = A + B/(T − T0) (τ in s).
 *
 * - Tg where τ = 100 s: Tg = T0 + B/(2 − A), which needs A < 2.
 * - Kinetic fragility at Tg: m = d log10 τ / d(Tg/T) at T = Tg = B·Tg/(Tg − T0)²
 *   (IUPAC, Pure Appl. Chem. 85, 1017 (2013) for the definition of m; the VFT form follows by
 *   differentiation, Böhmer, Ngai, Angell & Plazek, J. Chem. Phys. 99, 4201 (1993)).
 *
 * Policy: functions return NaN for parameters outside their domain (A ≥ 2, B ≤ 0, T ≤ T0).
 */

export interface VftParameters {
  /** A = log10 τ0, τ0 in s. */
  readonly log10Tau0: number;
  /** B in K (decadic). */
  readonly B: number;
  /** T0 in K. */
  readonly T0: number;
}

/** log10 τ at T (K); NaN at or below T0. */
export function vftLog10Tau(p: VftParameters, T: number): number {
  return T > p.T0 ? p.log10Tau0 + p.B / (T - p.T0) : NaN;
}

/** Temperature (K) where log10 τ reaches a value; NaN when it never does above T0. */
export function vftTemperatureAt(p: VftParameters, log10Tau: number): number {
  if (!(p.B > 0) || !(log10Tau > p.log10Tau0)) return NaN;
  return p.T0 + p.B / (log10Tau - p.log10Tau0);
}

/** Tg (K) where τ = 100 s. */
export function vftTg(p: VftParameters): number {
  return vftTemperatureAt(p, 2);
}

/** Fragility index m at Tg. */
export function vftFragility(p: VftParameters): number {
  const tg = vftTg(p);
  if (!Number.isFinite(tg)) return NaN;
  return (p.B * tg) / ((tg - p.T0) * (tg - p.T0));
}

/**
 * Standard uncertainties of Tg and m from those of A, B and T0 (delta method, first order),
 * with an optional covariance matrix in the order (A, B, T0).
 */
export function vftDerivedUncertainty(p: VftParameters, cov: readonly (readonly number[])[]): { tg: number; m: number } {
  const f = (q: VftParameters): [number, number] => [vftTg(q), vftFragility(q)];
  const steps = [Math.max(1e-7, Math.abs(p.log10Tau0) * 1e-7), Math.max(1e-7, Math.abs(p.B) * 1e-7), Math.max(1e-7, Math.abs(p.T0) * 1e-7)];
  const grads: number[][] = [[], []];
  for (let k = 0; k < 3; k++) {
    const up = { log10Tau0: p.log10Tau0 + (k === 0 ? steps[0] : 0), B: p.B + (k === 1 ? steps[1] : 0), T0: p.T0 + (k === 2 ? steps[2] : 0) };
    const dn = { log10Tau0: p.log10Tau0 - (k === 0 ? steps[0] : 0), B: p.B - (k === 1 ? steps[1] : 0), T0: p.T0 - (k === 2 ? steps[2] : 0) };
    const a = f(up);
    const b = f(dn);
    grads[0][k] = (a[0] - b[0]) / (2 * steps[k]);
    grads[1][k] = (a[1] - b[1]) / (2 * steps[k]);
  }
  const variance = (g: number[]): number => {
    let v = 0;
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) v += g[i] * (cov[i]?.[j] ?? 0) * g[j];
    return v;
  };
  return { tg: Math.sqrt(Math.max(0, variance(grads[0]))), m: Math.sqrt(Math.max(0, variance(grads[1]))) };
}
