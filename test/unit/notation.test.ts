import assert from 'node:assert/strict';
import { InMemoryHost, Notebook, summarise, toJsonReport } from '../../extension/core/index.js';
import { messages } from '../../extension/core/model/messages.js';
import { MATERIAL_BLOCK, tableBlock } from '../support/synthetic.js';

type JsonFile = ReturnType<typeof toJsonReport>['files'][number];

function analyse(files: Record<string, string>): { files: JsonFile[]; nb: Notebook } {
  const nb = new Notebook(new InMemoryHost());
  for (const [path, text] of Object.entries(files)) nb.setFile(path, text);
  return { files: toJsonReport(nb.analyze()).files, nb };
}

const depositionBlock = (id: string, lines: string) =>
  `\`\`\`deposition ${id}\nmaterial: M-1\n${lines}substrate: silicon\n\`\`\`\n`;

const blockOf = (files: JsonFile[], id: string) => files.flatMap((f) => f.blocks).find((b) => b.id === id)!;

// Two exact lines meeting at Tg, as in the tangent construction of ASTM E1545 [from memory]:
// VD h = 99.90 + 0.020(T − 300), SCL h = 101.0 + 0.070(T − 315), LC h = 101.0 + 0.020(T − 315);
// a heating of the as-deposited glass, transforming linearly from 326 to 331 K, then a cooling.
const vd = (T: number) => 99.9 + 0.02 * (T - 300);
const scl = (T: number) => 101.0 + 0.07 * (T - 315);
const lc = (T: number) => 101.0 + 0.02 * (T - 315);
function cycleRows(): number[][] {
  const rows: number[][] = [];
  let t = 0;
  for (let T = 280; T <= 345 + 1e-9; T += 0.25) {
    const x = Math.min(1, Math.max(0, (T - 326) / 5));
    rows.push([t, T, vd(T) + x * (scl(T) - vd(T))]);
    t += 15;
  }
  for (let T = 344.75; T >= 280 - 1e-9; T -= 0.25) {
    rows.push([t, T, T >= 315 ? scl(T) : lc(T)]);
    t += 15;
  }
  return rows;
}

