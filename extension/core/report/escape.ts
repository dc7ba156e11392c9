/** Escapes text for HTML content and attribute values. Everything from a notebook goes through it. */
export function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/**
 * A CSV field: quoted when needed, and never read as a formula by a spreadsheet. A number is
 * written with at most 15 significant digits, so binary noise (`0.19999999999999998`) does not
 * reach the file; the summary passes its numbers already formatted (formatResult.ts).
 */
export function csvField(value: string | number | undefined): string {
  if (value === undefined || (typeof value === 'number' && !Number.isFinite(value))) return '';
  let s = typeof value === 'number' ? String(Number(value.toPrecision(15))) : value;
  if (typeof value === 'string' && /^[=+@\t\r]|^-[^0-9.]/.test(s)) s = `'${s}`;
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
