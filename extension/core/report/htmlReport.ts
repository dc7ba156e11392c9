/**
 * The static HTML report: the notebook's files in reading order (top-level files first, then
 * each folder by path) with their prose rendered by unified
 * (remark → rehype → sanitize → stringify), each data block replaced by its chart, results table
 * and diagnostics, then the summary table and the stability maps. One self-contained file: no
 * scripts, no network. Everything taken from the notebook is escaped or sanitized; the only raw
 * markup inserted is Vitrine's own (and the SVG its renderer made).
 */
import rehypeSanitize from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import remarkParse from 'remark-parse';
import remarkRehype from 'remark-rehype';
import { unified } from 'unified';
import type { Code, Root, RootContent } from 'mdast';
import { catalogueEntry } from '../model/catalogue.js';
import { resultIntervalText, resultUncertaintyText, resultValueText, unitText } from '../model/formatResult.js';
import type { BlockReport, NotebookReport } from '../engine/notebook.js';
import type { FilmSummary } from '../engine/summary.js';
import { SUMMARY_TABLE_COLUMNS, isNumeric, summaryCell } from '../engine/summaryColumns.js';
import type { ResultValue } from '../model/result.js';
import { hashText } from '../text/hash.js';
import { LineIndex, toOneBasedPoint } from '../text/positions.js';
import { countDiagnostics } from '../engine/counts.js';
import { jsonDiagnostic } from '../engine/jsonReport.js';
import { escapeHtml } from './escape.js';

/** A chart that could not be drawn, and why in a few words: its card shows this instead. */
export interface ChartFailure {
  readonly failed: string;
}

export interface ReportInput {
  readonly title: string;
  readonly report: NotebookReport;
  /** SVG of each block's chart, or why it could not be drawn. */
  readonly charts: ReadonlyMap<BlockReport, string | ChartFailure>;
  readonly summary: readonly FilmSummary[];
  readonly maps: ReadonlyArray<{ readonly name: string; readonly svg: string } | { readonly name: string; readonly failed: string }>;
}

/** The short message that stands in for a chart that could not be drawn. */
function chartFailed(reason: string): string {
  return `<p class="chart-failed">This chart could not be drawn (${escapeHtml(reason)}). The figures and messages are not affected.</p>`;
}

const STYLE = `
:root { color-scheme: light dark; --fg: #1f2328; --muted: #59636e; --bg: #ffffff; --card: #f6f8fa; --line: #d0d7de; --err: #b42318; --warn: #9a6700; --info: #0969da; }
@media (prefers-color-scheme: dark) { :root { --fg: #e6edf3; --muted: #9198a1; --bg: #0d1117; --card: #161b22; --line: #30363d; --err: #ff7b72; --warn: #d29922; --info: #58a6ff; } }
body { font-family: "DejaVu Sans", Verdana, sans-serif; color: var(--fg); background: var(--bg); max-width: 1100px; margin: 2rem auto; padding: 0 1.5rem; line-height: 1.5; }
h1 { font-size: 1.7rem; } h2.file { border-top: 2px solid var(--line); padding-top: 1rem; margin-top: 2.5rem; font-size: 1.05rem; color: var(--muted); font-family: "DejaVu Sans Mono", monospace; }
section.block { background: var(--card); border: 1px solid var(--line); border-radius: 8px; padding: 0.8rem 1rem; margin: 1rem 0; }
section.block h3 { margin: 0 0 0.5rem; font-size: 1rem; font-family: "DejaVu Sans Mono", monospace; }
.chart { max-width: 700px; margin-bottom: 0.6rem; }
.chart svg { width: 100%; height: auto; background: #fff; border-radius: 4px; }
.chart-failed { color: var(--muted); font-style: italic; border-left: 3px solid var(--warn); padding-left: 0.5rem; }
table { border-collapse: collapse; font-size: 0.85rem; width: 100%; }
th, td { border-bottom: 1px solid var(--line); padding: 0.25rem 0.4rem; text-align: left; vertical-align: top; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.method { color: var(--muted); font-size: 0.78rem; }
ul.diagnostics { list-style: none; padding: 0; margin: 0.5rem 0 0; font-size: 0.82rem; }
ul.diagnostics li { margin: 0.2rem 0; padding-left: 0.5rem; border-left: 3px solid var(--line); }
li.error { border-color: var(--err) !important; } li.warning { border-color: var(--warn) !important; } li.info { border-color: var(--info) !important; }
.sev { font-weight: bold; } li.error .sev { color: var(--err); } li.warning .sev { color: var(--warn); } li.info .sev { color: var(--info); }
code.code { color: var(--muted); }
.maps { display: grid; grid-template-columns: repeat(auto-fit, minmax(320px, 1fr)); gap: 1rem; }
.maps svg { width: 100%; height: auto; background: #fff; border-radius: 4px; }
pre { background: var(--card); padding: 0.6rem; overflow-x: auto; }
footer { margin-top: 3rem; color: var(--muted); font-size: 0.8rem; }
`;