describe('a substrate temperature written as a multiple of Tg', () => {
  const film = depositionBlock('D-1', 'substrate_temperature: 0.92 Tg\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n');
  const ramp = tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', cycleRows(), 9);

  it('is resolved against the material\'s tg, said so, and read by the film\'s ramps and the summary', () => {
    // 0.92 × 315 K = 289.8 K; Tsub/Tg is the factor itself (the planning rule of Kearns et al.,
    // J. Chem. Phys. 127, 154702, 2007, gives Tsub as a fraction of Tg).
    const { files, nb } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': film + '\n' + ramp });
    const d = blockOf(files, 'D-1');
    assert.equal(d.results.tsub_over_tg.value, 0.92);
    assert.match(d.results.tsub_over_tg.method, /0\.92 Tg of M-1/);
    const info = d.diagnostics.find((x) => x.code === 'deposition.tsub-from-tg');
    assert.equal(info?.message, messages.tsubFromTg(0.92, 315, 'M-1', 0.92 * 315).message);
    assert.equal(info?.line, 3);
    const report = nb.analyze().files.find((f) => f.path === 'd.md')!.blocks[0];
    assert.ok(Math.abs(report.quantities['/substrate_temperature'].value - 289.8) < 1e-9);
    const r = blockOf(files, 'R-1');
    assert.ok(Math.abs(r.results.reference_temperature.value - 289.8) < 1e-9);
    // Density gain of the liquid-cooled over the as-deposited line at 289.8 K (Dalal & Ediger,
    // J. Phys. Chem. Lett. 3, 1229, 2012, define it so): 100·(h_LC/h_VD − 1).
    const expected = 100 * (lc(289.8) / vd(289.8) - 1);
    assert.ok(Math.abs(r.results.density_gain.value - expected) < 1e-6, `${r.results.density_gain.value} vs ${expected}`);
    const row = summarise(nb.analyze()).find((x) => x.film === 'D-1');
    assert.ok(row?.tsub !== undefined && Math.abs(row.tsub - 289.8) < 1e-9);
  });

  it('carries the uncertainty of the factor and of Tg', () => {
    // u(f·Tg)² = (Tg·u_f)² + (f·u_Tg)² (GUM, JCGM 100:2008, eq. 10): (315·0.01)² + (0.9·2)².
    const material = '```material M-1\nname: synthetic glass\ntg: 315 ± 2 K\ntg_source: invented for the test\n```\n';
    const { nb } = analyse({ 'm.md': material, 'd.md': depositionBlock('D-1', 'substrate_temperature: 0.9 ± 0.01 Tg\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') });
    const q = nb.analyze().files.find((f) => f.path === 'd.md')!.blocks[0].quantities['/substrate_temperature'];
    assert.ok(Math.abs(q.value - 283.5) < 1e-9);
    assert.ok(Math.abs(q.uncertainty! - Math.hypot(3.15, 1.8)) < 1e-12);
    const d = toJsonReport(nb.analyze()).files.find((f) => f.path === 'd.md')!.blocks[0];
    assert.equal(d.results.tsub_over_tg.uncertainty, 0.01);
  });

  it("passes Tg's uncertainty on to the density gain, through the gain's slope in temperature", () => {
    // Δρ/ρ = 100·(h_LC/h_VD − 1) at T_ref (Dalal & Ediger, J. Phys. Chem. Lett. 3, 1229, 2012);
    // u(T_ref) enters through d(gain)/dT = 100·(s_LC·h_VD − h_LC·s_VD)/h_VD² (GUM, JCGM 100:2008,
    // eq. 10), with u(T_ref) = 0.92 × 2 K for a substrate at 0.92 Tg and Tg = 315 ± 2 K.
    const material = '```material M-1\nname: synthetic glass\ntg: 315 ± 2 K\ntg_source: invented for the test\n```\n';
    const { files } = analyse({ 'm.md': material, 'd.md': film + '\n' + ramp });
    const gain = blockOf(files, 'R-1').results.density_gain;
    const T = 0.92 * 315;
    const slope = (100 * (0.02 * vd(T) - lc(T) * 0.02)) / vd(T) ** 2;
    const term = gain.budget?.find((t) => t.source === 'reference temperature');
    assert.ok(term, JSON.stringify(gain.budget));
    assert.ok(Math.abs(term.value - Math.abs(slope) * 0.92 * 2) < 1e-6 * Math.abs(slope), `${term.value} against ${Math.abs(slope) * 1.84}`);
    assert.ok(gain.uncertainty! >= term.value);
    // Without an uncertainty on Tg there is no such term.
    const plain = blockOf(analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': film + '\n' + ramp }).files, 'R-1').results.density_gain;
    assert.equal(plain.budget?.find((t) => t.source === 'reference temperature'), undefined);
  });

  it('says why there is no density gain when no substrate temperature reaches the ramp', () => {
    // Δρ/ρ is compared at the film's substrate temperature (Dalal & Ediger, J. Phys. Chem. Lett. 3,
    // 1229, 2012): without a film, or a film without one, the ramp says what to write.
    const noFilm = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': tableBlock('ramp', 'R-1', 'rate: 1 K/min\n', 't/s, T/K, h/nm', cycleRows(), 9) });
    const r1 = blockOf(noFilm.files, 'R-1');
    assert.equal(r1.results.density_gain, undefined);
    const n1 = r1.diagnostics.find((x) => x.code === 'ramp.no-reference-temperature');
    assert.equal(n1?.severity, 'info');
    assert.equal(n1?.message, messages.rampNoReferenceTemperature('no-film', '').message);
    const bare = depositionBlock('D-1', 'rate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n');
    const noTsub = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': bare + '\n' + ramp });
    const n2 = blockOf(noTsub.files, 'R-1').diagnostics.find((x) => x.code === 'ramp.no-reference-temperature');
    assert.equal(n2?.message, messages.rampNoReferenceTemperature('no-substrate-temperature', 'D-1').message);
    assert.ok(n2 && n2.line > 1, 'on the film key');
    // With a reference temperature of its own, the ramp needs no film.
    const own = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': tableBlock('ramp', 'R-1', 'rate: 1 K/min\nreference_temperature: 290 K\n', 't/s, T/K, h/nm', cycleRows(), 9) });
    const r3 = blockOf(own.files, 'R-1');
    assert.ok(r3.results.density_gain);
    assert.ok(!r3.diagnostics.some((x) => x.code === 'ramp.no-reference-temperature'));
  });

  it('is an error when the material has no tg, and nothing is computed from it', () => {
    const material = '```material M-1\nname: synthetic glass\n```\n';
    const { files } = analyse({ 'm.md': material, 'd.md': film + '\n' + ramp });
    const d = blockOf(files, 'D-1');
    assert.equal(d.results.tsub_over_tg, undefined);
    const e = d.diagnostics.find((x) => x.code === 'deposition.tsub-unresolved');
    assert.equal(e?.message, messages.tsubUnresolved(0.92, 'M-1', 'no-tg').message);
    assert.equal(e?.severity, 'error');
    const r = blockOf(files, 'R-1');
    assert.equal(r.results.reference_temperature, undefined);
    assert.equal(r.results.density_gain, undefined);
  });

  it('says when the material does not exist', () => {
    const { files } = analyse({ 'd.md': film });
    const e = blockOf(files, 'D-1').diagnostics.find((x) => x.code === 'deposition.tsub-unresolved');
    assert.equal(e?.message, messages.tsubUnresolved(0.92, 'M-1', 'dangling').message);
  });

  it('is refused on other temperature keys', () => {
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': film + '\n' + tableBlock('ramp', 'R-1', 'film: D-1\nrate: 1 K/min\nreference_temperature: 0.9 Tg\n', 't/s, T/K, h/nm', cycleRows(), 9) });
    const r = blockOf(files, 'R-1');
    const d = r.diagnostics.find((x) => x.message === messages.quantityTgMultiple('reference_temperature').message);
    assert.equal(d?.code, 'quantity.tg-multiple');
    assert.ok(!r.diagnostics.some((x) => x.code === 'quantity.wrong-dimension'));
  });

  it('has its own code when written in a form Vitrine does not read', () => {
    // "0.85 Tg ± 2 K": the uncertainty of a multiple of Tg is a fraction of Tg too.
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 0.85 Tg ± 2 K\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') });
    const d = blockOf(files, 'D-1').diagnostics.find((x) => x.line === 3);
    assert.equal(d?.code, 'quantity.tg-multiple');
    assert.equal(d?.message, messages.quantityTgMultipleForm('substrate_temperature').message);
  });
});

describe('a decimal comma that may separate thousands', () => {
  it('is refused with a code of its own, and the value is not used', () => {
    // SI Brochure (9th ed., 2019), 5.4.2: the decimal marker is a point or a comma, and digits
    // may be grouped in threes, so "1,250" reads either way.
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm/s\nduration: 500 s\nthickness: 1,250 nm\nbase_pressure: 1e-6 Pa\n') });
    const d = blockOf(files, 'D-1');
    const e = d.diagnostics.find((x) => x.line === 6);
    assert.equal(e?.code, 'quantity.ambiguous-comma');
    assert.equal(e?.message, messages.quantityAmbiguousComma('thickness', '1,250 nm').message);
    assert.equal(e?.severity, 'error');
    // 0.2 nm/s × 500 s = 100 nm: no thickness to compare it with, so no mismatch either way.
    assert.ok(!d.diagnostics.some((x) => x.code === 'deposition.thickness-mismatch'));
  });
});

describe('a duration on a clock', () => {
  const film = (duration: string) => analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', `substrate_temperature: 270 K\nrate: 0.2 nm/s\nduration: ${duration}\nbase_pressure: 1e-6 Pa\n`) });

  it('refuses a bare "1:10" (1 h 10 min or 1 min 10 s?), names both readings, and computes nothing from it', () => {
    const d = blockOf(film('1:10').files, 'D-1');
    const e = d.diagnostics.find((x) => x.line === 5);
    assert.equal(e?.code, 'quantity.ambiguous-clock');
    assert.equal(e?.severity, 'error');
    assert.equal(e?.message, messages.quantityAmbiguousClock('duration', '1:10', 1, 10).message);
    for (const written of ['1 h 10 min', '00:01:10', '70 s', '1:10 h', '1:10 min']) assert.ok(e!.message.includes(`"${written}"`), written);
    assert.equal(d.results.expected_thickness, undefined);
  });

  it('reads "1:10 h" as hours and minutes and "1:10 min" as minutes and seconds', () => {
    // Expected thickness = rate × duration (common practice, no source); 1 h = 3600 s, 1 min = 60 s
    // (NIST SP 811, 2008, B.8): 0.2 nm/s × 4200 s = 840 nm; 0.2 nm/s × 70 s = 14 nm.
    for (const [written, nm] of [['1:10 h', 840], ['1:10 min', 14], ['1 h 10 min', 840], ['01:10:00', 840], ['00:01:10', 14], ['70 s', 14]] as const) {
      const d = blockOf(film(written).files, 'D-1');
      assert.deepEqual(d.diagnostics.filter((x) => x.line === 5), [], written);
      assert.ok(Math.abs(d.results.expected_thickness.value - nm) < 1e-9, `${written}: ${d.results.expected_thickness.value}`);
    }
  });
});

describe('did you mean: units', () => {
  const fixesOf = (lines: string) => {
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', lines) });
    return blockOf(files, 'D-1').diagnostics;
  };

  it('offers °C for C (the coulomb), ºC and oC, with a fix on the value', () => {
    for (const [written, code] of [['5 C', 'quantity.wrong-dimension'], ['5 ºC', 'quantity.unknown-unit'], ['5 oC', 'quantity.unknown-unit']] as const) {
      const ds = fixesOf(`substrate_temperature: ${written}\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n`);
      const d = ds.find((x) => x.code === code);
      assert.ok(d, `${written}: ${ds.map((x) => x.code).join(' ')}`);
      assert.equal(d.fix?.newText, '5 °C', written);
      assert.equal(d.line, 3);
      assert.equal(d.fix?.column, 24);
    }
    const c = fixesOf('substrate_temperature: 5 C\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n').find((x) => x.code === 'quantity.wrong-dimension');
    assert.match(c!.message, /coulomb/);
  });

  it('offers Å for A (the ampere) in lengths and rates', () => {
    const ds = fixesOf('substrate_temperature: 270 K\nrate: 2 A/s\nthickness: 4000 A\nbase_pressure: 1e-6 Pa\n');
    assert.deepEqual(ds.filter((x) => x.fix).map((x) => x.fix!.newText), ['2 Å/s', '4000 Å']);
    assert.match(ds.find((x) => x.line === 4)!.message, /ampere/);
  });

  it('writes the suggested unit exactly where the wrong one stands, in the value and the uncertainty', () => {
    // "C" is the coulomb and "A" the ampere (BIPM, The International System of Units, 9th ed., 2019).
    for (const [key, written, fixed] of [
      ['substrate_temperature', '12 C ± 0.5 °C', '12 °C ± 0.5 °C'],
      ['substrate_temperature', '12 C ± 0.5 C', '12 °C ± 0.5 °C'],
      ['substrate_temperature', '285 K ± 0.5 C', '285 K ± 0.5 °C'],
      ['substrate_temperature', '(12 ± 0.5) C', '(12 ± 0.5) °C'],
      ['substrate_temperature', '12 ± 0.5 C', '12 ± 0.5 °C'],
      ['substrate_temperature', '12 C ± 0.5', '12 °C ± 0.5'],
      ['thickness', '4000 A ± 20 A', '4000 Å ± 20 Å'],
      ['rate', '2 A/s ± 0.1 A/s', '2 Å/s ± 0.1 Å/s'],
    ] as const) {
      const meta: Record<string, string> = { substrate_temperature: '270 K', rate: '0.2 nm/s', duration: '500 s', base_pressure: '1e-6 Pa', [key]: written };
      const ds = fixesOf(Object.entries(meta).map(([k, v]) => `${k}: ${v}\n`).join(''));
      assert.deepEqual(ds.filter((x) => x.fix).map((x) => x.fix!.newText), [fixed], written);
    }
  });

  it('names the dimension needed, two examples and what the unit measures', () => {
    const ds = fixesOf('substrate_temperature: 270 K\nrate: 0.2 nm\nduration: 500 s\nbase_pressure: 1e-6 Pa\n');
    const d = ds.find((x) => x.code === 'quantity.wrong-dimension');
    assert.equal(d?.message, messages.quantityWrongDimension('rate', 'nm', 'a deposition rate (length per time)', ['0.2 nm/s', '2 Å/s'], 'a length').message);
    assert.equal(d?.fix, undefined);
  });
});

describe('did you mean: keys', () => {
  it('renames a mistyped, capitalised or abbreviated key with a fix', () => {
    const { files } = analyse({
      'm.md': MATERIAL_BLOCK(315),
      'd.md': '```deposition D-1\nmaterial: M-1\nsubtrate_temperature: 270 K\nRate: 0.2 nm/s\nduration: 500 s\nbase_press: 1e-6 Pa\nsubstrate: silicon\n```\n',
    });
    const unknown = blockOf(files, 'D-1').diagnostics.filter((x) => x.code === 'meta.unknown-key');
    assert.deepEqual(
      unknown.map((x) => [x.line, x.fix?.newText, x.fix?.column, x.fix?.endColumn]),
      [
        [3, 'substrate_temperature', 1, 21],
        [4, 'rate', 1, 5],
        [6, 'base_pressure', 1, 11],
      ],
    );
    assert.equal(unknown[0].message, messages.unknownKey('subtrate_temperature', 'deposition', 'substrate_temperature').message);
  });

  it('offers no rename onto a key the block already has', () => {
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm/s\nRate: 0.3 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') });
    const d = blockOf(files, 'D-1').diagnostics.find((x) => x.code === 'meta.unknown-key');
    assert.ok(d && d.fix === undefined);
  });
});

describe('did you mean: block kinds', () => {
  it('hints at a kind written with a capital, in the plural or mistyped, and leaves the block unanalysed', () => {
    const words = ['Deposition', 'ramps', 'isotherms', 'DSC', 'relaxtion', 'Material', 'result', 'materials', 'depositon'];
    const text = words.map((w) => `\`\`\`${w} X-1\nfilm: D-1\n\`\`\`\n`).join('\n');
    const { files } = analyse({ 'a.md': text });
    const f = files[0];
    assert.equal(f.blocks.length, 0);
    assert.deepEqual(
      f.diagnostics.map((d) => [d.code, d.line, d.fix?.newText]),
      [
        ['block.kind-typo', 1, 'deposition'],
        ['block.kind-typo', 5, 'ramp'],
        ['block.kind-typo', 9, 'isotherm'],
        ['block.kind-typo', 13, 'dsc'],
        ['block.kind-typo', 17, 'relaxation'],
        ['block.kind-typo', 21, 'material'],
        ['block.kind-typo', 25, 'results'],
        ['block.kind-typo', 29, 'material'],
        ['block.kind-typo', 33, 'deposition'],
      ],
    );
    // A hint, not a warning: the fence may be meant as ordinary markdown.
    assert.deepEqual([...new Set(f.diagnostics.map((d) => d.severity))], ['info']);
    assert.equal(f.diagnostics[0].message, messages.blockKindTypo('Deposition', 'deposition').message);
    assert.deepEqual([f.diagnostics[0].column, f.diagnostics[0].endColumn], [4, 14]);
  });

  it('leaves other languages alone', () => {
    // English words a letter or two from a kind (position, relation, maternal, reposition), short
    // words near a short kind (raml, rmap) and fences of other languages are ordinary code blocks.
    const words = ['position', 'relation', 'maternal', 'reposition', 'relaxing', 'python', 'yaml', 'json', 'mermaid', 'text', 'math', 'raml', 'rmap', 'css', 'csv', 'r', 'matlab', 'rest'];
    const text = words.map((w) => `\`\`\`${w}\nx: 1\n\`\`\`\n`).join('\n');
    assert.deepEqual(analyse({ 'a.md': text }).files[0].diagnostics, []);
  });

  it('reports the same after an edit that fixes the kind as a fresh engine does', () => {
    const before = '# Day\n\n```Deposition D-1\nmaterial: M-1\n```\n';
    const after = before.replace('Deposition', 'deposition');
    const warm = new Notebook(new InMemoryHost());
    warm.setFile('a.md', before);
    warm.analyze();
    warm.setFile('a.md', after);
    const cold = new Notebook(new InMemoryHost());
    cold.setFile('a.md', after);
    assert.deepEqual(toJsonReport(warm.analyze()), toJsonReport(cold.analyze()));
    assert.equal(toJsonReport(warm.analyze()).files[0].diagnostics.length, 0);
  });
});

describe('a rate with the wrong dimension', () => {
  it('is an error on a deposition, and gives no expected thickness', () => {
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') });
    const d = blockOf(files, 'D-1');
    assert.ok(d.diagnostics.some((x) => x.code === 'quantity.wrong-dimension' && x.severity === 'error' && x.line === 4));
    assert.equal(d.results.expected_thickness, undefined);
    // Tsub/Tg does not need the rate: 270/315 [computed].
    assert.ok(Math.abs(d.results.tsub_over_tg.value - 270 / 315) < 1e-12);
  });

  it('is an error on a ramp, which then enters no standard Tg and no rate check', () => {
    // An exact cooling scan at Tg = 315 K; the rate "10 K" is a temperature, not a rate.
    const rows: number[][] = [];
    for (let T = 345; T >= 285 - 1e-9; T -= 0.5) rows.push([T, T >= 315 ? 100 + 0.07 * (T - 315) : 100 + 0.02 * (T - 315)]);
    const notebook = (rate: string) => ({
      'm.md': MATERIAL_BLOCK(315),
      'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') + tableBlock('ramp', 'R-1', `film: D-1\nrate: ${rate}\ndirection: cooling\n`, 'T/K, h/nm', rows, 9),
    });
    // With a rate, the one ramp at 10 K/min gives the standard Tg, 315 K.
    assert.ok(Math.abs(blockOf(analyse(notebook('10 K/min')).files, 'M-1').results.standard_tg.value - 315) < 1e-6);
    const { files } = analyse(notebook('10 K'));
    const r = blockOf(files, 'R-1');
    const e = r.diagnostics.find((x) => x.code === 'quantity.wrong-dimension');
    assert.equal(e?.severity, 'error');
    assert.match(e!.message, /"K" is a temperature/);
    assert.ok(!r.diagnostics.some((x) => x.code === 'ramp.rate-mismatch'));
    assert.equal(blockOf(files, 'M-1').results.standard_tg, undefined);
  });

  it('is an error on a dsc scan of heat flow, which then gives no heat capacity and no figures', () => {
    // Cp = Φ/(m·q) needs the rate q (common practice, no source): without it nothing is computed.
    const rows: number[][] = [];
    for (let T = 300; T <= 340 + 1e-9; T += 0.05) rows.push([T, (1.2 + 0.003 * (T - 300) + (T < 310 ? 0 : T < 320 ? (0.4 * (T - 310)) / 10 : 0.4)) * 5 * 0.2]);
    const meta = 'film: D-1\nrate: 10 K\nquantity: heat flow\nmass: 5 mg\nwindows:\n  glass: [300 K, 308 K]\n  liquid: [328 K, 340 K]\n';
    const { files } = analyse({
      'm.md': MATERIAL_BLOCK(315),
      'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') + tableBlock('dsc', 'C-1', meta, 'T/K, Phi/mW', rows, 12),
    });
    const c = blockOf(files, 'C-1');
    assert.ok(c.diagnostics.some((x) => x.code === 'quantity.wrong-dimension' && x.severity === 'error'));
    assert.deepEqual(Object.keys(c.results), []);
  });
});

