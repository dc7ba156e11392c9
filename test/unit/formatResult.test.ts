import assert from 'node:assert/strict';
import type { FilmSummary, ResultValue } from '../../extension/core/index.js';
import { summarise } from '../../extension/core/index.js';
import { summaryTable } from '../../extension/cli/summaryTable.js';
import { SUMMARY_COLUMNS, csvHeaders, quantityHeader } from '../../extension/core/engine/summaryColumns.js';
import { RESULT_CATALOGUE } from '../../extension/core/model/catalogue.js';
import {
  formatCsvNumber,
  formatInterval,
  formatMeasurement,
  formatQuantity,
  formatUncertainty,
  formatValue,
  resultText,
  resultValueText,
  unitText,
} from '../../extension/core/model/formatResult.js';
import { buildHtmlReport } from '../../extension/core/report/htmlReport.js';
import { summaryCsv } from '../../extension/core/report/summaryCsv.js';
import { csvField } from '../../extension/core/report/escape.js';
import { powerOfTenHtml } from '../../extension/core/report/readable.js';
import { csvRecords, parseCsv } from '../support/csv.js';
import { loadNotebook } from '../support/loadNotebook.js';
import { uniform } from '../support/random.js';

const FIXED4 = { digits: 4, notation: 'fixed' } as const;
const FIXED3 = { digits: 3, notation: 'fixed' } as const;
const EXP3 = { digits: 3, notation: 'exponential' } as const;

const rv = (value: number, unit: string, uncertainty?: number): ResultValue => (uncertainty === undefined ? { value, unit, method: 'test' } : { value, unit, uncertainty, method: 'test' });

/** Significant digits of a formatted number (mantissa digits without leading zeros). */
function significantDigits(text: string): number {
  const mantissa = text.replace(/^-/, '').replace(/e[+-]\d+$/, '');
  // Trailing zeros of an integer only place the decimal point.
  const digits = mantissa.includes('.') ? mantissa.replace('.', '') : mantissa.replace(/0+$/, '');
  return digits.replace(/^0+/, '').length;
}

describe('formatMeasurement: uncertainty to two significant digits, value to the same place', () => {
  it('rounds the value to the place of the uncertainty (JCGM 100:2008, GUM §7.2.6 example)', () => {
    // Source: JCGM 100:2008 (GUM) §7.2.6: "if y = 10,057 62 Ω with uc(y) = 27 mΩ, y should be rounded to 10,058 Ω".
    assert.equal(formatMeasurement(10.05762, 0.027, FIXED4), '10.058 ± 0.027');
    assert.equal(formatQuantity(10.05762, 0.027, 'Ω', FIXED4), '10.058 ± 0.027 Ω');
  });

  it('keeps at most two significant digits of the uncertainty (JCGM 100:2008, GUM §7.2.6)', () => {
    // Source: JCGM 100:2008 (GUM) §7.2.6: u(xi) = 28,05 kHz "should be rounded down to 28 kHz".
    assert.equal(formatUncertainty(1000, 28.05, FIXED4), '28');
    // Source: JCGM 100:2008 (GUM) §7.2.2, the example mS = 100,021 47 g with uc = 0,35 mg.
    assert.equal(formatMeasurement(100.02147, 0.00035, FIXED4), '100.02147 ± 0.00035');
    assert.equal(formatMeasurement(100.021468, 0.000347, FIXED4), '100.02147 ± 0.00035');
  });

  it('follows a carry in the uncertainty to the next place', () => {
    // 0.0996 to two significant digits is 0.10: the value keeps two decimals, not three.
    assert.equal(formatMeasurement(0.3512, 0.0996, FIXED4), '0.35 ± 0.10');
    assert.equal(formatMeasurement(900.125343982, 9.95659609815, FIXED4), '900 ± 10');
  });

  it('rounds to tens or hundreds when the uncertainty is large', () => {
    assert.equal(formatMeasurement(123456, 1234, FIXED4), '123500 ± 1200');
    assert.equal(formatMeasurement(-42, 120, FIXED4), '-40 ± 120');
  });

  it('gives the value cell and the uncertainty cell separately', () => {
    assert.equal(formatValue(313.82909975329915, 0.06925082091018593, FIXED4), '313.829');
    assert.equal(formatUncertainty(313.82909975329915, 0.06925082091018593, FIXED4), '0.069');
    assert.equal(formatValue(291.79549513122913, 0.10155650751344067, FIXED4), '291.80', 'trailing zero kept');
    assert.equal(formatUncertainty(291.79549513122913, 0.10155650751344067, FIXED4), '0.10');
  });

  it('keeps the rule on 2000 seeded random pairs: two digits of u, the value at its last place', () => {
    const u = uniform(11);
    for (let i = 0; i < 2000; i++) {
      const scale = 10 ** Math.floor(u() * 8 - 3);
      const value = (u() - 0.3) * 1000 * scale;
      const unc = u() * 50 * scale + 1e-9 * scale;
      const [v, un] = formatMeasurement(value, unc, FIXED4).split(' ± ');
      const decimals = (t: string): number => (t.includes('.') ? t.length - t.indexOf('.') - 1 : 0);
      assert.ok(significantDigits(un) <= 2, `${unc} → ${un}`);
      assert.equal(decimals(v), decimals(un), `${value} ± ${unc} → ${v} ± ${un}`);
      assert.ok(Math.abs(Number(un) - unc) <= 0.05 * unc + 1e-12, `${unc} → ${un}`);
    }
  });

  it('takes the magnitude of a negative uncertainty and ignores a zero or non-finite one', () => {
    assert.equal(formatMeasurement(313.829, -0.069, FIXED4), '313.829 ± 0.069');
    assert.equal(formatMeasurement(313.829, 0, FIXED4), '313.8');
    assert.equal(formatMeasurement(313.829, Number.NaN, FIXED4), '313.8');
    assert.equal(formatUncertainty(313.829, undefined, FIXED4), '');
  });
});

