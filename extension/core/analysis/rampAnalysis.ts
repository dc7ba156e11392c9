/**
 * Ramp analysis: thickness (or specific volume) against temperature.
 *
 * 1. Exact repeats of a row are left out (a warning says so), the scan is split into heating,
 *    cooling and isothermal segments (segments.ts).
 * 2. Tg, α_g and α_l from the longest cooling segment (coolingTg.ts): the hinge fit (Method A)
 *    where the data are two straight lines, two windows iterated from the fragility-based gap
 *    (Method B) where the transition is broad, or the windows written in `windows:`.
 * 3. When the scan starts with heating, that segment is the first heating of the as-deposited
 *    film: the as-deposited (VD) line is fitted from the start until the data leave it (3
 *    consecutive points beyond 4σ), then ended below the extrapolated onset by the width of the
 *    transformation and refitted, or fitted over `windows.deposited`; the supercooled-liquid
 *    (SCL) and liquid-cooled (LC) lines are those of the cooling construction. Then
 *    - `tonset`: the VD line meets the line through the points with 0.2 ≤ x ≤ 0.8, where
 *      x = (h − ĥ_VD)/(ĥ_SCL − ĥ_VD) (the thickness analogue of the extrapolated onset);
 *    - `tfictive`: the VD line meets the SCL line (Kearns et al., J. Phys. Chem. B 112, 4934 (2008));
 *    - `density_gain`: 100·(ĥ_LC/ĥ_VD − 1) at the reference temperature (default the film's
 *      substrate temperature), since ρ ∝ 1/h at fixed area and mass (Dalal & Ediger,
 *      J. Phys. Chem. Lett. 3, 1229 (2012)).
 * 4. Every figure carries an uncertainty budget (GUM, JCGM 100:2008): the statistical term of its
 *    fit (delta method for intersections), the window term (the figure recomputed with the gap
 *    scaled by 1.5 and by 0.7, the as-deposited window ended 5 K lower and 5 K trimmed from both
 *    ends of the cooling segment; the largest change taken as the half-width of a rectangular
 *    distribution, /√3), and for temperatures the calibration of the stage thermometer
 *    (`temperature_calibration`, default 0.5 K standard uncertainty).
 *
 * Policy: any missing piece gives a diagnostic and no result for that figure; the other figures
 * are still computed. "No transition detected" is reported, not thrown.
 */
import { at, type Diagnostic, type Message } from '../model/diagnostic.js';
import { messages } from '../model/messages.js';
import type { ParsedBlock } from '../block/parseBlock.js';
import { t95 } from '../numeric/distributions.js';
import { firstAbruptDrop } from '../numeric/abruptDrop.js';
import { fitLine, fitLineWhere, intersect, predict, predictVariance, type LineFit } from '../numeric/lineFit.js';
import { budgeted, type ResultValue, type UncertaintyTerm } from '../model/result.js';
import type { Span } from '../text/positions.js';
import { linePoints, thinIndices } from '../numeric/thin.js';
import type { Analysis, AnalysisContext } from './context.js';
import type { FigureData, FigureSeries } from '../model/figure.js';
import { addAging } from './agingTime.js';
import { filmOf, materialOf, metadataWindow as window } from './blockLinks.js';
import { materialVft, statedTg } from './materialAnalysis.js';
import { vftFragility } from './vft.js';
import { segmentScan, type Segment } from './segments.js';
import { coolingTg, type CoolingFailure, type CoolingFigures, type CoolingMemo } from './coolingTg.js';
import { substrateTemperatureOf } from './substrateTemperature.js';

/** Rows below which no figure can be computed: the first heating needs 10, Tg 8 on each side of it. */
const MIN_RAMP_ROWS = 10;

/** Standard uncertainty of the stage thermometer when `temperature_calibration` is not written, K. */
export const DEFAULT_TEMPERATURE_CALIBRATION = 0.5;

/** How far outside the measured glass lines a density gain may be evaluated, K. */
const DENSITY_EXTRAPOLATION_LIMIT = 20;

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

// The loops over a ramp's rows live in small functions of their own: the large function that
// calls them is compiled to fast code late in a run, and until then its own loops run slowly.

/** How many temperatures lie in [lo, hi]. */
function countInRange(T: Float64Array, lo: number, hi: number): number {
  let n = 0;
  for (let i = 0; i < T.length; i++) if (T[i] >= lo && T[i] <= hi) n++;
  return n;
}

