/**
 * Ramp analysis: thickness (or specific volume) against temperature.
 *
 * 1. The scan is split into heating, cooling and isothermal segments (segments.ts).
 * 2. Tg from the longest cooling segment: the continuous two-line hinge fit with an optimised
 *    breakpoint and its profile-likelihood interval (hingeFit.ts, Method A); with `windows.glass`
 *    and `windows.liquid` set, the intersection of two window fits instead (Method B).
 *    α = (1/h)(dh/dT) of each line at Tg.
 * 3. When the scan starts with heating, that segment is taken as the first heating of the
 *    as-deposited film: the as-deposited (VD) line is fitted from the start until the data leave
 *    it (3 consecutive points beyond 4σ) or over `windows.deposited`; the supercooled-liquid and
 *    liquid-cooled lines come from the cooling segment, 5 K away from its Tg. Then
 *    - `tonset`: the VD line meets the line through the points with 0.2 ≤ x ≤ 0.8, where
 *      x = (h − ĥ_VD)/(ĥ_SCL − ĥ_VD) (the thickness analogue of the extrapolated onset);
 *    - `tfictive`: the VD line meets the SCL line;
 *    - `density_gain`: 100·(ĥ_LC/ĥ_VD − 1) at the reference temperature (default the film's
 *      substrate temperature), since ρ ∝ 1/h at fixed area and mass.
 *    Uncertainties of intersections by the delta method.
 *
 * Policy: any missing piece gives a diagnostic and no result for that figure; the other figures
 * are still computed. "No transition detected" is reported, not thrown.
 */
import { at, type Diagnostic, type Message } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { t95 } from '../numeric/distributions.js';
import { fitHinge } from '../numeric/hingeFit.js';
import { firstAbruptDrop } from '../numeric/abruptDrop.js';
import { fitLine, fitLineWhere, intersect, predict, predictVariance, type LineFit } from '../numeric/lineFit.js';
import { result, type ResultValue } from '../model/result.js';
import type { Span } from '../text/positions.js';
import { linePoints, thinIndices } from '../numeric/thin.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData, FigureSeries } from '../model/figure.js';
import { addAging } from './agingTime.js';
import { filmOf, materialOf, metadataWindow as window } from './blockLinks.js';
import { statedTg } from './materialAnalysis.js';
import { segmentScan, type Segment } from './segments.js';

/** Rows below which no figure can be computed: the first heating needs 10, Tg 8 on each side of it. */
const MIN_RAMP_ROWS = 10;

/** Distance from Tg of the glass and liquid lines used for extrapolation, K. */
const LINE_GAP = 5;

interface Curve {
  readonly T: Float64Array;
  readonly h: Float64Array;
}

function slice(c: Curve, s: Segment): Curve {
  return { T: c.T.subarray(s.start, s.end), h: c.h.subarray(s.start, s.end) };
}

/** A line through the points whose temperature passes a test. */
function fitWhere(c: Curve, keep: (T: number) => boolean): LineFit | null {
  return fitLineWhere(c.T, c.h, (i) => keep(c.T[i]));
}

export interface RampLines {
  readonly vd?: LineFit;
  readonly scl?: LineFit;
  readonly lc?: LineFit;
  readonly transformation?: LineFit;
  readonly segments: readonly Segment[];
}

/** Choices an analysis makes by itself; varied to measure how much the figures depend on them. */
interface RampChoices {
  /** Distance of the glass and liquid lines from Tg, K (default 5, shrunk for sparse data). */
  readonly gap?: number;
  /** Move the end of the automatic as-deposited window this many kelvin lower. */
  readonly vdTrim?: number;
  /** Leave out this many kelvin at both ends of the cooling segment. */
  readonly coolTrim?: number;
  /** Only the figures are wanted (a sensitivity variant): no scan checks, no chart. */
  readonly figuresOnly?: boolean;
}

const VARIANTS: readonly RampChoices[] = [{ gap: 3 }, { gap: 8 }, { vdTrim: 5 }, { coolTrim: 5 }];

/**
 * The ramp analysis, with the sensitivity of Tg, Tonset, Tf and the density gain to the choices
 * of windows (window edges moved by 5 K, the spread reported): the largest change
 * over the variants is named in the method, beside the statistical uncertainty.
 */