describe('bounds', () => {
  it('accepts a base pressure written as a bound, and checks it on the side it tells', () => {
    // 1e-5 Torr = 1.33e-3 Pa is the limit (common practice for molecular glasses, no source).
    const good = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: < 3e-7 Torr\n') });
    assert.deepEqual(blockOf(good.files, 'D-1').diagnostics.filter((x) => x.line === 6), []);
    const loose = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: ≤ 1e-3 Torr\n') });
    const d = blockOf(loose.files, 'D-1').diagnostics.find((x) => x.line === 6);
    assert.equal(d?.code, 'deposition.pressure-high');
    assert.match(d!.message, /only known to be below/);
  });

  it('refuses a bound where a value is needed', () => {
    const { files } = analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': depositionBlock('D-1', 'substrate_temperature: 270 K\nrate: < 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\n') });
    const d = blockOf(files, 'D-1');
    assert.ok(d.diagnostics.some((x) => x.code === 'quantity.bound' && x.line === 4));
    assert.equal(d.results.expected_thickness, undefined);
  });
});

describe('near-miss units in a table header', () => {
  const ramp = (header: string) => `\`\`\`ramp R-1\nfilm: D-1\nrate: 1 K/min\n---\n${header}\n300, 100.0\n301, 100.1\n\`\`\`\n`;
  const diagnosticsOf = (header: string) => {
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('r.md', ramp(header));
    return nb.analyze().files[0].blocks[0].diagnostics;
  };

  // "C" is the coulomb and "A" the ampere in SI (BIPM, The International System of Units, 9th ed., 2019).
  it('"T/C" asks for °C, with a fix that writes it over the unit', () => {
    const d = diagnosticsOf('T/C, h/nm').find((x) => x.code === 'table.wrong-dimension');
    assert.ok(d, 'a wrong-dimension error');
    assert.match(d.message, /coulomb.*Did you mean "°C"/);
    assert.equal(d.fix?.newText, 'T/°C');
    const text = ramp('T/C, h/nm');
    assert.equal(text.slice(d.fix!.span.start, d.fix!.span.end), 'T/C');
  });

  it('"h/A" asks for Å, and a plain unknown unit gets no fix', () => {
    const d = diagnosticsOf('T/K, h/A').find((x) => x.code === 'table.wrong-dimension');
    assert.ok(d);
    assert.match(d.message, /ampere.*Did you mean "Å"/);
    assert.equal(d.fix?.newText, 'h/Å');
    const unknown = diagnosticsOf('T/K, h/zorks').find((x) => x.code === 'table.unknown-unit');
    assert.ok(unknown);
    assert.equal(unknown.fix, undefined);
  });
});

