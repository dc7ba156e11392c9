import assert from 'node:assert/strict';
import * as path from 'node:path';
import { InMemoryHost, Notebook, toJsonReport, type BlockReport, type JsonReport } from '../../extension/core/index.js';
import { tauDefinition } from '../../extension/core/analysis/relaxationAnalysis.js';
import { parseTable, type Table } from '../../extension/core/parse/table.js';
import { buildHtmlReport } from '../../extension/core/report/htmlReport.js';
import { FileHost } from '../../extension/node/fileHost.js';
import { DSC_EXPORTS, HOLD, LOSS_PEAKS, SCANS, cpGlass, cpLiquid, dscRows, scanRows, type DscExport } from '../support/exportsData.js';
import { REPO, loadNotebook } from '../support/loadNotebook.js';
import { DEPOSITION_BLOCK, MATERIAL_BLOCK } from '../support/synthetic.js';

// fixtures/exports: a notebook whose blocks read instrument exports as instruments write them
// (test/support/exportsData.ts generates the files from stated models with seeded noise). The
// figures must come out as the data were generated, within three of their stated standard
// uncertainties.

const ROOT = path.join(REPO, 'fixtures', 'exports');

describe('instrument exports notebook (fixtures/exports)', () => {
  const { notebook } = loadNotebook('fixtures/exports');
  const report = notebook.analyze();
  const json: JsonReport = toJsonReport(report);
  const blocks = new Map<string, BlockReport>(report.files.flatMap((f) => f.blocks).map((b) => [b.id ?? '', b]));
  const block = (id: string): BlockReport => {
    const b = blocks.get(id);
    assert.ok(b, `block ${id}`);
    return b;
  };

  /** Within 3 stated standard uncertainties of the generating value. */
  function near(id: string, name: string, expected: number): void {
    const r = block(id).results[name];
    assert.ok(r, `${id}: no ${name} (${block(id).diagnostics.map((d) => d.code).join(', ')})`);
    assert.ok(r.uncertainty !== undefined && r.uncertainty > 0, `${id} ${name} has no uncertainty`);
    assert.ok(Math.abs(r.value - expected) <= 3 * r.uncertainty, `${id} ${name} = ${r.value} ± ${r.uncertainty}, generated ${expected}`);
  }

  it('reads every export without a table, data-file or internal error', () => {
    const all = json.files.flatMap((f) => f.blocks.flatMap((b) => b.diagnostics.map((d) => `${b.id}: ${d.code}`)));
    assert.deepEqual(all.filter((d) => /: (table|data|internal)\./.test(d)), []);
    for (const id of ['R-V1', 'R-V2', 'H-V1', 'X-velvane', 'X-morrowite']) {
      assert.deepEqual(block(id).diagnostics.filter((d) => d.severity === 'error').map((d) => d.code), [], id);
    }
  });

  // Two-line glass/liquid thickness model (Keddie, Jones & Cory, Europhys. Lett. 27, 59 (1994)):
  // Tg at the intersection, α = (1/h)(dh/dT) of each line at Tg.
  it('gives the ramps the Tg and expansion coefficients the scans were generated with', () => {
    for (const [id, p] of [
      ['R-V1', SCANS['scan-V1-preamble.csv']],
      ['R-V2', SCANS['scan-V2-latin1.csv']],
    ] as const) {
      near(id, 'tg', p.tg);
      near(id, 'alpha_glass', p.ag);
      near(id, 'alpha_liquid', p.al);
    }
  });

  // Constant-velocity growth front between two plateaus (Swallen et al., Phys. Rev. Lett. 102,
  // 065503 (2009)); the hold starts at the first row (its temperature is at the hold throughout).
  it('gives the hh:mm:ss hold log the onset, transformation time and front velocity it was generated with', () => {
    near('H-V1', 'onset_time', HOLD.t1);
    near('H-V1', 'transformation_time', HOLD.t2);
    near('H-V1', 'front_velocity', HOLD.hVd / (HOLD.t2 - HOLD.t1));
  });

  // Decadic VFT law (Vogel 1921; Fulcher 1925; Tammann & Hesse 1926); Tg(τ = 100 s) = T0 + B/(2 − A).
  it('fits the VFT law the loss peaks were generated with, in Hz and in the log10(kHz) form', () => {
    for (const [id, p] of [
      ['X-velvane', LOSS_PEAKS['loss-peaks-velvane.csv']],
      ['X-morrowite', LOSS_PEAKS['loss-peaks-morrowite.txt']],
    ] as const) {
      near(id, 'vft_log10_tau0', p.A);
      near(id, 'vft_B', p.B);
      near(id, 'vft_T0', p.T0);
      near(id, 'tg_vft', p.T0 + p.B / (2 - p.A));
    }
  });

  it('says in the method labels which τ definition turned the frequencies into τ', () => {
    for (const name of ['vft_B', 'tg_vft', 'fragility']) {
      assert.match(block('X-velvane').results[name].method, /τ = 1\/\(2π f_max\)/);
      assert.match(block('X-morrowite').results[name].method, /τ = 1\/f_max/);
    }
    assert.match(block('X-velvane').figure?.yTitle ?? '', /1\/\(2π f_max\)/);
  });

  function readTable(name: string): Table {
    const read = new FileHost(ROOT).readDataFile(`data/${name}`, 1 << 20);
    assert.ok(read.ok, name);
    return parseTable(read.text.split(/\r\n|\n/));
  }

  it('reads the ellipsometer exports: preamble and units line, Latin-1 °C and trailing commas', () => {
    const first = readTable('scan-V1-preamble.csv');
    assert.deepEqual(first.problems, []);
    assert.deepEqual(first.columns.map((c) => [c.role, c.unit]), [
      ['time', 's'],
      ['temperature', 'K'],
      ['thickness', 'nm'],
      [null, ''],
      [null, ''],
    ]);
    assert.equal(first.preamble.find((e) => e.key === 'Sample')?.value, 'film V-1 on silicon');
    const second = readTable('scan-V2-latin1.csv');
    assert.deepEqual(second.problems, []);
    assert.equal(second.columns.length, 3);
    assert.equal(second.columns[1].writtenUnit, '°C');
    const rows = scanRows(SCANS['scan-V2-latin1.csv']);
    // Written with two decimals in °C; T/K = t/°C + 273.15 (SI Brochure, 9th ed., 2019).
    assert.ok(Math.abs(second.byRole.get('temperature')!.values[0] - rows[0][1]) < 0.006);
    assert.equal(second.rowCount, rows.length);
  });

  it('gives the calorimeter figures the exports were generated with, in both sign conventions', () => {
    // Cp is a logistic step of width w centred at T_step between two linear baselines. Half the step
    // height between the extrapolated baselines lies at T_step; the tangent at the inflection meets
    // the glass baseline 2w below it (the tangent of a logistic at its centre has slope 1/(4w);
    // the extrapolated-onset construction of ASTM E1356 [computed]). The step height is
    // Cp_liquid − Cp_glass at T_step.
    const ids: Record<string, string> = {
      'dsc-V1-mW-endo-up.txt': 'C-V1-endo-up',
      'dsc-V1-mW-exo-up.txt': 'C-V1-exo-up',
      'dsc-V2-Wg-endo-down.csv': 'C-V2-endo-down',
      'dsc-V2-Wg-exo-down.csv': 'C-V2-exo-down',
    };
    for (const [name, p] of Object.entries(DSC_EXPORTS) as Array<[string, DscExport]>) {
      const id = ids[name];
      near(id, 'tg_midpoint', p.step);
      near(id, 'tonset', p.step - 2 * p.width);
      const dcp = block(id).results.step_height;
      assert.ok(dcp && Math.abs(dcp.value - (cpLiquid(p.step) - cpGlass(p.step))) < 0.02, `${id} step ${dcp?.value}`);
      assert.ok(!block(id).diagnostics.some((d) => d.severity === 'error'), id);
    }
    // The block that gives no mass reads it from the export's preamble, and says so.
    assert.ok(block('C-V1-exo-up').diagnostics.some((d) => d.code === 'dsc.mass-from-preamble'));
  });

  it('reads the calorimeter exports: UTF-16 and UTF-8, mW and W/g, both sign conventions, the mass in the preamble', () => {
    for (const [name, p] of Object.entries(DSC_EXPORTS) as Array<[string, DscExport]>) {
      const t = readTable(name);
      assert.deepEqual(t.problems, [], name);
      const role = p.perMass ? 'specific_heat_flow' : 'heat_flow';
      const hf = t.byRole.get(role);
      assert.ok(hf, `${name}: ${role}`);
      assert.equal(hf.unit, p.perMass ? 'W/g' : 'mW');
      // Endotherms up when the written signal of a heat-capacity step is positive (Φ = m·q·Cp > 0 on heating).
      assert.equal(hf.convention, p.sign === 1 ? 'endotherm-up' : 'endotherm-down', name);
      const rows = dscRows(p);
      assert.equal(t.rowCount, rows.length);
      const last = rows.length - 1;
      assert.ok(Math.abs(hf.values[last] - rows[last][2]) < 1e-5, name);
      assert.ok(Math.abs(t.byRole.get('temperature')!.values[last] - (rows[last][1] + 273.15)) < 0.006, name);
      if (!p.perMass) {
        assert.equal(t.preamble.find((e) => e.key === 'Sample mass')?.value, `${p.mass} mg`);
        assert.ok(Math.abs(t.byRole.get('time')!.values[1] - (60 * 0.5) / p.q) < 0.1, `${name}: minutes in seconds`);
      } else {
        assert.equal(t.preamble.find((e) => e.key === 'Mass')?.value, `${p.mass} mg`);
      }
    }
  });
});

