/**
 * Splits a scan into heating, cooling and isothermal segments (METHODS.md §0.1).
 *
 * With a time column, dT/dt is the slope of a local linear regression over 7 points; a point is
 * heating when dT/dt > ε, cooling when dT/dt < −ε, isothermal otherwise, with ε = 0.1 × the
 * nominal rate (or 0.1 × the median |dT/dt| when no rate is given). Without time, the direction is
 * that of the centred temperature change over ±3 points, against a 0.05 K dead band. Runs
 * shorter than 5 points are merged into their neighbour. Within a segment, a back-step of more
 * than 0.1 K against its direction is reported (mixed heating and cooling).
 *
 * Policy: fewer than 2 points give one isothermal segment; never throws.
 */

export type Direction = 'heating' | 'cooling' | 'isothermal';

export interface Segment {
  readonly direction: Direction;
  /** Row indices [start, end). */
  readonly start: number;
  readonly end: number;
  /** Measured rate, K/min (slope of T against t), when there is a time column. */
  readonly measuredRate?: number;
  /** First row whose temperature steps back by more than 0.1 K, if any. */
  readonly backStep?: number;
}

const MIN_RUN = 5;

function localSlopes(t: ArrayLike<number>, T: ArrayLike<number>, half: number): Float64Array {
  const n = T.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - half);
    const b = Math.min(n, i + half + 1);
    let mt = 0;
    let mT = 0;
    for (let k = a; k < b; k++) {
      mt += t[k];
      mT += T[k];
    }
    mt /= b - a;
    mT /= b - a;
    let stt = 0;
    let stT = 0;
    for (let k = a; k < b; k++) {
      stt += (t[k] - mt) * (t[k] - mt);
      stT += (t[k] - mt) * (T[k] - mT);
    }
    out[i] = stt > 0 ? stT / stt : 0;
  }
  return out;
}

export function segmentScan(T: ArrayLike<number>, t: ArrayLike<number> | null, nominalRateKPerMin: number | null): Segment[] {
  const n = T.length;
  if (n < 2) return [{ direction: 'isothermal', start: 0, end: n }];
  const labels: Direction[] = new Array(n);
  if (t) {
    const slopes = localSlopes(t, T, 3);
    let eps: number;
    if (nominalRateKPerMin && nominalRateKPerMin > 0) eps = (0.1 * nominalRateKPerMin) / 60;
    else {
      const abs = Array.from(slopes, Math.abs).sort((a, b) => a - b);
      eps = 0.1 * abs[Math.floor(abs.length / 2)];
    }
    for (let i = 0; i < n; i++) labels[i] = slopes[i] > eps ? 'heating' : slopes[i] < -eps ? 'cooling' : 'isothermal';
  } else {
    for (let i = 0; i < n; i++) {
      const d = T[Math.min(n - 1, i + 3)] - T[Math.max(0, i - 3)];
      labels[i] = d > 0.05 ? 'heating' : d < -0.05 ? 'cooling' : 'isothermal';
    }
  }
  // Runs, then merge short runs into the previous one (or the next, at the start).
  let runs: Array<{ direction: Direction; start: number; end: number }> = [];
  for (let i = 0; i < n; i++) {
    const last = runs[runs.length - 1];
    if (last && last.direction === labels[i]) last.end = i + 1;
    else runs.push({ direction: labels[i], start: i, end: i + 1 });
  }
  let changed = true;
  while (changed && runs.length > 1) {
    changed = false;
    for (let r = 0; r < runs.length; r++) {
      if (runs[r].end - runs[r].start >= MIN_RUN) continue;
      const target = r > 0 ? r - 1 : r + 1;
      runs[target] = { direction: runs[target].direction, start: Math.min(runs[target].start, runs[r].start), end: Math.max(runs[target].end, runs[r].end) };
      runs.splice(r, 1);
      changed = true;
      break;
    }
    const merged: typeof runs = [];
    for (const run of runs) {
      const last = merged[merged.length - 1];
      if (last && last.direction === run.direction) last.end = run.end;
      else merged.push({ ...run });
    }
    runs = merged;
  }
  return runs.map((run) => {
    let backStep: number | undefined;
    if (run.direction !== 'isothermal') {
      const sign = run.direction === 'heating' ? 1 : -1;
      let extreme = T[run.start];
      for (let i = run.start + 1; i < run.end; i++) {
        if (sign * (T[i] - extreme) > 0) extreme = T[i];
        else if (sign * (extreme - T[i]) > 0.1 && backStep === undefined) backStep = i;
      }
    }
    let measuredRate: number | undefined;
    if (t && run.end - run.start >= 3) {
      let mt = 0;
      let mT = 0;
      const m = run.end - run.start;
      for (let i = run.start; i < run.end; i++) {
        mt += t[i];
        mT += T[i];
      }
      mt /= m;
      mT /= m;
      let stt = 0;
      let stT = 0;
      for (let i = run.start; i < run.end; i++) {
        stt += (t[i] - mt) ** 2;
        stT += (t[i] - mt) * (T[i] - mT);
      }
      if (stt > 0) measuredRate = (stT / stt) * 60;
    }
    return { ...run, ...(measuredRate !== undefined ? { measuredRate } : {}), ...(backStep !== undefined ? { backStep } : {}) };
  });
}
