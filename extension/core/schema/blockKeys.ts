/**
 * The top-level keys of a block kind, read from its schema: description, the dimension of a
 * quantity key, and whether the key is required or recommended. Editors complete and document
 * keys from this; the schema stays the one source of truth.
 */
import type { BlockKind } from '../model/blockKind.js';
import { SCHEMAS } from './schemas.js';

export interface BlockKey {
  readonly key: string;
  readonly description: string;
  /** The dimension of a quantity key (`temperature`, `rate`, …), or null for text, ids and maps. */
  readonly dimension: string | null;
  readonly required: boolean;
  /** Why the key is recommended (reported on save when missing), or null. */
  readonly recommended: string | null;
}

const cache = new Map<BlockKind, readonly BlockKey[]>();

export function blockKeys(kind: BlockKind): readonly BlockKey[] {
  const hit = cache.get(kind);
  if (hit) return hit;
  const schema = SCHEMAS[kind] as Record<string, unknown>;
  const props = (schema.properties ?? {}) as Record<string, Record<string, unknown>>;
  const required = new Set((schema.required as string[] | undefined) ?? []);
  const recommended = (schema.recommended ?? {}) as Record<string, string>;
  const keys = Object.entries(props).map(([key, p]) => ({
    key,
    description: typeof p.description === 'string' ? p.description : '',
    dimension: typeof p.quantityOf === 'string' ? p.quantityOf : null,
    required: required.has(key),
    recommended: recommended[key] ?? null,
  }));
  cache.set(kind, keys);
  return keys;
}

/** Groups of keys of which one is required (`thickness` or `duration`), from the schema's `anyOf`. */
export function requiredAlternatives(kind: BlockKind): ReadonlyArray<readonly string[]> {
  const alts = ((SCHEMAS[kind] as Record<string, unknown>).anyOf as Array<{ required?: string[] }> | undefined) ?? [];
  const keys = alts.map((a) => a.required ?? []).filter((r) => r.length === 1).map((r) => r[0]);
  return keys.length > 0 ? [keys] : [];
}