describe('formatValue without an uncertainty', () => {
  it('prints the catalogue digits as significant digits, trailing zeros kept', () => {
    assert.equal(formatValue(270, undefined, FIXED4), '270.0');
    assert.equal(formatValue(0.8490566037735849, undefined, FIXED3), '0.849');
    assert.equal(formatValue(1200, undefined, FIXED3), '1200');
    assert.equal(formatValue(99.996, undefined, FIXED4), '100.0');
    assert.equal(formatValue(-13.9594448763, undefined, FIXED4), '-13.96');
  });

  it('never shows binary noise', () => {
    assert.equal(formatValue(0.19999999999999998, undefined, FIXED3), '0.200');
    assert.equal(formatValue(0.1 + 0.2, undefined, FIXED3), '0.300');
    assert.equal(formatCsvNumber(0.19999999999999998, undefined, FIXED3), '0.200');
    assert.equal(csvField(0.19999999999999998), '0.2');
  });

  it('never shows more digits than asked, on 2000 seeded random values over 30 decades', () => {
    const u = uniform(7);
    for (let i = 0; i < 2000; i++) {
      const value = (u() - 0.5) * 10 ** Math.floor(u() * 30 - 15);
      const format = u() < 0.5 ? FIXED4 : EXP3;
      const text = formatValue(value, undefined, format);
      assert.match(text, /^-?\d+(\.\d+)?(e[+-]\d+)?$/, text);
      assert.ok(significantDigits(text) <= format.digits, `${value} → ${text}`);
      assert.ok(Math.abs(Number(text) - value) <= Math.abs(value) * 10 ** (1 - format.digits), `${value} → ${text}`);
    }
  });

  it('shows a non-finite value as an em dash, and an empty CSV field', () => {
    for (const v of [Number.NaN, Infinity, -Infinity]) {
      assert.equal(formatValue(v, undefined, FIXED4), '—');
      assert.equal(formatValue(v, 0.1, FIXED4), '—');
      assert.equal(formatQuantity(v, 0.1, 'K', FIXED4), '—');
      assert.equal(formatUncertainty(v, 0.1, FIXED4), '');
      assert.equal(formatCsvNumber(v, undefined, FIXED4), '');
    }
  });

  it('never throws nor shows more than 15 digits, whatever the magnitudes', () => {
    const extremes = [0, -0, 5e-324, 1e-310, 1e-200, 1e-20, 1, 1e20, 1e200, Number.MAX_VALUE, -Number.MAX_VALUE, Number.NaN, Infinity];
    for (const v of extremes) {
      for (const u of [undefined, ...extremes]) {
        for (const format of [FIXED4, EXP3]) {
          let texts: string[] = [];
          assert.doesNotThrow(() => (texts = [formatMeasurement(v, u, format), formatValue(v, u, format), formatUncertainty(v, u, format), formatInterval([v, -v], v, u, format)]), `${v} ± ${u}`);
          for (const n of texts.join(' ').match(/\d+(\.\d+)?/g) ?? []) assert.ok(significantDigits(n) <= 15, `${v} ± ${u}: ${texts.join(' | ')}`);
        }
      }
    }
  });

  it('drops the sign of a value that rounds to zero', () => {
    assert.equal(formatMeasurement(-0.001, 0.25, FIXED4), '0.00 ± 0.25');
    assert.equal(formatValue(-0, undefined, FIXED3), '0.00');
  });
});

