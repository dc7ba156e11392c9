/** What a block's chart shows: plain data that the chart presenters turn into a spec. */

/**
 * What a series or marker stands for, whatever its geometry. It picks the colour and marker shape
 * from the chart tokens, so that, for example, the liquid-cooled glass has the same colour in every
 * chart of a notebook.
 *
 * - `as-deposited`: the vapor-deposited glass (its first heating and its line).
 * - `supercooled-liquid`: the equilibrium liquid (its line, a liquid baseline).
 * - `liquid-cooled`: the reference glass made by cooling the liquid (cooling data and line).
 * - `fit`: a model fitted to the data (a VFT law, a three-segment fit).
 * - `construction`: lines and marks drawn to read a figure off (baselines, tangents, onset, Tf).
 * - `reference-line`: a line of reference (Tf = Tsub, Tf = Tg, the liquid's own h/h_liquid = 1).
 * - `data`: measured points with no further meaning.
 */
export type ChartRole = 'as-deposited' | 'supercooled-liquid' | 'liquid-cooled' | 'fit' | 'construction' | 'reference-line' | 'data';

/** What a chart of a block shows, in the units of the results: data, fitted lines, markers. */
export interface FigureSeries {
  readonly name: string;
  /** 'data' points, a fitted 'line', a 'baseline' or 'tangent' construction, an 'area' (x, y, y2). */
  readonly role: 'data' | 'line' | 'baseline' | 'tangent' | 'area';
  readonly points: ReadonlyArray<readonly number[]>;
  /** What the series stands for (its colour and marker shape); without it, 'data' for points and 'fit' for lines. */
  readonly meaning?: ChartRole;
}

export interface FigureMarker {
  readonly label: string;
  readonly x: number;
  /** What the marker stands for; a 'construction' (onset, Tf, Tg) without it. */
  readonly meaning?: ChartRole;
}

export interface FigureData {
  readonly xTitle: string;
  readonly yTitle: string;
  readonly series: readonly FigureSeries[];
  readonly markers: readonly FigureMarker[];
  /**
   * Calorimetry only: the direction in which an endotherm goes on the y axis ('up' for heat
   * capacity and for heat flow with endotherms positive). Charts draw "endo ↑" or "endo ↓".
   */
  readonly endotherm?: 'up' | 'down';
  /**
   * Ramps only: what the y axis measures, from the role of the table's column (film thickness
   * from an ellipsometer, or specific volume from a dilatometer). Absent means thickness.
   */
  readonly measured?: 'thickness' | 'volume';
}