export function analyzeRamp(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const nominal = rampDetails(block, ctx).analysis;
  const names = ['tg', 'tonset', 'tfictive', 'density_gain'].filter((n) => nominal.results[n]);
  if (names.length === 0) return nominal;
  const spread = new Map<string, number>();
  for (const choice of VARIANTS) {
    ctx.checkCancelled();
    const r = rampDetails(block, ctx, { ...choice, figuresOnly: true }).analysis.results;
    for (const n of names) {
      const v = r[n]?.value;
      if (v !== undefined) spread.set(n, Math.max(spread.get(n) ?? 0, Math.abs(v - nominal.results[n].value)));
    }
  }
  const results = { ...nominal.results };
  for (const [n, s] of spread) {
    const r = results[n];
    results[n] = { ...r, method: `${r.method}; window sensitivity ±${Number(s.toPrecision(2))} ${r.unit === '1' ? '' : r.unit}`.trimEnd() };
  }
  return { ...nominal, results };
}

/** The analysis and the fitted lines (the charts draw them). */
export function rampDetails(block: ParsedBlock, ctx: AnalysisContext, choices: RampChoices = {}): { analysis: Analysis; lines: RampLines } {
  const diagnostics: Diagnostic[] = [];
  const results: Record<string, ResultValue> = {};
  const empty = { analysis: { results, diagnostics }, lines: { segments: [] } };
  const table = block.table;
  if (!table || table.rowCount === 0) return empty;
  const Tcol = table.byRole.get('temperature');
  const hcol = table.byRole.get('thickness') ?? table.byRole.get('volume');
  const note = (m: Message, span: Span): void => void diagnostics.push(at(m, span));
  if (!Tcol || !hcol) {
    // A header problem was already reported by the table reader.
    if (table.problems.length === 0) note(messages.rampNoThickness(), block.spanOf('/data'));
    return empty;
  }
  if (table.rowCount < MIN_RAMP_ROWS) {
    note(messages.tableTooFewRows('ramp', table.rowCount, MIN_RAMP_ROWS, 'for any figure (a first heating needs 10, and Tg 8 on each side of the transition while cooling)'), block.header.kindSpan);
    return empty;
  }
  const curve: Curve = { T: Tcol.values, h: hcol.values };
  const time = table.byRole.get('time')?.values ?? null;
  const nominal = block.quantities.get('/rate')?.value ?? null;
  const segments = segmentScan(curve.T, time, nominal);
  const lines: { -readonly [K in keyof RampLines]: RampLines[K] } = { segments };

  const backSteps = time ? [] : segments.filter((s) => s.backStep !== undefined);
  if (backSteps.length > 0) note(messages.rampMixedDirection(backSteps[0].direction, backSteps.length), block.rowSpan(backSteps[0].backStep!));
  if (nominal) {
    const off = segments.find((s) => s.direction !== 'isothermal' && s.measuredRate !== undefined && Math.abs(Math.abs(s.measuredRate) - nominal) > 0.1 * nominal);
    if (off?.measuredRate !== undefined) note(messages.rampRateMismatch(Math.abs(off.measuredRate), nominal), block.spanOf('/rate'));
  }

  if (!choices.figuresOnly) scanChecks(block, curve, time, segments, note);
  const stated = block.metadata.data.direction;
  if (!choices.figuresOnly && typeof stated === 'string' && table.rowCount >= 10) {
    const has = (d: string): boolean => segments.some((s) => s.direction === d && s.end - s.start >= 5);
    const found = has('heating') && has('cooling') ? 'heating and cooling' : has('heating') ? 'heating only' : has('cooling') ? 'cooling only' : 'no temperature change';
    const ok = stated === 'cycle' ? has('heating') && has('cooling') : has(stated) && !has(stated === 'heating' ? 'cooling' : 'heating');
    if (!ok) note(messages.rampDirectionMismatch(stated, found), block.spanOf('/direction'));
  }

  // Tg from the longest clean cooling segment.
  const coolings = segments.filter((s) => s.direction === 'cooling' && (time || s.backStep === undefined));
  const cooling = coolings.sort((a, b) => b.end - b.start - (a.end - a.start))[0];
  let tg: number | null = null;
  if (!cooling) {
    if (table.rowCount >= 10) note(messages.rampNoCooling(), block.header.kindSpan);
  } else {
    let c = slice(curve, cooling);
    if (choices.coolTrim) {
      let lo = Infinity;
      let hi = -Infinity;
      for (const T of c.T) {
        lo = Math.min(lo, T);
        hi = Math.max(hi, T);
      }
      const keep: number[] = [];
      c.T.forEach((T, i) => {
        if (T >= lo + choices.coolTrim! && T <= hi - choices.coolTrim!) keep.push(i);
      });
      c = { T: Float64Array.from(keep, (i) => c.T[i]), h: Float64Array.from(keep, (i) => c.h[i]) };
    }
    const glassW = window(block, 'glass');
    const liquidW = window(block, 'liquid');
    if (glassW && liquidW) {
      const g = fitWhere(c, (T) => T >= glassW[0] && T <= glassW[1]);
      const l = fitWhere(c, (T) => T >= liquidW[0] && T <= liquidW[1]);
      const x = g && l ? intersect(g, l, t95) : null;
      if (!g || !l || !x) {
        note(messages.rampTooFewPoints('cooling segment'), block.spanOf('/windows'));
      } else {
        tg = x.x;
        const h = predict(g, x.x);
        const k = t95(Math.max(1, g.n + l.n - 4));
        results.tg = result(x.x, 'K', `two windows (glass ${glassW[0]}–${glassW[1]} K, liquid ${liquidW[0]}–${liquidW[1]} K), intersection; cooling segment`, x.se, [x.x - k * x.se, x.x + k * x.se]);
        results.alpha_glass = result(g.slope / h, '1/K', 'slope of the glass window line / h at Tg', Math.sqrt(g.varSlope) / h);
        results.alpha_liquid = result(l.slope / h, '1/K', 'slope of the liquid window line / h at Tg', Math.sqrt(l.varSlope) / h);
        if (!x.slopesDiffer) note(messages.rampSlopesEqual('Tg'), block.spanOf('/windows'));
      }
    } else {
      const fit = fitHinge(c.T, c.h);
      const where = block.rowSpan(cooling.start);
      if (!fit.ok) {
        note(messages.rampTooFewPoints('cooling segment'), where);
      } else if (fit.fit.pTransition > 0.05) {
        note(messages.rampNoTransition(fit.fit.pTransition), where);
      } else if (fit.fit.atEdge) {
        note(messages.rampTgAtEdge(), where);
      } else {
        const f = fit.fit;
        tg = f.breakpoint;
        const u = (f.interval[1] - f.interval[0]) / (2 * t95(Math.max(1, f.n - 4)));
        const rateText = nominal ? ` at ${nominal} K/min` : '';
        results.tg = result(f.breakpoint, 'K', `hinge fit (continuous two-line, optimised breakpoint), cooling segment${rateText}; 95 % profile-likelihood interval`, u, f.interval);
        results.alpha_glass = result(f.slopeLow / f.hAtBreak, '1/K', 'glass slope of the hinge fit / h at Tg', f.seSlopeLow / f.hAtBreak);
        results.alpha_liquid = result(f.slopeHigh / f.hAtBreak, '1/K', 'liquid slope of the hinge fit / h at Tg', f.seSlopeHigh / f.hAtBreak);
        const ratio = f.slopeHigh / f.slopeLow;
        if (!(f.slopeHigh > f.slopeLow) || (f.slopeLow > 0 && ratio < 1.3)) note(messages.rampWeakTransition(ratio), where);
        if (f.durbinWatson < 1) note(messages.rampCurvature(f.durbinWatson), where);
      }
    }
    if (tg !== null) {
      const material = materialOf(block, ctx);
      const ref = material ? statedTg(material) : null;
      if (ref && Math.abs(tg - ref.value) > 10) note(messages.rampTgFar(tg, ref.value, nominal ?? NaN), block.rowSpan(cooling.start));
      const gap = choices.gap ?? chooseGap(c, tg);
      lines.lc = fitWhere(c, glassW ? (T) => T >= glassW[0] && T <= glassW[1] : (T) => T <= tg! - gap) ?? undefined;
      lines.scl = fitWhere(c, liquidW ? (T) => T >= liquidW[0] && T <= liquidW[1] : (T) => T >= tg! + gap) ?? undefined;
    }
  }

  // First heating of the as-deposited film.
  const first = segments[0];
  if (first && first.direction === 'heating' && first.end - first.start >= 10) {
    firstHeating(block, ctx, slice(curve, first), first, lines, results, note, choices.vdTrim ?? 0);
  }
  const quantity = hcol.role === 'volume' ? `V / (${hcol.unit})` : 'h / nm';
  if (choices.figuresOnly) return { analysis: { results, diagnostics }, lines };
  return { analysis: { results, diagnostics, figure: rampFigure(curve, lines, results, quantity) }, lines };
}

