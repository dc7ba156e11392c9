/**
 * One data block's entry in the report: a label strip (kind, id, what it is about, where it is),
 * its chart (both themes) with a caption, its conditions as written beside its figures, the
 * table as it was read when the table failed, and every finding. All text from the notebook is
 * escaped; the only raw markup is Vitrine's own and the SVG its renderer drew.
 */
import type { BlockReport } from '../engine/notebook.js';
import { jsonDiagnostic } from '../engine/jsonReport.js';
import { catalogueEntry } from '../model/catalogue.js';
import type { BlockKind } from '../model/blockKind.js';
import { formatMeasurement, formatOf, formatUncertainty, formatValue, resultIntervalText, unitText } from '../model/formatResult.js';
import type { Quantity } from '../model/quantity.js';
import type { Diagnostic } from '../model/diagnostic.js';
import type { ResultValue, UncertaintyTerm } from '../model/result.js';
import { LineIndex, toOneBasedPoint } from '../text/positions.js';
import { escapeHtml } from './escape.js';
import { isBracket, powerOfTenHtml, readableFigure } from './readable.js';
import { subjectText, type BlockSubject } from './subject.js';

/** A chart drawn in both themes: the page shows the one its colour scheme asks for. */
export interface ChartDrawing {
  readonly light: string;
  readonly dark: string;
}

/** A chart that could not be drawn, and why in a few words: its card shows this instead. */
export interface ChartFailure {
  readonly failed: string;
}

/** What the report holds for a block's chart: one SVG (for both themes), both drawings, or why there is none. */
export type ChartImage = string | ChartDrawing | ChartFailure;

/** The short message that stands in for a chart that could not be drawn. */
export function chartFailedHtml(reason: string): string {
  return `<p class="stand-in">This chart could not be drawn (${escapeHtml(reason)}). The figures and findings are not affected.</p>`;
}

/**
 * Makes the ids inside one SVG unique in the page (`clip1` → `c3-clip1`), so that two drawings
 * of the same chart, one of them hidden, never resolve each other's clip paths or gradients.
 */
export function scopeSvgIds(svg: string, prefix: string): string {
  return svg
    .replace(/\sid="([^"]+)"/g, (_m, id: string) => ` id="${prefix}-${id}"`)
    .replace(/url\(#([^)]+)\)/g, (_m, id: string) => `url(#${prefix}-${id})`)
    .replace(/href="#([^"]+)"/g, (_m, id: string) => `href="#${prefix}-${id}"`);
}

/** The drawing(s) of a chart: both themes, each shown by the colour-scheme query. */
export function drawingHtml(image: string | ChartDrawing, prefix: string): string {
  if (typeof image === 'string') return `<div class="drawing">${scopeSvgIds(image, prefix)}</div>`;
  return `<div class="drawing on-light">${scopeSvgIds(image.light, `${prefix}l`)}</div><div class="drawing on-dark">${scopeSvgIds(image.dark, `${prefix}d`)}</div>`;
}

// ---- conditions as written -------------------------------------------------------------------

/** A metadata value as written: scalars as they are, maps as `key value · key value`, lists joined. */
function writtenText(value: unknown, depth = 0): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  if (depth > 3) return '…';
  if (Array.isArray(value)) return value.map((v) => writtenText(v, depth + 1)).join(', ');
  if (typeof value === 'object') {
    return Object.entries(value as Record<string, unknown>)
      .map(([k, v]) => `${k} ${writtenText(v, depth + 1)}`)
      .join(' · ');
  }
  return String(value);
}

/**
 * The quantity in the unit Vitrine computes with, where it was written in another: `= 270.00 K`
 * beside `-3.15 °C` (the offset is exact to 0.01 K), `= 4.67e-6 Pa` beside `3.5e-8 Torr`. A bound
 * keeps its sign (`< 4.00e-5 Pa` beside `< 3e-7 Torr`, `≤` where `≤` or `<=` was written) and a
 * written uncertainty comes along, converted and rounded by the one formatter (`285.15 ± 0.50 K`).
 */