/** Each result under its label (the result name beside it), printed by the one formatter. */
function resultsTable(results: Readonly<Record<string, ResultValue>>): string {
  const entries = Object.entries(results);
  if (entries.length === 0) return '';
  const rows = entries
    .map(([name, r]) => {
      const entry = catalogueEntry(name);
      const label = entry ? `<span class="label" title="${escapeHtml(entry.meaning)}">${escapeHtml(entry.label)}</span> ` : '';
      const uText = resultUncertaintyText(name, r);
      const u = uText ? `± ${escapeHtml(uText)}` : '';
      const intervalText = resultIntervalText(name, r);
      const interval = intervalText ? `<br><span class="interval">${escapeHtml(intervalText)}</span>` : '';
      return `<tr><td>${label}<code>${escapeHtml(name)}</code></td><td class="num">${escapeHtml(resultValueText(name, r))}</td><td class="num">${u}</td><td>${escapeHtml(unitText(r.unit))}</td><td class="method">${escapeHtml(r.method)}${interval}</td></tr>`;
    })
    .join('');
  return `<table class="results"><thead><tr><th>result</th><th>value</th><th>u</th><th>unit</th><th>method</th></tr></thead><tbody>${rows}</tbody></table>`;
}

function blockHtml(block: BlockReport, lines: LineIndex, chartImage: string | ChartFailure | undefined): string {
  const svg = typeof chartImage === 'string' ? chartImage : undefined;
  const diags = block.diagnostics
    .map((d) => {
      const r = jsonDiagnostic(d, lines);
      return `<li class="${escapeHtml(d.severity)}"><span class="sev">${escapeHtml(d.severity)}</span> line ${r.line}: ${escapeHtml(d.message)} <code class="code">${escapeHtml(d.code)}</code></li>`;
    })
    .join('');
  const line = toOneBasedPoint(lines.positionAt(block.span.start)).line;
  const title = `<h3><span class="kind">${escapeHtml(block.kind)}</span> ${escapeHtml(block.id ?? '(no id)')} <small>line ${line}</small></h3>`;
  const chart = svg ? `<div class="chart">${svg}</div>` : chartImage && typeof chartImage !== 'string' ? chartFailed(chartImage.failed) : '';
  const side = `<div>${resultsTable(block.results)}${diags ? `<ul class="diagnostics">${diags}</ul>` : ''}</div>`;
  return `<section class="block${svg ? '' : ' nochart'}">${title}${chart}${side}</section>`;
}

