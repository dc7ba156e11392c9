/**
 * Charts of one material across a notebook:
 *
 * - `tsubSeriesSpec`: the first heating of each film of a substrate-temperature series, as
 *   h/h_liquid(T), the thickness over the supercooled-liquid line of the same ramp extrapolated to
 *   T. Dividing by the film's own liquid line takes out the film's thickness, so films of
 *   different thickness overlay; the as-deposited glass lies below 1 by its density gain and
 *   joins the liquid (1) when it transforms (the normalisation of Dalal & Ediger, J. Phys. Chem.
 *   Lett. 3, 1229 (2012), in the form h/h_SCL).
 * - `relaxationMapSpec`: log10 τ against 1000 K/T with the relaxation data, the VFT law (fitted
 *   to those data, and as stated on the material), the τα each isotherm of the material's films
 *   used, the line τ = 100 s and Tg there (the relaxation map of Angell, Science 267, 1924 (1995)).
 *
 * Both return a chart, or a note saying what is missing (see `MapChart`).
 */
import type { NotebookReport } from '../engine/notebook.js';
import type { FigureData, FigureSeries } from '../model/figure.js';
import type { BlockReport } from '../model/report.js';
import { extent } from '../numeric/extent.js';
import { seriesChartSpec } from './figureSpec.js';
import type { MapChart } from './pointMap.js';
import { chartLook, type ChartOptions, type Theme } from './theme.js';
import { filmBlockOf, tsubText } from './subject.js';
import { kelvin } from './titles.js';
import { tsubRampColour } from './tokens.js';

function allBlocks(report: NotebookReport): BlockReport[] {
  return report.files.flatMap((f) => f.blocks);
}

/** The straight line through the two end points of a fitted-line series, as h(T). */
function lineOf(s: FigureSeries | undefined): ((T: number) => number) | null {
  if (!s || s.points.length < 2) return null;
  const [a, b] = [s.points[0], s.points[s.points.length - 1]];
  if (a[0] === b[0]) return null;
  const slope = (b[1] - a[1]) / (b[0] - a[0]);
  return (T) => a[1] + slope * (T - a[0]);
}

/** Overlaid first heatings of the films of `material`, as h/h_liquid(T), coloured along a ramp in order of Tsub. */
export function tsubSeriesSpec(material: string, report: NotebookReport, options: ChartOptions | Theme = {}): MapChart {
  const look = chartLook(options);
  const name = `tsub-series-${material}`;
  const title = `${material}: first heatings of a Tsub series, over the supercooled-liquid line`;
  const blocks = allBlocks(report);
  const films = blocks.filter((b) => b.kind === 'deposition' && b.id !== null && b.metadata.material === material);
  const curves: Array<{ film: string; tsub: number; points: number[][] }> = [];
  for (const film of films) {
    const tsub = film.quantities['/substrate_temperature']?.value;
    if (tsub === undefined) continue;
    for (const r of blocks) {
      if (r.kind !== 'ramp' || !r.figure || filmBlockOf(r, report) !== film) continue;
      const liquid = lineOf(r.figure.series.find((s) => s.meaning === 'supercooled-liquid' || s.name === 'supercooled liquid'));
      const heating = r.figure.series.find((s) => s.role === 'data' && (s.meaning === 'as-deposited' || s.name === 'heating'));
      if (!liquid || !heating) continue;
      const points = heating.points.flatMap((p) => {
        const hl = liquid(p[0]);
        return hl > 0 && Number.isFinite(hl) ? [[p[0], p[1] / hl]] : [];
      });
      if (points.length > 0) {
        curves.push({ film: film.id ?? '', tsub, points });
        break;
      }
    }
  }
  if (curves.length < 2) return { name, title, note: `needs at least 2 films of ${material} with a heating ramp and a supercooled-liquid line (${curves.length} so far)` };
  curves.sort((a, b) => a.tsub - b.tsub || (a.film < b.film ? -1 : 1));
  // A sequential ramp by Tsub (not material or role colours: these are all as-deposited films).
  const colours = new Map<string, string>();
  const series: FigureSeries[] = curves.map((c, i) => {
    const label = `${c.film} · ${tsubText(c.tsub)}`;
    colours.set(label, tsubRampColour(i, curves.length, look.theme));
    return { name: label, role: 'data', meaning: 'as-deposited', points: c.points };
  });
  const [lo, hi] = xExtent(curves);
  series.push({ name: 'supercooled liquid (h = h_liquid)', role: 'line', meaning: 'reference-line', points: [[lo, 1], [hi, 1]] });
  const figure: FigureData = { xTitle: 'T / K', yTitle: 'h / h_liquid(T)', series, markers: [] };
  return { name, title, spec: seriesChartSpec(title, figure, look, undefined, (s) => colours.get(s.name)) };
}

