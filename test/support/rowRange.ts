/** Assertions on where a diagnostic points inside a synthetic table (test/support/synthetic.ts). */
import assert from 'node:assert/strict';
import type { JsonDiagnostic } from '../../extension/core/index.js';

/**
 * The diagnostic covers exactly data row `row` (0-based) of the table whose header line is `header`
 * in `text`: 1-based line and column, end column exclusive, as in the JSON report. The table must
 * have no comment or blank lines (tableBlock writes none).
 */
export function assertOnRow(d: JsonDiagnostic, text: string, header: string, row: number): void {
  const lines = text.split('\n');
  const headerIndex = lines.indexOf(header);
  assert.ok(headerIndex >= 0, `no header line ${header}`);
  const line = headerIndex + 2 + row;
  assert.deepEqual(
    { line: d.line, column: d.column, endLine: d.endLine, endColumn: d.endColumn },
    { line, column: 1, endLine: line, endColumn: lines[line - 1].length + 1 },
    `${d.code} should cover row ${row}: ${JSON.stringify(lines[line - 1])}`,
  );
}
