/** What a block's chart shows: plain data that the chart presenters turn into a spec. */

/** What a chart of a block shows, in the units of the results: data, fitted lines, markers. */
export interface FigureSeries {
  readonly name: string;
  /** 'data' points, a fitted 'line', a 'baseline' or 'tangent' construction, an 'area' (x, y, y2). */
  readonly role: 'data' | 'line' | 'baseline' | 'tangent' | 'area';
  readonly points: ReadonlyArray<readonly number[]>;
}

export interface FigureMarker {
  readonly label: string;
  readonly x: number;
}

export interface FigureData {
  readonly xTitle: string;
  readonly yTitle: string;
  readonly series: readonly FigureSeries[];
  readonly markers: readonly FigureMarker[];
}
