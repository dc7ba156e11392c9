/**
 * The HTML report as a lab record, the long CSV and the stylesheet, on a report built by hand
 * (no analysis runs): what the header, an entry, its figures and findings, and the page's colours
 * say.
 */
import assert from 'node:assert/strict';
import type { BlockReport, NotebookReport } from '../../extension/core/engine/notebook.js';
import { summarise } from '../../extension/core/engine/summary.js';
import type { DiagnosticCode } from '../../extension/core/model/codes.js';
import { MATERIAL_COLOURS, ROLE, SURFACE, TYPE } from '../../extension/core/charts/tokens.js';
import { buildHtmlReport, type ReportInput } from '../../extension/core/report/htmlReport.js';
import { LONG_CSV_HEADERS, longCsv } from '../../extension/core/report/longCsv.js';
import { readableFigure, timeHtml } from '../../extension/core/report/readable.js';
import { blockCardHtml, figuresHtml } from '../../extension/core/report/blockCard.js';
import { SUMMARY_COLUMNS } from '../../extension/core/engine/summaryColumns.js';
import { catalogueEntry } from '../../extension/core/model/catalogue.js';
import { LineIndex } from '../../extension/core/text/positions.js';
import { reportStylesheet } from '../../extension/core/report/stylesheet.js';
import { csvRecords } from '../support/csv.js';

const TEXT = [
  '# 2026-03-14',
  '',
  '```deposition D-9',
  'material: aster-3',
  'substrate_temperature: -3.15 °C',
  'rate: 0.2 nm/s',
  'base_pressure: 3.5e-8 Torr',
  '```',
  '',
  '```ramp R-9',
  'film: D-9',
  'rate: 1 K/min',
  'data: data/R-9.csv',
  '```',
  '',
  '```isotherm I-9',
  'film: D-9',
  'temperature: 320 K',
  '```',
  '',
].join('\n');

function spanOf(fence: string): { start: number; end: number } {
  const start = TEXT.indexOf(fence);
  return { start, end: TEXT.indexOf('```\n', start + 3) + 3 };
}

const CLIP_SVG = (tag: string): string => `<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><defs><clipPath id="clip1"><rect width="5" height="5"/></clipPath></defs><g clip-path="url(#clip1)"><text>${tag}</text></g></svg>`;

const deposition: BlockReport = {
  kind: 'deposition',
  id: 'D-9',
  span: spanOf('```deposition'),
  metadata: { material: 'aster-3', substrate_temperature: '-3.15 °C', rate: '0.2 nm/s', base_pressure: '3.5e-8 Torr' },
  quantities: {
    // 1 Torr = 101325/760 Pa (NIST SP 811, appendix B.8).
    '/base_pressure': { value: (3.5e-8 * 101325) / 760, unit: 'Pa', dimension: 'pressure', writtenUnit: 'Torr', offsetTemperature: false },
    '/substrate_temperature': { value: 270, unit: 'K', dimension: 'temperature', writtenUnit: '°C', offsetTemperature: true },
    '/rate': { value: 0.2, unit: 'nm/s', dimension: 'rate', writtenUnit: 'nm/s', offsetTemperature: false },
  },
  results: {},
  diagnostics: [],
};

const rampSpan = spanOf('```ramp');
/** Ten findings on the ramp's data line: all must be listed. */
const findings = Array.from({ length: 10 }, (_, i) => ({
  code: 'table.bad-cell' as DiagnosticCode,
  severity: i === 0 ? ('error' as const) : ('warning' as const),
  message: `cell ${i + 1} is not a number <b>`,
  span: { start: TEXT.indexOf('data: data/R-9.csv'), end: TEXT.indexOf('data: data/R-9.csv') + 18 },
}));

// The first stands for three problems of the data file, each a related location (0-based).
findings[0] = {
  ...findings[0],
  message: 'data/R-9.csv:4:6: "4x0.1" in column "h/nm" is not a number (and 2 more)',
  related: [
    { path: 'data/R-9.csv', line: 3, character: 5, message: '"4x0.1" in column "h/nm" is not a number' },
    { path: 'data/R-9.csv', line: 4, character: 5, message: '"<b>" in column "h/nm" is not a number' },
    { path: 'data/R-9.csv', line: 9, character: 0, message: 'This row has 3 cells but the header has 2.' },
  ],
} as (typeof findings)[number];

