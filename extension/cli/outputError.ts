/** An output the report command refuses to write, or could not: printed as one line, exit status 2. */
export class OutputError extends Error {
  readonly refusedOutput = true;
}

/**
 * Is this an OutputError? Told by its mark rather than by `instanceof`: the report module is loaded
 * on demand, and a loader may give it its own copy of this module (and of the class).
 */
export function isOutputError(e: unknown): e is OutputError {
  return e instanceof Error && (e as Partial<OutputError>).refusedOutput === true;
}