/** The ramp chart: the scan by segment, the fitted lines, and Tg, Tonset, Tf marked. */
function rampFigure(curve: Curve, lines: RampLines, results: Record<string, ResultValue>, yTitle: string): FigureData {
  const series: FigureSeries[] = [];
  for (const dir of ['heating', 'cooling', 'isothermal'] as const) {
    const idx: number[] = [];
    for (const s of lines.segments) if (s.direction === dir) for (let i = s.start; i < s.end; i++) idx.push(i);
    if (idx.length === 0) continue;
    series.push({ name: dir, role: 'data', points: thinIndices(idx.length).map((k) => [curve.T[idx[k]], curve.h[idx[k]]]) });
  }
  let tmin = Infinity;
  let tmax = -Infinity;
  for (const T of curve.T) {
    tmin = Math.min(tmin, T);
    tmax = Math.max(tmax, T);
  }
  const tg = results.tg?.value;
  const tf = results.tfictive?.value;
  const on = results.tonset?.value;
  if (lines.lc) series.push({ name: 'liquid-cooled glass', role: 'line', points: linePoints(lines.lc, tmin, tg ?? lines.lc.xmax) });
  if (lines.scl) series.push({ name: 'supercooled liquid', role: 'line', points: linePoints(lines.scl, Math.min(tf ?? lines.scl.xmin, tg ?? lines.scl.xmin, lines.scl.xmin), tmax) });
  if (lines.vd) series.push({ name: 'as deposited', role: 'line', points: linePoints(lines.vd, Math.min(tmin, tf ?? tmin), Math.max(on ?? lines.vd.xmax, lines.vd.xmax)) });
  if (lines.transformation) series.push({ name: 'transformation', role: 'tangent', points: linePoints(lines.transformation, (on ?? lines.transformation.xmin) - 1, lines.transformation.xmax + 1) });
  const markers = [
    ...(tg !== undefined ? [{ label: `Tg ${tg.toFixed(1)} K`, x: tg }] : []),
    ...(on !== undefined ? [{ label: `Tonset ${on.toFixed(1)} K`, x: on }] : []),
    ...(tf !== undefined ? [{ label: `Tf ${tf.toFixed(1)} K`, x: tf }] : []),
  ];
  return { xTitle: 'T / K', yTitle, series, markers };
}