/** The first row whose value is not positive, or −1. */
function firstNotPositive(v: Float64Array): number {
  for (let i = 0; i < v.length; i++) if (!(v[i] > 0)) return i;
  return -1;
}

/** The points of a curve whose temperature lies in [lo, hi], in order. */
function pointsInRange(c: Curve, lo: number, hi: number): Curve {
  const T = new Float64Array(c.T.length);
  const h = new Float64Array(c.T.length);
  let m = 0;
  for (let i = 0; i < c.T.length; i++) {
    if (c.T[i] >= lo && c.T[i] <= hi) {
      T[m] = c.T[i];
      h[m++] = c.h[i];
    }
  }
  return { T: T.subarray(0, m), h: h.subarray(0, m) };
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
  /** Scale of the gap between the lines and Tg (default 1). */
  readonly gapScale?: number;
  /** Move the end of the automatic as-deposited window this many kelvin lower. */
  readonly vdTrim?: number;
  /** Leave out this many kelvin at both ends of the cooling segment. */
  readonly coolTrim?: number;
  /** Only the figures are wanted (a sensitivity variant): no scan checks, no chart. */
  readonly figuresOnly?: boolean;
}

const VARIANTS: readonly RampChoices[] = [
  { gapScale: 1.5, figuresOnly: true },
  { gapScale: 0.7, figuresOnly: true },
  { vdTrim: 5, figuresOnly: true },
  { coolTrim: 5, figuresOnly: true },
];

/**
 * Work the nominal analysis shares with its window variants (same block, same data): the rows
 * kept and the segments, and the cooling construction by cooling trim and gap scale; the hinge
 * stage of a cooling stretch is shared by the gap variants, which only move the windows.
 */
interface RampMemo {
  prepared?: { readonly curve: Curve; readonly time: Float64Array | null; readonly rows: Int32Array | null; readonly dropped: number; readonly firstDropped: number; readonly segments: readonly Segment[] };
  readonly cooling: Map<string, CoolingFigures | CoolingFailure>;
  /** Rows of the lowest and the highest temperature of the cooling segment. */
  extremes?: { readonly lowest: number; readonly highest: number };
  readonly stages: Map<number, CoolingMemo>;
}

/** The figures whose window sensitivity enters their budget. */
const SENSITIVE = ['tg', 'alpha_glass', 'alpha_liquid', 'tonset', 'tfictive', 'density_gain'] as const;

/**
 * The ramp analysis, with each figure's budget completed by its window term: the figure is
 * recomputed under each variant of the analysis's own choices; each change less the part the
 * noise explains (nested fits: the variance of the difference is that of the less efficient fit
 * minus that of the more efficient one, Hausman, Econometrica 46, 1251 (1978)), and the largest
 * is taken as the half-width of a rectangular distribution (GUM §4.3.7), u = a/√3.
 */
export function analyzeRamp(block: ParsedBlock, ctx: AnalysisContext): Analysis {
  const memo: RampMemo = { cooling: new Map(), stages: new Map() };
  const nominal = rampDetails(block, ctx, {}, memo).analysis;
  const names = SENSITIVE.filter((n) => nominal.results[n]);
  if (names.length === 0) return nominal;
  const spread = new Map<string, number>();
  for (const choice of VARIANTS) {
    ctx.checkCancelled();
    const r = rampDetails(block, ctx, choice, memo).analysis.results;
    for (const n of names) {
      const v = r[n];
      if (v === undefined) continue;
      const u0 = statistical(nominal.results[n]);
      const u1 = statistical(v);
      const change = Math.sqrt(Math.max(0, (v.value - nominal.results[n].value) ** 2 - Math.abs(u1 * u1 - u0 * u0)));
      spread.set(n, Math.max(spread.get(n) ?? 0, change));
    }
  }
  const results: Record<string, ResultValue> = { ...nominal.results };
  for (const n of names) {
    const r = results[n];
    const a = spread.get(n) ?? 0;
    const term: UncertaintyTerm = { source: 'window', value: a / Math.sqrt(3), note: `largest change over ${VARIANTS.length} window variants (gap ×1.5 and ×0.7, as-deposited window 5 K shorter, cooling span trimmed 5 K at both ends) beyond their noise, ${fmtTerm(a, r.unit)}, /√3` };
    results[n] = withTerm(r, term);
  }
  return { ...nominal, results };
}