interface Vft {
  readonly A: number;
  readonly B: number;
  readonly T0: number;
}

/** The VFT law a material block states, if complete. */
function statedVft(m: BlockReport | undefined): Vft | null {
  const v = m?.metadata.vft;
  const A = typeof v === 'object' && v !== null ? (v as Record<string, unknown>).log10_tau0 : undefined;
  const B = m?.quantities['/vft/B']?.value;
  const T0 = m?.quantities['/vft/T0']?.value;
  return typeof A === 'number' && Number.isFinite(A) && B !== undefined && B > 0 && T0 !== undefined ? { A, B, T0 } : null;
}

/** log10 τ against 1000 K/T for `material`: relaxation data, VFT laws, isotherms' τα, τ = 100 s. */
export function relaxationMapSpec(material: string, report: NotebookReport, options: ChartOptions | Theme = {}): MapChart {
  const look = chartLook(options);
  const name = `relaxation-map-${material}`;
  const title = `${material}: relaxation map`;
  const blocks = allBlocks(report);
  const stated = statedVft(blocks.find((b) => b.kind === 'material' && b.id === material));
  const series: FigureSeries[] = [];
  const temperatures: number[] = [];
  let fitted: Vft | null = null;
  for (const r of blocks) {
    if (r.kind !== 'relaxation' || r.metadata.material !== material || !r.figure) continue;
    const label = r.id ?? 'relaxation';
    for (const s of r.figure.series) {
      if (s.role === 'data') series.push({ name: `${label}: data`, role: 'data', meaning: 'data', points: s.points });
      else if (s.role === 'line') series.push({ name: `${label}: VFT fit`, role: 'line', meaning: 'fit', points: s.points });
      for (const p of s.points) if (p[0] > 0) temperatures.push(1000 / p[0]);
    }
    const res = r.results;
    if (!fitted && res.vft_log10_tau0 && res.vft_B && res.vft_T0) fitted = { A: res.vft_log10_tau0.value, B: res.vft_B.value, T0: res.vft_T0.value };
  }
  // The τα each isotherm of the material's films took, at its hold temperature.
  const filmsOf = new Set(blocks.filter((b) => b.kind === 'deposition' && b.id !== null && b.metadata.material === material).map((b) => b.id));
  const holds: number[][] = [];
  for (const b of blocks) {
    const T = b.quantities['/temperature']?.value;
    const tau = b.results.tau_alpha?.value;
    if (b.kind !== 'isotherm' || !filmsOf.has(b.metadata.film as string) || T === undefined || !(T > 0) || tau === undefined || !(tau > 0)) continue;
    holds.push([1000 / T, Math.log10(tau)]);
    temperatures.push(T);
  }
  const law = stated ?? fitted;
  if (series.length === 0 && !stated) return { name, title, note: `needs relaxation data or a stated VFT law for ${material}` };
  const markers: Array<{ label: string; x: number }> = [];
  if (law && law.A < 2) {
    const tg = law.T0 + law.B / (2 - law.A);
    temperatures.push(tg);
    if (stated) {
      // The stated law over the temperatures shown, from a little below Tg to above the data.
      const [tmin, tmax] = extent(temperatures);
      const lo = Math.max(law.T0 + 1, tmin - 5);
      const hi = tmax + 5;
      const points: number[][] = [];
      for (let k = 0; k <= 60; k++) {
        const T = hi - ((hi - lo) * k) / 60;
        points.push([1000 / T, law.A + law.B / (T - law.T0)]);
      }
      series.push({ name: 'VFT law stated for the material', role: 'line', meaning: fitted ? 'reference-line' : 'fit', points });
    }
    markers.push({ label: `Tg(100 s) ${kelvin(tg)}`, x: 1000 / tg });
  }
  if (holds.length > 0) series.push({ name: 'τα at the isotherm holds', role: 'data', meaning: 'supercooled-liquid', points: holds });
  const [xlo, xhi] = xExtent(series);
  if (Number.isFinite(xlo) && xhi > xlo) series.push({ name: 'τ = 100 s', role: 'line', meaning: 'reference-line', points: [[xlo, 2], [xhi, 2]] });
  const figure: FigureData = { xTitle: '1000 K / T', yTitle: 'log10(τ / s)', series, markers };
  return { name, title, spec: seriesChartSpec(title, figure, look) };
}

/** The smallest and largest x of the points of every curve (±Infinity when there are none). */
function xExtent(curves: ReadonlyArray<{ readonly points: ReadonlyArray<readonly number[]> }>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of curves) {
    for (const p of c.points) {
      lo = Math.min(lo, p[0]);
      hi = Math.max(hi, p[0]);
    }
  }
  return [lo, hi];
}