/** Evaporation during holds and abrupt drops. */
function scanChecks(block: ParsedBlock, c: Curve, time: Float64Array | null, segments: readonly Segment[], note: (m: Message, span: Span) => void): void {
  const drop = firstAbruptDrop(c.h);
  if (drop.index >= 0) note(messages.rampAbruptDrop(drop.drop), block.rowSpan(drop.index));
  if (!time) return;
  const tgRef = block.quantities.get('/reference_temperature')?.value;
  for (const s of segments) {
    if (s.direction !== 'isothermal' || s.end - s.start < 8) continue;
    const f = fitLine(time, c.h, s.start, s.end);
    const hot = tgRef === undefined || c.T[s.start] > tgRef;
    if (f && hot && f.slope < 0 && Math.abs(f.slope) > 4 * Math.sqrt(f.varSlope) && Math.abs(f.slope) * 60 > 1e-3) {
      note(messages.rampEvaporation(-f.slope * 60), block.rowSpan(s.start));
    }
  }
}

/** 5 K from Tg, shrunk when a side would keep fewer than 5 points. */
function chooseGap(c: Curve, tg: number): number {
  for (const gap of [LINE_GAP, 3, 2, 1]) {
    let below = 0;
    let above = 0;
    for (const T of c.T) {
      if (T <= tg - gap) below++;
      if (T >= tg + gap) above++;
    }
    if (below >= 5 && above >= 5) return gap;
  }
  return 0;
}