describe('relaxation blocks with loss-peak frequencies', () => {
  it('accepts the two τ definitions however they are spelled, and no other', () => {
    for (const s of [undefined, '1/(2 pi f_max)', '1/(2π f_max)', '1/(2*pi*fmax)', 'τ = 1/(2π f_peak)', '(2 pi f_max)^-1']) assert.equal(tauDefinition(s), 'angular', String(s));
    for (const s of ['1/f_max', '1 / fmax', 'tau = 1/f_max']) assert.equal(tauDefinition(s), 'cyclic', s);
    for (const s of ['mean KWW time', '1/(2 f_max)', '2 pi f_max', 42]) assert.equal(tauDefinition(s), null, String(s));
  });

  // log10 τ = A + B/(T − T0) with A = −14, B = 1008 K, T0 = 252 K (Tg = 315 K, m = 80), sampled
  // without noise; f_max = 1/(2π τ) or 1/τ.
  const vftRows = (cyclic: boolean): string =>
    [320, 330, 340, 350, 360, 370]
      .map((T) => {
        const tau = Math.pow(10, -14 + 1008 / (T - 252));
        return `${T}, ${(cyclic ? 1 / tau : 1 / (2 * Math.PI * tau)).toPrecision(12)}`;
      })
      .join('\n');
  const relaxation = (definition: string | null, cyclic = false): string =>
    `\`\`\`relaxation X-1\nmaterial: M-1\nmethod: dielectric loss peak\n${definition === null ? '' : `tau_definition: ${definition}\n`}---\nT/K, f_max/Hz\n${vftRows(cyclic)}\n\`\`\`\n`;
  const analyse = (text: string): BlockReport => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK() + text);
    return nb.analyze().files[0].blocks.find((b) => b.kind === 'relaxation')!;
  };

  it('recovers the VFT law through either definition', () => {
    for (const [definition, cyclic] of [
      [null, false],
      ['1/(2 pi f_max)', false],
      ['1/f_max', true],
    ] as const) {
      const b = analyse(relaxation(definition, cyclic));
      assert.ok(Math.abs(b.results.vft_B.value - 1008) < 0.5, `${definition}: B = ${b.results.vft_B?.value}`);
      assert.ok(Math.abs(b.results.tg_vft.value - 315) < 0.01, `${definition}: Tg`);
      assert.ok(Math.abs(b.results.fragility.value - 80) < 0.05, `${definition}: m`);
    }
  });

  it('refuses an unknown definition on its line, naming the two it accepts, and fits nothing', () => {
    const text = MATERIAL_BLOCK() + relaxation('mean KWW time');
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', text);
    const json = toJsonReport(nb.analyze());
    const b = json.files[0].blocks.find((x) => x.kind === 'relaxation')!;
    const d = b.diagnostics.find((x) => x.code === 'relaxation.tau-definition');
    assert.ok(d);
    assert.equal(d.line, text.split('\n').findIndex((l) => l.startsWith('tau_definition')) + 1);
    assert.match(d.message, /"1\/\(2 pi f_max\)".*"1\/f_max"/);
    assert.deepEqual(Object.keys(b.results), []);
  });

  it('leaves a free-text definition alone when the table gives τ itself', () => {
    const text = MATERIAL_BLOCK() + '```relaxation X-1\nmaterial: M-1\nmethod: dielectric\ntau_definition: mean KWW time\n---\nT/K, tau/s\n320, 10\n330, 0.5\n340, 0.04\n350, 0.005\n```\n';
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', text);
    const b = nb.analyze().files[0].blocks.find((x) => x.kind === 'relaxation')!;
    assert.equal(b.diagnostics.some((d) => d.code === 'relaxation.tau-definition'), false);
  });
});

