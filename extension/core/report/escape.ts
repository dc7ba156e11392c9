/** Escapes text for HTML content and attribute values. Everything from a notebook goes through it. */
export function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/**
 * Text that a spreadsheet would read as a formula: OWASP's CSV injection advice names a first
 * character of `=`, `+`, `-`, `@`, tab or carriage return. Also guarded: line feed and NUL, the
 * full-width forms of the four signs, and any of them after leading white space (some
 * spreadsheets trim it before they look).
 */
const FORMULA_START = /^[\s\0]*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20]|^[\t\r\n\0]/;

/** A number as Vitrine prints it (`-1.5`, `3.1263e+3`): nothing else may pass unguarded. */
const PLAIN_NUMBER = /^-?(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?$/i;

function quoted(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * A CSV field: quoted when needed, and never read as a formula by a spreadsheet. Every text is
 * guarded (a leading single quote where it would start a formula, after OWASP's CSV injection
 * advice), whatever follows the sign: `-1+1+cmd|…` is text, not a number. A number is written
 * with at most 15 significant digits, so binary noise (`0.19999999999999998`) does not reach the
 * file; non-finite numbers are left empty.
 */
export function csvField(value: string | number | undefined): string {
  if (value === undefined || (typeof value === 'number' && !Number.isFinite(value))) return '';
  if (typeof value === 'number') return String(Number(value.toPrecision(15)));
  return quoted(FORMULA_START.test(value) ? `'${value}` : value);
}

/**
 * A number Vitrine has formatted itself (the summary's fixed decimals, `3.1263e+3`): written
 * as it is, so a spreadsheet reads a number. Anything that is not plainly a number is treated
 * as text by `csvField`.
 */
export function csvNumberField(text: string): string {
  return PLAIN_NUMBER.test(text) ? text : csvField(text);
}
