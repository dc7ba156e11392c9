/**
 * Expectations written into the bad-input corpus: `# expect: CODE` at the end of a line,
 * `# expect-next: CODE` on the line before, `<!-- expect-line N: CODE -->` anywhere.
 * Lines are 1-based.
 */
export interface Expectation {
  readonly line: number;
  readonly code: string;
}

export function readExpectations(text: string): Expectation[] {
  const out: Expectation[] = [];
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  lines.forEach((l, i) => {
    const same = /#\s*expect:\s*([a-z][a-z0-9.-]*)/.exec(l);
    if (same) out.push({ line: i + 1, code: same[1] });
    const next = /^\s*#\s*expect-next:\s*([a-z][a-z0-9.-]*)/.exec(l);
    if (next) out.push({ line: i + 2, code: next[1] });
    for (const m of l.matchAll(/<!--\s*expect-line\s+(\d+):\s*([a-z][a-z0-9.-]*)\s*-->/g)) out.push({ line: Number(m[1]), code: m[2] });
  });
  return out;
}
