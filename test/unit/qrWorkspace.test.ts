import assert from 'node:assert/strict';
import { columnLevenbergMarquardt } from '../../extension/core/numeric/columnLevenbergMarquardt.js';
import { levenbergMarquardt } from '../../extension/core/numeric/levenbergMarquardt.js';
import { solveLeastSquares } from '../../extension/core/numeric/qr.js';
import { QrWorkspace } from '../../extension/core/numeric/qrWorkspace.js';
import { readNonlinear } from '../support/nist.js';
import { uniform } from '../support/random.js';

// The typed-array versions must give the numbers of qr.ts and levenbergMarquardt.ts exactly
// (they perform the same operations in the same order); those are checked against NIST StRD in
// numeric.test.ts, qr.test.ts and vftFit.test.ts.

function fill(work: QrWorkspace, a: readonly (readonly number[])[], b: readonly number[]): void {
  a.forEach((row, i) => row.forEach((v, j) => (work.design[j * work.capacity + i] = v)));
  b.forEach((v, i) => (work.rhs[i] = v));
}

describe('QrWorkspace.solve', () => {
  it('gives the solution and R of solveLeastSquares to the last bit', () => {
    const u = uniform(8);
    const work = new QrWorkspace(60, 5);
    for (let k = 0; k < 40; k++) {
      const m = 5 + Math.floor(u() * 55);
      const p = 1 + Math.floor(u() * 5);
      const a = Array.from({ length: m }, () => Array.from({ length: p }, () => (u() - 0.5) * 10 ** Math.floor(u() * 6)));
      const b = Array.from({ length: m }, () => u() * 100);
      fill(work, a, b);
      assert.deepEqual(work.solve(m, p), solveLeastSquares(a, b));
    }
  });

  it('returns null for a rank-deficient design, as solveLeastSquares does', () => {
    const a = [[1, 2], [2, 4], [3, 6]];
    const work = new QrWorkspace(3, 2);
    fill(work, a, [1, 2, 3]);
    assert.equal(work.solve(3, 2), null);
    assert.equal(solveLeastSquares(a, [1, 2, 3]), null);
  });
});

describe('columnLevenbergMarquardt', () => {
  // Source of the data and starts: NIST StRD nonlinear problems in test/fixtures/nist.
  const model = (b: readonly number[], x: number): number => b[0] * (1 - Math.exp(-b[1] * x));
  for (const [name, start] of [['Misra1a', 1], ['Misra1a', 2], ['BoxBOD', 2]] as const) {
    it(`follows levenbergMarquardt step for step on ${name} from start ${start}`, () => {
      const d = readNonlinear(name);
      const p0 = start === 1 ? d.start1 : d.start2;
      const m = d.x.length;
      const jacobian = (b: readonly number[]): number[][] => d.x.map((x) => [1 - Math.exp(-b[1] * x), b[0] * x * Math.exp(-b[1] * x)]);
      const rows = levenbergMarquardt({ residuals: (b) => d.x.map((x, i) => model(b, x) - d.y[i]), jacobian }, p0, { maxIterations: 5000 });
      const columns = columnLevenbergMarquardt(
        {
          rows: m,
          residuals: (b, out) => {
            d.x.forEach((x, i) => (out[i] = model(b, x) - d.y[i]));
            return true;
          },
          jacobian: (b, out) => jacobian(b).forEach((row, i) => row.forEach((v, j) => (out[j * m + i] = v))),
        },
        p0,
        { maxIterations: 5000 },
      );
      assert.deepEqual(columns, rows);
    });
  }
});
