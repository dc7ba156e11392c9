/** The kinds of data block a notebook may hold, and the form of a block id. */
export const BLOCK_KINDS = ['material', 'deposition', 'ramp', 'isotherm', 'dsc', 'relaxation', 'results'] as const;
export type BlockKind = (typeof BLOCK_KINDS)[number];

/** A block id: letters, digits and `. _ : -`, starting with a letter or digit. */
export const ID_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._:-]*$/;
