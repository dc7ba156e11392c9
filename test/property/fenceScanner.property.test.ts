import assert from 'node:assert/strict';
import fc from 'fast-check';
import { scanFencedBlocks } from '../../extension/core/scan/fenceScanner.js';
import { oracleFencedBlocks } from '../support/commonmarkOracle.js';

// Lines that exercise the block structure around fences: containers, fences of both kinds and
// lengths, indentation with spaces and tabs, HTML, paragraphs, blank lines.
const piece = fc.constantFrom(
  '```', '````', '~~~', '```ramp R-1', '~~~~ material M', '``` a `b`', '   ```', '    ```',
  '> ', '>', '> > ', '- ', '* ', '1. ', '2) ', '  ', '   ', '\t', ' \t',
  'text', 'film: D-1', 'T/K, h/nm', '---', '===', '# head', '<div>', '</div>', '<!--', '-->',
  '', 'a\\`b', '&amp;', '\u00e9\u{1F600}',
);
const line = fc.array(piece, { minLength: 0, maxLength: 4 }).map((parts) => parts.join(''));
// One line-ending convention per document, as files have (remark's body values differ from the
// specification's line model only for mixed "\n\r" sequences).
const ending = fc.constantFrom('\n', '\n', '\n', '\r\n', '\r');
const doc = fc
  .tuple(fc.array(line, { minLength: 0, maxLength: 14 }), ending, fc.boolean())
  .map(([ls, e, last]) => ls.join(e) + (last && ls.length > 0 ? e : ''));

function mine(text: string) {
  return scanFencedBlocks(text).map((b) => ({ start: b.span.start, end: b.span.end, lang: b.lang, meta: b.meta, value: b.body }));
}

describe('scanFencedBlocks on generated documents', () => {
  it('finds the same fenced blocks as remark, with the same positions, lang, meta and body', () => {
    fc.assert(
      fc.property(doc, (text) => {
        assert.deepEqual(mine(text), oracleFencedBlocks(text));
      }),
      { numRuns: Number(process.env.RUNS ?? 3000), seed: Number(process.env.SEED ?? 20261202) },
    );
  });
});