const ramp: BlockReport = {
  kind: 'ramp',
  id: 'R-9',
  span: rampSpan,
  metadata: { film: 'D-9', rate: '1 K/min', data: 'data/R-9.csv' },
  quantities: { '/rate': { value: 1, unit: 'K/min', dimension: 'heating_rate', writtenUnit: 'K/min', offsetTemperature: false } },
  results: {
    tg: {
      value: 313.82909975329915,
      unit: 'K',
      uncertainty: 0.5,
      method: 'hinge fit',
      interval: [312.85, 314.81],
      // A 3-4-5 budget: √(0.3² + 0.4²) = 0.5; shares 36 % and 64 % (GUM, JCGM 100:2008, §5.1.2, unit sensitivities).
      budget: [
        { source: 'window', value: 0.4, note: 'five window choices' },
        { source: 'statistical', value: 0.3 },
      ],
    },
    equivalent_aging_time: { value: 157794163248, unit: 's', method: 'bracket of two extrapolations', interval: [1528790679.12, 16286727997000] },
    alpha_glass: { value: 1.628e-4, unit: '1/K', uncertainty: 6.95e-7, method: 'slope of the glass line' },
  },
  diagnostics: findings,
  tableExcerpt: { path: 'data/R-9.csv', firstLine: 2, lines: ['T/K, h/nm', '300, 4x0.1', '301, <b>'] },
};

const isotherm: BlockReport = {
  kind: 'isotherm',
  id: 'I-9',
  span: spanOf('```isotherm'),
  metadata: { film: 'D-9', temperature: '320 K' },
  quantities: {},
  results: { onset_time: { value: 900.125343982, unit: 's', uncertainty: 9.95659609815, method: 'three-segment fit' } },
  diagnostics: [],
};

const report: NotebookReport = { files: [{ path: 'days/2026-03-14.md', text: TEXT, blocks: [deposition, ramp, isotherm], diagnostics: [] }] };

const input: ReportInput = {
  title: 'bench-notebook',
  record: { date: '2026-03-14 09:00 UTC', version: '9.8.7', folders: ['/lab/bench-notebook'] },
  report,
  charts: new Map([[ramp, { light: CLIP_SVG('light-drawing'), dark: CLIP_SVG('dark-drawing') }]]),
  summary: [],
  maps: [{ name: 'density-gain', title: 'Density gain', note: 'needs at least 3 films with a density gain; the notebook has 1' }],
};
const html = buildHtmlReport(input);

/** The HTML of one block's entry. */
function entry(kind: string, id: string): string {
  const start = html.lastIndexOf('<section class="entry', html.indexOf(`data-kind="${kind}"><div class="strip"><span class="kind">${kind}</span><span class="id">${id}<`));
  return html.slice(start, html.indexOf('</section>', start));
}

