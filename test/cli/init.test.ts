import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { runCli } from '../../extension/cli/main.js';

async function cli(args: string[], cwd: string): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await runCli(args, { out: (t) => (out += t), err: (t) => (err += t), cwd });
  return { code, out, err };
}

describe('vitrine init', () => {
  let dir: string;
  beforeEach(() => (dir = fs.mkdtempSync(path.join(os.tmpdir(), 'vitrine-init-'))));
  afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

  it('writes a starting notebook that passes check with figures for its film', async () => {
    const r = await cli(['init', 'lab'], dir);
    assert.equal(r.code, 0, r.err);
    assert.match(r.out, /wrote lab\/notebook\.md/);
    assert.ok(fs.existsSync(path.join(dir, 'lab', 'data', 'F-01-cycle.csv')));
    const check = await cli(['check', 'lab', '--summary'], dir);
    assert.equal(check.code, 0, check.out);
    assert.match(check.out, /3 data blocks: 0 errors/);
    const json = await cli(['analyze', 'lab', '--json'], dir);
    const ramp = JSON.parse(json.out).files[0].blocks.find((b: { kind: string }) => b.kind === 'ramp');
    // The synthetic cycle is built with Tg = 315 K (the rounded corner of the liquid-cooled line) and
    // a density gain of 1 % at Tsub: the two-line picture (common practice, no source).
    assert.ok(Math.abs(ramp.results.tg.value - 315) < 2, `Tg ${ramp.results.tg.value}`);
    assert.ok(Math.abs(ramp.results.density_gain.value - 1) < 0.1, `gain ${ramp.results.density_gain.value}`);
  });

  it('writes into the current folder by default, and never over an existing file', async () => {
    assert.equal((await cli(['init'], dir)).code, 0);
    const before = fs.readFileSync(path.join(dir, 'notebook.md'), 'utf8');
    fs.writeFileSync(path.join(dir, 'notebook.md'), before + '\nmy own line\n');
    const again = await cli(['init'], dir);
    assert.equal(again.code, 2);
    assert.match(again.err, /already exist.*nothing was written/);
    assert.match(fs.readFileSync(path.join(dir, 'notebook.md'), 'utf8'), /my own line/);
  });

  it('refuses a file as the folder, and unknown options', async () => {
    fs.writeFileSync(path.join(dir, 'plain'), 'x');
    assert.equal((await cli(['init', 'plain'], dir)).code, 2);
    assert.equal((await cli(['init', '--force'], dir)).code, 2);
    assert.deepEqual(fs.readdirSync(dir), ['plain']);
  });
});

describe('vitrine check --verbose', () => {
  it('lists every bad cell of a data file on its own line', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'vitrine-verbose-'));
    try {
      const rows = ['T/K, h/nm', ...Array.from({ length: 30 }, (_, i) => `${300 + i}, ${i % 3 === 0 ? 'n/a' : 100 + i * 0.02}`)];
      fs.mkdirSync(path.join(dir, 'data'));
      fs.writeFileSync(path.join(dir, 'data', 'scan.csv'), rows.join('\n'));
      fs.writeFileSync(path.join(dir, 'n.md'), '```material m\nname: m\ntg: 300 K\ntg_source: x\n```\n\n```deposition F\nmaterial: m\nsubstrate_temperature: 250 K\nrate: 0.1 nm/s\nthickness: 100 nm\nbase_pressure: 1e-6 Pa\nsubstrate: Si\n```\n\n```ramp R\nfilm: F\nrate: 1 K/min\ndata: data/scan.csv\n```\n');
      const plain = await cli(['check', '.'], dir);
      assert.match(plain.out, /and 9 more/);
      assert.doesNotMatch(plain.out, /^ {2}data\/scan\.csv:/m);
      const verbose = await cli(['check', '.', '--verbose'], dir);
      const listed = verbose.out.split('\n').filter((l) => /^ {2}data\/scan\.csv:\d+:\d+: /.test(l));
      assert.equal(listed.length, 10, verbose.out);
      assert.match(listed[1], /^ {2}data\/scan\.csv:5:/);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
