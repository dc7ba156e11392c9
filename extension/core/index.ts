/** The public API of the Vitrine core. Hosts import from here only. */
export { Notebook, type BlockReport, type FileReport, type NotebookReport, type NotebookOptions } from './notebook/notebook.js';
export { InMemoryHost, type NotebookHost, type DataFileRead } from './host.js';
export { toJsonReport, formatDiagnosticLine, type JsonReport, type JsonDiagnostic } from './results/reportJson.js';
export { summarise, type FilmSummary } from './results/summary.js';
export type { Diagnostic, Severity, SeverityOverrides } from './diagnostics/diagnostic.js';
export type { ResultValue, Results } from './results/result.js';
export { scanFencedBlocks, type FencedBlock } from './scan/fenceScanner.js';
export { LineIndex, stripBom, toOneBased, type Span, type Position } from './text/positions.js';
export { BLOCK_KINDS, type BlockKind } from './scan/blockHeader.js';
export { MAX_DATA_FILE_BYTES } from './notebook/parseBlock.js';
export { figureSpec, type VegaLiteSpec } from './charts/figureSpec.js';
export { stabilityMapSpecs } from './charts/mapSpecs.js';
export { toVega } from './charts/compile.js';
export { themeConfig, PALETTE, type Theme } from './charts/theme.js';
export type { FigureData } from './analysis/context.js';
export { buildHtmlReport, type ReportInput } from './report/htmlReport.js';
export { summaryCsv } from './report/summaryCsv.js';
export { escapeHtml } from './report/escape.js';
