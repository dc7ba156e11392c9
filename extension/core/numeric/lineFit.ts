/**
 * Straight-line least squares with the regressor centred on its mean:
 * y = c + s·(x − xc), which keeps c and s uncorrelated. Two passes (means, then centred sums),
 * so large offsets such as temperatures near 300 K or thicknesses near 400 nm lose no digits.
 * Checked against NIST StRD Norris in the tests.
 *
 * Policy: fewer than 2 points, or all x equal, gives null. Residual variance needs n ≥ 3
 * (with n = 2 it is reported as 0 and the fit has no uncertainty).
 */

export interface LineFit {
  readonly n: number;
  /** Centre of the regressor. */
  readonly xc: number;
  /** Value at xc. */
  readonly c: number;
  readonly slope: number;
  readonly sse: number;
  /** Residual variance SSE/(n − 2). */
  readonly sigma2: number;
  readonly varC: number;
  readonly varSlope: number;
  readonly sxx: number;
  readonly xmin: number;
  readonly xmax: number;
}

export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, from = 0, to = x.length): LineFit | null {
  const n = to - from;
  if (n < 2) return null;
  let mx = 0;
  let my = 0;
  let xmin = Infinity;
  let xmax = -Infinity;
  for (let i = from; i < to; i++) {
    mx += x[i];
    my += y[i];
    if (x[i] < xmin) xmin = x[i];
    if (x[i] > xmax) xmax = x[i];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = from; i < to; i++) {
    const dx = x[i] - mx;
    sxx += dx * dx;
    sxy += dx * (y[i] - my);
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  let sse = 0;
  for (let i = from; i < to; i++) {
    const r = y[i] - my - slope * (x[i] - mx);
    sse += r * r;
  }
  const sigma2 = n > 2 ? sse / (n - 2) : 0;
  return { n, xc: mx, c: my, slope, sse, sigma2, varC: sigma2 / n, varSlope: sigma2 / sxx, sxx, xmin, xmax };
}

/** Fits the points whose index passes a filter. */
export function fitLineWhere(x: ArrayLike<number>, y: ArrayLike<number>, keep: (i: number) => boolean): LineFit | null {
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < x.length; i++) {
    if (keep(i)) {
      xs.push(x[i]);
      ys.push(y[i]);
    }
  }
  return fitLine(xs, ys);
}

/** Fits the points with lo ≤ x ≤ hi, without copying them (two passes over all points). */
export function fitLineInRange(x: ArrayLike<number>, y: ArrayLike<number>, lo: number, hi: number): LineFit | null {
  let n = 0;
  let mx = 0;
  let my = 0;
  let xmin = Infinity;
  let xmax = -Infinity;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    if (!(xi >= lo && xi <= hi)) continue;
    n++;
    mx += xi;
    my += y[i];
    if (xi < xmin) xmin = xi;
    if (xi > xmax) xmax = xi;
  }
  if (n < 2) return null;
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    if (!(xi >= lo && xi <= hi)) continue;
    const dx = xi - mx;
    const dy = y[i] - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  const sse = Math.max(0, syy - slope * sxy);
  const sigma2 = n > 2 ? sse / (n - 2) : 0;
  return { n, xc: mx, c: my, slope, sse, sigma2, varC: sigma2 / n, varSlope: sigma2 / sxx, sxx, xmin, xmax };
}

export function predict(f: LineFit, x: number): number {
  return f.c + f.slope * (x - f.xc);
}

/** Variance of the fitted line at x: Var(c) + (x − xc)²·Var(s) (c and s are uncorrelated). */
export function predictVariance(f: LineFit, x: number): number {
  const d = x - f.xc;
  return f.varC + d * d * f.varSlope;
}

/** Intercept at x = 0 and its standard error (the uncentred form, for comparison with tables). */
export function interceptAtZero(f: LineFit): { value: number; se: number } {
  return { value: f.c - f.slope * f.xc, se: Math.sqrt(predictVariance(f, 0)) };
}

export interface Intersection {
  readonly x: number;
  /** First-order standard uncertainty (delta method). */
  readonly se: number;
  /** Slopes differ significantly (two-sided t-test at 5 %). */
  readonly slopesDiffer: boolean;
}

/**
 * Intersection of two independently fitted lines with its delta-method uncertainty:
 * σ(x×) ≈ √(Var ĥ₁(x×) + Var ĥ₂(x×)) / |s₂ − s₁|.
 */
export function intersect(a: LineFit, b: LineFit, tCritical: (df: number) => number): Intersection | null {
  const ds = b.slope - a.slope;
  if (!(Math.abs(ds) > 0)) return null;
  const x = (a.c - b.c + b.slope * b.xc - a.slope * a.xc) / ds;
  const se = Math.sqrt(predictVariance(a, x) + predictVariance(b, x)) / Math.abs(ds);
  const seDs = Math.sqrt(a.varSlope + b.varSlope);
  const df = Math.max(1, a.n + b.n - 4);
  const slopesDiffer = seDs === 0 ? true : Math.abs(ds) / seDs > tCritical(df);
  return { x, se, slopesDiffer };
}