describe('buildHtmlReport: the report as a lab record', () => {
  it('heads the record with the notebook, the date, the version and the folder', () => {
    const header = html.slice(html.indexOf('<header'), html.indexOf('</header>'));
    assert.match(header, /<h1>bench-notebook<\/h1>/);
    assert.match(header, /<dt>date<\/dt><dd>2026-03-14 09:00 UTC<\/dd>/);
    assert.match(header, /<dt>notebook folder<\/dt><dd>\/lab\/bench-notebook<\/dd>/);
    assert.match(header, /<dt>Vitrine<\/dt><dd>9\.8\.7<\/dd>/);
  });

  it('shows the conditions as written, with the kelvin value beside a temperature in °C', () => {
    const d = entry('deposition', 'D-9');
    assert.match(d, /<dt>substrate_temperature<\/dt><dd>-3\.15 °C <span class="canonical">= 270\.00 K<\/span><\/dd>/);
    assert.match(d, /<dt>rate<\/dt><dd>0\.2 nm\/s<\/dd>/, 'no conversion where the unit is already the one computed with');
    // 3.5e-8 Torr × 133.322 Pa/Torr = 4.666e-6 Pa.
    assert.match(d, /<dt>base_pressure<\/dt><dd>3\.5e-8 Torr <span class="canonical">= 4\.67 × 10<sup>−6<\/sup> Pa<\/span><\/dd>/);
    assert.match(d, /<span class="about">aster-3 · Tsub 270\.0 K \(-3\.2 °C\)<\/span>/, 'a deposition is the film: its material and Tsub');
    // The ramp's entry names its film, the film's material and Tsub (ITS-90: 270 K = −3.15 °C, shown at 0.1 K).
    const r = entry('ramp', 'R-9');
    assert.match(r, /<span class="about">film D-9 · aster-3 · Tsub 270\.0 K \(-3\.2 °C\)<\/span>/);
    assert.match(r, /<figcaption><b>ramp R-9<\/b> — film D-9 · aster-3 · Tsub 270\.0 K \(-3\.2 °C\)<\/figcaption>/);
  });

  it('prints a temperature in K rounded to its uncertainty, °C beside, and its budget term by term', () => {
    const r = entry('ramp', 'R-9');
    // GUM §7.2.6: u to two significant digits (0.50), the value to the same place.
    assert.match(r, /313\.83 ± 0\.50 K<span class="beside">40\.68 °C<\/span>/);
    assert.match(r, /<span class="label"[^>]*>Tg<\/span>/, 'the catalogue label');
    assert.match(r, /95 % interval \[312\.85, 314\.81\] K/);
    assert.match(r, /<details class="budget"><summary>uncertainty budget \(2 terms\)<\/summary>/);
    assert.match(r, /<td>window<\/td><td class="num">0\.40 K<\/td><td class="num">64 %<\/td><td>five window choices<\/td>/);
    assert.match(r, /<td>statistical<\/td><td class="num">0\.30 K<\/td><td class="num">36 %<\/td>/);
    // An exponent as a power of ten: 1.628e-4 ± 6.95e-7 → (1.6280 ± 0.0070) × 10⁻⁴.
    assert.match(r, /\(1\.6280 ± 0\.0070\) × 10<sup>−4<\/sup> 1\/K/);
  });

  it('gives the aging time as its bracket in years (Julian year, 365.25 d), not a central value', () => {
    const r = entry('ramp', 'R-9');
    // 1528790679.12 s / 31557600 s = 48.4 years; 16286727997000 s / 31557600 s = 5.16e5 years.
    assert.match(r, /48 years – 5\.2 × 10<sup>5<\/sup> years/);
    assert.doesNotMatch(r, /5000 years|1\.58/, 'no central value');
  });

  it('gives times in the unit that fits (SI brochure: 1 min = 60 s, 1 h = 3600 s)', () => {
    // 900.125 ± 9.957 s = 15.0021 ± 0.1659 min.
    assert.match(entry('isotherm', 'I-9'), /15\.00 ± 0\.17 min<span class="beside">900 ± 10 s<\/span>/);
    assert.equal(timeHtml(90, undefined, { digits: 3, notation: 'fixed' }), '90.0 s');
    assert.equal(timeHtml(3 * 3600, undefined, { digits: 3, notation: 'fixed' }), '3.00 h');
    assert.equal(timeHtml(3 * 86400, undefined, { digits: 3, notation: 'fixed' }), '3.00 d');
  });

  it('shows the failed table as it was read, with its line numbers, escaped', () => {
    const r = entry('ramp', 'R-9');
    assert.match(r, /The table as it was read: data\/R-9\.csv, lines 3–5/);
    assert.match(r, /<span class="ln">4<\/span>300, 4x0\.1\n<span class="ln">5<\/span>301, &lt;b&gt;/);
  });

  it('lists every finding, none left out, in line order, escaped', () => {
    const r = entry('ramp', 'R-9');
    assert.equal((r.match(/<li class="(error|warning)">/g) ?? []).length, 10);
    assert.match(r, /Findings \(10\)/);
    assert.match(r, /cell 10 is not a number &lt;b&gt;/);
    // A data file's problems: each at its place (1-based), and no "(and 2 more)" since all are listed.
    assert.doesNotMatch(r, /more\)/);
    assert.match(r, /is not a number <code>table\.bad-cell<\/code><ol class="related"><li><span class="place">data\/R-9\.csv:4:6<\/span> &quot;4x0\.1&quot;/);
    assert.match(r, /<span class="place">data\/R-9\.csv:5:6<\/span> &quot;&lt;b&gt;&quot; in column/);
    assert.match(r, /<span class="place">data\/R-9\.csv:10:1<\/span> This row has 3 cells/);
  });

  it('embeds both drawings of a chart, each shown by the colour scheme, with ids kept apart', () => {
    const r = entry('ramp', 'R-9');
    assert.match(r, /<div class="drawing on-light"><svg[^]*light-drawing[^]*<\/svg><\/div><div class="drawing on-dark"><svg[^]*dark-drawing/);
    const ids = [...html.matchAll(/ id="([^"]+)"/g)].map((m) => m[1]);
    assert.equal(new Set(ids).size, ids.length, `unique ids: ${ids.join(' ')}`);
    for (const m of html.matchAll(/url\(#([^)]+)\)/g)) assert.ok(ids.includes(m[1]), `url(#${m[1]}) resolves`);
    assert.match(html, /@media \(prefers-color-scheme: dark\) \{ figure\.chart \.on-light \{ display: none; \} figure\.chart \.on-dark \{ display: block; \} \}/);
  });

  it('links each film of the summary to its deposition entry', () => {
    const page = buildHtmlReport({ ...input, summary: summarise(report) });
    const summary = page.slice(page.indexOf('id="summary"'));
    const anchor = /<td><a href="#([^"]+)">D-9<\/a><\/td>/.exec(summary)?.[1];
    assert.ok(anchor, 'the film cell is a link');
    assert.match(page, new RegExp(`<section class="entry nochart" id="${anchor}" data-kind="deposition"><div class="strip"><span class="kind">deposition</span><span class="id">D-9<`));
  });

  it('puts a short message in the place of a chart that could not be drawn', () => {
    const page = buildHtmlReport({ ...input, charts: new Map([[ramp, { failed: 'scale domain <empty>' }]]) });
    const start = page.lastIndexOf('<section', page.indexOf('<span class="id">R-9<'));
    const card = page.slice(start, page.indexOf('</section>', start));
    assert.match(card, /^<section class="entry nochart"/);
    assert.match(card, /<p class="stand-in">This chart could not be drawn \(scale domain &lt;empty&gt;\)\. The figures and findings are not affected\.<\/p>/);
    assert.match(card, /313\.83 ± 0\.50 K/, 'the figures are still there');
  });

  it('shows the note of a map that cannot be drawn in its place', () => {
    assert.match(html, /<figure class="map" id="map-density-gain"><figcaption><b>Density gain<\/b><\/figcaption><p class="stand-in">needs at least 3 films/);
  });
});

