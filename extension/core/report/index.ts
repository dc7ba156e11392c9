/** The self-contained HTML report and the summary CSV. */
export { buildHtmlReport, type ChartFailure, type ReportInput } from './htmlReport.js';
export { summaryCsv } from './summaryCsv.js';
export { escapeHtml } from './escape.js';