/** The statistical term of a figure's budget (0 when it has none). */
function statistical(r: ResultValue): number {
  return r.budget?.find((t) => t.source === 'statistical')?.value ?? 0;
}

function fmtTerm(value: number, unit: string): string {
  return `${Number(value.toPrecision(2))}${unit === '1' ? '' : ` ${unit}`}`;
}

/** The figure with one more budget term, and its 95 % interval widened to ±2u (GUM §6.3, k = 2). */
function withTerm(r: ResultValue, term: UncertaintyTerm): ResultValue {
  const terms = [...(r.budget ?? []), term];
  const b = budgeted(r.value, r.unit, r.method, terms);
  const u = b.uncertainty;
  return u !== undefined && r.interval ? { ...b, interval: [r.value - 2 * u, r.value + 2 * u] } : b;
}

/** The material's fragility, from its stated VFT law or its relaxation data. */
function fragilityOf(block: ParsedBlock, ctx: AnalysisContext): number | null {
  const material = materialOf(block, ctx);
  const vft = material ? materialVft(material, ctx) : null;
  const m = vft ? vftFragility(vft.p) : NaN;
  return Number.isFinite(m) && m > 0 ? m : null;
}

/** The analysis and the fitted lines (the charts draw them). */
export function rampDetails(block: ParsedBlock, ctx: AnalysisContext, choices: RampChoices = {}, memo?: RampMemo): { analysis: Analysis; lines: RampLines } {
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
  const what = hcol.role === 'volume' ? 'specific volume' : 'thickness';
  // (A variant runs only after the nominal analysis found every thickness positive.)
  const hv = hcol.values;
  const bad = memo?.prepared !== undefined ? -1 : firstNotPositive(hv);
  if (bad >= 0) {
    note(messages.rampThicknessNotPositive(hv[bad], what), block.rowSpan(bad));
    return empty;
  }
  const nominal = block.quantities.get('/rate')?.value ?? null;
  const prepared = memo?.prepared ?? prepare(Tcol.values, hcol.values, table.byRole.get('time')?.values ?? null, nominal);
  if (memo) memo.prepared = prepared;
  const { curve, time, rows, segments } = prepared;
  if (prepared.dropped > 0 && !choices.figuresOnly) note(messages.rampDuplicateRows(prepared.dropped), block.rowSpan(prepared.firstDropped));
  const rowSpan = (i: number): Span => block.rowSpan(rows ? rows[i] : i);
  const lines: { -readonly [K in keyof RampLines]: RampLines[K] } = { segments };

  if (segments.every((s) => s.direction === 'isothermal')) {
    note(messages.rampNoTemperatureChange(), rowSpan(0));
    return { analysis: { results, diagnostics }, lines };
  }
  const calibration = block.quantities.get('/temperature_calibration');
  const uCal = calibration ? Math.abs(calibration.value) : DEFAULT_TEMPERATURE_CALIBRATION;
  const calTerm: UncertaintyTerm = {
    source: 'calibration',
    value: uCal,
    note: calibration ? `stage thermometer, temperature_calibration as written` : `stage thermometer, ${DEFAULT_TEMPERATURE_CALIBRATION} K assumed (write temperature_calibration to change it)`,
  };

  const backSteps = time ? [] : segments.filter((s) => s.backStep !== undefined);
  if (backSteps.length > 0) note(messages.rampMixedDirection(backSteps[0].direction, backSteps.length), rowSpan(backSteps[0].backStep!));
  if (nominal) {
    const off = segments.find((s) => s.direction !== 'isothermal' && s.measuredRate !== undefined && Math.abs(Math.abs(s.measuredRate) - nominal) > 0.1 * nominal);
    if (off?.measuredRate !== undefined) note(messages.rampRateMismatch(Math.abs(off.measuredRate), nominal), block.spanOf('/rate'));
  }

  if (!choices.figuresOnly) scanChecks(block, curve, time, segments, note, rowSpan);
  if (!choices.figuresOnly) directionCheck(block, segments, note);

  // Tg from the longest clean cooling segment.
  const coolings = segments.filter((s) => s.direction === 'cooling' && (time || s.backStep === undefined));
  const cooling = coolings.sort((a, b) => b.end - b.start - (a.end - a.start))[0];
  const glassW = window(block, 'glass');
  const liquidW = window(block, 'liquid');
  const depositedW = window(block, 'deposited');
  if (emptyWindow(block, curve.T, 'glass', glassW, choices, note) || emptyWindow(block, curve.T, 'liquid', liquidW, choices, note) || emptyWindow(block, curve.T, 'deposited', depositedW, choices, note)) {
    return { analysis: { results, diagnostics }, lines };
  }
  if (!cooling) note(messages.rampNoCooling(), block.header.kindSpan);
  else coolingFigures({ block, ctx, choices, memo, curve, cooling, glassW, liquidW, rowSpan, note, nominal, calTerm }, results, lines);

  // First heating of the as-deposited film.
  const first = segments[0];
  if (first && first.direction === 'heating' && first.end - first.start >= 10) {
    const rowOf = (i: number): Span => rowSpan(first.start + i);
    firstHeating(block, ctx, slice(curve, first), depositedW, rowOf, lines, results, note, choices.vdTrim ?? 0, calTerm);
  }
  const quantity = hcol.role === 'volume' ? `V / (${hcol.unit})` : 'h / nm';
  if (choices.figuresOnly) return { analysis: { results, diagnostics }, lines };
  // Drawn only when a chart is asked for: `analyze --json` and `check` never build it.
  const figure = (): FigureData => {
    const f = rampFigure(curve, lines, results, quantity);
    return hcol.role === 'volume' ? { ...f, measured: 'volume' } : f;
  };
  return { analysis: { results, diagnostics, figure }, lines };
}

