/** Keeps at most `max` evenly spaced points of a series, so a chart stays light whatever the scan. */
export function thinIndices(n: number, max = 1500): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  const out: number[] = [];
  const step = (n - 1) / (max - 1);
  for (let k = 0; k < max; k++) out.push(Math.round(k * step));
  return out;
}

/** Points of a line a + s·(x − xc) between two x values. */
export function linePoints(f: { c: number; slope: number; xc: number }, x0: number, x1: number): number[][] {
  return [
    [x0, f.c + f.slope * (x0 - f.xc)],
    [x1, f.c + f.slope * (x1 - f.xc)],
  ];
}
