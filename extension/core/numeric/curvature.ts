/**
 * Curvature of a stretch of data that should be straight (the points with lo ≤ x ≤ hi): the t statistic of the quadratic
 * coefficient of y = a + b·u + c·(u² − mean u²), u = x − mean x, fitted by least squares with the
 * regressors centred (the classical test for lack of linearity by a quadratic term; Draper &
 * Smith, Applied Regression Analysis, 3rd ed. (1998), §2.4 and §12.2). |t| above about 3 says the
 * stretch bends more than its noise allows.
 *
 * Policy: fewer than 5 points, or points that do not determine a parabola, give t = 0 (no
 * evidence of curvature). Never throws.
 */
export function curvatureT(x: ArrayLike<number>, y: ArrayLike<number>, lo: number, hi: number): number {
  let n = 0;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < x.length; i++) {
    if (!(x[i] >= lo && x[i] <= hi)) continue;
    n++;
    mx += x[i];
    my += y[i];
  }
  if (n < 5) return 0;
  mx /= n;
  my /= n;
  let muu = 0;
  for (let i = 0; i < x.length; i++) if (x[i] >= lo && x[i] <= hi) muu += (x[i] - mx) ** 2;
  muu /= n;
  // Normal equations of the centred regressors u and v = u² − mean u² (y centred too).
  let suu = 0;
  let suv = 0;
  let svv = 0;
  let suy = 0;
  let svy = 0;
  let syy = 0;
  for (let i = 0; i < x.length; i++) {
    if (!(x[i] >= lo && x[i] <= hi)) continue;
    const u = x[i] - mx;
    const v = u * u - muu;
    const yc = y[i] - my;
    suu += u * u;
    suv += u * v;
    svv += v * v;
    suy += u * yc;
    svy += v * yc;
    syy += yc * yc;
  }
  const det = suu * svv - suv * suv;
  if (!(det > 1e-12 * suu * svv) || n < 5) return 0;
  const b = (svv * suy - suv * svy) / det;
  const c = (suu * svy - suv * suy) / det;
  const sse = Math.max(0, syy - b * suy - c * svy);
  // Rounding leaves residuals of about 1e-16 of the data's spread on exact data; a noise floor of
  // 1e-10 of that spread keeps them from reading as curvature.
  const sigma2 = Math.max(sse / (n - 3), 1e-20 * (syy / n));
  const varC = (sigma2 * suu) / det;
  if (!(varC > 0)) return 0;
  return c / Math.sqrt(varC);
}