describe('exponential notation', () => {
  it('prints exponential where the catalogue says so', () => {
    assert.equal(formatValue(3126.2778750292005, undefined, EXP3), '3.13e+3');
    assert.equal(formatValue(0.000162836569472, undefined, EXP3), '1.63e-4');
    assert.equal(formatValue(1.6303862454, undefined, EXP3), '1.63e+0');
  });

  it('shares the exponent of value and uncertainty', () => {
    assert.equal(formatMeasurement(3126.27787503, 4.5115278468, EXP3), '(3.1263 ± 0.0045)e+3');
    assert.equal(formatValue(3126.27787503, 4.5115278468, EXP3), '3.1263e+3');
    // An exponent of 0 is left out (GUM §7.2.2 writes a value and its uncertainty with one factor of ten or none).
    assert.equal(formatMeasurement(1.6303862454, 0.3725866, EXP3), '1.63 ± 0.37');
    assert.equal(formatUncertainty(3126.27787503, 4.5115278468, EXP3), '4.5e+0');
    assert.equal(formatMeasurement(0.000162836569472, 6.95241378583e-7, EXP3), '(1.6284 ± 0.0070)e-4');
    assert.equal(formatMeasurement(999.6, 0.35, EXP3), '(9.9960 ± 0.0035)e+2');
  });

  it('falls back to it in fixed notation for very small or very large magnitudes', () => {
    assert.equal(formatValue(1e-7, undefined, FIXED4), '1.000e-7');
    assert.equal(formatValue(5.75110324775e27, undefined, FIXED4), '5.751e+27');
    assert.equal(formatMeasurement(2.5e-5, 3e-8, FIXED4), '(2.5000 ± 0.0030)e-5');
  });
});

describe('units, intervals and named results', () => {
  it('prints units as written, none for a dimensionless number', () => {
    assert.equal(formatQuantity(1.092148582693775, 0.002246874051618298, '%', FIXED3), '1.0921 ± 0.0022 %');
    assert.equal(formatQuantity(0.849, undefined, '1', FIXED3), '0.849');
    assert.equal(unitText('J/(g*K)'), 'J/(g·K)');
  });

  it('prints an interval at the place of the value', () => {
    assert.equal(formatInterval([313.691971409, 313.965698527], 313.829099753, 0.0692508209102, FIXED4), '[313.692, 313.966]');
    assert.equal(formatInterval([1528790679.12, 16286727997000], 157794163248, undefined, { digits: 2, notation: 'exponential' }), '[1.5e+9, 1.6e+13]');
  });

  it('takes digits and notation from the catalogue by result name', () => {
    assert.equal(resultText('tg', rv(313.82909975329915, 'K', 0.06925082091018593)), '313.829 ± 0.069 K');
    assert.equal(resultText('stability_ratio', rv(3126.2778750292005, '1')), '3.13e+3');
    assert.equal(resultValueText('tsub_over_tg', rv(0.8490566037735849, '1')), '0.849');
    assert.equal(resultValueText('no_such_result', rv(1 / 3, '1')), '0.3333');
  });
});

