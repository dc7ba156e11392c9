/**
 * Completion inside notebooks: block kinds after a fence opener; the keys of the block's kind
 * (with description, unit and whether required); ids of the right kind after `film:`,
 * `material:`, `reference:` and `of:`; units after a number of a quantity key; `data:` paths in
 * the notebook folder.
 */
import * as path from 'node:path';
import { CompletionItemKind, type CompletionItem, type Position } from 'vscode-languageserver';
import { BLOCK_KINDS, blockKeys, type BlockKind } from '../core/index.js';
import { filesBelow } from '../node/discovery.js';
import { at } from './blocks.js';
import type { Workspace } from './workspace.js';

/** Units a practitioner writes for each dimension, most common first. */
export const UNITS: Readonly<Record<string, readonly string[]>> = {
  temperature: ['K', '°C'],
  temperature_interval: ['K'],
  length: ['nm', 'Å', 'µm'],
  time: ['s', 'min', 'h'],
  rate: ['nm/s', 'Å/s'],
  pressure: ['Pa', 'Torr', 'mbar'],
  heating_rate: ['K/min', 'K/s'],
  heat_capacity: ['J/(g*K)'],
  mass: ['mg', 'µg', 'g'],
  molar_mass: ['g/mol'],
  specific_volume: ['cm^3/g'],
  heat_flow: ['mW', 'W'],
  specific_heat_flow: ['W/g', 'mW/mg'],
  specific_enthalpy: ['J/g'],
};

const REFERENCE_KINDS: Readonly<Record<string, BlockKind | null>> = { film: 'deposition', material: 'material', reference: 'dsc', of: null };
const DATA_EXTENSIONS = /\.(csv|tsv|txt|dat|asc|xy)$/i;
const KIND_WORDS: Readonly<Record<BlockKind, string>> = {
  material: 'a glass former: name, standard Tg, VFT parameters',
  deposition: 'one film grown by vapor deposition',
  ramp: 'thickness or volume against temperature (heating and cooling)',
  isotherm: 'thickness against time at a fixed temperature',
  dsc: 'heat capacity or heat flow against temperature',
  relaxation: 'relaxation times against temperature',
  results: "a record of another block's figures",
};

export function completions(ws: Workspace, uri: string, position: Position): CompletionItem[] {
  const a = at(ws, uri, position);
  if (!a) return [];
  const line = a.text.lineText(position.line).slice(0, position.character);
  const fence = /^(?:\s*>)*\s*(?:[-*+]\s+|\d+[.)]\s+)?(`{3,}|~{3,})([a-z]*)$/.exec(line);
  if (fence) {
    return BLOCK_KINDS.filter((k) => k.startsWith(fence[2])).map((k) => ({ label: k, kind: CompletionItemKind.Keyword, detail: KIND_WORDS[k] }));
  }
  const block = a.place.folder.engine.blockAt(a.place.rel, a.offset);
  if (!block) return [];
  // Only the metadata part: lines before a `---` separator.
  const before = a.text.text.slice(block.span.start, a.offset).split(/\r\n|\r|\n/).slice(1);
  if (before.slice(0, -1).some((l) => /^(?:\s*>)*\s*---\s*$/.test(l))) return [];
  const body = line.replace(/^(?:\s*>)*/, '');
  const keyTyping = /^(\s*)([A-Za-z_]*)$/.exec(body);
  if (keyTyping) {
    if (keyTyping[1].length > 0 && keyTyping[2].length === 0) return [];
    return blockKeys(block.kind).map((k, i) => ({
      label: k.key,
      kind: CompletionItemKind.Property,
      detail: `${k.required ? 'required' : k.recommended ? 'recommended' : 'optional'}${k.dimension ? ` · ${k.dimension.replace('_', ' ')} (${(UNITS[k.dimension] ?? []).join(', ')})` : ''}`,
      documentation: k.recommended ? `${k.description}. Recommended: ${k.recommended}.` : k.description,
      insertText: `${k.key}: `,
      sortText: `${k.required ? 0 : k.recommended ? 1 : 2}${String(i).padStart(3, '0')}`,
    }));
  }
  const value = /^\s*([A-Za-z_]+):\s*(.*)$/.exec(body);
  if (!value) return [];
  const [, key, typed] = value;
  if (key in REFERENCE_KINDS) {
    const kind = REFERENCE_KINDS[key];
    return a.place.folder.engine
      .ids(kind ?? undefined)
      .filter((b) => b.id !== block.id || kind === null)
      .map((b) => ({ label: b.id!, kind: CompletionItemKind.Reference, detail: `${b.kind} in ${b.path}` }));
  }
  if (key === 'data') return dataPaths(a.place.folder.root, a.place.rel, typed);
  const field = blockKeys(block.kind).find((k) => k.key === key);
  const number = /^[-+−]?(?:\d+[.,]?\d*|[.,]\d+)(?:[eE][-+]?\d+)?(?:\s*±\s*[\d.]+)?\s+\S*$/.test(typed);
  if (field?.dimension && number) return (UNITS[field.dimension] ?? []).map((u, i) => ({ label: u, kind: CompletionItemKind.Unit, sortText: String(i) }));
  return [];
}

/** Data-like files in the notebook folder, as paths relative to the notebook file. */
function dataPaths(root: string, rel: string, typed: string): CompletionItem[] {
  const fileDir = path.posix.dirname(rel);
  return filesBelow(root, (name) => DATA_EXTENSIONS.test(name), 5)
    .map((p) => path.posix.relative(fileDir === '.' ? '' : fileDir, p))
    .filter((shown) => shown.startsWith(typed))
    .slice(0, 200)
    .map((shown) => ({ label: shown, kind: CompletionItemKind.File }));
}
