/**
 * What analyses read from their own metadata and from the blocks they name: the film a block is
 * about, its material, and temperature windows. One place, so every kind follows the same links.
 */
import type { ParsedBlock } from '../block/parseBlock.js';
import type { AnalysisContext } from './context.js';

/** The deposition named by `film:`, if it exists. */
export function filmOf(block: ParsedBlock, ctx: AnalysisContext): ParsedBlock | undefined {
  const id = block.metadata.data.film;
  return typeof id === 'string' ? ctx.lookup(id, 'deposition') : undefined;
}

/** The material of a block: through its film, or named directly by `material:`. */
export function materialOf(block: ParsedBlock, ctx: AnalysisContext): ParsedBlock | undefined {
  const id = filmOf(block, ctx)?.metadata.data.material ?? block.metadata.data.material;
  return typeof id === 'string' ? ctx.lookup(id, 'material') : undefined;
}

/** `windows.<name>: [low, high]` in kelvin, low first, or null when not written. */
export function metadataWindow(block: ParsedBlock, name: string): [number, number] | null {
  const a = block.quantities.get(`/windows/${name}/0`);
  const b = block.quantities.get(`/windows/${name}/1`);
  if (!a || !b) return null;
  return a.value <= b.value ? [a.value, b.value] : [b.value, a.value];
}