describe('what the engine says about a table that has errors', () => {
  const RAMP = 'film: D-1\nrate: 10 K/min\ndirection: cooling\n';

  const excerptOf = (lines: readonly string[]): BlockReport['tableExcerpt'] => {
    const nb = new Notebook(new InMemoryHost(new Map([['data/bad.csv', lines.join('\n')]])));
    nb.setFile('r.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280) + '```ramp R-1\n' + RAMP + 'data: data/bad.csv\n```\n');
    return nb.analyze().files[0].blocks.find((b) => b.kind === 'ramp')!.tableExcerpt;
  };
  const rows = (n: number, from = 356): string[] => Array.from({ length: n }, (_, i) => `${from - 2 * i}, ${(104 - 0.1 * i).toFixed(1)}`);

  it('shows 8 lines of a data file as read beside its errors, from the header', () => {
    const lines = ['Sample: film D-1', 'T/K, h/nm', '360, 104.5', '358, oops', ...rows(10)];
    const x = excerptOf(lines);
    assert.deepEqual(x, { path: 'data/bad.csv', firstLine: 1, lines: lines.slice(1, 9), lengths: lines.slice(1, 9).map((l) => l.length) });
  });

  it('starts after a long instrument preamble, at the header and its units line', () => {
    const preamble = Array.from({ length: 10 }, (_, i) => `Setting ${i + 1}: value ${i + 1}`);
    const lines = [...preamble, 'Temperature, Thickness', 'K, nm', '360, 104.5', '358, oops', ...rows(10)];
    const x = excerptOf(lines)!;
    assert.equal(x.firstLine, 10);
    assert.deepEqual(x.lines.slice(0, 4), ['Temperature, Thickness', 'K, nm', '360, 104.5', '358, oops']);
  });

  it('starts at the first problem when it lies further down than 8 lines below the header', () => {
    const lines = ['T/K, h/nm', ...rows(20, 380), '338, oops', ...rows(5, 336)];
    const x = excerptOf(lines)!;
    assert.equal(x.firstLine, 21);
    assert.equal(x.lines[0], '338, oops');
  });

  it('carries the length of a cut line as read, and the report prints that length', () => {
    const long = `358, ${'9'.repeat(5000)}x`;
    const lines = ['T/K, h/nm', '360, 104.5', long, ...rows(10)];
    const x = excerptOf(lines)!;
    assert.equal(x.lines[2].length, 1001);
    assert.equal(x.lengths?.[2], long.length);
    const nb = new Notebook(new InMemoryHost(new Map([['data/bad.csv', lines.join('\n')]])));
    nb.setFile('r.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280) + '```ramp R-1\n' + RAMP + 'data: data/bad.csv\n```\n');
    const html = buildHtmlReport({ title: 't', record: { date: '2026-03-14 09:00 UTC', version: '0', folders: ['/x'] }, report: nb.analyze(), charts: new Map(), summary: [], maps: [] });
    assert.match(html, new RegExp(`… \\(${long.length} characters\\)`));
  });

  it('reports a mistyped first row of an inline table as a bad cell, keeping the header', () => {
    const nb = new Notebook(new InMemoryHost());
    const text = MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280) + '```ramp R-1\n' + RAMP + '---\nT/K, h/nm\n3OO, 400\n' + rows(12).join('\n') + '\n```\n';
    nb.setFile('r.md', text);
    const ramp = nb.analyze().files[0].blocks.find((b) => b.kind === 'ramp')!;
    const codes = ramp.diagnostics.map((d) => d.code);
    assert.ok(codes.includes('table.bad-cell'), codes.join(' '));
    assert.ok(!codes.includes('table.missing-column'), codes.join(' '));
    const bad = ramp.diagnostics.find((d) => d.code === 'table.bad-cell')!;
    assert.equal(text.slice(bad.span.start, bad.span.end), '3OO');
  });

  it('gives the notebook line of an inline table, and nothing for a clean table', () => {
    const head = MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280);
    const inline = '```ramp R-1\n' + RAMP + '---\nT/K, h/nm\n360, 104.5\n358, x\n```\n';
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('r.md', head + inline);
    const ramp = nb.analyze().files[0].blocks.find((b) => b.kind === 'ramp')!;
    const firstLine = (head + inline).split('\n').indexOf('T/K, h/nm');
    assert.deepEqual(ramp.tableExcerpt, { path: null, firstLine, lines: ['T/K, h/nm', '360, 104.5', '358, x'], lengths: [9, 10, 6] });
    nb.setFile('r.md', head + inline.replace('358, x', '358, 104.3'));
    assert.equal(nb.analyze().files[0].blocks.find((b) => b.kind === 'ramp')!.tableExcerpt, undefined);
  });

  it('says why the standard Tg has no fragility when the relaxation table failed', () => {
    // A two-line cooling curve through Tg = 315 K at 1 K/min (invented), no VFT parameters.
    const rows = Array.from({ length: 60 }, (_, i) => {
      const T = 360 - (i * 100) / 59;
      return `${T.toFixed(3)}, ${(T > 315 ? 100 * (1 + 8e-4 * (T - 315)) : 100 * (1 + 2e-4 * (T - 315))).toFixed(4)}`;
    });
    const ramp = '```ramp R-1\nfilm: D-1\nrate: 1 K/min\ndirection: cooling\n---\nT/K, h/nm\n' + rows.join('\n') + '\n```\n';
    const relaxation = '```relaxation X-1\nmaterial: M-1\nmethod: dielectric\n---\nT/K, tau/s\n320, 10\n330, abc\n```\n';
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280) + ramp + relaxation);
    const material = nb.analyze().files[0].blocks.find((b) => b.kind === 'material')!;
    const d = material.diagnostics.find((x) => x.code === 'material.no-fragility');
    assert.ok(d, material.diagnostics.map((x) => x.code).join(', '));
    assert.match(d.message, /errors in the data table of relaxation block X-1 prevent its VFT fit/);
  });

  it('does not call relaxation data whose table failed "no relaxation data"', () => {
    const relaxation = '```relaxation X-1\nmaterial: M-1\nmethod: dielectric\n---\nT/K, tau/s\n320, 10\n330, abc\n```\n';
    const hold = Array.from({ length: 80 }, (_, i) => `${60 * i}, ${i < 20 ? 400 : i > 60 ? 406 : 400 + (6 * (i - 20)) / 40}`).join('\n');
    const isotherm = '```isotherm I-1\nfilm: D-1\ntemperature: 330 K\n---\nt/s, h/nm\n' + hold + '\n```\n';
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL_BLOCK() + DEPOSITION_BLOCK('D-1', 280) + relaxation + isotherm);
    const iso = nb.analyze().files[0].blocks.find((b) => b.kind === 'isotherm')!;
    const d = iso.diagnostics.find((x) => x.code === 'isotherm.no-vft');
    assert.ok(d, iso.diagnostics.map((x) => x.code).join(', '));
    assert.match(d.message, /errors in the data table of relaxation block X-1 prevent its VFT fit/);
    assert.doesNotMatch(d.message, /nor relaxation data/);
  });
});
