/** A computed figure: value in the unit DESIGN.md names, its method and, where the method yields one, its standard uncertainty. */
export interface ResultValue {
  readonly value: number;
  readonly unit: string;
  readonly uncertainty?: number;
  readonly method: string;
  /** A 95 % interval or, for a bracket, the range between the methods' values. */
  readonly interval?: readonly [number, number];
}

export type Results = Readonly<Record<string, ResultValue>>;

export function result(value: number, unit: string, method: string, uncertainty?: number, interval?: readonly [number, number]): ResultValue {
  // A standard uncertainty is a magnitude; propagated formulas may carry the sign of the value.
  const base: ResultValue = uncertainty !== undefined && Number.isFinite(uncertainty) ? { value, unit, uncertainty: Math.abs(uncertainty), method } : { value, unit, method };
  return interval && interval.every(Number.isFinite) ? { ...base, interval } : base;
}
