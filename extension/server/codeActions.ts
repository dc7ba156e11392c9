/**
 * Code actions. Every edit is minimal: it inserts or replaces only the lines it must, in the
 * file's own line endings and container prefix (list item, block quote); the rest of the file,
 * its BOM included, stays byte-identical.
 *
 * - Each diagnostic's own fix (a unit for a bare number, a near-miss name).
 * - Insert the missing required keys, with `?` placeholders that stay errors until filled in.
 * - Write the figures of a block as a `results` block below it (a record with the hash of its
 *   inputs), refresh a record whose inputs changed, and refresh every record of a file.
 */
import { CodeActionKind, type CodeAction, type CodeActionParams, type Diagnostic as LspDiagnostic, type TextEdit } from 'vscode-languageserver';
import { blockKeys, requiredAlternatives, resultText, visibleSpan, type BlockLocation, type BlockReport, type FileReport } from '../core/index.js';
import type { DocumentText } from './documentText.js';
import type { Folder, Workspace } from './workspace.js';

export const REFRESH_KIND = 'source.vitrine.refreshResults';

const PLACEHOLDER_UNITS: Readonly<Record<string, string>> = {
  temperature: 'K',
  temperature_interval: 'K',
  length: 'nm',
  time: 's',
  rate: 'nm/s',
  pressure: 'Pa',
  heating_rate: 'K/min',
  mass: 'mg',
};

interface FileContext {
  readonly uri: string;
  readonly folder: Folder;
  readonly rel: string;
  readonly text: DocumentText;
  readonly file: FileReport;
}

export function codeActions(ws: Workspace, params: CodeActionParams): CodeAction[] {
  const uri = params.textDocument.uri;
  const place = ws.placeOf(uri);
  const text = ws.textOf(uri);
  if (!place || !text) return [];
  const file = place.folder.engine.analyze({ only: [place.rel] }).files[0];
  if (!file) return [];
  const ctx: FileContext = { uri, folder: place.folder, rel: place.rel, text, file };
  const only = params.context.only;
  const wants = (kind: string) => !only || only.some((k) => kind === k || kind.startsWith(`${k}.`));
  const out: CodeAction[] = [];
  const edit = (edits: TextEdit[]) => ({ changes: { [uri]: edits } });

  if (wants(CodeActionKind.QuickFix)) {
    // A fix comes from the analysis of the text as it is now, not from the published diagnostic:
    // text typed since then (above it, or in it) would leave a published range pointing elsewhere.
    // The editor keeps the range of a diagnostic in step with the text; a fix is offered when a
    // current diagnostic of the same code has that range.
    const current = [...file.diagnostics, ...file.blocks.flatMap((b) => b.diagnostics)].filter((x) => x.fix);
    for (const d of params.context.diagnostics) {
      if (d.source !== 'vitrine') continue;
      const now = current.find((x) => x.code === d.code && sameRange(text.range(visibleSpan(x.span, text.text.length)), d.range));
      if (now?.fix) out.push({ title: now.fix.title, kind: CodeActionKind.QuickFix, diagnostics: [d], isPreferred: true, edit: edit([{ range: text.range(now.fix.span), newText: now.fix.newText }]) });
    }
    const missing = params.context.diagnostics.filter((d) => d.source === 'vitrine' && d.code === 'meta.missing-required');
    for (const block of blocksUnder(ctx, missing)) {
      const insert = missingKeysEdit(ctx, block);
      if (insert) out.push({ title: 'Insert the missing required keys', kind: CodeActionKind.QuickFix, diagnostics: missing, edit: edit([insert]) });
    }
    for (const d of params.context.diagnostics.filter((x) => x.source === 'vitrine' && x.code === 'results.stale')) {
      const record = ctx.file.blocks.find((b) => b.kind === 'results' && rangeHolds(ctx, b, d));
      const refreshed = record ? refreshEdit(ctx, record) : null;
      if (refreshed) out.push({ title: 'Refresh the recorded figures', kind: CodeActionKind.QuickFix, diagnostics: [d], isPreferred: true, edit: edit([refreshed]) });
    }
  }
  if (wants(CodeActionKind.RefactorRewrite)) {
    const offset = text.offset(params.range.start);
    const target = ctx.file.blocks.find((b) => b.kind !== 'results' && b.id !== null && offset >= b.span.start && offset <= b.span.end && Object.keys(b.results).length > 0);
    const hasRecord = target && ctx.file.blocks.some((b) => b.kind === 'results' && b.metadata.of === target.id);
    if (target && !hasRecord) {
      const insert = recordEdit(ctx, target);
      if (insert) out.push({ title: `Record the figures of ${target.id} in a results block below it`, kind: CodeActionKind.RefactorRewrite, edit: edit([insert]) });
    }
  }
  if (wants(REFRESH_KIND)) {
    const edits = ctx.file.blocks.filter((b) => b.kind === 'results' && b.diagnostics.some((d) => d.code === 'results.stale')).map((b) => refreshEdit(ctx, b)).filter((e): e is TextEdit => e !== null);
    if (edits.length > 0) out.push({ title: `Refresh ${edits.length} recorded figure block${edits.length === 1 ? '' : 's'} in this file`, kind: REFRESH_KIND, edit: edit(edits) });
  }
  return out;
}

function rangeHolds(ctx: FileContext, block: BlockReport, d: LspDiagnostic): boolean {
  const o = ctx.text.offset(d.range.start);
  return o >= block.span.start && o <= block.span.end;
}