/** What the cooling Tg needs from the ramp's analysis. */
interface CoolingPart {
  readonly block: ParsedBlock;
  readonly ctx: AnalysisContext;
  readonly choices: RampChoices;
  readonly memo: RampMemo | undefined;
  readonly curve: Curve;
  /** The longest clean cooling segment. */
  readonly cooling: Segment;
  readonly glassW: readonly [number, number] | null;
  readonly liquidW: readonly [number, number] | null;
  readonly rowSpan: (i: number) => Span;
  readonly note: (m: Message, span: Span) => void;
  /** The rate as written, K/min. */
  readonly nominal: number | null;
  readonly calTerm: UncertaintyTerm;
}

/**
 * Tg and the expansivities of the glass and the liquid from the cooling segment, into `results`
 * and `lines`. (A function of its own: V8 compiles a large function late, and slowly.)
 */
function coolingFigures(part: CoolingPart, results: Record<string, ResultValue>, lines: { -readonly [K in keyof RampLines]: RampLines[K] }): void {
  const { block, ctx, choices, memo, curve, cooling, glassW, liquidW, rowSpan, note, nominal, calTerm } = part;
  let c = slice(curve, cooling);
  const { lowest, highest } = (memo?.extremes ?? extremes(curve.T, cooling));
  if (memo) memo.extremes = { lowest, highest };
  if (choices.coolTrim) c = pointsInRange(c, curve.T[lowest] + choices.coolTrim, curve.T[highest] - choices.coolTrim);
  const variant = `${choices.coolTrim ?? 0}|${choices.gapScale ?? 1}`;
  // Looked up by every variant, also one that reuses a construction: the engine records each
  // lookup, and they are part of the inputs a results block keeps.
  const fragility = fragilityOf(block, ctx);
  let fig = memo?.cooling.get(variant);
  if (!fig) {
    let stage = memo?.stages.get(choices.coolTrim ?? 0);
    if (memo && !stage) memo.stages.set(choices.coolTrim ?? 0, (stage = {}));
    fig = coolingTg({ T: c.T, h: c.h, glassWindow: glassW, liquidWindow: liquidW, fragility, gapScale: choices.gapScale }, stage);
    memo?.cooling.set(variant, fig);
  }
  const place = (where: 'segment' | 'low' | 'high' | 'windows'): Span =>
    where === 'windows' ? block.spanOf('/windows') : rowSpan(where === 'low' ? lowest : where === 'high' ? highest : cooling.start);
  if (!fig.ok) {
    note(fig.message, place(fig.at));
  } else {
    for (const w of fig.warnings) note(w.message, place(w.at));
    const rateText = nominal ? ` at ${nominal} K/min` : '';
    const modelNote = 'hinge against the two-window construction, difference beyond its noise, /√3';
    results.tg = budgeted(
      fig.tg,
      'K',
      // (A variant's figures are compared, never shown: no method text for them.)
      choices.figuresOnly ? '' : `${fig.label()}; cooling segment${rateText}`,
      [{ source: 'statistical', value: fig.uTg, note: fig.construction === 'hinge' ? 'profile-likelihood interval / (2·t₀.₉₇₅)' : 'delta method at the intersection of the two lines' }, { source: 'model', value: fig.model.tg, note: modelNote }, calTerm],
      fig.interval,
    );
    const alpha = (slope: number, u: number, model: number, line: string): ResultValue =>
      budgeted(slope / fig.hAtTg, '1/K', choices.figuresOnly ? '' : `out-of-plane (supported film): slope of the ${line} line / h at Tg; ${fig.lineLabel()}`, [
        { source: 'statistical', value: u / fig.hAtTg, note: 'standard error of the slope / h at Tg' },
        { source: 'model', value: model / fig.hAtTg, note: modelNote },
      ]);
    results.alpha_glass = alpha(fig.slopeGlass, fig.uSlopeGlass, fig.model.slopeGlass, 'glass');
    results.alpha_liquid = alpha(fig.slopeLiquid, fig.uSlopeLiquid, fig.model.slopeLiquid, 'liquid');
    const material = materialOf(block, ctx);
    const ref = material ? statedTg(material) : null;
    if (ref && Math.abs(fig.tg - ref.value) > 10) note(messages.rampTgFar(fig.tg, ref.value, nominal ?? NaN), rowSpan(cooling.start));
    lines.lc = fig.lc ?? undefined;
    lines.scl = fig.scl ?? undefined;
  }
}

