/**
 * The reference for the fence scanner: remark's parser (mdast-util-from-markdown), whose `code`
 * nodes with a fence are what the scanner must find.
 */
import { fromMarkdown } from 'mdast-util-from-markdown';
import { visit } from 'unist-util-visit';
import type { Code } from 'mdast';

export interface OracleBlock {
  start: number;
  end: number;
  lang: string | null;
  meta: string | null;
  value: string;
}

/** Fenced code nodes of a document (indented code has no fence and is skipped). */
export function oracleFencedBlocks(text: string): OracleBlock[] {
  const tree = fromMarkdown(text);
  const out: OracleBlock[] = [];
  visit(tree, 'code', (node: Code) => {
    const start = node.position?.start.offset ?? -1;
    const end = node.position?.end.offset ?? -1;
    const first = text.slice(start, start + 3);
    if (first !== '```' && first !== '~~~') return;
    // Line endings inside the body are normalised to \n, as the scanner's body is.
    out.push({ start, end, lang: node.lang ?? null, meta: node.meta ?? null, value: node.value.replace(/\r\n?/g, '\n') });
  });
  return out;
}
