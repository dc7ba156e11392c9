import assert from 'node:assert/strict';
import { Matrix, QrDecomposition } from 'ml-matrix';
import { inverseNormalMatrix, solveLeastSquares } from '../../extension/core/numeric/qr.js';

// NIST StRD Longley (higher difficulty, ill-conditioned): data and certified coefficients of the
// NIST file, as the GNU Scientific Library test suite quotes them (multifit/test_longley.c).
const LONGLEY = [
  [83.0, 234289, 2356, 1590, 107608, 1947, 60323], [88.5, 259426, 2325, 1456, 108632, 1948, 61122],
  [88.2, 258054, 3682, 1616, 109773, 1949, 60171], [89.5, 284599, 3351, 1650, 110929, 1950, 61187],
  [96.2, 328975, 2099, 3099, 112075, 1951, 63221], [98.1, 346999, 1932, 3594, 113270, 1952, 63639],
  [99.0, 365385, 1870, 3547, 115094, 1953, 64989], [100.0, 363112, 3578, 3350, 116219, 1954, 63761],
  [101.2, 397469, 2904, 3048, 117388, 1955, 66019], [104.6, 419180, 2822, 2857, 118734, 1956, 67857],
  [108.4, 442769, 2936, 2798, 120445, 1957, 68169], [110.8, 444546, 4681, 2637, 121950, 1958, 66513],
  [112.6, 482704, 3813, 2552, 123366, 1959, 68655], [114.2, 502601, 3931, 2514, 125368, 1960, 69564],
  [115.7, 518173, 4806, 2572, 127852, 1961, 69331], [116.9, 554894, 4007, 2827, 130081, 1962, 70551],
];
const CERTIFIED = [-3482258.63459582, 15.0618722713733, -0.358191792925910e-1, -2.02022980381683, -1.03322686717359, -0.511041056535807e-1, 1829.15146461355];
const CERTIFIED_SD = [890420.383607373, 84.9149257747669, 0.334910077722432e-1, 0.488399681651699, 0.214274163161675, 0.22607320006937, 455.478499142212];

describe('solveLeastSquares (Householder QR)', () => {
  const X = LONGLEY.map((r) => [1, ...r.slice(0, 6)]);
  const y = LONGLEY.map((r) => r[6]);

  it('reproduces NIST Longley coefficients to at least 8 digits', () => {
    // NIST certifies values, not a tolerance: LRE ≥ 8 for QR on Longley is common practice, no
    // source (ml-matrix's QR reaches about 13 digits).
    const s = solveLeastSquares(X, y)!;
    s.x.forEach((b, j) => assert.ok(-Math.log10(Math.abs(b - CERTIFIED[j]) / Math.abs(CERTIFIED[j])) >= 8, `b${j} ${b}`));
  });

  it('reproduces the certified standard deviations from (RᵀR)⁻¹', () => {
    const s = solveLeastSquares(X, y)!;
    const rss = X.reduce((acc, row, i) => acc + (y[i] - row.reduce((a, v, j) => a + v * s.x[j], 0)) ** 2, 0);
    const cov = inverseNormalMatrix(s.r).map((row) => row.map((v) => (v * rss) / (16 - 7)));
    cov.forEach((row, j) => assert.ok(-Math.log10(Math.abs(Math.sqrt(row[j]) - CERTIFIED_SD[j]) / CERTIFIED_SD[j]) >= 6, `sd${j}`));
  });

  it('agrees with ml-matrix QrDecomposition', () => {
    // Oracle: ml-matrix 6 QrDecomposition.solve (independent implementation).
    const ref = new QrDecomposition(new Matrix(X)).solve(Matrix.columnVector(y)).to1DArray();
    const s = solveLeastSquares(X, y)!;
    s.x.forEach((b, j) => assert.ok(Math.abs(b - ref[j]) <= 1e-7 * Math.abs(ref[j]), `b${j}`));
  });

  it('returns null for a rank-deficient design', () => {
    assert.equal(solveLeastSquares([[1, 2], [2, 4], [3, 6]], [1, 2, 3]), null);
  });
});
