/**
 * The one gate every analysis passes on its way out of the engine: a figure that is not a finite
 * number (an overflow of 1e300 × 1e300, a division by a subnormal 1e-320, a logarithm out of its
 * domain) is never reported. It is dropped, and a diagnostic on the block says which and why.
 * Uncertainties and intervals that are not finite are dropped from their figure; points and
 * markers of the chart that are not finite are left out of it.
 *
 * Policy: never throws; finite input passes unchanged (the same objects).
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import type { FigureData } from '../model/figure.js';
import { messages } from '../model/messages.js';
import type { ResultValue, Results } from '../model/result.js';
import type { Span } from '../text/positions.js';

function finiteValue(r: ResultValue): ResultValue {
  const badU = r.uncertainty !== undefined && !Number.isFinite(r.uncertainty);
  const badI = r.interval !== undefined && !r.interval.every(Number.isFinite);
  if (!badU && !badI) return r;
  const { uncertainty, interval, ...rest } = r;
  return { ...rest, ...(badU || uncertainty === undefined ? {} : { uncertainty }), ...(badI || interval === undefined ? {} : { interval }) };
}

/** The finite results, and a diagnostic (at `span`) for each one dropped. */
export function finiteResults(results: Results, span: Span): { results: Results; diagnostics: Diagnostic[] } {
  const diagnostics: Diagnostic[] = [];
  let out: Record<string, ResultValue> | null = null;
  for (const [name, r] of Object.entries(results)) {
    const value = r.value as unknown;
    const ok = typeof value === 'number' && Number.isFinite(value);
    const kept = ok ? finiteValue(r) : null;
    if (kept !== r) {
      out ??= { ...results };
      if (kept) out[name] = kept;
      else {
        delete out[name];
        diagnostics.push(at(messages.resultNotFinite(name, typeof value === 'number' ? value : NaN), span));
      }
    }
  }
  return { results: out ?? results, diagnostics };
}

/** The figure with its non-finite points and markers left out (the same object when there are none). */
export function finiteFigure(figure: FigureData): FigureData {
  const pointOk = (p: readonly number[]): boolean => p.every(Number.isFinite);
  const clean = figure.series.every((s) => s.points.every(pointOk)) && figure.markers.every((m) => Number.isFinite(m.x));
  if (clean) return figure;
  return {
    ...figure,
    series: figure.series.map((s) => (s.points.every(pointOk) ? s : { ...s, points: s.points.filter(pointOk) })),
    markers: figure.markers.filter((m) => Number.isFinite(m.x)),
  };
}