function canonicalText(q: Quantity, written: string): string {
  if (!Number.isFinite(q.value) || q.writtenUnit === '' || q.writtenUnit === q.unit) return '';
  const u = q.uncertainty !== undefined && Number.isFinite(q.uncertainty) && q.uncertainty > 0 ? q.uncertainty : undefined;
  const format = { digits: 3, notation: Math.abs(q.value) >= 1e5 || Math.abs(q.value) < 1e-3 ? 'exponential' : 'fixed' } as const;
  // An offset scale converts exactly to 0.01 K; an uncertainty sets the place where it is coarser.
  const value = u !== undefined ? formatMeasurement(q.value, Math.max(u, q.offsetTemperature ? 0.01 : 0), q.offsetTemperature ? { digits: 5, notation: 'fixed' } : format) : q.offsetTemperature ? q.value.toFixed(2) : formatValue(q.value, undefined, format);
  const inclusive = /^\s*(≤|≥|<=|>=)/.test(written);
  const sign = q.bound === 'upper' ? (inclusive ? '≤' : '<') : q.bound === 'lower' ? (inclusive ? '≥' : '>') : '=';
  return ` <span class="canonical">${escapeHtml(sign)} ${powerOfTenHtml(value)} ${escapeHtml(unitText(q.unit))}</span>`;
}

/** Each metadata key as written, with the value Vitrine computes with beside a quantity written in another unit. */
function conditionsHtml(block: BlockReport): string {
  const rows = Object.entries(block.metadata).map(([k, v]) => {
      const q = block.quantities[`/${k}`];
      const written = writtenText(v);
      const canonical = q ? canonicalText(q, written) : '';
      return `<dt>${escapeHtml(k)}</dt><dd>${escapeHtml(written)}${canonical}</dd>`;
    });
  if (rows.length === 0) return '';
  return `<h4 class="sub">Conditions as written</h4><dl class="conditions">${rows.join('')}</dl>`;
}

// ---- figures ---------------------------------------------------------------------------------

/** The budget of a figure: each term's standard uncertainty and its share of the variance. */
function budgetHtml(name: string, r: ResultValue, terms: readonly UncertaintyTerm[]): string {
  const format = formatOf(name);
  const total = terms.reduce((s, t) => s + t.value * t.value, 0);
  const shownUnit = unitText(r.unit);
  const unit = shownUnit === '' ? '' : ` ${escapeHtml(shownUnit)}`;
  const rows = terms
    .map((t) => {
      const u = formatUncertainty(r.value, t.value, format) || escapeHtml(String(t.value));
      const share = total > 0 ? `${Math.round((100 * t.value * t.value) / total)} %` : '';
      return `<tr><td>${escapeHtml(t.source)}</td><td class="num">${powerOfTenHtml(u)}${unit}</td><td class="num">${share}</td><td>${escapeHtml(t.note ?? '')}</td></tr>`;
    })
    .join('');
  return `<details class="budget"><summary>uncertainty budget (${terms.length} term${terms.length === 1 ? '' : 's'})</summary><table><thead><tr><th>source</th><th class="num">u</th><th class="num">share of u²</th><th>how</th></tr></thead><tbody>${rows}</tbody></table></details>`;
}

/** Each figure under its label, rounded to its uncertainty, with its method, interval and budget. */
export function figuresHtml(results: Readonly<Record<string, ResultValue>>, kind?: BlockKind): string {
  const entries = Object.entries(results);
  if (entries.length === 0) return '';
  const rows = entries
    .map(([name, r]) => {
      const entry = catalogueEntry(name, kind);
      const label = entry ? `<span class="label" title="${escapeHtml(entry.meaning)}">${escapeHtml(entry.label)}</span>` : '';
      const shown = readableFigure(name, r, formatOf(name));
      const intervalText = isBracket(name) ? '' : resultIntervalText(name, r);
      const interval = intervalText ? `<span class="interval">95 % interval ${escapeHtml(`${intervalText} ${unitText(r.unit)}`.trim())}</span>` : '';
      const budget = r.budget && r.budget.length > 0 ? budgetHtml(name, r, r.budget) : '';
      return `<tr><td>${label}<code class="name">${escapeHtml(name)}</code></td><td class="num">${shown.main}${shown.beside ? `<span class="beside">${shown.beside}</span>` : ''}</td><td class="method">${interval}${escapeHtml(r.method)}${budget}</td></tr>`;
    })
    .join('');
  return `<h4 class="sub">Figures</h4><table class="figures"><thead><tr><th>figure</th><th class="num">value</th><th>method</th></tr></thead><tbody>${rows}</tbody></table>`;
}

// ---- the table as read, and findings -----------------------------------------------------------

/** Characters of an excerpt line shown. */
const EXCERPT_LINE = 300;

