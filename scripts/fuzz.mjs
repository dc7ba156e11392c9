// `npm run fuzz`: the notebook property test and the warm-against-cold engine property test with
// many more runs than `npm test` (RUNS=20000 by default) under several seeds, within a time
// budget: each property stops early, still passing, when its share of the budget is spent.
//
//   FUZZ_SEEDS=1,2,3   seeds to run (default 1,2,3)
//   RUNS=20000         runs per property and seed
//   FUZZ_MINUTES=4     the whole budget, shared evenly by every property and seed
//
// A failure prints fast-check's counterexample and the seed; rerun it with
// `RUNS=20000 SEED=<seed> npx mocha <file>`.
import { spawnSync } from 'node:child_process';

const FILES = ['test/property/notebook.property.test.ts', 'test/property/engineEdits.property.test.ts'];
/** Properties in those files (1 + 2): the budget is shared among them. */
const PROPERTIES = 3;
const seeds = (process.env.FUZZ_SEEDS ?? '1,2,3').split(',').map((s) => s.trim()).filter(Boolean);
const runs = process.env.RUNS ?? '20000';
const minutes = Number(process.env.FUZZ_MINUTES ?? 4);
const perProperty = Math.max(1000, Math.floor((minutes * 60000) / (seeds.length * PROPERTIES)));

let failed = 0;
for (const seed of seeds) {
  process.stdout.write(`fuzz: seed ${seed}, ${runs} runs per property, at most ${Math.round(perProperty / 1000)} s each\n`);
  const r = spawnSync(process.execPath, ['node_modules/mocha/bin/mocha.js', '--timeout', '0', ...FILES], {
    stdio: 'inherit',
    env: { ...process.env, RUNS: runs, SEED: seed, TIME_LIMIT: String(perProperty) },
  });
  if (r.status !== 0) failed++;
}
process.stdout.write(failed === 0 ? `fuzz: ${seeds.length} seeds passed\n` : `fuzz: ${failed} of ${seeds.length} seeds failed\n`);
process.exitCode = failed === 0 ? 0 : 1;
