import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { run } from '../support/runCli.js';
import { csvRecords } from '../support/csv.js';
import { REPO } from '../support/loadNotebook.js';
import { runCli } from '../../extension/cli/main.js';
import { progressBar } from '../../extension/cli/progress.js';
import { PRINT } from '../../extension/core/charts/tokens.js';
import { csvField } from '../../extension/core/report/escape.js';
import { LONG_CSV_HEADERS } from '../../extension/core/report/longCsv.js';
import { sourceDateClock } from '../../extension/cli/sourceDate.js';

interface JsonResult {
  readonly value: number;
  readonly uncertainty?: number;
  readonly method: string;
}

/** The results of a block of the JSON report, by id. */
function jsonResults(json: { out: string }, id: string): Record<string, JsonResult> {
  const report = JSON.parse(json.out) as { files: Array<{ blocks: Array<{ id: string | null; results: Record<string, JsonResult> }> }> };
  const block = report.files.flatMap((f) => f.blocks).find((b) => b.id === id);
  assert.ok(block, `block ${id} in the JSON report`);
  return block.results;
}

/**
 * A printed number is the full value rounded at its last printed digit: within half a unit of that
 * place (`0.51` of 0.5111; `7.87` of 7.8723; `1.1e+2` of 111.3). Common practice, no source.
 */