function excerptHtml(block: BlockReport): string {
  const x = block.tableExcerpt;
  if (!x || x.lines.length === 0) return '';
  const first = x.firstLine + 1;
  const last = x.firstLine + x.lines.length;
  const where = x.path === null ? 'the inline table' : escapeHtml(x.path);
  // A line longer than a screen (a file with no line breaks) is cut, and says how long it was as read.
  const shown = (line: string, i: number): string => {
    const length = x.lengths?.[i] ?? line.length;
    return length > EXCERPT_LINE ? `${line.slice(0, EXCERPT_LINE)}… (${length} characters)` : line;
  };
  const body = x.lines.map((line, i) => `<span class="ln">${first + i}</span>${escapeHtml(shown(line, i))}`).join('\n');
  return `<figure class="excerpt wide"><figcaption>The table as it was read: ${where}, line${x.lines.length === 1 ? ` ${first}` : `s ${first}–${last}`}</figcaption><pre>${body}</pre></figure>`;
}

/**
 * A finding's message, and the places it stands for (a data file's problems, each at its line and
 * column): every one listed, so the message's own "(and N more)" is dropped when all N are here.
 */
function findingText(d: Diagnostic): string {
  const related = d.related ?? [];
  if (related.length <= 1) return `${escapeHtml(d.message)} <code>${escapeHtml(d.code)}</code>`;
  const more = / \(and (\d+) more\)$/.exec(d.message);
  const message = more && Number(more[1]) + 1 === related.length ? d.message.slice(0, more.index) : d.message;
  const places = related.map((r) => `<li><span class="place">${escapeHtml(r.path)}:${r.line + 1}:${r.character + 1}</span> ${escapeHtml(r.message)}</li>`).join('');
  return `${escapeHtml(message)} <code>${escapeHtml(d.code)}</code><ol class="related">${places}</ol>`;
}

/** Every finding of the block, in line order, none left out. */
function findingsHtml(block: BlockReport, lines: LineIndex): string {
  if (block.diagnostics.length === 0) return '';
  const items = block.diagnostics
    .map((d) => ({ d, r: jsonDiagnostic(d, lines) }))
    .sort((a, b) => a.r.line - b.r.line || a.r.column - b.r.column)
    .map(({ d, r }) => `<li class="${escapeHtml(d.severity)}"><span class="tag">${escapeHtml(d.severity)}</span><span class="at">line ${r.line}</span><span>${findingText(d)}</span></li>`)
    .join('');
  return `<div class="wide"><h4 class="sub">Findings (${block.diagnostics.length})</h4><ol class="findings">${items}</ol></div>`;
}

// ---- the entry -----------------------------------------------------------------------------------

export interface CardContext {
  readonly lines: LineIndex;
  readonly subject: BlockSubject;
  /** Unique within the page: the entry's anchor, and the scope of its chart's SVG ids. */
  readonly key: string;
}

export function blockCardHtml(block: BlockReport, chart: ChartImage | undefined, context: CardContext): string {
  const line = toOneBasedPoint(context.lines.positionAt(block.span.start)).line;
  // A material block is its own subject; a deposition block is the film (its material and Tsub remain).
  const about = block.kind === 'material' ? '' : subjectText(block.kind === 'deposition' ? { ...context.subject, film: null } : context.subject);
  const strip = `<div class="strip"><span class="kind">${escapeHtml(block.kind)}</span><span class="id">${escapeHtml(block.id ?? '(no id)')}</span>${about ? `<span class="about">${escapeHtml(about)}</span>` : ''}<span class="where">line ${line}</span></div>`;
  const drawn = chart !== undefined && (typeof chart === 'string' || 'light' in chart) ? chart : undefined;
  const failed = chart !== undefined && typeof chart !== 'string' && 'failed' in chart ? chart.failed : undefined;
  const caption = `<figcaption><b>${escapeHtml(`${block.kind} ${block.id ?? ''}`.trim())}</b>${about ? ` — ${escapeHtml(about)}` : ''}</figcaption>`;
  const chartHtml = drawn ? `<figure class="chart">${drawingHtml(drawn, context.key)}${caption}</figure>` : failed !== undefined ? chartFailedHtml(failed) : '';
  const conditions = conditionsHtml(block);
  const figures = figuresHtml(block.results, block.kind);
  // The chart beside the conditions, the figures across below; without a chart, conditions beside figures.
  const side = chartHtml
    ? `<div class="figure-side">${chartHtml}</div><div class="side">${conditions}</div>${figures ? `<div class="side wide">${figures}</div>` : ''}`
    : conditions && figures
      ? `<div class="side">${conditions}</div><div class="side">${figures}</div>`
      : conditions || figures
        ? `<div class="side wide">${conditions}${figures}</div>`
        : '';
  const body = `${side}${excerptHtml(block)}${findingsHtml(block, context.lines)}`;
  return `<section class="entry${drawn ? '' : ' nochart'}" id="${escapeHtml(context.key)}" data-kind="${escapeHtml(block.kind)}">${strip}<div class="body">${body}</div></section>`;
}
