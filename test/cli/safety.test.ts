import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { runCli } from '../../extension/cli/main.js';
import { MAX_NOTEBOOK_FILE_BYTES } from '../../extension/core/index.js';
import { writeReport } from '../../extension/cli/report.js';
import { markdownFiles } from '../../extension/node/discovery.js';
import { loadRoot } from '../../extension/node/notebookRoots.js';
import { renderSvg } from '../../extension/node/renderSvg.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

/** A character a terminal would obey rather than show. */
// eslint-disable-next-line no-control-regex -- these are the characters to find
const RAW_CONTROL = /[\0-\x09\x0b-\x1f\x7f-\x9f\u202e]/;

/** Runs the CLI in-process from a folder and collects what it prints. */
async function runIn(cwd: string, args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await runCli(args, { out: (t) => (out += t), err: (t) => (err += t), cwd });
  return { code, out, err };
}

/** A ramp of 40 rows heating then cooling through a transition at 315 K (a two-line model). */
function rampBlock(id: string): string {
  const rows: number[][] = [];
  const h = (T: number): number => 400 * (1 + 2e-4 * (T - 315) + (T > 315 ? 6e-4 * (T - 315) : 0));
  for (let T = 290; T <= 340; T += 2) rows.push([T, h(T)]);
  for (let T = 340; T >= 290; T -= 2) rows.push([T, h(T)]);
  return tableBlock('ramp', id, 'film: D-1\nrate: 10 K/min\n', 'T/K, h/nm', rows);
}

const NOTEBOOK = MATERIAL_BLOCK(315) + DEPOSITION_BLOCK('D-1', 260) + rampBlock('R-1');

