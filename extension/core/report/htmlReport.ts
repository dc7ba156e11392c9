/**
 * The static HTML report, written as a lab record: a header band with the notebook's name, the
 * date, Vitrine's version and the notebook folder; the notebook's files in reading order
 * (top-level files first, then each folder by path) with their prose rendered by unified
 * (remark → rehype → sanitize → stringify), each data block replaced by its entry (blockCard.ts);
 * then the summary per film and the stability maps. One self-contained file: no scripts, no
 * network; the look comes from the design tokens (stylesheet.ts). Everything taken from the
 * notebook is escaped or sanitized; the only raw markup inserted is Vitrine's own (and the SVG
 * its renderer made).
 */
import rehypeSanitize from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import remarkParse from 'remark-parse';
import remarkRehype from 'remark-rehype';
import { unified } from 'unified';
import type { Code, Root, RootContent } from 'mdast';
import type { BlockReport, NotebookReport } from '../engine/notebook.js';
import type { FilmSummary } from '../engine/summary.js';
import { SUMMARY_TABLE_COLUMNS, celsiusText, isNumeric, summaryCell, type SummaryColumn } from '../engine/summaryColumns.js';
import { hashText } from '../text/hash.js';
import { LineIndex } from '../text/positions.js';
import { countDiagnostics } from '../engine/counts.js';
import { jsonDiagnostic } from '../engine/jsonReport.js';
import { blockCardHtml, chartFailedHtml, drawingHtml, type ChartDrawing, type ChartImage } from './blockCard.js';
import { escapeHtml } from './escape.js';
import { powerOfTenHtml } from './readable.js';
import { reportStylesheet } from './stylesheet.js';
import { subjectsOf, type BlockSubject } from './subject.js';

export type { ChartDrawing, ChartFailure, ChartImage } from './blockCard.js';

/** What the header of the record says beside the notebook's name. */
export interface ReportRecord {
  /** When the report was written, as printed (the CLI passes today's date; tests pass a fixed one). */
  readonly date: string;
  /** Vitrine's version (the CLI reads it from package.json). */
  readonly version: string;
  /** The notebook folder(s) read, as the reader should see them. */
  readonly folders: readonly string[];
}

/**
 * A stability map: drawn (one SVG, or both themes), failed to draw, or a note that stands in
 * for it (a map that needs more films than the notebook has).
 */
export type MapEntry = { readonly name: string; readonly title?: string } & ({ readonly svg: string | ChartDrawing } | { readonly failed: string } | { readonly note: string });

export interface ReportInput {
  /** The notebook's name, shown in the header band. */
  readonly title: string;
  readonly record?: ReportRecord;
  readonly report: NotebookReport;
  /** Each block's chart (both themes, or one SVG), or why it could not be drawn. */
  readonly charts: ReadonlyMap<BlockReport, ChartImage>;
  readonly summary: readonly FilmSummary[];
  readonly maps: readonly MapEntry[];
  /** Per material: the Tsub series normalised to the liquid line and the relaxation map. */
  readonly materialFigures?: readonly MapEntry[];
}

/** A summary cell: the formatter's text (exponents as powers of ten), °C beside an absolute temperature. */
function summaryCellHtml(column: SummaryColumn, row: FilmSummary): string {
  const text = summaryCell(column, row);
  if (!isNumeric(column)) return `<td>${escapeHtml(text)}</td>`;
  let beside = '';
  if (column.absoluteTemperature === true) {
    const kelvin = column.type === 'number' ? column.number(row) : column.type === 'result' ? column.result(row)?.value : undefined;
    const value = text.split(' ± ')[0];
    const celsius = kelvin === undefined ? '' : celsiusText(value, kelvin);
    if (celsius) beside = `<span class="beside">${escapeHtml(celsius)} °C</span>`;
  }
  return `<td class="num">${powerOfTenHtml(text)}${beside}</td>`;
}

/** The anchor of each film's deposition entry, by file path and film id. */
function filmAnchors(report: NotebookReport, entries: Entries): (row: FilmSummary) => string | undefined {
  const byFilm = new Map<string, string>();
  for (const f of report.files) for (const b of f.blocks) if (b.kind === 'deposition' && b.id !== null && entries.has(b)) byFilm.set(`${f.root ?? ''}\n${f.path}\n${b.id}`, entries.get(b)!);
  return (row) => byFilm.get(`${row.root ?? ''}\n${row.file}\n${row.film}`);
}

function summaryHtml(rows: readonly FilmSummary[], anchorOf: (row: FilmSummary) => string | undefined = () => undefined): string {
  if (rows.length === 0) return '<p>No films (deposition blocks) yet.</p>';
  const columns = SUMMARY_TABLE_COLUMNS;
  const head = columns.map((c) => `<th${isNumeric(c) ? ' class="num"' : ''} title="${escapeHtml(c.meaning)}">${escapeHtml(c.header)}</th>`).join('');
  const cell = (c: SummaryColumn, r: FilmSummary): string => {
    const anchor = c.key === 'film' ? anchorOf(r) : undefined;
    return anchor ? `<td><a href="#${anchor}">${escapeHtml(r.film)}</a></td>` : summaryCellHtml(c, r);
  };
  const body = rows.map((r) => `<tr>${columns.map((c) => cell(c, r)).join('')}</tr>`).join('');
  return `<table class="summary"><thead><tr>${head}</tr></thead><tbody>${body}</tbody></table>`;
}

