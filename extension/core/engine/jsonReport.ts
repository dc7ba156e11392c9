/**
 * The results contract of `vitrine analyze --json` (DESIGN.md): files, blocks, results and
 * diagnostics with 1-based lines and columns.
 */
import type { Diagnostic } from '../model/diagnostic.js';
import type { BlockReport, NotebookReport } from './notebook.js';
import { sparsePositions, toOneBased, toOneBasedPoint, visibleSpan, type Positions } from '../text/positions.js';
import type { ResultValue } from '../model/result.js';

export interface JsonDiagnostic {
  severity: string;
  code: string;
  message: string;
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
  related?: ReadonlyArray<{ path: string; line: number; column: number; message: string }>;
  fix?: { title: string; newText: string; line: number; column: number; endLine: number; endColumn: number };
}

export interface JsonBlock {
  kind: string;
  id: string | null;
  line: number;
  results: Record<string, ResultValue>;
  diagnostics: JsonDiagnostic[];
}

export interface JsonFile {
  path: string;
  blocks: JsonBlock[];
  diagnostics: JsonDiagnostic[];
}

export interface JsonReport {
  files: JsonFile[];
}

export function jsonDiagnostic(d: Diagnostic, lines: Positions): JsonDiagnostic {
  const r = toOneBased(lines.rangeOf(visibleSpan(d.span, lines.text.length)));
  const out: JsonDiagnostic = { severity: d.severity, code: d.code, message: d.message, ...r };
  if (d.related) out.related = d.related.map((r) => ({ path: r.path, ...toOneBasedPoint({ line: r.line, character: r.character }), message: r.message }));
  if (d.fix) out.fix = { title: d.fix.title, newText: d.fix.newText, ...toOneBased(lines.rangeOf(d.fix.span)) };
  return out;
}

/** Rounds to 12 significant digits so that golden files do not churn on the last bit. */
function tidy(v: ResultValue): ResultValue {
  const r = (x: number): number => (Number.isFinite(x) ? Number(x.toPrecision(12)) : x);
  const out: ResultValue = v.uncertainty !== undefined ? { ...v, value: r(v.value), uncertainty: r(v.uncertainty) } : { ...v, value: r(v.value) };
  const withInterval = v.interval ? { ...out, interval: [r(v.interval[0]), r(v.interval[1])] as const } : out;
  return v.budget ? { ...withInterval, budget: v.budget.map((t) => ({ ...t, value: r(t.value) })) } : withInterval;
}

/**
 * A list whose items are made when they are read. The command line writes the blocks of a file one
 * at a time from it, so that the report of a notebook of thousands of blocks is never in memory all
 * at once; as JSON (`toJSON`) it is the array of its items.
 */
export class JsonList<T> {
  constructor(
    readonly length: number,
    readonly at: (index: number) => T,
  ) {}
  toJSON(): T[] {
    return Array.from({ length: this.length }, (_, i) => this.at(i));
  }
}

/** A file of the report with its blocks made when they are read. */
export interface LazyJsonFile {
  path: string;
  blocks: JsonList<JsonBlock>;
  diagnostics: JsonDiagnostic[];
}

/** The report with each file's blocks made when they are read (see JsonList). */
export function toLazyJsonReport(report: NotebookReport, pathPrefix = ''): { files: LazyJsonFile[] } {
  return {
    files: report.files.map((f) => {
      const lines = sparsePositions(f.text);
      const block = (b: BlockReport): JsonBlock => ({
        kind: b.kind,
        id: b.id,
        line: toOneBasedPoint(lines.positionAt(b.span.start)).line,
        results: Object.fromEntries(Object.entries(b.results).map(([k, v]) => [k, tidy(v)])),
        diagnostics: b.diagnostics.map((d) => jsonDiagnostic(d, lines)),
      });
      return {
        path: pathPrefix + f.path,
        blocks: new JsonList(f.blocks.length, (i) => block(f.blocks[i])),
        diagnostics: f.diagnostics.map((d) => jsonDiagnostic(d, lines)),
      };
    }),
  };
}

export function toJsonReport(report: NotebookReport, pathPrefix = ''): JsonReport {
  return { files: toLazyJsonReport(report, pathPrefix).files.map((f) => ({ path: f.path, blocks: f.blocks.toJSON(), diagnostics: f.diagnostics })) };
}

/** `file:line:col: severity: message [code]`, the compiler-style line of `vitrine check`. */
export function formatDiagnosticLine(file: string, d: JsonDiagnostic): string {
  return `${file}:${d.line}:${d.column}: ${d.severity}: ${d.message} [${d.code}]`;
}