describe('longCsv: one row per block and figure', () => {
  const rows = csvRecords(longCsv(report));

  it('has the tidy columns and one row per figure', () => {
    assert.equal(longCsv(report).split('\n')[0], LONG_CSV_HEADERS.join(','));
    assert.equal(rows.length, 3 + 1);
  });

  it('writes the value at full precision and rounded to its uncertainty, with the block it belongs to', () => {
    const tg = rows.find((r) => r.get('figure') === 'tg')!;
    assert.deepEqual(Object.fromEntries(tg), {
      file: 'days/2026-03-14.md', block: 'R-9', kind: 'ramp', film: 'D-9', material: 'aster-3', technique: 'ellipsometry',
      rate: '1', rate_unit: 'K/min', figure: 'tg', label: 'Tg', value: '313.82909975329915', uncertainty: '0.5', unit: 'K',
      value_rounded: '313.83', uncertainty_rounded: '0.50', interval_low: '312.85', interval_high: '314.81', method: 'hinge fit',
    });
    const aging = rows.find((r) => r.get('figure') === 'equivalent_aging_time')!;
    assert.equal(aging.get('interval_low'), '1.5e+9');
    assert.equal(aging.get('interval_high'), '1.6e+13');
  });

  it('writes the full value so that it reads back as the same double (ECMAScript Number::toString, at most 17 digits)', () => {
    for (const r of rows) {
      const computed = [ramp, isotherm].flatMap((b) => Object.entries(b.results)).find(([name]) => name === r.get('figure'))![1];
      assert.equal(Number(r.get('value')), computed.value, `${r.get('figure')}: ${r.get('value')}`);
    }
  });
});