describe('summary columns in the CLI table, the HTML summary and the CSV', () => {
  const row: FilmSummary = {
    film: 'D-9',
    file: 'days/x.md',
    material: 'aster-3',
    tsub: 270,
    tsubOverTg: rv(0.8490566037735849, '1'),
    rate: 0.19999999999999998,
    thickness: 412,
    tg: rv(313.82909975329915, 'K', 0.06925082091018593),
    tonset: rv(331.50320113903666, 'K'),
    densityGain: rv(1.092148582693775, '%', 0.002246874051618298),
    stabilityRatio: rv(3126.2778750292005, '1'),
  };
  const cli = summaryTable([row]);
  const html = buildHtmlReport({ title: 't', report: { files: [] }, charts: new Map(), summary: [row], maps: [] });
  const csv = summaryCsv([row]).trim().split('\n');
  const csvRow = csvRecords(summaryCsv([row]))[0];

  it('print the same value identically', () => {
    const cells: Array<[string, string, string[]]> = [
      ['0.200', 'rate/(nm/s)', ['0.200']],
      ['270.0', 'Tsub/K', ['270.0']],
      ['0.849', 'Tsub/Tg', ['0.849']],
      ['313.829 ± 0.069', 'Tg/K', ['313.829', '0.069']],
      ['331.5', 'Tonset/K', ['331.5']],
      ['1.0921 ± 0.0022', 'density_gain/%', ['1.0921', '0.0022']],
      ['3.13e+3', 'stability_ratio', ['3.13e+3']],
    ];
    const cliCells = cli.split('\n')[2].split(/\s{2,}/);
    for (const [text, csvHeader, csvTexts] of cells) {
      assert.ok(cliCells.includes(text), `CLI: ${text} in ${cli}`);
      // The HTML writes an exponent as a power of ten and may add °C beside a temperature.
      assert.ok(html.includes(`<td class="num">${powerOfTenHtml(text)}</td>`) || html.includes(`<td class="num">${powerOfTenHtml(text)}<span class="beside">`), `HTML: ${text}`);
      assert.equal(csvRow.get(csvHeader), csvTexts[0], `CSV ${csvHeader}`);
      if (csvTexts[1]) assert.equal(csvRow.get(`u(${csvHeader.replace('/', ')/')}`), csvTexts[1]);
    }
    assert.ok(cliCells.includes('—'), 'a missing figure is an em dash');
    assert.equal(csvRow.get('Tf/K'), '', 'and an empty CSV field');
  });

  it('share one header per column between the CLI and the HTML table', () => {
    const cliHeader = cli.split('\n')[0].split(/\s{2,}/);
    assert.deepEqual(cliHeader, ['film', 'material', 'Tsub/K', 'Tsub/Tg', 'rate/(nm/s)', 'h/nm', 'Tg/K', 'T_onset/K', 'Tf/K', '(Δρ/ρ)/%', 'S']);
    for (const h of cliHeader) assert.ok(html.includes(`>${h}</th>`), h);
    assert.equal(quantityHeader(RESULT_CATALOGUE.density_gain.label, '%'), '(Δρ/ρ)/%');
  });

  it('keep the CSV header names with units, °C beside K and the method of each figure', () => {
    assert.deepEqual(SUMMARY_COLUMNS.flatMap(csvHeaders), [
      'film', 'material', 'file', 'Tsub/K', 'Tsub/°C', 'Tsub/Tg', 'rate/(nm/s)', 'thickness/nm',
      'Tg/K', 'u(Tg)/K', 'Tg/°C', 'method(Tg)', 'technique', 'scan', 'scan_rate/(K/min)',
      'Tonset/K', 'u(Tonset)/K', 'Tonset/°C', 'method(Tonset)', 'Tf/K', 'u(Tf)/K', 'Tf/°C', 'method(Tf)',
      'density_gain/%', 'u(density_gain)/%', 'method(density_gain)', 'stability_ratio', 'u(stability_ratio)', 'method(stability_ratio)',
      'aging_time_low/s', 'aging_time_high/s', 'method(aging_time)', 'enthalpy_gap/(J/g)', 'u(enthalpy_gap)/(J/g)', 'method(enthalpy_gap)',
      'front_velocity/(nm/s)', 'u(front_velocity)/(nm/s)', 'method(front_velocity)', 'fragility', 'u(fragility)', 'method(fragility)',
    ]);
    assert.equal(csv[0], SUMMARY_COLUMNS.flatMap(csvHeaders).join(','));
  });

  it('write °C beside K at the same decimal place (ITS-90: t/°C = T/K − 273.15)', () => {
    // 313.829 K − 273.15 = 40.679 °C; 270.0 K is −3.15 °C, shown at 0.1: −3.2 (half away from zero).
    assert.equal(csvRow.get('Tg/°C'), '40.679');
    assert.equal(csvRow.get('Tsub/°C'), '-3.2');
    assert.equal(csvRow.get('Tonset/°C'), '58.4', '331.5 K (four digits) → 58.35… °C at 0.1');
    assert.match(html, /313\.829 ± 0\.069<span class="beside">40\.679 °C<\/span>/);
  });

  it('write a CSV of the demo notebook free of binary noise', () => {
    const { notebook } = loadNotebook('fixtures/demo');
    const lines = parseCsv(summaryCsv(summarise(notebook.analyze())));
    assert.equal(lines.length, 1 + 4);
    const numeric = new Set(SUMMARY_COLUMNS.filter((c) => c.type !== 'text').flatMap(csvHeaders).filter((h) => !h.startsWith('method(')));
    const header = lines[0];
    for (const line of lines.slice(1)) {
      line.forEach((field, i) => {
        if (!numeric.has(header[i]) || field === '') return;
        assert.match(field, /^-?\d+(\.\d+)?(e[+-]\d+)?$/, `${header[i]}: ${field}`);
        assert.ok(significantDigits(field) <= 7, `${header[i]}: ${field}`);
      });
    }
  });
});