function blocksUnder(ctx: FileContext, diagnostics: readonly LspDiagnostic[]): BlockReport[] {
  const out = new Set<BlockReport>();
  for (const d of diagnostics) for (const b of ctx.file.blocks) if (rangeHolds(ctx, b, d)) out.add(b);
  return [...out];
}

/** What stands before the fence on its line (indentation, `> `, a list marker as spaces). */
function prefixOf(ctx: FileContext, block: { span: { start: number } }): string {
  const raw = ctx.text.raw;
  const start = block.span.start + ctx.text.bom;
  const lineStart = ctx.text.lines.lineStart(ctx.text.lines.lineAt(start));
  return raw.slice(lineStart, start).replace(/[-*+]|\d+[.)]/g, (m) => ' '.repeat(m.length));
}

/** The 0-based line of a block's last character (a block that a container ended stops at the start of the next line). */
function lastLineOf(ctx: FileContext, block: { span: { start: number; end: number } }): number {
  const end = Math.max(block.span.start, block.span.end - 1);
  return ctx.text.lines.lineAt(end + ctx.text.bom);
}

/** Offset (in the editor's text) of the start of the line after the opening fence. */
function afterFenceLine(ctx: FileContext, start: number): number {
  const line = ctx.text.lines.lineAt(start + ctx.text.bom);
  return ctx.text.lines.lineStart(line + 1);
}

function missingKeysEdit(ctx: FileContext, block: BlockReport): TextEdit | null {
  const keys = blockKeys(block.kind);
  const lines: string[] = [];
  for (const k of keys) if (k.required && block.metadata[k.key] === undefined) lines.push(placeholderLine(k.key, k.dimension));
  for (const group of requiredAlternatives(block.kind)) {
    if (group.some((g) => block.metadata[g] !== undefined)) continue;
    const k = keys.find((x) => x.key === group[0]);
    if (k) lines.push(placeholderLine(k.key, k.dimension));
  }
  if (lines.length === 0) return null;
  const prefix = prefixOf(ctx, block);
  const at = ctx.text.lines.positionAt(afterFenceLine(ctx, block.span.start));
  return { range: { start: at, end: at }, newText: lines.map((l) => prefix + l + ctx.text.eol).join('') };
}

function placeholderLine(key: string, dimension: string | null): string {
  const unit = dimension ? PLACEHOLDER_UNITS[dimension] : undefined;
  return `${key}: ?${unit ? ` ${unit}` : ''}`;
}

/** The body of a results block for a block: `of`, `inputs`, then every figure as `value ± u unit`. */
function recordBody(ctx: FileContext, target: BlockReport): string[] | null {
  if (target.id === null) return null;
  const hash = ctx.folder.engine.inputsHashOf(target.id);
  if (!hash) return null;
  const figures = Object.entries(target.results).map(([name, r]) => `${name}: ${yamlText(resultText(name, r))}`);
  return [`of: ${target.id}`, `inputs: "${hash}"`, ...figures];
}

function recordEdit(ctx: FileContext, target: BlockReport): TextEdit | null {
  const body = recordBody(ctx, target);
  if (!body) return null;
  const prefix = prefixOf(ctx, target);
  const eol = ctx.text.eol;
  // After the block's last line: the block span ends at the end of its closing fence line.
  const endLine = lastLineOf(ctx, target);
  const lineEnd = ctx.text.lines.lineEnd(endLine);
  const atEnd = lineEnd === ctx.text.raw.length;
  const pos = ctx.text.lines.positionAt(lineEnd);
  const lines = ['', '```results', ...body, '```'].map((l) => (l ? prefix + l : prefix.trimEnd()));
  return { range: { start: pos, end: pos }, newText: eol + lines.join(eol) + (atEnd ? eol : '') };
}

/** Replaces the body lines of a stale results block (fences untouched). */
function refreshEdit(ctx: FileContext, record: BlockReport): TextEdit | null {
  const of = record.metadata.of;
  if (typeof of !== 'string') return null;
  const def: BlockLocation | undefined = ctx.folder.engine.definitionOf(of);
  if (!def) return null;
  const targetFile = ctx.folder.engine.analyze({ only: [def.path] }).files[0];
  const target = targetFile?.blocks.find((b) => b.span.start === def.span.start);
  const body = target ? recordBody(ctx, target) : null;
  if (!body) return null;
  const prefix = prefixOf(ctx, record);
  const first = ctx.text.lines.lineAt(record.span.start + ctx.text.bom) + 1;
  const last = lastLineOf(ctx, record);
  const closing = /^\s*(?:>\s*)*(`{3,}|~{3,})\s*$/.test(ctx.text.lineText(last));
  const endLine = closing ? last : last + 1;
  if (endLine < first) return null;
  const eol = ctx.text.eol;
  return {
    range: { start: { line: first, character: 0 }, end: { line: endLine, character: 0 } },
    newText: body.map((l) => prefix + l + eol).join(''),
  };
}

/** A YAML scalar: plain where YAML reads it back as the same text, quoted otherwise. */
function yamlText(value: string): string {
  return /^[\w(+\-.−][^#:]*$/.test(value) && !/\s$/.test(value) ? value : JSON.stringify(value);
}

function sameRange(a: TextEdit['range'], b: TextEdit['range']): boolean {
  return a.start.line === b.start.line && a.start.character === b.start.character && a.end.line === b.end.line && a.end.character === b.end.character;
}
