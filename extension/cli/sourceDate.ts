import { terminalText } from './terminalText.js';

/**
 * A reproducible report date from SOURCE_DATE_EPOCH (reproducible-builds.org: an integer of
 * seconds since 1970-01-01 00:00 UTC). A value that is not one, or lies beyond the dates a
 * JavaScript Date holds (±8.64e15 ms), is ignored with a warning, and the report takes the clock.
 */
export function sourceDateClock(value: string | undefined, warn: (text: string) => void): (() => Date) | undefined {
  if (value === undefined || value === '') return undefined;
  const date = /^\d+$/.test(value) ? new Date(Number(value) * 1000) : undefined;
  if (date === undefined || !Number.isFinite(date.getTime())) {
    const shown = value.length > 40 ? `${value.slice(0, 40)}…` : value;
    warn(`vitrine: warning: SOURCE_DATE_EPOCH "${terminalText(shown)}" is not a date (whole seconds since 1970 up to 275760-09-13); it is ignored.\n`);
    return undefined;
  }
  return () => new Date(date.getTime());
}
