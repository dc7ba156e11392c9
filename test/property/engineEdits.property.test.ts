import assert from 'node:assert/strict';
import fc from 'fast-check';
import { Notebook, type DataFileFailure, type DataFileRead, type NotebookHost } from '../../extension/core/index.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';
import { propertyOptions } from '../support/propertyOptions.js';

// A warm engine that has seen any sequence of edits must report exactly what a fresh engine
// reports on the final texts: the caches may save work, never change an answer.

type Content = string | DataFileFailure;

class MapHost implements NotebookHost {
  constructor(private readonly files: ReadonlyMap<string, Content>) {}
  readDataFile(path: string): DataFileRead {
    const c = this.files.get(path);
    if (c === undefined) return { ok: false, reason: 'missing' };
    return typeof c === 'string' ? { ok: true, text: c } : c;
  }
}

function cooling(n: number, tg: number): number[][] {
  return Array.from({ length: n }, (_, i) => {
    const T = tg + 40 - (i * 80) / (n - 1);
    return [T, T > tg ? 100 * (1 + 8e-4 * (T - tg)) : 100 * (1 + 2e-4 * (T - tg))];
  });
}
const csvOf = (tg: number) => 'T/K, h/nm\n' + cooling(30, tg).map((r) => r.map((v) => v.toFixed(4)).join(', ')).join('\n') + '\n';

const PIECES = [
  MATERIAL_BLOCK(315, 'vft:\n  log10_tau0: -14\n  B: 1100 K\n  T0: 250 K\n'),
  DEPOSITION_BLOCK('D-1', 280),
  DEPOSITION_BLOCK('D-2', 290),
  tableBlock('ramp', 'R-1', 'film: D-1\nrate: 10 K/min\ndirection: cooling\n', 'T/K, h/nm', cooling(30, 314)),
  '```ramp R-2\nfilm: D-2\nrate: 10 K/min\ndirection: cooling\ndata: data/a.csv\n```\n',
  '```ramp R-3\nfilm: D-1\nrate: 1 K/min\ndirection: cooling\ndata: data/b.csv\n```\n',
  '  ```deposition D-3\n  material: M-1\n  substrate_temperature: 270 K\n  rate: 0.1 nm/s\n  duration: 100 s\n  ```\n',
  '```results\nof: D-1\ninputs: "0000"\ntsub_over_tg: 0.9\n```\n',
  '> ```material M-2\n> name: other glass\n> tg: 330 K\n> ```\n',
  'Some prose about the day.\n',
  '# A heading\n',
  // A substrate temperature resolved through the material's tg, and a near miss of a kind.
  '```deposition D-4\nmaterial: M-1\nsubstrate_temperature: 0.9 Tg\nrate: 0.1 nm/s\nduration: 100 s\n```\n',
  '```Deposition D-5\nmaterial: M-1\n```\n',
  // The same block text in a list item and directly in the document (the same text key).
  '- a list item\n\n  ```material M-3\n  name: listed glass\n  ```\n',
  '  ```material M-3\n  name: listed glass\n  ```\n',
];
const DATA: Content[] = [csvOf(312), csvOf(318), 'T/K, h/nm\n300, x\n', { ok: false, reason: 'unreadable', detail: 'permission denied' }, { ok: false, reason: 'too-large', size: 1e9 }];
const FILES = ['a.md', 'b.md', 'days/c.md'];
const DATA_PATHS = ['data/a.csv', 'data/b.csv'];

type Op =
  | { readonly t: 'insert'; readonly file: number; readonly at: number; readonly piece: number }
  | { readonly t: 'remove'; readonly file: number; readonly at: number }
  | { readonly t: 'move'; readonly from: number; readonly at: number; readonly to: number; readonly at2: number }
  | { readonly t: 'char'; readonly file: number; readonly at: number; readonly ch: string }
  | { readonly t: 'data'; readonly path: number; readonly content: number }
  | { readonly t: 'drop'; readonly path: number }
  | { readonly t: 'deleteFile'; readonly file: number }
  | { readonly t: 'analyze' };

const nat = fc.nat({ max: 1000 });
const op: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ t: fc.constant('insert' as const), file: fc.nat({ max: 2 }), at: nat, piece: fc.nat({ max: PIECES.length - 1 }) }),
  fc.record({ t: fc.constant('remove' as const), file: fc.nat({ max: 2 }), at: nat }),
  fc.record({ t: fc.constant('move' as const), from: fc.nat({ max: 2 }), at: nat, to: fc.nat({ max: 2 }), at2: nat }),
  fc.record({ t: fc.constant('char' as const), file: fc.nat({ max: 2 }), at: nat, ch: fc.constantFrom('', '`', '\n', ' ', '1', 'x', ':', '-', '  ') }),
  fc.record({ t: fc.constant('data' as const), path: fc.nat({ max: 1 }), content: fc.nat({ max: DATA.length - 1 }) }),
  fc.record({ t: fc.constant('drop' as const), path: fc.nat({ max: 1 }) }),
  fc.record({ t: fc.constant('deleteFile' as const), file: fc.nat({ max: 2 }) }),
  fc.constant({ t: 'analyze' as const }),
);

