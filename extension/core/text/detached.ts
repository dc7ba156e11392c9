/**
 * A copy of a string that keeps nothing else alive. A piece cut from a longer string may share
 * the longer string's memory (V8 keeps the whole parent of a slice of 13 characters or more
 * alive): a block kept across edits would otherwise keep the document of the edit it was read in,
 * one whole document per edited block. Joining makes a new string, which the slice then reads
 * from (the join is flattened into fresh memory before it is sliced).
 */
export function detached(s: string): string {
  return s.length === 0 ? s : (' ' + s).slice(1);
}
