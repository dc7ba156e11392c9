/** The published JSON Schemas, one per block kind (schemas/*.schema.json). */
import material from '../../../schemas/material.schema.json' with { type: 'json' };
import deposition from '../../../schemas/deposition.schema.json' with { type: 'json' };
import ramp from '../../../schemas/ramp.schema.json' with { type: 'json' };
import isotherm from '../../../schemas/isotherm.schema.json' with { type: 'json' };
import dsc from '../../../schemas/dsc.schema.json' with { type: 'json' };
import relaxation from '../../../schemas/relaxation.schema.json' with { type: 'json' };
import results from '../../../schemas/results.schema.json' with { type: 'json' };
import type { BlockKind } from '../scan/blockHeader.js';

export type JsonSchema = Record<string, unknown>;

export const SCHEMAS: Readonly<Record<BlockKind, JsonSchema>> = {
  material,
  deposition,
  ramp,
  isotherm,
  dsc,
  relaxation,
  results,
};
