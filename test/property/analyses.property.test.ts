import assert from 'node:assert/strict';
import fc from 'fast-check';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';
import { uniform } from '../support/random.js';

// Analyses on arbitrary numeric tables: no internal error, and every reported value finite.
const MATERIAL = '```material M-1\nname: x\ntg: 300 K\ntg_source: test\nvft:\n  log10_tau0: -14\n  B: 1000 K\n  T0: 240 K\n```\n';
const DEPOSITION = '```deposition D-1\nmaterial: M-1\nsubstrate_temperature: 255 K\nrate: 0.2 nm/s\nthickness: 100 nm\nbase_pressure: 1e-6 Pa\nsubstrate: Si\n```\n';

const value = fc.oneof(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.integer({ min: 0, max: 400 }), fc.constantFrom(0, 1, 300, 300, 1e-300, 1e12));
const rows = (cols: number) => fc.array(fc.array(value, { minLength: cols, maxLength: cols }), { minLength: 0, maxLength: 60 });
const smooth = fc.record({ n: fc.integer({ min: 5, max: 120 }), a: fc.double({ min: 250, max: 350, noNaN: true }), b: fc.double({ min: -2, max: 2, noNaN: true }), c: fc.double({ min: -5, max: 5, noNaN: true }), d: fc.double({ min: 0, max: 1, noNaN: true }) });

const table = fc.oneof(
  fc.tuple(fc.constant('ramp R-1\nfilm: D-1\nrate: 1 K/min\n'), fc.constant('t/s, T/K, h/nm'), rows(3)),
  fc.tuple(fc.constant('ramp R-1\nfilm: D-1\nrate: 1 K/min\n'), fc.constant('T/K, h/nm'), rows(2)),
  fc.tuple(fc.constant('isotherm I-1\nfilm: D-1\ntemperature: 310 K\n'), fc.constant('t/s, T/K, h/nm'), rows(3)),
  fc.tuple(fc.constant('dsc C-1\nfilm: D-1\nrate: 10 K/min\n'), fc.constant('T/K, Cp/(J/(g*K))'), rows(2)),
  fc.tuple(fc.constant('relaxation X-1\nmaterial: M-1\nmethod: test\n'), fc.constant('T/K, tau/s'), rows(2)),
  // Smooth curves with kinks, closer to real scans.
  smooth.map(({ n, a, b, c, d }) => ['ramp R-1\nfilm: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm', Array.from({ length: n }, (_, i) => { const T = a + (i < n / 2 ? i : n - i) * d; return [i * 60, T, 100 + b * T + c * Math.max(0, T - a - 3)]; })] as const),
  smooth.map(({ n, a, b, c }) => ['dsc C-1\nfilm: D-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))', Array.from({ length: n }, (_, i) => [a + i * 0.5, 1 + 0.001 * b * i + (i > n / 2 ? Math.abs(c) * 0.1 : 0)])] as const),
  smooth.map(({ n, b, c }) => ['isotherm I-1\nfilm: D-1\ntemperature: 310 K\n', 't/s, h/nm', Array.from({ length: n }, (_, i) => [i * 30, 100 + (i > n / 3 && i < (2 * n) / 3 ? b * (i - n / 3) : i >= (2 * n) / 3 ? b * (n / 3) : 0) + 0.01 * c])] as const),
);

describe('analyses on arbitrary tables', () => {
  it('never fail inside and report only finite values', () => {
    fc.assert(
      fc.property(table, ([head, header, data]) => {
        const nb = new Notebook(new InMemoryHost());
        nb.setFile('m.md', MATERIAL + DEPOSITION);
        const body = `\`\`\`${head}---\n${header}\n${data.map((r) => r.join(', ')).join('\n')}\n\`\`\`\n`;
        nb.setFile('t.md', body);
        const report = toJsonReport(nb.analyze());
        for (const f of report.files) {
          for (const b of f.blocks) {
            for (const d of b.diagnostics) assert.notEqual(d.code, 'internal.error', d.message);
            for (const [name, r] of Object.entries(b.results)) {
              assert.ok(Number.isFinite(r.value), `${b.kind} ${name} = ${r.value}`);
              if (r.uncertainty !== undefined) assert.ok(Number.isFinite(r.uncertainty) && r.uncertainty >= 0, `${name} u = ${r.uncertainty}`);
            }
          }
        }
      }),
      { numRuns: Number(process.env.RUNS ?? 400), seed: Number(process.env.SEED ?? 11) },
    );
  });
});