describe('figures and conditions in a card', () => {
  const result = (value: number, unit: string, extra: object = {}) => ({ value, unit, method: 'test', ...extra });

  it('puts °C beside an absolute temperature only, never beside the VFT B (a temperature difference)', () => {
    // log10 τ = A + B/(T − T0) (Böhmer, Ngai, Angell & Plazek, J. Chem. Phys. 99, 4201 (1993)): B in K is not a temperature on a scale.
    const b = readableFigure('vft_B', result(1008.4, 'K', { uncertainty: 12 }), { digits: 4, notation: 'fixed' });
    assert.equal(b.main, '1008 ± 12 K');
    assert.equal(b.beside, '');
    // T0 is one: 240.0 K − 273.15 = −33.15 °C (ITS-90 offset).
    const t0 = readableFigure('vft_T0', result(240.04, 'K', { uncertainty: 0.5 }), { digits: 4, notation: 'fixed' });
    assert.equal(t0.beside, '-33.11 °C');
    const html = figuresHtml({ vft_B: result(1008.4, 'K', { uncertainty: 12 }), vft_T0: result(240.04, 'K', { uncertainty: 0.5 }) }, 'relaxation');
    assert.equal((html.match(/°C/g) ?? []).length, 1);
  });

  it('gives the summary CSV a °C column only beside an absolute temperature (the same catalogue rule)', () => {
    const celsius = SUMMARY_COLUMNS.filter((c) => c.type === 'result' && c.csvCelsiusHeader !== undefined);
    assert.deepEqual(celsius.map((c) => c.key), ['tg', 'tonset', 'tfictive']);
    for (const c of celsius) assert.equal(catalogueEntry(c.key)?.absolute, true, c.key);
    // The HTML tables follow the same flag: Tsub and the absolute temperatures, nothing else in K.
    assert.deepEqual(SUMMARY_COLUMNS.filter((c) => c.absoluteTemperature).map((c) => c.key), ['tsub', 'tg', 'tonset', 'tfictive']);
    assert.notEqual(catalogueEntry('vft_B')?.absolute, true);
  });

  it('prints units through the shared formatter in the interval and the budget: J/(g·K), never J/(g*K)', () => {
    const html = figuresHtml({ step_height: result(0.3512, 'J/(g*K)', { uncertainty: 0.012, interval: [0.3277, 0.3747], budget: [{ source: 'baselines', value: 0.012 }] }) }, 'dsc');
    assert.doesNotMatch(html, /\*/);
    assert.match(html, /95 % interval \[0\.328, 0\.375\] J\/\(g·K\)/);
    assert.match(html, /<td class="num">0\.012 J\/\(g·K\)<\/td>/);
  });

  it('keeps the sign of a bound and the ± of a condition in the value computed with', () => {
    const text = ['```deposition D-7', 'base_pressure: < 3e-7 Torr', 'substrate_temperature: 12 °C ± 0.5 °C', 'rate: ≤ 0.3 nm/s', '```', ''].join('\n');
    const block: BlockReport = {
      kind: 'deposition',
      id: 'D-7',
      span: { start: 0, end: text.length - 1 },
      metadata: { base_pressure: '< 3e-7 Torr', substrate_temperature: '12 °C ± 0.5 °C', rate: '≤ 0.3 Å/s' },
      quantities: {
        // 1 Torr = 101325/760 Pa (NIST SP 811, appendix B.8): 3e-7 Torr = 4.00e-5 Pa.
        '/base_pressure': { value: (3e-7 * 101325) / 760, unit: 'Pa', dimension: 'pressure', writtenUnit: 'Torr', offsetTemperature: false, bound: 'upper' },
        // 12 °C = 285.15 K (ITS-90 offset); an uncertainty of 0.5 °C is 0.5 K.
        '/substrate_temperature': { value: 285.15, uncertainty: 0.5, unit: 'K', dimension: 'temperature', writtenUnit: '°C', offsetTemperature: true },
        // 1 Å = 0.1 nm (SI brochure): ≤ 0.3 Å/s is ≤ 0.03 nm/s.
        '/rate': { value: 0.03, unit: 'nm/s', dimension: 'rate', writtenUnit: 'Å/s', offsetTemperature: false, bound: 'upper' },
      },
      results: {},
      diagnostics: [],
    };
    const card = blockCardHtml(block, undefined, { lines: new LineIndex(text), subject: { film: null, material: null }, key: 'e0-0' });
    assert.match(card, /<dd>&lt; 3e-7 Torr <span class="canonical">&lt; 4\.00 × 10<sup>−5<\/sup> Pa<\/span><\/dd>/);
    assert.match(card, /<dd>12 °C ± 0\.5 °C <span class="canonical">= 285\.15 ± 0\.50 K<\/span><\/dd>/);
    assert.match(card, /<dd>≤ 0\.3 Å\/s <span class="canonical">≤ 0\.0300 nm\/s<\/span><\/dd>/);
  });
});

