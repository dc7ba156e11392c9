import assert from 'node:assert/strict';
import { spawn, spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { run } from '../support/runCli.js';
import { REPO } from '../support/loadNotebook.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK } from '../support/synthetic.js';


/** The built executable (`npm run build`); a test of it is skipped where it is not built. */
function builtCli(test: Mocha.Context, name = 'cli.cjs'): string {
  const bin = path.join(REPO, 'dist', name);
  if (!fs.existsSync(bin)) test.skip();
  return bin;
}

/** A temporary folder, removed after the tests of this file. */
function tempFolder(prefix: string): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  after(() => fs.rmSync(dir, { recursive: true, force: true }));
  return dir;
}

describe('vitrine CLI', () => {
  it('check on the demo: warnings only, exit 0, and a summary table', async () => {
    const r = await run(['check', 'fixtures/demo', '--summary']);
    assert.equal(r.code, 0, r.out + r.err);
    assert.match(r.out, /^fixtures\/demo\/days\/2026-03-06\.md:\d+:\d+: warning: .* \[meta\.missing-recommended\]$/m);
    assert.match(r.out, /0 errors/);
    assert.match(r.out, /^film\s+material\s+Tsub\/K\s+Tsub\/Tg/m);
    assert.match(r.out, /^D-02\s+amberine-3\s+270\.0\s+0\.849/m);
  });

  it('check on the bad corpus: file:line:col: severity: message [code], exit 1', async () => {
    const r = await run(['check', 'fixtures/bad']);
    assert.equal(r.code, 1);
    assert.match(r.out, /^fixtures\/bad\/units\.md:5:24: error: .* \[quantity\.wrong-dimension\]$/m);
    assert.doesNotMatch(r.out + r.err, /\n\s+at /, 'no stack trace');
  });

  it('check on one file resolves references from its folder', async () => {
    const r = await run(['check', 'fixtures/demo/materials.md']);
    assert.equal(r.code, 0, r.out);
    assert.match(r.out, /^1 file, 3 data blocks/m);
  });

  it('--root resolves the references and data paths of a file across the notebook folder', async () => {
    const alone = await run(['check', 'fixtures/demo/days/2026-03-02.md']);
    assert.equal(alone.code, 1, 'without --root the materials and data lie outside the file\'s folder');
    const r = await run(['check', 'fixtures/demo/days/2026-03-02.md', '--root', 'fixtures/demo']);
    assert.equal(r.code, 0, r.out);
    assert.match(r.out, /^1 file, 3 data blocks: 0 errors/m);
    const outside = await run(['check', 'fixtures/bad/units.md', '--root', 'fixtures/demo']);
    assert.equal(outside.code, 2);
  });

  it('analyze --json gives the results contract with 1-based lines', async () => {
    const r = await run(['analyze', 'fixtures/demo', '--json']);
    assert.equal(r.code, 0);
    const json = JSON.parse(r.out);
    const day = json.files.find((f: { path: string }) => f.path === 'days/2026-03-02.md');
    const d02 = day.blocks.find((b: { id: string }) => b.id === 'D-02');
    assert.equal(d02.line, 24);
    assert.equal(d02.kind, 'deposition');
    assert.ok(Math.abs(d02.results.tsub_over_tg.value - 270 / 318) < 1e-9);
    assert.equal(d02.results.tsub_over_tg.unit, '1');
    assert.ok(d02.results.tsub_over_tg.method.length > 0);
    assert.ok(json.files.every((f: { blocks: unknown[]; diagnostics: unknown[] }) => Array.isArray(f.blocks) && Array.isArray(f.diagnostics)));
  });

  it('usage errors exit 2 with the usage text', async () => {
    for (const args of [[], ['frobnicate', 'x'], ['check'], ['analyze', 'fixtures/demo'], ['check', 'no/such/folder'], ['check', 'fixtures/demo', '--bogus']]) {
      const r = await run(args);
      assert.equal(r.code, 2, args.join(' '));
      assert.match(r.err + r.out, /usage: vitrine/);
    }
  });

  it('the built executable runs and sets its exit status, also from its earlier path dist/cli.js', function () {
    for (const name of ['cli.cjs', 'cli.js']) {
      const bin = builtCli(this, name);
      const ok = spawnSync(process.execPath, [bin, 'check', 'fixtures/demo'], { cwd: REPO, encoding: 'utf8' });
      assert.equal(ok.status, 0, ok.stderr);
      const bad = spawnSync(process.execPath, [bin, 'check', 'fixtures/bad'], { cwd: REPO, encoding: 'utf8' });
      assert.equal(bad.status, 1, name);
      assert.equal(bad.stderr, '');
    }
  });

  it('check and analyze never load the report\'s libraries; report does', function () {
    const bin = builtCli(this);
    const dir = tempFolder('vitrine-libs-');
    // Says at exit whether the bundle of the report's libraries was required.
    const hook = path.join(dir, 'hook.cjs');
    fs.writeFileSync(hook, "process.on('exit', () => process.stderr.write('report libraries: ' + Object.keys(require.cache).some((f) => f.endsWith('cli-report-libs.cjs')) + '\\n'));\n");
    const loaded = (args: string[]): string => {
      const r = spawnSync(process.execPath, ['--require', hook, bin, ...args], { cwd: REPO, encoding: 'utf8' });
      return /report libraries: (\w+)/.exec(r.stderr)?.[1] ?? r.stderr;
    };
    assert.equal(loaded(['check', 'fixtures/demo', '--summary']), 'false');
    assert.equal(loaded(['analyze', '--json', 'fixtures/demo']), 'false');
    assert.equal(loaded(['report', 'fixtures/demo', '-o', path.join(dir, 'r.html')]), 'true');
  });

  it('stops without a stack trace when the reader of its output goes away (| head)', async function () {
    const bin = builtCli(this);
    // Output well beyond what a pipe holds (64 KB), so that writes go on after the reader has gone.
    const dir = tempFolder('vitrine-pipe-');
    fs.writeFileSync(path.join(dir, 'n.md'), MATERIAL_BLOCK() + Array.from({ length: 1500 }, (_, i) => DEPOSITION_BLOCK(`D-${i}`, 250 + (i % 40))).join('\n'));
    const child = spawn(process.execPath, [bin, 'analyze', '--json', dir], { cwd: REPO, stdio: ['ignore', 'pipe', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    // The first piece read, the pipe is closed, as `head -c 1` does.
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on('close', (c) => resolve(c)));
    assert.equal(err, '');
    assert.equal(code, 141);
  });
});