function mapHtml(m: MapEntry, i: number): string {
  const title = m.title ? `<figcaption><b>${escapeHtml(m.title)}</b></figcaption>` : '';
  // A drawn map carries its title; a map not drawn is named above the reason.
  const inner = 'svg' in m ? drawingHtml(m.svg, `m${i}`) : `${title}${'failed' in m ? chartFailedHtml(m.failed) : `<p class="stand-in">${escapeHtml(m.note)}</p>`}`;
  const chart = 'svg' in m && typeof m.svg !== 'string' ? ' chart' : '';
  return `<figure class="map${chart}" id="map-${escapeHtml(m.name)}">${inner}</figure>`;
}

/** Keys of the entries written (`e3-1`: file 3, block 1), each an anchor of the page. */
type Entries = Map<BlockReport, string>;

/** Renders one markdown file, with its data blocks replaced by their sections. */
function fileHtml(file: NotebookReport['files'][number], fileIndex: number, charts: ReportInput['charts'], subjectOf: (b: BlockReport) => BlockSubject, entries: Entries): string {
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
          const key = `e${fileIndex}-${file.blocks.indexOf(block)}`;
          entries.set(block, key);
          inserts.set(token, blockCardHtml(block, charts.get(block), { lines, subject: subjectOf(block), key }));
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

/** The record's header: the notebook's name in the band, then date, version and folder. */
function headerHtml(input: ReportInput): string {
  const r = input.record;
  const item = (term: string, value: string): string => `<div><dt>${escapeHtml(term)}</dt><dd>${escapeHtml(value)}</dd></div>`;
  const record = r
    ? `<dl class="record">${item('date', r.date)}${item(r.folders.length === 1 ? 'notebook folder' : 'notebook folders', r.folders.join(', '))}${item('Vitrine', r.version)}</dl>`
    : '';
  return `<header class="band"><div class="inner"><p class="what">Lab record · stability notebook</p><h1>${escapeHtml(input.title)}</h1>${record}</div></header>`;
}

export function buildHtmlReport(input: ReportInput): string {
  const subjectOf = subjectsOf(input.report);
  const entries: Entries = new Map();
  const ordered = [...input.report.files].sort(readingOrder);
  const files = ordered
    .map((f, i) => {
      const lines = new LineIndex(f.text);
      const fileDiags = f.diagnostics
        .map((d) => `<li class="${escapeHtml(d.severity)}"><span class="tag">${escapeHtml(d.severity)}</span><span class="at">line ${jsonDiagnostic(d, lines).line}</span><span>${escapeHtml(d.message)} <code>${escapeHtml(d.code)}</code></span></li>`)
        .join('');
      const count = f.blocks.length;
      return `<section class="page" id="file-${i + 1}"><h2 class="file"><span>${escapeHtml(f.path)}</span><span class="folio">${count} data block${count === 1 ? '' : 's'}</span></h2>${fileDiags ? `<ol class="findings">${fileDiags}</ol>` : ''}<article>${fileHtml(f, i + 1, input.charts, subjectOf, entries)}</article></section>`;
    })
    .join('\n');
  const maps = input.maps.map(mapHtml).join('');
  const materialFigures = (input.materialFigures ?? []).map((m, i) => mapHtml(m, input.maps.length + i)).join('');
  const blockCount = input.report.files.reduce((n, f) => n + f.blocks.length, 0);
  const counts = countDiagnostics(input.report);
  const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;
  const contents = ordered.map((f, i) => `<a href="#file-${i + 1}">${escapeHtml(f.path)}</a>`).join('');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="color-scheme" content="light dark">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<title>${escapeHtml(input.title)} — lab record</title><style>${reportStylesheet()}</style></head>
<body>${headerHtml(input)}
<main><p class="lead">${plural(input.report.files.length, 'file')}, ${plural(blockCount, 'data block')}: ${plural(counts.error, 'error')}, ${plural(counts.warning, 'warning')}. The summary per film, the stability maps and the figures per material follow the pages.</p>
<nav class="contents">${contents}<a href="#summary">summary per film</a>${maps ? '<a href="#maps">stability maps</a>' : ''}${materialFigures ? '<a href="#materials">figures per material</a>' : ''}</nav>
${files}
<h2 class="part" id="summary">Summary per film</h2>${summaryHtml(input.summary, filmAnchors(input.report, entries))}
${maps ? `<h2 class="part" id="maps">Stability maps</h2><div class="maps">${maps}</div>` : ''}
${materialFigures ? `<h2 class="part" id="materials">Figures per material</h2><div class="maps">${materialFigures}</div>` : ''}
<footer>Written by Vitrine${input.record ? ` ${escapeHtml(input.record.version)} on ${escapeHtml(input.record.date)}` : ''}. Numbers are computed from the notebook's data with the methods named beside them; they do not replace the lab's own checks or safety rules.</footer>
</main>
</body></html>
`;
}