function assertRounded(cell: string | undefined, value: number | undefined, what: string): void {
  assert.ok(cell !== undefined && cell !== '' && value !== undefined, `${what}: a cell and a value`);
  const m = /^-?\d+(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(cell);
  assert.ok(m, `${what}: ${cell} is a number`);
  const place = -(m[1]?.length ?? 0) + Number(m[2] ?? 0);
  assert.ok(Math.abs(Number(cell) - value) <= 0.5 * 10 ** place * (1 + 1e-9), `${what}: ${cell} is ${value} rounded`);
}


/** The long CSV: one row per figure of the JSON report, each with its film, technique and rounding. */
function checkLongCsv(text: string, json: { out: string }): void {
  assert.equal(text.split('\n')[0], LONG_CSV_HEADERS.join(','));
  const rows = csvRecords(text);
  const figures = (JSON.parse(json.out) as { files: Array<{ blocks: Array<{ results: object }> }> }).files.flatMap((f) => f.blocks.flatMap((b) => Object.keys(b.results)));
  assert.equal(rows.length, figures.length, 'every figure of the JSON report, once');
  const tg = rows.find((x) => x.get('block') === 'R-02' && x.get('figure') === 'tg')!;
  assert.deepEqual([tg.get('film'), tg.get('material'), tg.get('technique'), tg.get('rate'), tg.get('rate_unit'), tg.get('unit')], ['D-02', 'amberine-3', 'ellipsometry', '1', 'K/min', 'K']);
  // Rounded to its uncertainty (GUM §7.2.6), the printed value lies within it of the full one.
  assert.ok(Math.abs(Number(tg.get('value_rounded')) - Number(tg.get('value'))) <= Number(tg.get('uncertainty_rounded')));
}

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
    assert.match(r.out, /wrote .*demo\.html \(8 block charts, 4 maps, 3 material figures, 4 films\)/);
    const html = fs.readFileSync(out, 'utf8');
    assert.doesNotMatch(html, /<script/i, 'no scripts');
    assert.doesNotMatch(html, /(src|href)="https?:/i, 'no network');
    assert.match(html, /Content-Security-Policy/);
    assert.equal((html.match(/<section class="entry/g) ?? []).length, 14, 'every data block has its entry');
    assert.equal((html.match(/<svg /g) ?? []).length, 2 * (8 + 4 + 3), 'each chart drawn in the light and the dark theme');
    assert.equal((html.match(/<div class="drawing on-dark">/g) ?? []).length, 8 + 4 + 3);
    assert.match(html, /<h2 class="part" id="summary">/);
    // The figures per material: the Tsub series of amberine-3 and both relaxation maps.
    const materials = html.slice(html.indexOf('<h2 class="part" id="materials">'));
    assert.ok(materials.length > 0 && materials.includes('id="map-tsub-series-amberine-3"') && materials.includes('id="map-relaxation-map-quillite"'), 'figures per material');
    // Prose from the notebook is rendered; numbers sit inside their block's entry.
    assert.match(html, /<h1>2026-03-02 — first amberine-3 films<\/h1>/);
    const r02 = html.slice(html.indexOf('<span class="kind">ramp</span><span class="id">R-02'));
    assert.match(r02.slice(0, r02.indexOf('</section>')), /<code class="name">density_gain<\/code>/);
    // The record's header: the notebook folder's name, the folder and the version of package.json.
    const version = (JSON.parse(fs.readFileSync(path.join(REPO, 'package.json'), 'utf8')) as { version: string }).version;
    assert.match(html, /<h1>demo<\/h1>/);
    assert.ok(html.includes(`<dt>Vitrine</dt><dd>${version}</dd>`));
    assert.ok(html.includes(`<dd>${path.join(REPO, 'fixtures', 'demo')}</dd>`));
  });

  it('dates the record by the clock it is given, in UTC', async () => {
    const out = path.join(tmp, 'dated.html');
    const code = await runCli(['report', 'fixtures/demo/materials.md', '-o', out], { out: () => {}, err: () => {}, cwd: REPO, now: () => new Date(Date.UTC(2026, 2, 14, 9, 5)) });
    assert.equal(code, 0);
    assert.match(fs.readFileSync(out, 'utf8'), /<dt>date<\/dt><dd>2026-03-14 09:05 UTC<\/dd>/);
  });

  it('writes the summary CSV with units in the header, one row per film, and the long CSV', async () => {
    const file = path.join(tmp, 'demo.csv');
    const long = path.join(tmp, 'long.csv');
    const r = await run(['report', 'fixtures/demo', '-o', path.join(tmp, 'demo.html'), '--csv', file, '--csv-long', long]);
    assert.equal(r.code, 0, r.err);
    const json = await run(['analyze', 'fixtures/demo', '--json']);
    checkLongCsv(fs.readFileSync(long, 'utf8'), json);
    const text = fs.readFileSync(file, 'utf8');
    assert.equal(text.split('\n')[0].split(',').slice(0, 9).join(','), 'film,material,file,Tsub/K,Tsub/°C,Tsub/Tg,rate/(nm/s),thickness/nm,Tg/K');
    const rows = csvRecords(text);
    assert.equal(rows.length, 4);
    const d02 = rows[1];
    // D-02 was deposited at −3.15 °C = 270.00 K (ITS-90 offset), 2 Å/s = 0.2 nm/s, 412 nm.
    assert.deepEqual(['film', 'material', 'file', 'Tsub/K', 'Tsub/°C', 'rate/(nm/s)', 'thickness/nm'].map((h) => d02.get(h)), ['D-02', 'amberine-3', 'days/2026-03-02.md', '270.0', '-3.2', '0.200', '412']);
    // Tg in °C is Tg in K − 273.15 at the same decimal place; the method and the heating scan are named.
    const tg = d02.get('Tg/K')!;
    const decimals = tg.split('.')[1]?.length ?? 0;
    assert.equal(d02.get('Tg/°C'), (Number(tg) - 273.15).toFixed(decimals));
    const r02 = jsonResults(json, 'R-02');
    assertRounded(tg, r02.tg.value, 'Tg/K');
    assertRounded(d02.get('u(Tg)/K'), r02.tg.uncertainty, 'u(Tg)/K');
    assert.equal(d02.get('method(Tg)'), r02.tg.method);
    assert.equal(d02.get('technique'), 'ellipsometry');
    assert.equal(d02.get('scan'), 'R-02');
    assert.equal(d02.get('scan_rate/(K/min)'), '1.00');
    assertRounded(d02.get('Tonset/K'), r02.tonset.value, 'Tonset/K of R-02');
    assertRounded(d02.get('Tf/K'), r02.tfictive.value, 'Tf/K of R-02');
    // The isotherm's and the dsc block's figures reach the row of their film (D-01); its heating
    // scan is the calorimetry scan C-01, and T_onset and Tf both come from it.
    const d01 = rows[0];
    assert.equal(d01.get('film'), 'D-01');
    assertRounded(d01.get('front_velocity/(nm/s)'), jsonResults(json, 'I-01').front_velocity.value, 'front velocity of I-01');
    const c01 = jsonResults(json, 'C-01');
    assertRounded(d01.get('enthalpy_gap/(J/g)'), c01.enthalpy_gap.value, 'enthalpy gap of C-01');
    assert.equal(d01.get('method(enthalpy_gap)'), c01.enthalpy_gap.method);
    assert.deepEqual([d01.get('technique'), d01.get('scan')], ['calorimetry', 'C-01']);
    assertRounded(d01.get('Tonset/K'), c01.tonset.value, 'Tonset/K of C-01');
    assertRounded(d01.get('Tf/K'), c01.tfictive.value, 'Tf/K of C-01');
    assertRounded(d01.get('fragility'), jsonResults(json, d01.get('material')!).fragility.value, 'fragility of the material');
  });

  it('refuses -o and --csv-long naming the same file, and --print without --svg', async () => {
    const same = path.join(tmp, 'x.html');
    const r = await run(['report', 'fixtures/demo', '-o', same, '--csv-long', same]);
    assert.equal(r.code, 2);
    assert.match(r.err, /-o and --csv-long name the same file/);
    assert.deepEqual(fs.readdirSync(tmp), [], 'nothing written');
    const p = await run(['report', 'fixtures/demo', '-o', same, '--print']);
    assert.equal(p.code, 2);
    assert.match(p.err, /--print sets the size of the SVG files: add --svg DIR/);
  });

  it('writes every chart as SVG, at one column width with print-size text under --print', async () => {
    const dir = path.join(tmp, 'svg');
    // One day of the notebook: the chart of its ramp.
    const r = await run(['report', 'fixtures/demo/days/2026-03-02.md', '--root', 'fixtures/demo', '-o', path.join(tmp, 'demo.html'), '--svg', dir, '--print']);
    assert.equal(r.code, 0, r.err);
    const files = fs.readdirSync(dir).sort();
    assert.deepEqual(files, ['ramp-R-02.svg']);
    const svg = fs.readFileSync(path.join(dir, 'ramp-R-02.svg'), 'utf8');
    assert.match(svg, /^<svg /);
    const sizes = new Set([...svg.matchAll(/font-size="([\d.]+)px"/g)].map((m) => Number(m[1])));
    assert.deepEqual([...sizes], [PRINT.fontSize], 'every text at the print size');
    // About one column: the whole figure within 15 % of PRINT.width (axes and legend included).
    // Sized in cm for a layout program (96 px to the inch, 2.54 cm to the inch: CSS Values 4),
    // the drawing's own px in its viewBox.
    const root = /^<svg[^>]*>/.exec(svg)![0];
    const width = /\swidth="([\d.]+)cm"/.exec(root);
    const height = /\sheight="([\d.]+)cm"/.exec(root);
    const box = /\sviewBox="0 0 ([\d.]+) ([\d.]+)"/.exec(root);
    assert.ok(width && height && box, `sized in cm with a viewBox: ${root}`);
    assert.ok(Math.abs(Number(width[1]) - (PRINT.width * 2.54) / 96) <= 0.15 * ((PRINT.width * 2.54) / 96), `width ${width[1]} cm`);
    assert.equal(Number(width[1]), Number(((Number(box[1]) * 2.54) / 96).toFixed(2)));
    assert.equal(Number(height[1]), Number(((Number(box[2]) * 2.54) / 96).toFixed(2)));
  });

  it('keeps same-id films of two notebook folders apart on the maps', async () => {
    // Two copies of the demo; in the second, D-02 was deposited at 5.00 °C (278.15 K) instead of -3.15 °C (270.00 K).
    const a = path.join(tmp, 'a');
    const b = path.join(tmp, 'b');
    fs.cpSync(path.join(REPO, 'fixtures/demo'), a, { recursive: true });
    fs.cpSync(path.join(REPO, 'fixtures/demo'), b, { recursive: true });
    const day = path.join(b, 'days/2026-03-02.md');
    fs.writeFileSync(day, fs.readFileSync(day, 'utf8').replace('material: amberine-3\nsubstrate_temperature: -3.15 °C', 'material: amberine-3\nsubstrate_temperature: 5.00 °C'));
    const dir = path.join(tmp, 'svg');
    const r = await run(['report', a, b, '-o', path.join(tmp, 'two.html'), '--svg', dir]);
    assert.equal(r.code, 0, r.err);
    const svg = fs.readFileSync(path.join(dir, 'map-fictive-temperature.svg'), 'utf8');
    const x = [...svg.matchAll(/aria-label="Tsub \/ Tg: ([\d.]+);[^"]*film: D-02;/g)].map((m) => Number(m[1]));
    assert.equal(x.length, 2, svg.slice(0, 200));
    // Each R-02 at its own film's Tsub/Tg: 278.15/270.00 apart.
    assert.ok(Math.abs(Math.max(...x) / Math.min(...x) - 278.15 / 270) < 0.01, String(x));
  });

  it('writes every chart as PNG', async () => {
    const dir = path.join(tmp, 'png');
    const r = await run(['report', 'fixtures/demo', '-o', path.join(tmp, 'demo.html'), '--png', dir]);
    assert.equal(r.code, 0, r.err);
    const files = fs.readdirSync(dir);
    // 8 block charts, 4 stability maps, the Tsub series of amberine-3 and the relaxation maps of both materials.
    assert.equal(files.length, 15);
    for (const name of ['tsub-series-amberine-3.png', 'relaxation-map-amberine-3.png', 'relaxation-map-quillite.png']) assert.ok(files.includes(name), name);
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

  it('names every report option in the help text and in the README', async () => {
    const help = (await run(['--help'])).out;
    const readme = fs.readFileSync(path.join(REPO, 'README.md'), 'utf8').split('## Command line')[1];
    for (const option of ['--csv', '--csv-long', '--png', '--svg', '--print']) {
      assert.match(help, new RegExp(`\\n  ${option} `), `help: ${option}`);
      assert.ok(readme.includes(`\`${option}`), `README: ${option}`);
    }
  });

  it('needs -o', async () => {
    const r = await run(['report', 'fixtures/demo']);
    assert.equal(r.code, 2);
  });
});

describe('report helpers', () => {
  it('takes SOURCE_DATE_EPOCH as seconds since 1970, and ignores one no date can hold, with a warning', () => {
    const warnings: string[] = [];
    const warn = (t: string): number => warnings.push(t);
    // 1773479100 s after 1970-01-01 00:00 UTC is 2026-03-14 09:05 UTC (reproducible-builds.org's definition).
    assert.equal(sourceDateClock('1773479100', warn)?.().toISOString(), '2026-03-14T09:05:00.000Z');
    assert.equal(sourceDateClock(undefined, warn), undefined);
    assert.deepEqual(warnings, []);
    // 9999999999999 s lies beyond ECMAScript's last date (8.64e15 ms after 1970, ECMA-262 §21.4.1.1).
    assert.equal(sourceDateClock('9999999999999', warn), undefined);
    assert.equal(sourceDateClock('2026-03-14', warn), undefined);
    assert.equal(warnings.length, 2);
    assert.match(warnings[0], /SOURCE_DATE_EPOCH "9999999999999" is not a date.*ignored/);
  });

  it('writes the report under a SOURCE_DATE_EPOCH beyond the last date, dated by the clock, with a warning', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'vitrine-epoch-'));
    try {
      const out = path.join(dir, 'r.html');
      // The executable itself, as a shell would start it.
      const r = spawnSync(process.execPath, ['--import', 'tsx', 'extension/cli/bin.ts', 'report', 'fixtures/demo/materials.md', '-o', out], { cwd: REPO, encoding: 'utf8', env: { ...process.env, SOURCE_DATE_EPOCH: '9999999999999' } });
      assert.equal(r.status, 0, r.stderr);
      assert.match(r.stderr, /SOURCE_DATE_EPOCH .* ignored/);
      assert.match(fs.readFileSync(out, 'utf8'), /<dt>date<\/dt><dd>\d{4}-\d\d-\d\d \d\d:\d\d UTC<\/dd>/);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

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