describe('summarise: the heating scan of a film', () => {
  const temperature = (value: number) => ({ value, unit: 'K', method: 'test' });
  const mk = (kind: BlockReport['kind'], id: string, metadata: Record<string, unknown>, results: BlockReport['results']): BlockReport => ({ kind, id, span: { start: 0, end: 1 }, metadata, quantities: {}, results, diagnostics: [] });

  it('takes T_onset and Tf from one scan, the first that gave both, and names it', () => {
    // Common practice, no source: a film's row must not join the onset of one scan to the Tf of another.
    const blocks = [
      mk('deposition', 'F-1', { material: 'm' }, {}),
      mk('ramp', 'R-1', { film: 'F-1' }, { tonset: temperature(330) }),
      mk('dsc', 'C-1', { film: 'F-1' }, { tonset: temperature(334), tfictive: temperature(298) }),
    ];
    const [row] = summarise({ files: [{ path: 'n.md', text: '', blocks, diagnostics: [] }] });
    assert.equal(row.scan?.block, 'C-1');
    assert.equal(row.scan?.technique, 'calorimetry');
    assert.deepEqual([row.tonset?.value, row.tfictive?.value], [334, 298]);
  });

  it('keeps the first scan that gave either when none gave both', () => {
    const blocks = [mk('deposition', 'F-1', {}, {}), mk('ramp', 'R-1', { film: 'F-1' }, { tonset: temperature(330) }), mk('dsc', 'C-1', { film: 'F-1' }, { tfictive: temperature(298) })];
    const [row] = summarise({ files: [{ path: 'n.md', text: '', blocks, diagnostics: [] }] });
    assert.equal(row.scan?.block, 'R-1');
    assert.equal(row.tonset?.value, 330);
    assert.equal(row.tfictive, undefined);
  });

  it('keeps same-id films of two notebook folders apart', () => {
    const file = (root: string, tsub: number, tg: number) => ({
      path: 'n.md',
      root,
      text: '',
      diagnostics: [],
      blocks: [{ ...mk('deposition', 'F-1', {}, {}), quantities: { '/substrate_temperature': { value: tsub, unit: 'K', dimension: 'temperature', writtenUnit: 'K', offsetTemperature: false } } }, mk('ramp', 'R-1', { film: 'F-1' }, { tg: temperature(tg) })],
    });
    const rows = summarise({ files: [file('/a', 250, 310), file('/b', 270, 315)] });
    assert.deepEqual(rows.map((r) => [r.root, r.tsub, r.tg?.value]), [['/a', 250, 310], ['/b', 270, 315]]);
  });
});