function firstHeating(
  block: ParsedBlock,
  ctx: AnalysisContext,
  c: Curve,
  seg: Segment,
  lines: { vd?: LineFit; scl?: LineFit; lc?: LineFit; transformation?: LineFit },
  results: Record<string, ResultValue>,
  note: (m: Message, span: Span) => void,
  vdTrim: number,
): void {
  const m = c.T.length;
  const depositedW = window(block, 'deposited');
  let vdEnd = m; // exclusive index of the VD window in the heating segment
  let deviation = -1;
  let vd: LineFit | null;
  if (depositedW) {
    vd = fitWhere(c, (T) => T >= depositedW[0] && T <= depositedW[1]);
    vdEnd = 0;
    for (let i = 0; i < m; i++) if (c.T[i] <= depositedW[1]) vdEnd = i + 1;
    deviation = vdEnd < m ? vdEnd : -1;
  } else {
    let k = Math.min(Math.max(8, Math.floor(0.15 * m)), Math.floor(m / 2));
    vd = fitLine(c.T, c.h, 0, k);
    let run = 0;
    for (let i = k; i < m && vd; i++) {
      if (i >= 1.5 * k && run === 0) {
        k = i;
        vd = fitLine(c.T, c.h, 0, k) ?? vd;
      }
      const sigma = Math.max(Math.sqrt(vd.sigma2), 1e-9 * Math.abs(vd.c));
      const r = c.h[i] - predict(vd, c.T[i]);
      run = Math.abs(r) > 4 * sigma ? run + 1 : 0;
      if (run === 3) {
        deviation = i - 2;
        break;
      }
    }
    if (deviation >= 0) {
      vdEnd = deviation;
      while (vdEnd > 3 && c.T[vdEnd - 1] > c.T[deviation] - 2) vdEnd--;
      if (vdTrim > 0) {
        const limit = c.T[Math.max(0, vdEnd - 1)] - vdTrim;
        while (vdEnd > 3 && c.T[vdEnd - 1] > limit) vdEnd--;
      }
      vd = fitLine(c.T, c.h, 0, vdEnd) ?? vd;
    }
  }
  const rowOf = (i: number): Span => block.rowSpan(seg.start + i);
  if (!vd) return;
  lines.vd = vd;
  if (vd.n < 8) note(messages.rampFewLinePoints('as-deposited', vd.n), rowOf(0));
  if (deviation < 0) {
    note(messages.rampNoOnset(), rowOf(0));
    return;
  }

  // Supercooled-liquid line: from the cooling segment, else from the top of this heating.
  let scl = lines.scl ?? null;
  if (!scl) {
    const top = c.T[m - 1];
    const start = c.T[deviation];
    scl = fitWhere({ T: c.T.subarray(deviation), h: c.h.subarray(deviation) }, (T) => T >= top - 0.25 * (top - start));
    if (scl) lines.scl = scl;
  }
  if (!scl) return;
  if (scl.n < 8) note(messages.rampFewLinePoints('supercooled-liquid', scl.n), rowOf(m - 1));
  if (!(scl.slope > vd.slope)) {
    note(messages.rampSclNotSteeper(), rowOf(deviation));
    return;
  }

  // Transformation line through 0.2 ≤ x ≤ 0.8, from the first crossing of 0.2.
  const xs: number[] = [];
  const ys: number[] = [];
  for (const [lo, hi] of [
    [0.2, 0.8],
    [0.1, 0.9],
  ] as const) {
    xs.length = 0;
    ys.length = 0;
    let started = false;
    for (let i = vdEnd; i < m; i++) {
      const a = predict(vd, c.T[i]);
      const b = predict(scl, c.T[i]);
      const x = (c.h[i] - a) / (b - a);
      if (!started && x >= lo) started = true;
      if (!started) continue;
      if (x > hi) break;
      if (x >= lo) {
        xs.push(c.T[i]);
        ys.push(c.h[i]);
      }
    }
    if (xs.length >= 3) break;
  }
  // Densification before onset: the data fall clearly below the VD line before rising.
  {
    const sigma = Math.sqrt(vd.sigma2);
    let below = 0;
    for (let i = vdEnd; i < m; i++) {
      const r = c.h[i] - predict(vd, c.T[i]);
      if (r > 4 * sigma) break;
      if (r < -4 * sigma) below++;
    }
    if (below >= 3) note(messages.rampDensification(), rowOf(vdEnd));
  }
  // The supercooled liquid on heating against the cooling one.
  if (lines.scl && m > 10) {
    const top = c.T[m - 1];
    let sum = 0;
    let k = 0;
    for (let i = 0; i < m; i++) {
      if (c.T[i] >= top - 5 && c.T[i] >= lines.scl.xmin) {
        sum += c.h[i] - predict(lines.scl, c.T[i]);
        k++;
      }
    }
    const sigma = Math.sqrt(Math.max(lines.scl.sigma2, vd.sigma2));
    if (k >= 3 && Math.abs(sum / k) > 5 * sigma && Math.abs(sum / k) > 1e-3 * Math.abs(lines.scl.c)) note(messages.rampSclShift(sum / k), rowOf(m - 1));
  }

  // Deviation onset: the first of 3 consecutive points beyond 3σ of the VD line.
  {
    const sigma = Math.max(Math.sqrt(vd.sigma2), 1e-9 * Math.abs(vd.c));
    let run = 0;
    for (let i = 0; i < m; i++) {
      run = Math.abs(c.h[i] - predict(vd, c.T[i])) > 3 * sigma && c.T[i] > vd.xmin ? run + 1 : 0;
      if (run === 3 && i - 2 >= vdEnd - 1) {
        results.tonset_deviation = result(c.T[i - 2], 'K', 'first of 3 consecutive points more than 3σ from the as-deposited line (noise-sensitive; reported beside the extrapolated onset)');
        break;
      }
    }
  }

  const transformation = fitLine(xs, ys);
  if (transformation) {
    lines.transformation = transformation;
    const on = intersect(vd, transformation, t95);
    if (on) {
      results.tonset = result(on.x, 'K', 'extrapolated onset: as-deposited line ∩ line through 0.2 ≤ x ≤ 0.8, first heating', on.se);
      if (!on.slopesDiffer) note(messages.rampSlopesEqual('the onset'), rowOf(deviation));
    }
  }
  const tf = intersect(vd, scl, t95);
  if (tf) {
    results.tfictive = result(tf.x, 'K', 'as-deposited line ∩ supercooled-liquid line', tf.se);
    if (tf.x < vd.xmin - 20) note(messages.rampTfExtrapolated(tf.x, vd.xmin), rowOf(0));
    const agingNotes: Diagnostic[] = [];
    addAging(block, ctx, tf.x, results, agingNotes);
    for (const d of agingNotes) note(d, d.span);
  }

  // Density gained over the liquid-cooled glass.
  const lc = lines.lc;
  if (!lc) {
    note(messages.rampNoLcReference(), block.header.kindSpan);
    return;
  }
  const explicit = block.quantities.get('/reference_temperature');
  const tsub = filmOf(block, ctx)?.quantities.get('/substrate_temperature');
  const tref = explicit?.value ?? tsub?.value;
  if (tref === undefined) return;
  const hLc = predict(lc, tref);
  const hVd = predict(vd, tref);
  const ratio = hLc / hVd;
  const u = 100 * Math.abs(ratio) * Math.sqrt(predictVariance(lc, tref) / (hLc * hLc) + predictVariance(vd, tref) / (hVd * hVd));
  results.density_gain = result(100 * (ratio - 1), '%', `100·(h_LC/h_VD − 1) from the fitted lines at ${Number(tref.toPrecision(6))} K`, u);
  results.reference_temperature = result(tref, 'K', explicit ? 'reference_temperature as written' : `substrate temperature of ${String(block.metadata.data.film)}`);
}