/** Does a window written in the metadata hold fewer than 3 points (said, unless for a variant)? */
function emptyWindow(block: ParsedBlock, T: Float64Array, name: 'glass' | 'liquid' | 'deposited', w: readonly [number, number] | null, choices: RampChoices, note: (m: Message, span: Span) => void): boolean {
  if (!w) return false;
  const n = countInRange(T, w[0], w[1]);
  if (n >= 3) return false;
  if (!choices.figuresOnly) note(messages.rampEmptyWindow(name, n, w[0], w[1]), block.spanOf(`/windows/${name}`));
  return true;
}

/** Does the scan run the way `direction` says? */
function directionCheck(block: ParsedBlock, segments: readonly Segment[], note: (m: Message, span: Span) => void): void {
  const stated = block.metadata.data.direction;
  if (typeof stated !== 'string') return;
  const has = (d: string): boolean => segments.some((s) => s.direction === d && s.end - s.start >= 5);
  const found = has('heating') && has('cooling') ? 'heating and cooling' : has('heating') ? 'heating only' : has('cooling') ? 'cooling only' : 'no temperature change';
  const ok = stated === 'cycle' ? has('heating') && has('cooling') : has(stated) && !has(stated === 'heating' ? 'cooling' : 'heating');
  if (!ok) note(messages.rampDirectionMismatch(stated, found), block.spanOf('/direction'));
}

/** Rows of the lowest and the highest temperature of a segment. */
function extremes(T: Float64Array, s: Segment): { lowest: number; highest: number } {
  let lowest = s.start;
  let highest = s.start;
  for (let i = s.start; i < s.end; i++) {
    const t = T[i];
    if (t < T[lowest]) lowest = i;
    if (t > T[highest]) highest = i;
  }
  return { lowest, highest };
}

/** The rows kept (exact repeats left out), as a curve, and the scan's segments. */
function prepare(T: Float64Array, h: Float64Array, timeCol: Float64Array | null, rate: number | null): NonNullable<RampMemo['prepared']> {
  const kept = keptRows(T, h, timeCol);
  const rows = kept.rows;
  const pick = (v: Float64Array): Float64Array => (rows ? Float64Array.from(rows, (r) => v[r]) : v);
  const curve: Curve = { T: pick(T), h: pick(h) };
  const time = timeCol ? pick(timeCol) : null;
  return { curve, time, rows, dropped: kept.dropped, firstDropped: kept.firstDropped, segments: segmentScan(curve.T, time, rate) };
}

