/** A computed figure: value in the unit DESIGN.md names, its method and, where the method yields one, its standard uncertainty. */
export interface ResultValue {
  readonly value: number;
  readonly unit: string;
  readonly uncertainty?: number;
  readonly method: string;
}

export type Results = Readonly<Record<string, ResultValue>>;

export function result(value: number, unit: string, method: string, uncertainty?: number): ResultValue {
  return uncertainty !== undefined && Number.isFinite(uncertainty) ? { value, unit, uncertainty, method } : { value, unit, method };
}
