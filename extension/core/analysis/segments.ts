/**
 * Splits a scan into heating, cooling and isothermal segments.
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

/** Point labels are indices into this list. */
const DIRECTIONS: readonly Direction[] = ['isothermal', 'heating', 'cooling'];
const ISOTHERMAL = 0;
const HEATING = 1;
const COOLING = 2;

interface Run {
  direction: Direction;
  start: number;
  end: number;
}

/** Maximal runs of equal labels: run r covers [bounds[r], bounds[r + 1]). */
function runBounds(labels: Uint8Array): Int32Array {
  const bounds = new Int32Array(labels.length + 1);
  let count = 0;
  for (let i = 1; i < labels.length; i++) if (labels[i] !== labels[i - 1]) bounds[++count] = i;
  bounds[++count] = labels.length;
  return bounds.subarray(0, count + 1);
}

/**
 * Merges every run shorter than MIN_RUN into the run before it (at the start, into the run after
 * it), first short run first, joining neighbours that end up with the same direction; a single
 * run is kept whatever its length. One pass with a stack: the runs already on the stack are long
 * and never change again, except the top one, which absorbs what follows. Only the runs it keeps
 * become objects.
 */
function mergeShortRuns(labels: Uint8Array, bounds: Int32Array): Run[] {
  const out: Run[] = [];
  const count = bounds.length - 1;
  // The run under consideration: the next run, or a short first run joined to those after it.
  let label = labels[bounds[0]];
  let start = bounds[0];
  let end = bounds[1];
  for (let k = 0; k < count; ) {
    const top = out[out.length - 1];
    const direction = DIRECTIONS[label];
    if (top && top.direction === direction) top.end = end;
    else if (end - start >= MIN_RUN) out.push({ direction, start, end });
    else if (top) top.end = end;
    else if (k + 1 < count) {
      // A short first run joins the run after it, which may then be short in turn.
      k++;
      label = labels[bounds[k]];
      end = bounds[k + 1];
      continue;
    } else out.push({ direction, start, end });
    k++;
    if (k < count) {
      label = labels[bounds[k]];
      start = bounds[k];
      end = bounds[k + 1];
    }
  }
  return out;
}

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
  const labels = new Uint8Array(n);
  if (t) {
    const slopes = localSlopes(t, T, 3);
    let eps: number;
    if (nominalRateKPerMin && nominalRateKPerMin > 0) eps = (0.1 * nominalRateKPerMin) / 60;
    else {
      const abs = Float64Array.from(slopes, Math.abs).sort();
      eps = 0.1 * abs[Math.floor(abs.length / 2)];
    }
    for (let i = 0; i < n; i++) labels[i] = slopes[i] > eps ? HEATING : slopes[i] < -eps ? COOLING : ISOTHERMAL;
  } else {
    for (let i = 0; i < n; i++) {
      const d = T[Math.min(n - 1, i + 3)] - T[Math.max(0, i - 3)];
      labels[i] = d > 0.05 ? HEATING : d < -0.05 ? COOLING : ISOTHERMAL;
    }
  }
  return mergeShortRuns(labels, runBounds(labels)).map((run) => {
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
