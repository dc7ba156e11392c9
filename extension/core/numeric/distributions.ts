/**
 * Student t and Fisher F quantiles through the regularised incomplete beta function
 * (continued fraction evaluated by the modified Lentz method; Press et al., Numerical Recipes,
 * 3rd ed., §6.4) and bisection. Checked against jstat in the tests.
 *
 * Policy: degrees of freedom must be positive; otherwise NaN.
 */

function logGamma(x: number): number {
  // Lanczos approximation (g = 7, n = 9), accurate to ~1e-15 for x > 0.
  const c = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
  if (x < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
  x -= 1;
  let a = c[0];
  const t = x + 7.5;
  for (let i = 1; i < 9; i++) a += c[i] / (x + i);
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(a);
}

function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 300; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-15) break;
  }
  return h;
}

/** Regularised incomplete beta I_x(a, b). */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const lbt = logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x);
  const bt = Math.exp(lbt);
  if (x < (a + 1) / (a + b + 2)) return (bt * betaContinuedFraction(a, b, x)) / a;
  return 1 - (bt * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** P(T ≤ t) for Student's t with df degrees of freedom. */
export function studentTCdf(t: number, df: number): number {
  if (!(df > 0)) return NaN;
  const x = df / (df + t * t);
  const tail = 0.5 * incompleteBeta(x, df / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/** P(F ≤ f) for Fisher's F(d1, d2). */
export function fisherFCdf(f: number, d1: number, d2: number): number {
  if (!(d1 > 0) || !(d2 > 0)) return NaN;
  if (f <= 0) return 0;
  return incompleteBeta((d1 * f) / (d1 * f + d2), d1 / 2, d2 / 2);
}

function invert(cdf: (x: number) => number, p: number, lo: number, hi: number): number {
  while (cdf(hi) < p) hi *= 2;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (cdf(mid) < p) lo = mid;
    else hi = mid;
    if (hi - lo <= 1e-13 * Math.max(1, Math.abs(mid))) break;
  }
  return 0.5 * (lo + hi);
}

/**
 * Quantiles are asked for again and again with the same few probabilities and degrees of freedom
 * (one per fit of a given size): each is inverted once and kept, up to a bounded number. Kept by
 * number, not by a text key (making such a key cost more than finding the value).
 */
const tQuantiles = new Map<number, Map<number, number>>();
const fQuantiles = new Map<number, Map<number, Map<number, number>>>();
let quantileCount = 0;

/** The quantile kept under `key` in `byKey`, computed and kept when not there yet. */
function kept(byKey: Map<number, number>, key: number, compute: () => number): number {
  let v = byKey.get(key);
  if (v === undefined) {
    v = compute();
    byKey.set(key, v);
    quantileCount++;
  }
  return v;
}

/** Starts the kept quantiles afresh once there are many (before a lookup fetches its maps). */
function boundQuantiles(): void {
  if (quantileCount < 4096) return;
  tQuantiles.clear();
  fQuantiles.clear();
  quantileCount = 0;
}

function level<K, V>(map: Map<K, V>, key: K, make: () => V): V {
  let v = map.get(key);
  if (v === undefined) map.set(key, (v = make()));
  return v;
}

/** Quantile of Student's t. */
export function studentTQuantile(p: number, df: number): number {
  if (!(df > 0) || !(p > 0 && p < 1)) return NaN;
  if (p < 0.5) return -studentTQuantile(1 - p, df);
  boundQuantiles();
  return kept(level(tQuantiles, p, () => new Map()), df, () => invert((t) => studentTCdf(t, df), p, 0, 10));
}

/** Quantile of Fisher's F(d1, d2). */
export function fisherFQuantile(p: number, d1: number, d2: number): number {
  if (!(d1 > 0) || !(d2 > 0) || !(p > 0 && p < 1)) return NaN;
  boundQuantiles();
  const byD1 = level(fQuantiles, p, () => new Map<number, Map<number, number>>());
  return kept(level(byD1, d1, () => new Map()), d2, () => invert((f) => fisherFCdf(f, d1, d2), p, 0, 10));
}

/** Two-sided 95 % t value. */
export function t95(df: number): number {
  return studentTQuantile(0.975, df);
}