// Large tables: 200 000 rows of every kind, to show that no analysis overflows the stack (a
// spread into Math.min) or takes unbounded time on a long noisy scan. A few fixed runs, one per
// kind: the curves are built from a seed, with noise and an occasional wild value.
const BIG_ROWS = 200_000;
const MATERIAL_WITHOUT_VFT = '```material M-1\nname: x\ntg: 300 K\ntg_source: test\n```\n';
// An isotherm whose τα comes from the material's VFT law, fitted to the large relaxation table.
const SMALL_ISOTHERM = `\`\`\`isotherm I-2\nfilm: D-1\ntemperature: 320 K\n---\nt/s, h/nm\n${Array.from({ length: 40 }, (_, i) => `${i * 30}, ${100 + (i > 13 && i < 27 ? 0.1 * (i - 13) : i >= 27 ? 1.4 : 0)}`).join('\n')}\n\`\`\`\n`;
const BIG_CASE = { seed: 7, noise: 1, wild: 2e-4 };

type BigKind = 'ramp' | 'isotherm' | 'dsc' | 'relaxation';
const BIG_HEAD: Record<BigKind, [string, string]> = {
  ramp: ['ramp R-1\nfilm: D-1\nrate: 1 K/min\n', 't/s, T/K, h/nm'],
  isotherm: ['isotherm I-1\nfilm: D-1\ntemperature: 310 K\n', 't/s, T/K, h/nm'],
  dsc: ['dsc C-1\nfilm: D-1\nrate: 10 K/min\n', 'T/K, Cp/(J/(g*K))'],
  relaxation: ['relaxation X-1\nmaterial: M-1\nmethod: test\n', 'T/K, tau/s'],
};

function bigTable(kind: BigKind, { seed, noise, wild }: { seed: number; noise: number; wild: number }): string {
  const u = uniform(seed);
  const jitter = (scale: number): number => noise * scale * (u() - 0.5);
  const maybeWild = (v: number): number => (u() < wild ? [0, 1e-300, 1e12, -1][Math.floor(u() * 4)] : v);
  const lines: string[] = [];
  for (let i = 0; i < BIG_ROWS; i++) {
    const x = i / BIG_ROWS;
    if (kind === 'ramp') {
      const T = 250 + 100 * (x < 0.5 ? 2 * x : 2 - 2 * x) + jitter(0.2);
      lines.push(`${i * 0.5}, ${maybeWild(T)}, ${100 + 0.01 * T + 0.02 * Math.max(0, T - 300) + jitter(0.02)}`);
    } else if (kind === 'isotherm') {
      lines.push(`${i * 2}, ${310 + jitter(0.1)}, ${maybeWild(300 + 6 * Math.min(1, Math.max(0, (x - 0.4) / 0.3)) + jitter(0.1))}`);
    } else if (kind === 'dsc') {
      const T = 250 + 100 * x;
      lines.push(`${T}, ${maybeWild(1 + 0.001 * T + (T > 300 ? 0.3 : 0) + jitter(0.01))}`);
    } else {
      const T = 310 + 60 * x;
      lines.push(`${T}, ${maybeWild(Math.pow(10, -14 + 1000 / (T - 240) + jitter(0.1)))}`);
    }
  }
  const [head, header] = BIG_HEAD[kind];
  return `\`\`\`${head}---\n${header}\n${lines.join('\n')}\n\`\`\`\n`;
}

describe(`analyses on ${BIG_ROWS} rows`, () => {
  for (const kind of ['ramp', 'isotherm', 'dsc', 'relaxation'] as const) {
    it(`${kind}: no internal error${kind === 'relaxation' ? ', and the material takes its VFT law from it' : ''}`, () => {
      const nb = new Notebook(new InMemoryHost());
      nb.setFile('m.md', (kind === 'relaxation' ? MATERIAL_WITHOUT_VFT : MATERIAL) + DEPOSITION + (kind === 'relaxation' ? SMALL_ISOTHERM : ''));
      nb.setFile('t.md', bigTable(kind, BIG_CASE));
      const report = toJsonReport(nb.analyze());
      for (const f of report.files) for (const b of f.blocks) for (const d of b.diagnostics) assert.notEqual(d.code, 'internal.error', d.message);
      const block = report.files.find((f) => f.path === 't.md')!.blocks[0];
      assert.equal(block.kind, kind);
      if (kind === 'relaxation') {
        const tau = report.files.find((f) => f.path === 'm.md')!.blocks.find((b) => b.id === 'I-2')!.results.tau_alpha;
        assert.match(tau?.method ?? '', /fit of relaxation block X-1/);
      }
    });
  }
});