/**
 * Rows kept after leaving out exact repeats: with a time column, a row whose (t, T, h) equals the
 * last kept row of the same time; without, a row equal to the row before it (a heating and a
 * cooling pass may read the same T and h). `rows` is null when nothing is left out.
 */
function keptRows(T: Float64Array, h: Float64Array, t: Float64Array | null): { rows: Int32Array | null; dropped: number; firstDropped: number } {
  const n = T.length;
  // Made at the first repeat: most scans have none.
  let keep: Int32Array | null = null;
  let m = 0;
  let firstDropped = -1;
  // The last kept row at each time: a repeat has the same time, so only that row is compared.
  const atTime = t ? new Map<number, number>() : null;
  for (let i = 0; i < n; i++) {
    let repeat: boolean;
    if (t && atTime) {
      const j = atTime.get(t[i]);
      repeat = j !== undefined && T[j] === T[i] && h[j] === h[i];
      if (!repeat) atTime.set(t[i], i);
    } else repeat = i > 0 && T[i] === T[i - 1] && h[i] === h[i - 1];
    if (repeat) {
      if (firstDropped < 0) {
        firstDropped = i;
        keep = new Int32Array(n);
        for (let k = 0; k < i; k++) keep[k] = k;
      }
    } else {
      if (keep) keep[m] = i;
      m++;
    }
  }
  return keep === null ? { rows: null, dropped: 0, firstDropped } : { rows: keep.slice(0, m), dropped: n - m, firstDropped };
}

