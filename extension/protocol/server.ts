/**
 * The messages between the language server and its clients beyond LSP itself: types only, the
 * one home of every shape. Positions are LSP's (0-based line and UTF-16 character).
 */

/** A figure as presenters show it: label and text from the results catalogue. */
export interface FigureRow {
  readonly name: string;
  /** As practitioners write it: `Tg`, `Tf`, `Δρ/ρ`. */
  readonly label: string;
  /** Value with its uncertainty and unit, rounded by the catalogue's rule: `314.2 ± 0.3 K`. */
  readonly text: string;
  readonly method: string;
  readonly meaning: string;
}

export interface BlockDiagnosticRow {
  readonly severity: 'error' | 'warning' | 'info';
  readonly code: string;
  readonly message: string;
  /** 0-based line in the notebook file. */
  readonly line: number;
}

export interface BlockChart {
  readonly kind: string;
  readonly id: string | null;
  /** 0-based line of the opening fence. */
  readonly line: number;
  /** 0-based line of the closing fence (or the last line of the block). */
  readonly endLine: number;
  readonly title: string;
  /** The compiled Vega spec, or null when the block has nothing to draw. */
  readonly vega: unknown;
  /** The chart drawn as SVG, when asked for (`svg: true`) and the block has one. */
  readonly svg?: string | null;
  readonly figures: readonly FigureRow[];
  readonly diagnostics: readonly BlockDiagnosticRow[];
}

/** `vitrine/charts`: the charts of a notebook file, or of the block at a line. */
export interface ChartsParams {
  readonly uri: string;
  /** Only the block that holds this 0-based line. */
  readonly line?: number;
  readonly theme: 'light' | 'dark';
  /** Also draw each chart as SVG (for views that run no script, such as the markdown preview). */
  readonly svg?: boolean;
}

export interface ChartsResult {
  readonly uri: string;
  /** The document version the charts were computed from (null for a file read from disk). */
  readonly version: number | null;
  readonly blocks: readonly BlockChart[];
}

export interface SummaryCell {
  readonly column: string;
  readonly text: string;
}

/** `vitrine/summary`: every film of every notebook of the workspace, and the stability maps. */
export interface SummaryParams {
  readonly theme: 'light' | 'dark';
}

export interface SummaryResult {
  readonly columns: readonly string[];
  readonly rows: ReadonlyArray<{ readonly film: string; readonly uri: string; readonly line: number; readonly cells: readonly string[] }>;
  readonly maps: ReadonlyArray<{ readonly title: string; readonly vega: unknown }>;
}

/** `vitrine/resultsChanged` (server → client): the figures of these notebook files changed. */
export interface ResultsChangedParams {
  readonly uris: readonly string[];
}

/** Argument of the `vitrine.showChart` command that a code lens carries. */
export interface ShowChartArgs {
  readonly uri: string;
  readonly line: number;
}

/** Every custom method, with its parameter and result types. */
export interface ServerRequests {
  'vitrine/charts': { params: ChartsParams; result: ChartsResult };
  'vitrine/summary': { params: SummaryParams; result: SummaryResult };
}

export interface ServerNotifications {
  'vitrine/resultsChanged': ResultsChangedParams;
}

/** The settings the server reads under `vitrine.` */
export interface VitrineSettings {
  readonly diagnostics: {
    /** `onType` (default): while typing, debounced; `onSave`: only when a file is saved. */
    readonly run: 'onType' | 'onSave';
    /** A diagnostic code mapped to a new severity, or `off`. */
    readonly severity: Readonly<Record<string, 'error' | 'warning' | 'info' | 'off'>>;
  };
}
