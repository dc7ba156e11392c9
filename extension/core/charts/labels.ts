/**
 * Where labels go so that they do not overlap, measured in pixels of the chart's own scales.
 *
 * - Marker labels (onset, midpoint, Tf, Tg…) hang beside their vertical rules in lanes from the
 *   top of the plot. A marker goes to the first lane where its label clears every label of that
 *   lane and every rule that crosses the lane, and where its own rule, which starts at its label
 *   and runs down (a leader), crosses no label below. Labels that would leave the plot on the
 *   right turn to the left of their rule.
 * - Point labels (films on the maps) take the first of eight places around their point that
 *   clears the other points, the labels already placed and the plot's edges; a label with no
 *   free place is left out (the legend and tooltip still name the point).
 *
 * Text width is estimated from the character count (0.6 em a character for the figures face,
 * a little wide on purpose), as the SVG renderer does without a canvas.
 */

/** Estimated width of `text` in px at `fontSize`. */
export function textWidth(text: string, fontSize: number): number {
  return [...text].length * fontSize * 0.6;
}

/** A linear scale from a domain to [0, range] px; `flip` for a y axis (0 at the top). */
export function linear(domain: readonly [number, number], range: number, flip = false): (v: number) => number {
  const [d0, d1] = domain;
  const k = d1 === d0 ? 0 : range / (d1 - d0);
  return flip ? (v) => range - (v - d0) * k : (v) => (v - d0) * k;
}

export interface LanePlacement {
  /** Index into the markers given. */
  readonly index: number;
  readonly lane: number;
  /** The label's anchor side: right of the rule ('left' aligned text) or left of it. */
  readonly align: 'left' | 'right';
}

const GAP = 4;
/** Above this many markers, or this many steps, the search gives way to a greedy pass (lanes in x order). */
const SEARCH_LIMIT = 8;
const SEARCH_BUDGET = 20_000;

interface Placed {
  readonly x: number;
  readonly lane: number;
  readonly a: number;
  readonly b: number;
}

/** Whether two placed labels and their rules keep clear of each other. */
function compatible(p: Placed, q: Placed): boolean {
  // Labels of the same lane do not overlap.
  if (p.lane === q.lane) return p.b + GAP <= q.a || q.b + GAP <= p.a;
  // The rule of the upper one runs down through the lower one's lane: not through its label.
  const [upper, lower] = p.lane < q.lane ? [p, q] : [q, p];
  return upper.x <= lower.a - GAP || upper.x >= lower.b + GAP;
}

/**
 * Lanes for labels of vertical markers at pixel positions `xs` (0 … `width`), labels `widths`
 * px wide, drawn `pad` px from their rule. A search (backtracking in x order, fewest lanes first)
 * finds an arrangement where no two labels of a lane overlap and no rule crosses a label; a label
 * goes right of its rule unless only the left keeps it inside the plot, and turns to the other
 * side only when no arrangement in lanes exists otherwise.
 */
export function markerLanes(xs: readonly number[], widths: readonly number[], width: number, pad = 3): LanePlacement[] {
  const n = xs.length;
  const order = xs.map((_, i) => i).sort((a, b) => xs[a] - xs[b] || a - b);
  /** The label's extent for each side, the side that keeps it inside first. */
  const sides = (i: number): Array<{ align: 'left' | 'right'; a: number; b: number }> => {
    const left = { align: 'left' as const, a: xs[i] + pad, b: xs[i] + pad + widths[i] };
    const right = { align: 'right' as const, a: xs[i] - pad - widths[i], b: xs[i] - pad };
    const inside = (s: { a: number; b: number }) => s.a >= 0 && s.b <= width;
    if (inside(left)) return inside(right) ? [left, right] : [left];
    if (inside(right)) return [right];
    return [left.b - width <= -right.a ? left : right];
  };
  const choice = new Map<number, Placed & { align: 'left' | 'right' }>();
  // Markers at one x cannot stack at all: the budget bounds the search before the greedy pass.
  let budget = SEARCH_BUDGET;
  const search = (k: number, lanes: number, turn: boolean): boolean => {
    if (k === order.length) return true;
    if (--budget < 0) return false;
    const i = order[k];
    for (let lane = 0; lane < lanes; lane++) {
      for (const side of turn ? sides(i) : sides(i).slice(0, 1)) {
        const placed = { x: xs[i], lane, a: side.a, b: side.b, align: side.align };
        if ([...choice.values()].every((p) => compatible(p, placed))) {
          choice.set(i, placed);
          if (search(k + 1, lanes, turn)) return true;
          choice.delete(i);
        }
      }
    }
    return false;
  };
  // Labels stay on their own side (right of the rule, unless that leaves the plot) and stagger
  // in lanes; only when that fails may a label turn to the other side of its rule.
  if (n <= SEARCH_LIMIT) {
    for (const turn of [false, true]) {
      for (let lanes = 1; lanes <= n; lanes++) {
        choice.clear();
        if (search(0, lanes, turn)) return xs.map((_, i) => ({ index: i, lane: choice.get(i)!.lane, align: choice.get(i)!.align }));
      }
    }
  }
  // Many markers, or no arrangement: the first lane that keeps clear of what is placed, else a new one.
  choice.clear();
  let deepest = -1;
  for (const i of order) {
    const side = sides(i)[0];
    let lane = 0;
    while (![...choice.values()].every((p) => compatible(p, { x: xs[i], lane, a: side.a, b: side.b })) && lane <= deepest) lane++;
    deepest = Math.max(deepest, lane);
    choice.set(i, { x: xs[i], lane, a: side.a, b: side.b, align: side.align });
  }
  return xs.map((_, i) => ({ index: i, lane: choice.get(i)!.lane, align: choice.get(i)!.align }));
}