describe('reportStylesheet: colours from the design tokens only', () => {
  /** Every hex colour of the tokens, lower case. */
  const TOKEN_COLOURS = new Set(
    [...Object.values(SURFACE.light), ...Object.values(SURFACE.dark), ...Object.values(ROLE).flatMap((r) => [r.light, r.dark]), ...MATERIAL_COLOURS.light, ...MATERIAL_COLOURS.dark].map((c) => c.toLowerCase()),
  );
  /** CSS Color Module Level 4: the named colours, and the keywords that are colours. */
  const NAMED =
    'aliceblue antiquewhite aqua aquamarine azure beige bisque black blanchedalmond blue blueviolet brown burlywood cadetblue chartreuse chocolate coral cornflowerblue cornsilk crimson cyan darkblue darkcyan darkgoldenrod darkgray darkgreen darkgrey darkkhaki darkmagenta darkolivegreen darkorange darkorchid darkred darksalmon darkseagreen darkslateblue darkslategray darkslategrey darkturquoise darkviolet deeppink deepskyblue dimgray dimgrey dodgerblue firebrick floralwhite forestgreen fuchsia gainsboro ghostwhite gold goldenrod gray green greenyellow grey honeydew hotpink indianred indigo ivory khaki lavender lavenderblush lawngreen lemonchiffon lightblue lightcoral lightcyan lightgoldenrodyellow lightgray lightgreen lightgrey lightpink lightsalmon lightseagreen lightskyblue lightslategray lightslategrey lightsteelblue lightyellow lime limegreen linen magenta maroon mediumaquamarine mediumblue mediumorchid mediumpurple mediumseagreen mediumslateblue mediumspringgreen mediumturquoise mediumvioletred midnightblue mintcream mistyrose moccasin navajowhite navy oldlace olive olivedrab orange orangered orchid palegoldenrod palegreen paleturquoise palevioletred papayawhip peachpuff peru pink plum powderblue purple rebeccapurple red rosybrown royalblue saddlebrown salmon sandybrown seagreen seashell sienna silver skyblue slateblue slategray slategrey snow springgreen steelblue tan teal thistle tomato turquoise violet wheat white whitesmoke yellow yellowgreen transparent canvas canvastext linktext visitedtext activetext buttonface buttontext buttonborder field fieldtext highlight highlighttext selecteditem selecteditemtext mark marktext graytext accentcolor accentcolortext'.split(' ');
  const NAMED_SET = new Set(NAMED);

  /** Every colour literal in the declarations of a stylesheet, and whether the tokens have it. */
  function colourLiterals(css: string): Array<{ literal: string; fromTokens: boolean }> {
    const found: Array<{ literal: string; fromTokens: boolean }> = [];
    const values = [...css.replace(/\/\*[^]*?\*\//g, '').matchAll(/[a-z-]+\s*:\s*([^;{}]+)/gi)].map((m) => m[1]);
    for (const value of values) {
      // Font family names are not colours ("Iowan Old Style" holds no colour word, but guard all).
      const v = value.replace(/'[^']*'|"[^"]*"/g, '');
      for (const m of v.matchAll(/#[0-9a-f]{3,8}\b/gi)) found.push({ literal: m[0], fromTokens: TOKEN_COLOURS.has(m[0].toLowerCase()) });
      for (const m of v.matchAll(/\b(rgba?|hsla?|hwb|lab|lch|oklab|oklch|color|color-mix)\(/gi)) found.push({ literal: m[0], fromTokens: false });
      for (const m of v.matchAll(/(?<![#\w-])[a-z]+(?![\w-])/gi)) if (NAMED_SET.has(m[0].toLowerCase())) found.push({ literal: m[0], fromTokens: false });
    }
    return found;
  }

  it('finds a colour written outside the tokens (the check can fail)', () => {
    assert.deepEqual(colourLiterals('a { color: #ffffff; } b { background: white; border: 1px solid rgb(0 0 0); } c { color: var(--ink); }'), [
      { literal: '#ffffff', fromTokens: false },
      { literal: 'white', fromTokens: false },
      { literal: 'rgb(', fromTokens: false },
    ]);
    assert.deepEqual(colourLiterals(`a { color: ${SURFACE.light.ink}; }`), [{ literal: SURFACE.light.ink, fromTokens: true }]);
  });

  it('writes every colour of the page from SURFACE, both themes, and nothing else', () => {
    const css = reportStylesheet();
    const literals = colourLiterals(css);
    const foreign = literals.filter((l) => !l.fromTokens).map((l) => l.literal);
    assert.deepEqual(foreign, []);
    for (const theme of ['light', 'dark'] as const) {
      for (const [key, colour] of Object.entries(SURFACE[theme])) assert.ok(css.includes(`--${key}: ${colour};`), `${theme} ${key}`);
    }
    // The same holds for the page as written (its one style element).
    const style = html.slice(html.indexOf('<style>') + 7, html.indexOf('</style>'));
    assert.deepEqual(colourLiterals(style).filter((l) => !l.fromTokens), []);
    assert.ok(!/style="/.test(html.replace(/<svg[^]*?<\/svg>/g, '')), 'no inline style outside the drawings');
  });

  it('takes its fonts and type scale from TYPE', () => {
    const css = reportStylesheet();
    assert.ok(css.includes(`--font-text: ${TYPE.text};`));
    assert.ok(css.includes(`--size-body: ${TYPE.size.body}px;`));
    assert.deepEqual([...css.matchAll(/font-size:\s*(\d+(?:\.\d+)?)px/g)].map((m) => m[1]), [], 'no font size in px outside the scale');
  });
});
