/**
 * Near misses of a known word, for "did you mean": the restricted Damerau–Levenshtein distance
 * (insertions, deletions, substitutions and transpositions of two adjacent characters, each
 * costing 1; F. J. Damerau, "A technique for computer detection and correction of spelling
 * errors", Comm. ACM 7(3), 171–176, 1964), computed only inside the diagonal band |i − j| ≤ limit
 * (E. Ukkonen, "Algorithms for approximate string matching", Information and Control 64,
 * 100–118, 1985), so a comparison costs O(limit · length) and stops as soon as every cell of a row
 * exceeds the limit.
 *
 * Policy: never throws; words longer than MAX_WORD_LENGTH are never near anything (nobody
 * mistypes a 65-character key), so hostile input costs nothing.
 */

const MAX_WORD_LENGTH = 64;

/**
 * The restricted Damerau–Levenshtein distance between a and b when it is at most `limit`,
 * otherwise `limit + 1`. Compares UTF-16 code units, as written (callers fold case if they want).
 */
export function boundedDamerauLevenshtein(a: string, b: string, limit: number): number {
  const over = limit + 1;
  if (a.length > MAX_WORD_LENGTH || b.length > MAX_WORD_LENGTH) return a === b ? 0 : over;
  if (Math.abs(a.length - b.length) > limit) return over;
  if (a === b) return 0;
  const n = b.length;
  // Three rows: i − 2, i − 1, i; cells outside the band hold `over`.
  let prev2 = new Array<number>(n + 1).fill(over);
  let prev = Array.from({ length: n + 1 }, (_, j) => (j <= limit ? j : over));
  let cur = new Array<number>(n + 1).fill(over);
  for (let i = 1; i <= a.length; i++) {
    const lo = Math.max(1, i - limit);
    const hi = Math.min(n, i + limit);
    cur.fill(over);
    cur[0] = i <= limit ? i : over;
    let rowMin = cur[0];
    for (let j = lo; j <= hi; j++) {
      const cost = a.charCodeAt(i - 1) === b.charCodeAt(j - 1) ? 0 : 1;
      let d = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a.charCodeAt(i - 1) === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === b.charCodeAt(j - 1)) {
        d = Math.min(d, prev2[j - 2] + 1);
      }
      cur[j] = Math.min(d, over);
      if (cur[j] < rowMin) rowMin = cur[j];
    }
    if (rowMin > limit) return over;
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return Math.min(prev[n], over);
}

/**
 * Whether `written` abbreviates `name` part by part: both split at `_`, the same number of parts
 * or fewer, each written part a prefix of the name's part (`substrate_temp`, `sub_temp` and
 * `base_press` abbreviate `substrate_temperature` and `base_pressure`). Case is folded.
 */
export function abbreviates(written: string, name: string): boolean {
  if (written.length < 3 || written.length >= name.length || written.length > MAX_WORD_LENGTH) return false;
  const w = written.toLowerCase().split('_');
  const n = name.toLowerCase().split('_');
  if (w.length > n.length) return false;
  for (let i = 0; i < w.length; i++) if (w[i].length === 0 || !n[i].startsWith(w[i])) return false;
  // A shortened last part must still say which name it is: two letters at least.
  return w[w.length - 1].length >= 2 || w.length === n.length;
}

/**
 * The one candidate nearest to a written word: case folded, within `limit` edits, else the one
 * candidate it abbreviates. Null when nothing is near, or when two candidates are equally near
 * (a guess between them would mislead).
 */
export function nearest(written: string, candidates: readonly string[], limit: number): string | null {
  const w = written.toLowerCase();
  let best: string | null = null;
  let bestD = limit + 1;
  let tie = false;
  for (const c of candidates) {
    const d = boundedDamerauLevenshtein(w, c.toLowerCase(), limit);
    if (d < bestD) {
      best = c;
      bestD = d;
      tie = false;
    } else if (d === bestD && d <= limit) {
      tie = true;
    }
  }
  if (best !== null && bestD <= limit) return tie ? null : best;
  const abbreviated = candidates.filter((c) => abbreviates(written, c));
  return abbreviated.length === 1 ? abbreviated[0] : null;
}
