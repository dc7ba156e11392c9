/** The self-contained HTML report, the summary CSV (one row per film) and the long CSV (one row per figure). */
export { buildHtmlReport, type ChartDrawing, type ChartFailure, type ChartImage, type MapEntry, type ReportInput, type ReportRecord } from './htmlReport.js';
export { summaryCsv } from './summaryCsv.js';
export { longCsv } from './longCsv.js';
export { subjectsOf, subjectText, type BlockSubject } from './subject.js';
export { escapeHtml } from './escape.js';