function summaryHtml(rows: readonly FilmSummary[]): string {
  if (rows.length === 0) return '<p>No films (deposition blocks) yet.</p>';
  const columns = SUMMARY_TABLE_COLUMNS;
  const head = columns.map((c) => `<th title="${escapeHtml(c.meaning)}">${escapeHtml(c.header)}</th>`).join('');
  const body = rows.map((r) => `<tr>${columns.map((c) => `<td${isNumeric(c) ? ' class="num"' : ''}>${escapeHtml(summaryCell(c, r))}</td>`).join('')}</tr>`).join('');
  return `<table class="summary"><thead><tr>${head}</tr></thead><tbody>${body}</tbody></table>`;
}

/** Renders one markdown file, with its data blocks replaced by their sections. */
function fileHtml(file: NotebookReport['files'][number], charts: ReportInput['charts']): string {
  const nonce = hashText(file.text + file.path);
  const byStart = new Map(file.blocks.map((b) => [b.span.start, b]));
  const lines = new LineIndex(file.text);
  const inserts = new Map<string, string>();
  const processor = unified().use(remarkParse);
  const tree = processor.parse(file.text) as Root;
  const replace = (nodes: RootContent[]): void => {
    for (let i = 0; i < nodes.length; i++) {
      const node = nodes[i];
      if (node.type === 'code') {
        const start = (node as Code).position?.start.offset;
        const block = start !== undefined ? byStart.get(start) : undefined;
        if (block) {
          const token = `vitrineblock${nonce}n${inserts.size}`;
          inserts.set(token, blockHtml(block, lines, charts.get(block)));
          nodes[i] = { type: 'paragraph', children: [{ type: 'text', value: token }] };
          continue;
        }
      }
      if ('children' in node && Array.isArray(node.children)) replace(node.children as RootContent[]);
    }
  };
  replace(tree.children);
  const pipeline = unified().use(remarkRehype).use(rehypeSanitize).use(rehypeStringify);
  let html = pipeline.stringify(pipeline.runSync(tree));
  for (const [token, section] of inserts) html = html.split(`<p>${token}</p>`).join(section);
  // A block inside a list or quote may not sit in its own paragraph; replace any remaining token.
  for (const [token, section] of inserts) html = html.split(token).join(section);
  return html;
}

/** Files at the top of the notebook (materials, overviews) first, then folders, each by path. */
function readingOrder(a: { path: string }, b: { path: string }): number {
  const da = a.path.split('/').length;
  const db = b.path.split('/').length;
  return da - db || (a.path < b.path ? -1 : a.path > b.path ? 1 : 0);
}

export function buildHtmlReport(input: ReportInput): string {
  const files = [...input.report.files]
    .sort(readingOrder)
    .map((f) => {
      const fileDiags = f.diagnostics.map((d) => `<li class="${escapeHtml(d.severity)}"><span class="sev">${escapeHtml(d.severity)}</span> ${escapeHtml(d.message)} <code class="code">${escapeHtml(d.code)}</code></li>`).join('');
      return `<h2 class="file">${escapeHtml(f.path)}</h2>${fileDiags ? `<ul class="diagnostics">${fileDiags}</ul>` : ''}<article>${fileHtml(f, input.charts)}</article>`;
    })
    .join('\n');
  const maps = input.maps.map((m) => `<figure class="map" id="map-${escapeHtml(m.name)}">${'svg' in m ? m.svg : chartFailed(m.failed)}</figure>`).join('');
  const blockCount = input.report.files.reduce((n, f) => n + f.blocks.length, 0);
  const errors = countDiagnostics(input.report).error;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<title>${escapeHtml(input.title)}</title><style>${STYLE}</style></head>
<body><h1>${escapeHtml(input.title)}</h1>
<p>${input.report.files.length} files, ${blockCount} data blocks, ${errors} errors. Summary table and stability maps at the end.</p>
${files}
<h2 id="summary">Summary per film</h2>${summaryHtml(input.summary)}
${maps ? `<h2 id="maps">Stability maps</h2><div class="maps">${maps}</div>` : ''}
<footer>Written by Vitrine. Numbers are computed from the notebook's data with the methods named beside them; they do not replace the lab's own checks or safety rules.</footer>
</body></html>
`;
}
