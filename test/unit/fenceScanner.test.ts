import assert from 'node:assert/strict';
import spec from 'commonmark-spec';
import { scanFencedBlocks } from '../../extension/core/scan/fenceScanner.js';
import { oracleFencedBlocks } from '../support/commonmarkOracle.js';

interface SpecExample {
  markdown: string;
  number: number;
  section: string;
}

function mine(text: string) {
  return scanFencedBlocks(text).map((b) => ({ start: b.span.start, end: b.span.end, lang: b.lang, meta: b.meta, value: b.body }));
}

describe('scanFencedBlocks', () => {
  // Source: the CommonMark 0.31.2 specification's examples (npm commonmark-spec), with remark's
  // parser (mdast-util-from-markdown) as the oracle for which fenced code blocks exist.
  describe('agrees with remark on every CommonMark specification example', () => {
    const examples = (spec as unknown as { tests: SpecExample[] }).tests;
    it('has the whole specification', () => assert.ok(examples.length >= 650));
    for (const ex of examples) {
      it(`example ${ex.number} (${ex.section})`, () => {
        const md = ex.markdown.replace(/→/g, '\t');
        assert.deepEqual(mine(md), oracleFencedBlocks(md));
      });
    }
  });

  // Shapes from the pathological-input tests of the CommonMark reference implementation (cmark,
  // test/pathological_tests.py: "nested block quotes", "deeply nested lists"), small enough for
  // remark and with a fence to find: the scanner remembers what it has seen on a line (the next
  // non-space character, a thematic break, the containers a blank line continues) and must still
  // agree with remark. Their cost at full size is in linearCost.test.ts.
  describe('agrees with remark on deeply nested containers', () => {
    const cases: Record<string, string> = {
      'list markers on one line': '- '.repeat(300) + '```ramp R-1\n' + ' \n'.repeat(3) + '```\n',
      'block-quote markers on one line': '> '.repeat(300) + '```ramp R-1\n' + '> '.repeat(300) + 'x\n',
      'ordered markers on one line': '1. '.repeat(200) + '```\n\n' + ' '.repeat(600) + 'x\n',
      'nested list, one item per line': Array.from({ length: 60 }, (_, i) => '  '.repeat(i) + '* a\n').join('') + '  '.repeat(60) + '```\n' + '  '.repeat(60) + 'x\n',
      'blank lines with spaces and tabs after a deep list': '- '.repeat(50) + '```\n' + ['', ' ', '   \t', '\t\t\t', ' '.repeat(120)].join('\n') + '\n```\n',
      'blank lines after a deep list with an empty item': '- '.repeat(40) + '-\n\n```\n\n',
      'block quotes and lists mixed': '> - '.repeat(80) + '```\n\n' + '> - '.repeat(80) + '~~~\n',
      'a long run of list markers, thematic break after it': '- '.repeat(200) + '-\n```\n',
      'a paragraph interrupted by many list markers': 'para\n' + '- '.repeat(200) + '```\n',
    };
    for (const [name, text] of Object.entries(cases)) {
      it(name, () => assert.deepEqual(mine(text), oracleFencedBlocks(text)));
    }
  });

  it('opens no backtick fence when a backtick follows a U+2028 in the info string, as remark', () => {
    const text = '```ramp R-1 \u2028`x\n```\n';
    assert.deepEqual(mine(text), oracleFencedBlocks(text));
    assert.equal(scanFencedBlocks(text)[0]?.span.start, 16);
  });

  it('finds a data block with its info string split into lang and meta', () => {
    const [b] = scanFencedBlocks('text\n\n```deposition D-17\nmaterial: x\n```\n');
    assert.equal(b.lang, 'deposition');
    assert.equal(b.meta, 'D-17');
    assert.equal(b.body, 'material: x');
    assert.equal(b.closed, true);
  });

  it('takes the body of a fence in the document as remark does, whatever runs of fence characters it holds', () => {
    // Lines that look like a closing fence and are not, and ones that are.
    const bodies = [
      'a\n    ```\nb\n   ```\nafter\n',
      'a ```\n``` b\n`````\nafter\n',
      'x\n```\n  ```  \nafter\n',
      '\t```\n ``\n```\t\nafter',
      'one\ntwo\nthree',
      'one\n```',
      '\n\n```\n',
    ];
    for (const body of bodies) {
      for (const open of ['```ramp R-1\n', '````ramp R-1\n', '~~~ramp R-1\n', ' ```ramp R-1\n', '> ```ramp R-1\n']) {
        const text = `text\n\n${open}${body}`;
        assert.deepEqual(mine(text), oracleFencedBlocks(text), JSON.stringify(text));
      }
    }
  });

  it('handles CRLF line ends', () => {
    const text = '```ramp R-1\r\nfilm: D-1\r\n---\r\nT/K, h/nm\r\n```\r\n';
    assert.deepEqual(mine(text), oracleFencedBlocks(text));
    assert.equal(scanFencedBlocks(text)[0].body, 'film: D-1\n---\nT/K, h/nm');
  });

  it('handles a lone CR as a line end (CommonMark)', () => {
    const text = '~~~ material M\rname: x\r~~~\r';
    assert.deepEqual(mine(text), oracleFencedBlocks(text));
  });

  it('maps body lines back to source offsets inside a block quote', () => {
    const text = '> ```material M-1\n> name: x\n> tg: 300 K\n> ```\n';
    const [b] = scanFencedBlocks(text);
    assert.equal(b.body, 'name: x\ntg: 300 K');
    assert.equal(text.slice(b.bodyLines.start(1), b.bodyLines.end(1)), 'tg: 300 K');
  });

  it('keeps a fence inside a list item, indented body removed', () => {
    const text = '1. a step\n\n   ```deposition D-2\n   rate: 1 nm/s\n   ```\n';
    assert.deepEqual(mine(text), oracleFencedBlocks(text));
    assert.equal(scanFencedBlocks(text)[0].body, 'rate: 1 nm/s');
  });

  it('runs an unclosed fence to the end of the document', () => {
    const text = '```material M\nname: x\n\nmore\n';
    const [b] = scanFencedBlocks(text);
    assert.equal(b.closed, false);
    assert.equal(b.span.end, text.length);
    assert.deepEqual(mine(text), oracleFencedBlocks(text));
  });

  it('does not see fences in indented code or HTML blocks', () => {
    assert.equal(scanFencedBlocks('    ```material M\n    name: x\n    ```\n').length, 0);
    assert.equal(scanFencedBlocks('<div>\n```material M\nname: x\n```\n</div>\n').length, 0);
  });

  it('returns nothing for an empty document', () => {
    assert.deepEqual(scanFencedBlocks(''), []);
  });
});
