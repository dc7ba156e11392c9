import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { run } from '../support/runCli.js';
import { progressBar } from '../../extension/cli/progress.js';
import { csvField } from '../../extension/core/report/escape.js';


describe('vitrine report', function () {
  this.timeout(120000);
  // Each test writes into its own fresh folder, removed after it.
  let tmp = '';
  beforeEach(() => {
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'vitrine-report-'));
  });
  afterEach(() => {
    fs.rmSync(tmp, { recursive: true, force: true });
  });

  it('writes one self-contained HTML file with charts, results, summary and maps', async () => {
    const out = path.join(tmp, 'demo.html');
    const r = await run(['report', 'fixtures/demo', '-o', out]);
    assert.equal(r.code, 0, r.err);
    assert.match(r.out, /wrote .*demo\.html \(8 block charts, 4 maps, 4 films\)/);
    const html = fs.readFileSync(out, 'utf8');
    assert.doesNotMatch(html, /<script/i, 'no scripts');
    assert.doesNotMatch(html, /(src|href)="https?:/i, 'no network');
    assert.match(html, /Content-Security-Policy/);
    assert.equal((html.match(/<section class="block/g) ?? []).length, 14, 'every data block has its section');
    assert.equal((html.match(/<svg /g) ?? []).length, 8 + 4);
    assert.match(html, /<h2 id="summary">/);
    // Prose from the notebook is rendered; numbers sit inside their block's section.
    assert.match(html, /<h1>2026-03-02 — first amberine-3 films<\/h1>/);
    const r02 = html.slice(html.indexOf('<span class="kind">ramp</span> R-02'));
    assert.match(r02.slice(0, r02.indexOf('</section>')), /<code>density_gain<\/code>/);
  });

  it('writes the summary CSV with units in the header, one row per film', async () => {
    const file = path.join(tmp, 'demo.csv');
    const r = await run(['report', 'fixtures/demo', '-o', path.join(tmp, 'demo.html'), '--csv', file]);
    assert.equal(r.code, 0, r.err);
    const csv = fs.readFileSync(file, 'utf8').trim().split('\n');
    assert.equal(csv[0].split(',').slice(0, 8).join(','), 'film,material,file,Tsub/K,Tsub/Tg,rate/(nm/s),thickness/nm,Tg/K');
    assert.equal(csv.length, 1 + 4);
    assert.match(csv[2], /^D-02,amberine-3,days\/2026-03-02\.md,270\.0,0\.849,0\.200,412,313\.829,0\.069,/);
  });

  it('writes every chart as PNG', async () => {
    const dir = path.join(tmp, 'png');
    const r = await run(['report', 'fixtures/demo', '-o', path.join(tmp, 'demo.html'), '--png', dir]);
    assert.equal(r.code, 0, r.err);
    const files = fs.readdirSync(dir);
    assert.equal(files.length, 12);
    const png = fs.readFileSync(path.join(dir, 'ramp-R-02.png'));
    assert.equal(png.subarray(1, 4).toString(), 'PNG');
  });

  it('keeps hostile markup from the notebook inert', async () => {
    const out = path.join(tmp, 'bad.html');
    const r = await run(['report', 'fixtures/bad', '-o', out]);
    assert.equal(r.code, 1, 'the corpus has errors');
    const html = fs.readFileSync(out, 'utf8');
    assert.doesNotMatch(html, /<script/i);
    assert.doesNotMatch(html, /<img/i);
    assert.doesNotMatch(html, /<[^>]*onerror=/i);
    assert.match(html, /&lt;script&gt;alert\(/, 'the hostile text is shown, escaped');
  });

  it('needs -o', async () => {
    const r = await run(['report', 'fixtures/demo']);
    assert.equal(r.code, 2);
  });
});

describe('report helpers', () => {
  it('CSV fields are quoted and never read as formulas', () => {
    assert.equal(csvField('a,b'), '"a,b"');
    assert.equal(csvField('say "x"'), '"say ""x"""');
    assert.equal(csvField('=SUM(A1)'), "'=SUM(A1)");
    assert.equal(csvField(-3.5), '-3.5');
    assert.equal(csvField(undefined), '');
  });

  it('the progress bar draws only for many files and clears itself', () => {
    let text = '';
    const p = progressBar((t) => (text += t), 3);
    p.update(0, 2, 'a.md');
    assert.equal(text, '');
    p.update(1, 4, 'b.md');
    assert.match(text, /\r\[#+ +\] 1\/4 b\.md/);
    p.done();
    assert.match(text, /\r +\r$/);
  });
});
