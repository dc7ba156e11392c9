/** A quantity read from metadata, in the canonical unit of its dimension. */
export interface Quantity {
  /** Value in the canonical unit of the dimension (the bound itself, for a bound). */
  readonly value: number;
  /** Standard uncertainty in the canonical unit, when written. */
  readonly uncertainty?: number;
  readonly unit: string;
  /** What the quantity measures: `temperature`, `temperature_interval`, `length`, `time`, … */
  readonly dimension: string;
  /** The unit as the user wrote it; empty for a bare number. */
  readonly writtenUnit: string;
  /** Written in °C or °F. */
  readonly offsetTemperature: boolean;
  /** Written as a bound: `< 3e-7 Torr` or `≤ …` (upper), `> …` or `≥ …` (lower); `value` is the bound. */
  readonly bound?: 'upper' | 'lower';
}
