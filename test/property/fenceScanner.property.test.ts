import assert from 'node:assert/strict';
import fc from 'fast-check';
import { scanFencedBlocks } from '../../extension/core/scan/fenceScanner.js';
import { BodyLines, BodyMap, ContiguousLines } from '../../extension/core/text/bodyMap.js';
import { LineIndex } from '../../extension/core/text/positions.js';
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

  it('gives each body lines that rebuild it, and maps body offsets as a line-by-line map does', () => {
    fc.assert(
      fc.property(doc, fc.integer({ min: 0, max: 50 }), (text, shift) => {
        for (const b of scanFencedBlocks(text)) {
          const lines = b.bodyLines;
          const rebuilt = Array.from({ length: lines.length }, (_, i) => ' '.repeat(lines.pad(i)) + text.slice(lines.start(i), lines.end(i))).join('\n');
          assert.equal(rebuilt, b.body);
          if (lines instanceof ContiguousLines) {
            // The index taken from the scanner is the one the body's own text gives.
            const own = new LineIndex(b.body);
            assert.equal(lines.index.lineCount, own.lineCount);
            for (let i = 0; i < own.lineCount; i++) assert.deepEqual([lines.index.lineStart(i), lines.index.lineEnd(i)], [own.lineStart(i), own.lineEnd(i)]);
          }
          // The general map, line by line, over the same lines in the scanner's packed store.
          const store = new BodyLines();
          for (let i = 0; i < lines.length; i++) store.push(lines.start(i), lines.end(i), lines.pad(i));
          const general = new BodyMap(store, b.infoSpan.end, shift);
          const map = new BodyMap(lines, b.infoSpan.end, shift);
          for (let off = -1; off <= b.body.length + 1; off++) assert.equal(map.toDocument(off), general.toDocument(off), `offset ${off}`);
          for (let i = -1; i <= lines.length; i++) assert.deepEqual(map.lineSpan(i), general.lineSpan(i));
          assert.equal(map.lineCount, general.lineCount);
        }
      }),
      { numRuns: Number(process.env.RUNS ?? 2000), seed: Number(process.env.SEED ?? 20261202) },
    );
  });
});
