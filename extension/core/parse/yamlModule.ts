/**
 * The YAML parser (the `yaml` package), as the metadata reader gets it. Bundled here; the command
 * line's build puts `extension/cli/yamlModule.ts` in its place, which loads the package the first
 * time a block's metadata needs it (flat `key: text` lines, most metadata, are read without it).
 */
import * as yaml from 'yaml';

export function yamlModule(): typeof yaml {
  return yaml;
}