describe('a bound in the hover of a quantity', () => {
  it('keeps the sign in every unit and says it is a bound', async () => {
    const { quantityMarkdown } = await import('../../extension/server/hover.js');
    // 1 Torr = 101325/760 Pa (the standard atmosphere over 760 mm of mercury; common practice, no source).
    const md = quantityMarkdown({ value: 3e-7 * (101325 / 760), unit: 'Pa', dimension: 'pressure', writtenUnit: 'Torr', offsetTemperature: false, bound: 'upper' });
    assert.match(md, /^< 0\.0000399967 Pa = < 3e-7 Torr/);
    assert.match(md, /an upper bound/);
  });
});

describe('a placeholder left by the quick fix for missing keys', () => {
  it('is one error at the "?" with an example, and the keys after it are still read', () => {
    // `key: ?` is what "Insert the missing required keys" writes; YAML would read "? nm/s" as a
    // mapping key and stop there (YAML 1.2.2 §8.2.2), so the placeholder is read as an empty value.
    const text = depositionBlock('D-1', 'rate: ? nm/s\nsubstrate_temperature: 270 K\nduration: ?\nbase_pressure: 1e-6 Pa\n');
    const d = blockOf(analyse({ 'm.md': MATERIAL_BLOCK(315), 'd.md': text }).files, 'D-1');
    const codes = d.diagnostics.map((x) => x.code);
    assert.deepEqual(codes.filter((c) => c !== 'meta.missing-recommended'), ['meta.placeholder', 'meta.placeholder'], JSON.stringify(d.diagnostics));
    const [rate, duration] = d.diagnostics.filter((x) => x.code === 'meta.placeholder');
    assert.equal(rate.message, messages.metaPlaceholder('rate', '0.2 nm/s').message);
    assert.deepEqual([rate.line, rate.column, rate.endColumn], [3, 7, 13]);
    assert.equal(duration.message, messages.metaPlaceholder('duration', '2000 s').message);
    assert.ok(Math.abs(d.results.tsub_over_tg.value - 270 / 315) < 1e-12, 'the key after the placeholder is read');
  });
});