describe('the engine after random edits', () => {
  it('reports exactly what a fresh engine reports on the final texts', () => {
    fc.assert(
      fc.property(fc.array(op, { maxLength: 25 }), (ops) => {
        // Each file is a list of pieces, flattened to text; 'char' edits the flattened text.
        const files: Array<string[] | null> = [[PIECES[0], PIECES[1]], [PIECES[3], PIECES[9]], [PIECES[4]]];
        const data = new Map<string, Content>([[DATA_PATHS[0], DATA[0]]]);
        // The host is a live view of the files, as a disk is; pushes tell the engine what changed.
        const warm = new Notebook(new MapHost(data));
        const textOf = (i: number) => (files[i] ?? []).join('\n');
        const push = (i: number) => (files[i] === null ? warm.deleteFile(FILES[i]) : warm.setFile(FILES[i], textOf(i)));
        files.forEach((_, i) => push(i));
        for (const o of ops) {
          if (o.t === 'insert' || o.t === 'remove' || o.t === 'char') {
            const list = (files[o.file] ??= []);
            if (o.t === 'insert') list.splice(o.at % (list.length + 1), 0, PIECES[o.piece]);
            else if (o.t === 'remove' && list.length > 0) list.splice(o.at % list.length, 1);
            else if (o.t === 'char') {
              const text = list.join('\n');
              const i = o.at % (text.length + 1);
              files[o.file] = [text.slice(0, i) + o.ch + text.slice(i + (o.ch === '' ? 1 : 0))];
            }
            push(o.file);
          } else if (o.t === 'move') {
            const from = files[o.from] ?? [];
            if (from.length === 0) continue;
            const [piece] = from.splice(o.at % from.length, 1);
            const to = (files[o.to] ??= []);
            to.splice(o.at2 % (to.length + 1), 0, piece);
            push(o.from);
            push(o.to);
          } else if (o.t === 'data') {
            data.set(DATA_PATHS[o.path], DATA[o.content]);
            warm.setDataFile(DATA_PATHS[o.path], DATA[o.content]);
          } else if (o.t === 'drop') {
            data.delete(DATA_PATHS[o.path]);
            warm.deleteDataFile(DATA_PATHS[o.path]);
          } else if (o.t === 'deleteFile') {
            files[o.file] = null;
            push(o.file);
          } else {
            warm.analyze();
          }
        }
        const cold = new Notebook(new MapHost(data));
        files.forEach((f, i) => f !== null && cold.setFile(FILES[i], textOf(i)));
        assert.deepEqual(warm.analyze(), cold.analyze());
        const id = 'D-1';
        assert.equal(warm.inputsHashOf(id), cold.inputsHashOf(id));
      }),
      propertyOptions(150, 11),
    );
  });
});

// Typing: single characters inserted or deleted anywhere in a notebook that holds the structures
// that can swallow or release a fence (HTML blocks, lists, quotes, indented code, blank lines).
const RICH = [
  '# Day',
  '',
  'Some prose before the first block.',
  MATERIAL_BLOCK(315),
  '<div>',
  'html text',
  '```deposition D-9',
  'material: M-1',
  '```',
  '</div>',
  '',
  '- a list item',
  '  more text',
  '',
  '  ```deposition D-1',
  '  material: M-1',
  '  substrate_temperature: 280 K',
  '  rate: 0.2 nm/s',
  '  duration: 100 s',
  '  ```',
  '',
  '> a quote',
  '> ```deposition D-2',
  '> material: M-1',
  '> ```',
  '',
  '    indented code',
  '',
  '<!-- a comment',
  'still comment',
  '-->',
  '',
  tableBlock('ramp', 'R-1', 'film: D-1\nrate: 10 K/min\ndirection: cooling\n', 'T/K, h/nm', cooling(12, 314)),
  'Closing prose.',
].join('\n');

describe('the engine while typing', () => {
  it('keeps a fence that a short setext underline or a tab-indented heading ends up swallowing', () => {
    // Found by comparing warm and fresh engines: "=x" → "=" underlines the paragraph above, and
    // " \t#x" → " \t# x" is a heading; either lets the HTML line below swallow the fence.
    for (const [before, after] of [
      ['Para\n=x\n<x-y>\n', 'Para\n=\n<x-y>\n'],
      ['- item\n \t#x\n<x-y>\n', '- item\n \t# x\n<x-y>\n'],
    ]) {
      const warm = new Notebook(new MapHost(new Map()));
      warm.setFile('n.md', before + MATERIAL_BLOCK(315));
      warm.analyze();
      warm.setFile('n.md', after + MATERIAL_BLOCK(315));
      const cold = new Notebook(new MapHost(new Map()));
      cold.setFile('n.md', after + MATERIAL_BLOCK(315));
      assert.deepEqual(warm.analyze(), cold.analyze());
    }
  });

  it('reports after every keystroke what a fresh engine reports', () => {
    const keystroke = fc.record({ at: fc.nat({ max: 5000 }), ch: fc.constantFrom('', 'a', ' ', '\n', '`', '~', '<', '>', '-', '#', '1', ':', '\t', '=', '[', ']') });
    fc.assert(
      fc.property(fc.array(keystroke, { minLength: 1, maxLength: 30 }), (keys) => {
        const warm = new Notebook(new MapHost(new Map()));
        let text = RICH;
        warm.setFile('n.md', text);
        warm.analyze();
        for (const k of keys) {
          const i = k.at % (text.length + 1);
          text = text.slice(0, i) + k.ch + text.slice(i + (k.ch === '' ? 1 : 0));
          warm.setFile('n.md', text);
        }
        const cold = new Notebook(new MapHost(new Map()));
        cold.setFile('n.md', text);
        assert.deepEqual(warm.analyze(), cold.analyze());
      }),
      propertyOptions(300, 13),
    );
  });
});