export interface PointLabel {
  /** Offset of the label's anchor from its point, px. */
  readonly dx: number;
  readonly dy: number;
  readonly align: 'left' | 'center' | 'right';
  readonly baseline: 'top' | 'middle' | 'bottom';
}

/** A rectangle in px, y down. */
export interface Box {
  readonly x0: number;
  readonly x1: number;
  readonly y0: number;
  readonly y1: number;
}

/**
 * A place for each point's label (or null when none is free), points at pixel positions
 * (`xs`, `ys`, y down) in a plot `width` × `height`, labels `widths` px wide and `fontSize` high,
 * each point a marker of `radius` px; `obstacles` are boxes no label may cover (line labels).
 */
export function pointLabels(xs: readonly number[], ys: readonly number[], widths: readonly number[], fontSize: number, width: number, height: number, radius = 5, obstacles: readonly Box[] = []): Array<PointLabel | null> {
  const h = fontSize;
  const r = radius + 2;
  const candidates: PointLabel[] = [
    { dx: r, dy: 0, align: 'left', baseline: 'middle' },
    { dx: -r, dy: 0, align: 'right', baseline: 'middle' },
    { dx: 0, dy: -r, align: 'center', baseline: 'bottom' },
    { dx: 0, dy: r, align: 'center', baseline: 'top' },
    { dx: r * 0.7, dy: -r * 0.7, align: 'left', baseline: 'bottom' },
    { dx: r * 0.7, dy: r * 0.7, align: 'left', baseline: 'top' },
    { dx: -r * 0.7, dy: -r * 0.7, align: 'right', baseline: 'bottom' },
    { dx: -r * 0.7, dy: r * 0.7, align: 'right', baseline: 'top' },
  ];
  const boxOf = (i: number, c: PointLabel): Box => {
    const x = xs[i] + c.dx;
    const y = ys[i] + c.dy;
    const x0 = c.align === 'left' ? x : c.align === 'right' ? x - widths[i] : x - widths[i] / 2;
    const y0 = c.baseline === 'top' ? y : c.baseline === 'bottom' ? y - h : y - h / 2;
    return { x0, x1: x0 + widths[i], y0, y1: y0 + h };
  };
  const hits = (p: Box, q: Box): boolean => p.x0 < q.x1 && q.x0 < p.x1 && p.y0 < q.y1 && q.y0 < p.y1;
  const points: Box[] = xs.map((x, i) => ({ x0: x - radius, x1: x + radius, y0: ys[i] - radius, y1: ys[i] + radius }));
  const taken: Box[] = [...obstacles];
  // Left to right, then top to bottom, so that the result does not depend on the input order.
  const order = xs.map((_, i) => i).sort((a, b) => xs[a] - xs[b] || ys[a] - ys[b] || a - b);
  const out: Array<PointLabel | null> = xs.map(() => null);
  for (const i of order) {
    for (const c of candidates) {
      const box = boxOf(i, c);
      if (box.x0 < 0 || box.x1 > width || box.y0 < 0 || box.y1 > height) continue;
      if (points.some((p) => hits(p, box)) || taken.some((t) => hits(t, box))) continue;
      taken.push(box);
      out[i] = c;
      break;
    }
  }
  return out;
}

/**
 * The extent of the finite `values`, widened by `fraction` of its span on each side (by 5 % of
 * the value, or 1 at zero, when all are equal; [0, 1] when there are none).
 */
export function paddedDomain(values: readonly number[], fraction: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo > hi) return [0, 1];
  const span = hi - lo;
  if (span === 0) {
    const d = Math.abs(lo) > 0 ? Math.abs(lo) * 0.05 : 1;
    return [lo - d, hi + d];
  }
  return [lo - span * fraction, hi + span * fraction];
}
