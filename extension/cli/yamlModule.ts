/**
 * The YAML parser for the command line: loaded the first time a block's metadata needs it, not
 * at every start (flat `key: text` lines, most metadata, are read without it). The build puts this
 * file in the place of `extension/core/parse/yamlModule.ts` (scripts/build.mjs).
 */
import { createRequire } from 'node:module';
import type * as Yaml from 'yaml';

let loaded: typeof Yaml | undefined;

export function yamlModule(): typeof Yaml {
  return (loaded ??= createRequire(import.meta.url)('yaml') as typeof Yaml);
}
