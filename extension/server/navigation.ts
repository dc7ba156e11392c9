/**
 * Block ids across the notebook: go to definition, find references, rename (one workspace edit),
 * document symbols (the data blocks, for the outline) and workspace symbols.
 */
import { SymbolKind, type DocumentSymbol, type Location, type Position, type Range, type SymbolInformation, type TextEdit, type WorkspaceEdit } from 'vscode-languageserver';
import { ID_PATTERN, type BlockLocation, type Span } from '../core/index.js';
import { at } from './blocks.js';
import type { DocumentText } from './documentText.js';
import type { Folder, Workspace } from './workspace.js';


interface IdAt {
  readonly id: string;
  readonly folder: Folder;
  /** The span of the id itself (quotes excluded) in the requesting file. */
  readonly span: Span;
}

/** The span of an id inside a value span that may carry quotes: `"D-1"` → `D-1`. */
export function idSpanIn(text: string, span: Span, id: string): Span | null {
  const slice = text.slice(span.start, span.end);
  const i = slice.indexOf(id);
  return i < 0 ? null : { start: span.start + i, end: span.start + i + id.length };
}

/** The block id under the cursor: a block's own id, or a reference to one. */
function idAt(ws: Workspace, uri: string, position: Position): IdAt | null {
  const a = at(ws, uri, position);
  if (!a) return null;
  const engine = a.place.folder.engine;
  const block = engine.blockAt(a.place.rel, a.offset);
  if (block?.id && block.idSpan && a.offset >= block.idSpan.start && a.offset <= block.idSpan.end) return { id: block.id, folder: a.place.folder, span: block.idSpan };
  const entry = engine.entryAt(a.place.rel, a.offset);
  if (!entry || entry.onKey || typeof entry.value !== 'string') return null;
  const ref = engine.referencesTo(entry.value).find((r) => r.path === a.place.rel && r.span.start === entry.valueSpan.start);
  if (!ref) return null;
  const span = idSpanIn(a.text.text, entry.valueSpan, entry.value);
  return span ? { id: entry.value, folder: a.place.folder, span } : null;
}

function textOf(ws: Workspace, folder: Folder, rel: string): DocumentText | undefined {
  return ws.textOf(ws.uriOf(folder, rel));
}

function locationOf(ws: Workspace, folder: Folder, rel: string, span: Span): Location | null {
  const text = textOf(ws, folder, rel);
  return text ? { uri: ws.uriOf(folder, rel), range: text.range(span) } : null;
}

export function definition(ws: Workspace, uri: string, position: Position): Location | null {
  const hit = idAt(ws, uri, position);
  const def = hit ? hit.folder.engine.definitionOf(hit.id) : undefined;
  if (!hit || !def) return null;
  return locationOf(ws, hit.folder, def.path, def.idSpan ?? def.span);
}

/** Every use of the id (and its definition, when asked), as spans of the id itself. */
function occurrences(ws: Workspace, hit: IdAt, includeDeclaration: boolean): Array<{ rel: string; span: Span }> {
  const engine = hit.folder.engine;
  const out: Array<{ rel: string; span: Span }> = [];
  const def = engine.definitionOf(hit.id);
  if (includeDeclaration && def?.idSpan) out.push({ rel: def.path, span: def.idSpan });
  for (const ref of engine.referencesTo(hit.id)) {
    const text = textOf(ws, hit.folder, ref.path);
    const span = text ? idSpanIn(text.text, ref.span, hit.id) : null;
    if (span) out.push({ rel: ref.path, span });
  }
  return out;
}

export function references(ws: Workspace, uri: string, position: Position, includeDeclaration: boolean): Location[] {
  const hit = idAt(ws, uri, position);
  if (!hit) return [];
  return occurrences(ws, hit, includeDeclaration)
    .map((o) => locationOf(ws, hit.folder, o.rel, o.span))
    .filter((l): l is Location => l !== null);
}

export function prepareRename(ws: Workspace, uri: string, position: Position): { range: Range; placeholder: string } | null {
  const hit = idAt(ws, uri, position);
  const text = ws.textOf(uri);
  if (!hit || !text || !hit.folder.engine.definitionOf(hit.id)) return null;
  return { range: text.range(hit.span), placeholder: hit.id };
}

/** Renames a block id and every reference to it, in one workspace edit. An invalid or taken name gives no edit. */
export function rename(ws: Workspace, uri: string, position: Position, newName: string): WorkspaceEdit | null {
  const hit = idAt(ws, uri, position);
  if (!hit || !ID_PATTERN.test(newName) || newName === hit.id) return null;
  if (hit.folder.engine.definitionOf(newName)) return null;
  const changes: Record<string, TextEdit[]> = {};
  for (const o of occurrences(ws, hit, true)) {
    const text = textOf(ws, hit.folder, o.rel);
    if (!text) continue;
    const target = ws.uriOf(hit.folder, o.rel);
    (changes[target] ??= []).push({ range: text.range(o.span), newText: newName });
  }
  return { changes };
}

function symbolName(b: BlockLocation): string {
  return `${b.kind} ${b.id ?? ''}`.trim();
}

const KIND_SYMBOL: Record<string, SymbolKind> = {
  material: SymbolKind.Class,
  deposition: SymbolKind.Object,
  ramp: SymbolKind.Function,
  isotherm: SymbolKind.Function,
  dsc: SymbolKind.Function,
  relaxation: SymbolKind.Function,
  results: SymbolKind.Constant,
};

export function documentSymbols(ws: Workspace, uri: string): DocumentSymbol[] {
  const place = ws.placeOf(uri);
  const text = ws.textOf(uri);
  if (!place || !text) return [];
  return place.folder.engine.blocksOf(place.rel).map((b) => ({
    name: symbolName(b),
    detail: b.kind,
    kind: KIND_SYMBOL[b.kind] ?? SymbolKind.Object,
    range: text.range(b.span),
    selectionRange: text.range(b.idSpan ?? { start: b.span.start, end: b.span.start }),
  }));
}

export function workspaceSymbols(ws: Workspace, query: string): SymbolInformation[] {
  const q = query.toLowerCase();
  const out: SymbolInformation[] = [];
  for (const folder of ws.allFolders()) {
    for (const b of folder.engine.ids()) {
      if (q && !symbolName(b).toLowerCase().includes(q)) continue;
      const loc = locationOf(ws, folder, b.path, b.idSpan ?? b.span);
      if (loc) out.push({ name: symbolName(b), kind: KIND_SYMBOL[b.kind] ?? SymbolKind.Object, location: loc, containerName: b.path });
      if (out.length >= 500) return out;
    }
  }
  return out;
}
