/**
 * fast-check options from the environment: `RUNS` and `SEED` (defaults per property), and
 * `TIME_LIMIT` in milliseconds per property, after which a passing run stops early (for
 * `npm run fuzz`, which asks for many runs within a few minutes).
 */
export function propertyOptions(defaultRuns: number, defaultSeed: number): { numRuns: number; seed: number; interruptAfterTimeLimit?: number; markInterruptAsFailure?: boolean } {
  const limit = Number(process.env.TIME_LIMIT ?? 0);
  return {
    numRuns: Number(process.env.RUNS ?? defaultRuns),
    seed: Number(process.env.SEED ?? defaultSeed),
    ...(limit > 0 ? { interruptAfterTimeLimit: limit, markInterruptAsFailure: false } : {}),
  };
}
