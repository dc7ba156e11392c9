/**
 * Validates block metadata against the kind's JSON Schema (draft 2020-12) with ajv's validators,
 * compiled from the schemas ahead of time (scripts/compile-schemas.mjs), and turns every ajv error
 * into a diagnostic message with a stable code and the JSON pointer it is about. Where a pointer lands in the source is the caller's business.
 *
 * Policy: never throws; data of any shape is accepted and reported on.
 */
import type { ErrorObject } from 'ajv';
import { messages } from '../model/messages.js';
import type { Message } from '../model/diagnostic.js';
import type { BlockKind } from '../scan/blockHeader.js';
import { SCHEMAS, type JsonSchema } from './schemas.js';
import * as compiled from './compiledValidators.js';
import { nearest } from '../text/editDistance.js';

export interface SchemaProblem {
  readonly message: Message;
  /** Pointer of the value concerned; '' is the whole block. */
  readonly pointer: string;
  /** Point at the key rather than the value (unknown keys, missing nested keys). */
  readonly atKey: boolean;
  /** A known key that an unknown key is a near miss of: the fix renames the key to it. */
  readonly rename?: string;
}

/** A compiled validator: true when the data pass, else false with the errors beside it. */
interface ValidateFunction {
  (data: unknown): boolean;
  errors?: ErrorObject[] | null;
}

/** The validator of a kind, compiled from its schema when Vitrine was built (scripts/compile-schemas.mjs). */
function validatorOf(kind: BlockKind): ValidateFunction {
  return (compiled as unknown as Record<BlockKind, ValidateFunction>)[kind];
}

/** Keys the schema names as recommended, with the reason shown to the user. */
export function recommendedKeys(kind: BlockKind): Readonly<Record<string, string>> {
  return (SCHEMAS[kind].recommended as Record<string, string> | undefined) ?? {};
}

/**
 * The known name a written one is a near miss of, for "did you mean": case folded, within a
 * restricted Damerau–Levenshtein distance of 2 (1 for names of four letters or fewer), or
 * abbreviating one name part by part (`substrate_temp`); see text/editDistance.ts.
 */
export function suggest(word: string, candidates: readonly string[]): string | null {
  return nearest(word, candidates, word.length <= 4 ? 1 : 2);
}

function keyName(pointer: string): string {
  const parts = pointer.split('/').filter((p) => p.length > 0);
  return parts.length === 0 ? '(block)' : parts.join('.');
}

const TYPE_WORDS: Record<string, string> = {
  string: 'text',
  number: 'a number',
  integer: 'a whole number',
  object: 'a map of "key: value" lines',
  array: 'a list',
  boolean: 'true or false',
  'string,number': 'a value with a unit',
};

export function validateMetadata(kind: BlockKind, data: unknown): SchemaProblem[] {
  if (!(kind in SCHEMAS)) return [];
  const validate = validatorOf(kind);
  if (validate(data)) return [];
  const errors = (validate.errors ?? []) as ErrorObject[];
  const out: SchemaProblem[] = [];
  // A missing "one of these keys" shows as an anyOf error over required errors: merge them.
  const anyOfRequired = new Set<ErrorObject>();
  for (const e of errors) {
    if (e.keyword !== 'anyOf') continue;
    const branches = errors.filter((r) => r.keyword === 'required' && r.instancePath === e.instancePath && r.schemaPath.startsWith(e.schemaPath + '/'));
    if (branches.length > 0) {
      branches.forEach((b) => anyOfRequired.add(b));
      const keys = branches.map((b) => String((b.params as { missingProperty: string }).missingProperty));
      out.push({ message: messages.missingOneOf(keys, kind), pointer: e.instancePath, atKey: e.instancePath !== '' });
    }
  }
  for (const e of errors) {
    if (anyOfRequired.has(e) || e.keyword === 'anyOf' || e.keyword === 'if') continue;
    const pointer = e.instancePath;
    const key = keyName(pointer);
    switch (e.keyword) {
      case 'required': {
        const missing = String((e.params as { missingProperty: string }).missingProperty);
        const desc = ((e.parentSchema as JsonSchema | undefined)?.properties as Record<string, JsonSchema> | undefined)?.[missing]?.description;
        const name = pointer === '' ? missing : `${key}.${missing}`;
        out.push({ message: messages.missingRequired(name, kind, typeof desc === 'string' ? desc : ''), pointer, atKey: pointer !== '' });
        break;
      }
      case 'additionalProperties': {
        const extra = String((e.params as { additionalProperty: string }).additionalProperty);
        const allowed = Object.keys(((e.parentSchema as JsonSchema | undefined)?.properties as object | undefined) ?? {});
        const near = suggest(extra, allowed);
        out.push({ message: messages.unknownKey(pointer === '' ? extra : `${key}.${extra}`, kind, near), pointer: `${pointer}/${extra}`, atKey: true, ...(near ? { rename: near } : {}) });
        break;
      }
      case 'type': {
        const t = (e.params as { type: string | string[] }).type;
        const ts = Array.isArray(t) ? t.join(',') : t;
        // YAML reads 1e400 as a number, Infinity, which is not one for the schema.
        if (typeof e.data === 'number' && !Number.isFinite(e.data)) out.push({ message: messages.quantityNotFinite(key), pointer, atKey: false });
        else out.push({ message: messages.wrongType(key, TYPE_WORDS[ts] ?? ts), pointer, atKey: false });
        break;
      }
      case 'enum':
        out.push({ message: messages.badValue(key, ((e.params as { allowedValues: unknown[] }).allowedValues ?? []).map(String)), pointer, atKey: false });
        break;
      case 'pattern':
        out.push({ message: messages.badPattern(key, 'a block id (letters, digits and . _ - :)'), pointer, atKey: false });
        break;
      case 'minLength':
        out.push({ message: messages.badPattern(key, 'not empty'), pointer, atKey: false });
        break;
      case 'minItems':
      case 'maxItems':
      case 'items':
        out.push({ message: messages.badPattern(key, 'a list of two values, [low, high]'), pointer, atKey: false });
        break;
      case 'minimum':
      case 'maximum':
      case 'exclusiveMinimum':
      case 'exclusiveMaximum':
        out.push({ message: messages.outOfRange(key, `${e.message ?? ''}`), pointer, atKey: false });
        break;
      default:
        out.push({ message: messages.schemaOther(key, e.message ?? e.keyword), pointer, atKey: false });
    }
  }
  return out;
}
