/**
 * The engine's public API: notebooks in, plain reports out. Hosts (CLI, language server, tests)
 * import from here; charts and the HTML report have their own entry points
 * (`charts/index.ts`, `report/index.ts`), so that the engine alone carries no chart library.
 */
export { Notebook, type AnalyzeOptions, type BlockLocation, type BlockReference, type CancellationToken, type MetadataEntry, type NotebookOptions } from './engine/notebook.js';
export { InMemoryHost, MAX_NOTEBOOK_FILE_BYTES, NO_FILES, type NotebookFileFailure, type NotebookHost, type DataFileRead } from './engine/host.js';
export { MAX_DATA_FILE_BYTES, type DataFileFailure } from './engine/dataFiles.js';
export { toJsonReport, toLazyJsonReport, JsonList, formatDiagnosticLine, type JsonReport, type JsonDiagnostic, type LazyJsonFile } from './engine/jsonReport.js';
export { summarise, type FilmSummary } from './engine/summary.js';
export { SUMMARY_TABLE_COLUMNS, summaryCell, isNumeric, type SummaryColumn } from './engine/summaryColumns.js';
export { RESULT_CATALOGUE, RESULT_NAMES, catalogueEntry, type CatalogueEntry, type NumberFormat, type Notation, type ResultName } from './model/catalogue.js';
export { formatValue, formatUncertainty, formatMeasurement, formatQuantity, formatCsvNumber, formatInterval, unitText, resultText, resultValueText, resultUncertaintyText, resultIntervalText } from './model/formatResult.js';
export { countDiagnostics, type SeverityCounts } from './engine/counts.js';
export type { BlockReport, FileReport, NotebookReport, TableExcerpt } from './model/report.js';
export type { Diagnostic, Fix, RelatedLocation, Severity, SeverityOverrides } from './model/diagnostic.js';
export type { ResultValue, Results, UncertaintyTerm } from './model/result.js';
export type { FigureData, FigureMarker, FigureSeries } from './model/figure.js';
export type { Quantity } from './model/quantity.js';
export type { Span, Position, PositionRange } from './model/span.js';
export { BLOCK_KINDS, ID_PATTERN, type BlockKind } from './model/blockKind.js';
export { DIAGNOSTIC_CODES, type DiagnosticCode } from './model/codes.js';
export { scanFencedBlocks, type FencedBlock } from './scan/fenceScanner.js';
export { blockKeys, requiredAlternatives, type BlockKey } from './schema/blockKeys.js';
export { LineIndex, stripBom, toOneBased, toOneBasedPoint, visibleSpan } from './text/positions.js';