/** The ramp chart: the scan by segment, the fitted lines, and Tg, Tonset, Tf marked. */
function rampFigure(curve: Curve, lines: RampLines, results: Record<string, ResultValue>, yTitle: string): FigureData {
  const series: FigureSeries[] = [];
  for (const dir of ['heating', 'cooling', 'isothermal'] as const) {
    const idx: number[] = [];
    for (const s of lines.segments) if (s.direction === dir) for (let i = s.start; i < s.end; i++) idx.push(i);
    if (idx.length === 0) continue;
    // The first heating is the as-deposited film's; cooling makes the liquid-cooled glass.
    const meaning = dir === 'heating' ? 'as-deposited' : dir === 'cooling' ? 'liquid-cooled' : 'data';
    series.push({ name: dir, role: 'data', meaning, points: thinIndices(idx.length).map((k) => [curve.T[idx[k]], curve.h[idx[k]]]) });
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
  if (lines.lc) series.push({ name: 'liquid-cooled glass', role: 'line', meaning: 'liquid-cooled', points: linePoints(lines.lc, tmin, tg ?? lines.lc.xmax) });
  if (lines.scl) series.push({ name: 'supercooled liquid', role: 'line', meaning: 'supercooled-liquid', points: linePoints(lines.scl, Math.min(tf ?? lines.scl.xmin, tg ?? lines.scl.xmin, lines.scl.xmin), tmax) });
  if (lines.vd) series.push({ name: 'as deposited', role: 'line', meaning: 'as-deposited', points: linePoints(lines.vd, Math.min(tmin, tf ?? tmin), Math.max(on ?? lines.vd.xmax, lines.vd.xmax)) });
  if (lines.transformation) series.push({ name: 'transformation', role: 'tangent', meaning: 'construction', points: linePoints(lines.transformation, (on ?? lines.transformation.xmin) - 1, lines.transformation.xmax + 1) });
  const markers = [
    ...(tg !== undefined ? [{ label: `Tg ${tg.toFixed(1)} K`, x: tg }] : []),
    ...(on !== undefined ? [{ label: `Tonset ${on.toFixed(1)} K`, x: on }] : []),
    ...(tf !== undefined ? [{ label: `Tf ${tf.toFixed(1)} K`, x: tf }] : []),
  ];
  return { xTitle: 'T / K', yTitle, series, markers };
}

/** Evaporation during holds and abrupt drops. */
function scanChecks(block: ParsedBlock, c: Curve, time: Float64Array | null, segments: readonly Segment[], note: (m: Message, span: Span) => void, rowSpan: (i: number) => Span): void {
  const drop = firstAbruptDrop(c.h);
  if (drop.index >= 0) note(messages.rampAbruptDrop(drop.drop), rowSpan(drop.index));
  if (!time) return;
  const tgRef = block.quantities.get('/reference_temperature')?.value;
  for (const s of segments) {
    if (s.direction !== 'isothermal' || s.end - s.start < 8) continue;
    const f = fitLine(time, c.h, s.start, s.end);
    const hot = tgRef === undefined || c.T[s.start] > tgRef;
    if (f && hot && f.slope < 0 && Math.abs(f.slope) > 4 * Math.sqrt(f.varSlope) && Math.abs(f.slope) * 60 > 1e-3) {
      note(messages.rampEvaporation(-f.slope * 60), rowSpan(s.start));
    }
  }
}

/** Points of the heating with 0.2 ≤ x ≤ 0.8 (else 0.1–0.9), from the first crossing of the lower bound. */
function transformationPoints(c: Curve, from: number, vd: LineFit, scl: LineFit): { T: number[]; h: number[] } {
  const xs: number[] = [];
  const ys: number[] = [];
  const m = c.T.length;
  for (const [lo, hi] of [
    [0.2, 0.8],
    [0.1, 0.9],
  ] as const) {
    xs.length = 0;
    ys.length = 0;
    let started = false;
    for (let i = from; i < m; i++) {
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
  return { T: xs, h: ys };
}

function firstHeating(
  block: ParsedBlock,
  ctx: AnalysisContext,
  c: Curve,
  depositedW: [number, number] | null,
  rowOf: (i: number) => Span,
  lines: { vd?: LineFit; scl?: LineFit; lc?: LineFit; transformation?: LineFit },
  results: Record<string, ResultValue>,
  note: (m: Message, span: Span) => void,
  vdTrim: number,
  calTerm: UncertaintyTerm,
): void {
  const m = c.T.length;
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
  if (!vd) return;
  lines.vd = vd;
  if (deviation < 0) {
    if (vd.n < 8) note(messages.rampFewLinePoints('as-deposited', vd.n), rowOf(0));
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
  let points = transformationPoints(c, vdEnd, vd, scl);
  let transformation = fitLine(points.T, points.h);
  // The as-deposited window ends below the onset by the width of the transformation (at least
  // 2 K), so that its first rounding does not bend the line; then everything is placed again.
  if (!depositedW && transformation) {
    const on = intersect(vd, transformation, t95);
    if (on) {
      const width = Math.max(2, transformation.xmax - transformation.xmin);
      let end = vdEnd;
      while (end > 8 && c.T[end - 1] > on.x - width - vdTrim) end--;
      if (end < vdEnd && end >= 8) {
        const refit = fitLine(c.T, c.h, 0, end);
        if (refit && scl.slope > refit.slope) {
          vd = refit;
          vdEnd = end;
          lines.vd = vd;
          points = transformationPoints(c, vdEnd, vd, scl);
          transformation = fitLine(points.T, points.h);
        }
      }
    }
  }
  if (vd.n < 8) note(messages.rampFewLinePoints('as-deposited', vd.n), rowOf(0));

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
        // Known to the row: the departure lies somewhere within the step before the first point
        // found, a rectangular distribution of that width (GUM, JCGM 100:2008, §4.3.7).
        const step = Math.abs(c.T[i - 2] - c.T[Math.max(0, i - 3)]);
        const resolution = { source: 'resolution', value: step / Math.sqrt(12), note: `one row step (${Number(step.toPrecision(3))} K) as a rectangular distribution, width/√12` };
        results.tonset_deviation = budgeted(c.T[i - 2], 'K', 'first of 3 consecutive points more than 3σ from the as-deposited line (noise-sensitive; reported beside the extrapolated onset)', [resolution, calTerm]);
        break;
      }
    }
  }

  // A transformation line through a handful of points estimates its own noise poorly: its
  // variance is at least that of the as-deposited line, measured on many more points.
  if (transformation && transformation.sigma2 < vd.sigma2 && transformation.sigma2 > 0) {
    const k = vd.sigma2 / transformation.sigma2;
    transformation = { ...transformation, sigma2: vd.sigma2, varC: transformation.varC * k, varSlope: transformation.varSlope * k };
  }
  const vdText = `as-deposited line ${Number(vd.xmin.toFixed(1))}–${Number(vd.xmax.toFixed(1))} K${depositedW ? ' (window as written)' : ''}`;
  if (transformation) {
    lines.transformation = transformation;
    const on = intersect(vd, transformation, t95);
    if (on && on.x < c.T[0]) {
      note(messages.rampOnsetOutsideData(on.x, c.T[0]), rowOf(0));
    } else if (on) {
      const tr = `${Number(transformation.xmin.toFixed(1))}–${Number(transformation.xmax.toFixed(1))} K`;
      results.tonset = budgeted(on.x, 'K', `extrapolated onset: ${vdText} ∩ line through 0.2 ≤ x ≤ 0.8 (${tr}), first heating`, [{ source: 'statistical', value: on.se, note: 'delta method at the intersection' }, calTerm]);
      if (!on.slopesDiffer) note(messages.rampSlopesEqual('the onset'), rowOf(deviation));
    }
  }
  const sclText = `supercooled-liquid line of the cooling ${Number(scl.xmin.toFixed(1))}–${Number(scl.xmax.toFixed(1))} K`;
  const tf = intersect(vd, scl, t95);
  if (tf) {
    results.tfictive = budgeted(tf.x, 'K', `${vdText} ∩ ${sclText}`, [{ source: 'statistical', value: tf.se, note: 'delta method at the intersection' }, calTerm]);
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
  const film = filmOf(block, ctx);
  // Resolved through the film's material when written as a multiple of Tg (substrateTemperature.ts).
  const substrate = film ? substrateTemperatureOf(film, ctx) : null;
  const tsub = substrate && substrate.source !== 'unresolved' ? substrate.quantity : undefined;
  const tref = explicit?.value ?? tsub?.value;
  if (tref === undefined) {
    // (A substrate temperature written as a multiple of an unknown Tg has its own error on the film.)
    if (!film) note(messages.rampNoReferenceTemperature('no-film', ''), block.header.kindSpan);
    else if (!substrate) note(messages.rampNoReferenceTemperature('no-substrate-temperature', film.id ?? 'the film'), block.spanOf('/film'));
    return;
  }
  const lo = Math.max(vd.xmin, lc.xmin);
  const hi = Math.min(vd.xmax, lc.xmax);
  if (tref < lo - DENSITY_EXTRAPOLATION_LIMIT || tref > hi + DENSITY_EXTRAPOLATION_LIMIT) {
    note(messages.rampDensityGainExtrapolated(tref, lo, hi), explicit ? block.spanOf('/reference_temperature') : block.header.kindSpan);
    return;
  }
  const hLc = predict(lc, tref);
  const hVd = predict(vd, tref);
  const ratio = hLc / hVd;
  const u = 100 * Math.abs(ratio) * Math.sqrt(predictVariance(lc, tref) / (hLc * hLc) + predictVariance(vd, tref) / (hVd * hVd));
  // d(gain)/dT at tref: a thermometer offset moves the lines against the reference temperature.
  const dGain = (100 * (lc.slope * hVd - hLc * vd.slope)) / (hVd * hVd);
  // The reference temperature's own uncertainty (written with it, or that of Tg when the film's
  // substrate temperature is a multiple of Tg) moves the point where the lines are compared.
  const uRef = (explicit ? explicit.uncertainty : tsub?.uncertainty) ?? 0;
  const refTerm: UncertaintyTerm[] =
    uRef > 0
      ? [
          {
            source: 'reference temperature',
            value: Math.abs(dGain) * uRef,
            note: `u(T_ref) = ${Number(uRef.toPrecision(2))} K (${explicit ? 'reference_temperature as written' : substrate?.source === 'tg' ? "from the material's Tg" : 'substrate temperature as written'}) × d(gain)/dT`,
          },
        ]
      : [];
  results.density_gain = budgeted(100 * (ratio - 1), '%', `100·(h_LC/h_VD − 1) at ${Number(tref.toPrecision(6))} K from the fitted lines (${vdText}; liquid-cooled line ${Number(lc.xmin.toFixed(1))}–${Number(lc.xmax.toFixed(1))} K)`, [
    { source: 'statistical', value: u, note: 'variances of the two fitted lines at the reference temperature' },
    { source: 'calibration', value: Math.abs(dGain) * calTerm.value, note: `${calTerm.note} × d(gain)/dT` },
    ...refTerm,
  ]);
  results.reference_temperature = budgeted(tref, 'K', explicit ? 'reference_temperature as written' : `substrate temperature of ${String(block.metadata.data.film)}`, []);
}
