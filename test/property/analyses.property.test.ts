import assert from 'node:assert/strict';
import fc from 'fast-check';
import { InMemoryHost, Notebook, toJsonReport } from '../../extension/core/index.js';

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
