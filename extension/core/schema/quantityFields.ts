/**
 * Finds the metadata fields that hold quantities, from the `quantityOf` annotations of a block
 * kind's schema (the schema is the one source of truth for which key has which dimension), and
 * their `quantityExclusiveMinimum` (the value in the canonical unit must be greater: a rate, a
 * duration, a thickness or a mass is positive). An absolute temperature is always above 0 K.
 * `quantityBound: true` marks a quantity that may be written as a bound (`< 3e-7 Torr`): a base
 * pressure is often known only as "below the gauge's reading"; elsewhere a bound is refused.
 */
import type { Dimension } from '../parse/units.js';
import type { JsonSchema } from './schemas.js';

export interface QuantityField {
  /** JSON pointer with `*` standing for any array index, e.g. "/windows/glass/*". */
  readonly pattern: string;
  /** Concrete pointers are matched segment by segment. */
  readonly segments: readonly string[];
  readonly dimension: Dimension;
  /** The quantity, in the canonical unit, must be greater than this. */
  readonly exclusiveMinimum?: number;
  /** It may be written as a bound (`< 3e-7 Torr`, `≥ …`). */
  readonly boundAllowed?: boolean;
}

export function quantityFields(schema: JsonSchema): QuantityField[] {
  const out: QuantityField[] = [];
  const visit = (node: unknown, segments: string[]): void => {
    if (!node || typeof node !== 'object') return;
    const s = node as Record<string, unknown>;
    if (typeof s.quantityOf === 'string') {
      const field: QuantityField = { pattern: '/' + segments.join('/'), segments: [...segments], dimension: s.quantityOf as Dimension };
      out.push({
        ...field,
        ...(typeof s.quantityExclusiveMinimum === 'number' ? { exclusiveMinimum: s.quantityExclusiveMinimum } : {}),
        ...(s.quantityBound === true ? { boundAllowed: true } : {}),
      });
    }
    const props = s.properties as Record<string, unknown> | undefined;
    if (props) for (const [k, v] of Object.entries(props)) visit(v, [...segments, k]);
    const prefix = s.prefixItems as unknown[] | undefined;
    if (prefix) prefix.forEach((v, i) => visit(v, [...segments, String(i)]));
    if (s.items && typeof s.items === 'object') visit(s.items, [...segments, '*']);
  };
  visit(schema, []);
  return out;
}