describe('vitrine CLI: inputs and outputs that must not surprise', function () {
  this.timeout(120000);
  let tmp = '';
  let nb = '';
  beforeEach(() => {
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'vitrine-safety-'));
    nb = path.join(tmp, 'nb');
    fs.mkdirSync(nb);
    fs.writeFileSync(path.join(nb, 'day.md'), NOTEBOOK);
  });
  afterEach(() => {
    fs.rmSync(tmp, { recursive: true, force: true });
  });

  describe('control characters', () => {
    it('check shows ESC, CR, BEL and NUL from key names, paths and cells escaped', async () => {
      fs.writeFileSync(path.join(nb, 'x\x1b[2Jy.md'), '```deposition D-2\nmaterial: M-1\nsub\x1b]0;title\x07strate: 1\r\nrate: 0.2 nm/s\n```\n');
      fs.writeFileSync(path.join(nb, 'cells.md'), '```ramp R-9\nfilm: D-1\nrate: 10 K/min\n---\nT/K, h/nm\n300, 1\x1b[8m\n301, \0\n```\n');
      const r = await runIn(tmp, ['check', 'nb']);
      assert.doesNotMatch(r.out + r.err, RAW_CONTROL, 'no raw control character reaches the terminal');
      assert.match(r.out, /nb\/x\\x1b\[2Jy\.md:/);
      assert.match(r.out, /"sub\\x1b\]0;title\\x07strate" is not a deposition key/);
      assert.match(r.out, /"1\\x1b\[8m" in column "h\/nm" is not a number/);
    });

    it('analyze --json stays valid JSON with the control characters escaped', async () => {
      fs.writeFileSync(path.join(nb, 'k.md'), '```deposition D-2\nmaterial: M-1\nk\x9b31m\u202Eey: 1\n```\n');
      const r = await runIn(tmp, ['analyze', 'nb', '--json']);
      assert.doesNotMatch(r.out, RAW_CONTROL);
      const json = JSON.parse(r.out);
      const k = json.files.find((f: { path: string }) => f.path === 'k.md');
      assert.ok(k.blocks[0].diagnostics.some((d: { message: string }) => d.message.includes('k\x9b31m\u202Eey')));
    });
  });

  describe('report outputs', () => {
    const before = (): string => fs.readFileSync(path.join(nb, 'day.md'), 'utf8');

    it('refuses -o or --csv on a markdown file of the notebook, and leaves it as it was', async () => {
      for (const args of [['-o', 'nb/day.md'], ['-o', 'out.html', '--csv', 'nb/day.md'], ['-o', 'nb/new.MD']]) {
        const r = await runIn(tmp, ['report', 'nb', ...args]);
        assert.equal(r.code, 2, args.join(' '));
        assert.match(r.err, /never writes over notebook files/);
        assert.equal(before(), NOTEBOOK);
      }
      assert.deepEqual(fs.readdirSync(nb).sort(), ['day.md']);
      assert.ok(!fs.existsSync(path.join(tmp, 'out.html')), 'nothing else was written either');
    });

    it('refuses a symbolic link at an output path and does not follow it', async () => {
      const target = path.join(tmp, 'target.txt');
      fs.writeFileSync(target, 'keep me');
      fs.symlinkSync(target, path.join(tmp, 'link.html'));
      fs.symlinkSync(path.join(tmp, 'nowhere.csv'), path.join(tmp, 'dangling.csv'));
      for (const args of [['-o', 'link.html'], ['-o', 'out.html', '--csv', 'dangling.csv']]) {
        const r = await runIn(tmp, ['report', 'nb', ...args]);
        assert.equal(r.code, 2, args.join(' '));
        assert.match(r.err, /is a symbolic link/);
      }
      assert.equal(fs.readFileSync(target, 'utf8'), 'keep me');
      assert.ok(!fs.existsSync(path.join(tmp, 'nowhere.csv')));
    });

    it('refuses -o equal to --csv', async () => {
      const r = await runIn(tmp, ['report', 'nb', '-o', 'same.html', '--csv', './same.html']);
      assert.equal(r.code, 2);
      assert.match(r.err, /-o and --csv name the same file/);
      assert.ok(!fs.existsSync(path.join(tmp, 'same.html')));
    });

    it('writes nothing at all when --png cannot be written', async () => {
      fs.writeFileSync(path.join(tmp, 'a-file'), '');
      const r = await runIn(tmp, ['report', 'nb', '-o', 'out.html', '--csv', 'out.csv', '--png', 'a-file/png']);
      assert.equal(r.code, 2);
      assert.doesNotMatch(r.err, /internal error/);
      assert.match(r.err, /a part of the path is not a folder/);
      assert.deepEqual(fs.readdirSync(tmp).sort(), ['a-file', 'nb']);
    });

    it('removes its temporary files and replaces nothing when a write fails half-way', async () => {
      fs.writeFileSync(path.join(tmp, 'out.html'), 'the old report');
      const png = path.join(tmp, 'png');
      fs.mkdirSync(png);
      // A folder where the temporary file of the ramp's PNG would go: that write fails.
      for (let i = 0; i < 8; i++) fs.mkdirSync(path.join(png, `.ramp-R-1.png.${process.pid}.${i}.tmp`));
      const r = await runIn(tmp, ['report', 'nb', '-o', 'out.html', '--csv', 'out.csv', '--png', 'png']);
      assert.equal(r.code, 2, r.err);
      assert.match(r.err, /nothing was written/);
      assert.equal(fs.readFileSync(path.join(tmp, 'out.html'), 'utf8'), 'the old report');
      assert.ok(!fs.existsSync(path.join(tmp, 'out.csv')));
      assert.deepEqual(fs.readdirSync(tmp).sort(), ['nb', 'out.html', 'png']);
      assert.ok(fs.readdirSync(png).every((n) => n.startsWith('.ramp-R-1.png.')), 'no PNG and no other temporary file left');
    });

    it('replaces an existing report in one step and leaves no temporary file', async () => {
      fs.writeFileSync(path.join(tmp, 'out.html'), 'the old report');
      const r = await runIn(tmp, ['report', 'nb', '-o', 'out.html', '--csv', 'out.csv']);
      assert.equal(r.code, 0, r.err);
      assert.match(fs.readFileSync(path.join(tmp, 'out.html'), 'utf8'), /^<!doctype html>/);
      assert.deepEqual(fs.readdirSync(tmp).sort(), ['nb', 'out.csv', 'out.html']);
    });

    it('gives the charts of ids R:1 and R_1 different PNG files', async () => {
      fs.writeFileSync(path.join(nb, 'day.md'), NOTEBOOK.replace('ramp R-1', 'ramp R:1') + rampBlock('R_1') + rampBlock('r_1'));
      const r = await runIn(tmp, ['report', 'nb', '-o', 'out.html', '--png', 'png']);
      assert.equal(r.code, 0, r.err);
      const names = fs.readdirSync(path.join(tmp, 'png')).filter((n) => n.startsWith('ramp-'));
      assert.equal(names.length, 3, names.join(' '));
      assert.equal(new Set(names.map((n) => n.toLowerCase())).size, 3, 'distinct even where case is ignored');
      assert.ok(names.includes('ramp-R_1.png'));
    });
  });

  describe('a chart that cannot be drawn', () => {
    it('is replaced by a short message in its card; the report is still written, with no stack trace', async () => {
      // A drawing library that fails on one chart (as it may on data no axis can be laid out over).
      fs.writeFileSync(path.join(nb, 'tiny.md'), rampBlock('R-tiny'));
      const draw: typeof renderSvg = async (spec, options) => {
        if (JSON.stringify(spec).includes('R-tiny')) throw new RangeError('no axis can be laid out over this data');
        return renderSvg(spec, options);
      };
      const run = loadRoot(nb, null);
      const written = await writeReport([run], { output: path.join(tmp, 'out.html'), title: 'nb', roots: [nb], draw });
      assert.ok(written.warnings.some((w) => /the chart of ramp R-tiny \(tiny\.md\) could not be drawn: no axis/.test(w)), written.warnings.join('\n'));
      const html = fs.readFileSync(path.join(tmp, 'out.html'), 'utf8');
      const card = html.slice(html.indexOf('<span class="kind">ramp</span><span class="id">R-tiny'));
      assert.match(card.slice(0, card.indexOf('</section>')), /<p class="stand-in">This chart could not be drawn/);
      assert.match(html, /<span class="kind">ramp<\/span><span class="id">R-1<[\s\S]*?<svg /, 'the other charts are drawn');
    });
  });

  describe('reading notebook files', () => {
    it('reads UTF-16 notebooks (little- and big-endian, with BOM) and a doubled BOM', async () => {
      const le = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(MATERIAL_BLOCK(315).replace('M-1', 'M-le'), 'utf16le')]);
      const be = Buffer.from(Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(MATERIAL_BLOCK(315).replace('M-1', 'M-be'), 'utf16le')]).swap16());
      fs.writeFileSync(path.join(nb, 'le.md'), le);
      fs.writeFileSync(path.join(nb, 'be.md'), be);
      fs.writeFileSync(path.join(nb, 'bom2.md'), '\uFEFF\uFEFF' + MATERIAL_BLOCK(315).replace('M-1', 'M-bom'));
      const r = await runIn(tmp, ['analyze', 'nb', '--json']);
      const ids = JSON.parse(r.out).files.flatMap((f: { blocks: Array<{ id: string }> }) => f.blocks.map((b) => b.id));
      for (const id of ['M-le', 'M-be', 'M-bom']) assert.ok(ids.includes(id), `${id} in ${ids.join(' ')}`);
    });

    it('reads an explicit .txt file and a symbolic link that stays inside the root', async () => {
      fs.writeFileSync(path.join(nb, 'notes.txt'), MATERIAL_BLOCK(315).replace('M-1', 'M-txt'));
      fs.symlinkSync('day.md', path.join(nb, 'alias.md'));
      const txt = await runIn(tmp, ['check', 'nb/notes.txt']);
      assert.match(txt.out, /^1 file, 1 data block/m);
      const link = await runIn(tmp, ['check', 'nb/alias.md']);
      assert.match(link.out, /^1 file, 3 data blocks/m);
    });

    it('refuses a symbolic link that leads outside the root, and a FIFO, with a usage error', async function () {
      fs.writeFileSync(path.join(tmp, 'outside.md'), MATERIAL_BLOCK(315));
      fs.symlinkSync('../outside.md', path.join(nb, 'out.md'));
      const link = await runIn(tmp, ['check', 'nb/out.md']);
      assert.equal(link.code, 2);
      assert.match(link.err, /symbolic link that leads outside/);
      if (spawnSync('mkfifo', [path.join(nb, 'pipe.md')]).status !== 0) this.skip();
      const fifo = await runIn(tmp, ['check', 'nb/pipe.md']);
      assert.equal(fifo.code, 2);
      assert.match(fifo.err, /nb\/pipe\.md is a FIFO, not a notebook file or folder/);
      const all = await runIn(tmp, ['check', 'nb']);
      assert.equal(all.code, 0, 'a FIFO found in the folder is not read (and does not block)');
    });

    it('refuses a notebook file larger than the limit, unread, with file.too-large', async () => {
      const big = path.join(nb, 'big.md');
      fs.writeFileSync(big, '');
      fs.truncateSync(big, MAX_NOTEBOOK_FILE_BYTES + 1);
      const r = await runIn(tmp, ['check', 'nb']);
      assert.equal(r.code, 1);
      assert.match(r.out, /^nb\/big\.md:1:1: error: The notebook file is 16\.8 MB, more than the 16 MiB Vitrine reads; it was not read\. .*\[file\.too-large\]$/m);
    });

    it('says which tool folders were skipped, once, on standard error', async () => {
      for (const d of ['.git', 'node_modules', 'sub/.cache']) {
        fs.mkdirSync(path.join(nb, d), { recursive: true });
        fs.writeFileSync(path.join(nb, d, 'x.md'), '# not a notebook file\n');
      }
      const skipped: string[] = [];
      assert.deepEqual(markdownFiles(nb, skipped), ['day.md']);
      assert.deepEqual(skipped, ['.git', 'node_modules', 'sub/.cache']);
      const r = await runIn(tmp, ['check', 'nb']);
      assert.equal(r.code, 0);
      assert.equal(r.err, 'vitrine: skipped .git, node_modules, sub/.cache (hidden folders and node_modules are not searched for notebooks)\n');
      assert.match(r.out, /^1 file, 3 data blocks/m);
    });

    it('says that a name is too long rather than that it does not exist', async () => {
      const long = 'x'.repeat(300);
      fs.writeFileSync(path.join(nb, 'long.md'), `\`\`\`ramp R-2\nfilm: D-1\nrate: 10 K/min\ndata: ${long}.csv\n\`\`\`\n`);
      const r = await runIn(tmp, ['check', 'nb']);
      assert.match(r.out, /long\.md:4:7: error: The data file "x+\.csv" cannot be read: the name is too long for the file system\. \[data\.unreadable\]/);
      const arg = await runIn(tmp, ['check', `nb/${long}.md`]);
      assert.equal(arg.code, 2);
      assert.match(arg.err, /the name is too long/);
    });

    it('reads a root-level data file named ..x.csv', async () => {
      const rows = Array.from({ length: 12 }, (_, i) => `${300 + i}, ${100 + 0.1 * i}`).join('\n');
      fs.writeFileSync(path.join(nb, '..x.csv'), `T/K, h/nm\n${rows}\n`);
      fs.writeFileSync(path.join(nb, 'dots.md'), '```ramp R-2\nfilm: D-1\nrate: 10 K/min\ndata: ..x.csv\n```\n');
      const r = await runIn(tmp, ['check', 'nb']);
      assert.doesNotMatch(r.out, /dots\.md:.*\[data\./);
    });

    it('calls a failure to write what it is, not an internal error', async () => {
      fs.writeFileSync(path.join(tmp, 'a-file'), '');
      const r = await runIn(tmp, ['report', 'nb', '-o', 'a-file/out.html']);
      assert.equal(r.code, 2);
      assert.doesNotMatch(r.err, /internal error/);
      assert.match(r.err, /a-file\/out\.html: a part of the path is not a folder/);
    });
  });
});
