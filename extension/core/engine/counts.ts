/** How many diagnostics of each severity a report holds, file-level ones included. */
import type { Severity } from '../model/diagnostic.js';
import type { NotebookReport } from './notebook.js';

export type SeverityCounts = Record<Severity, number>;

export function countDiagnostics(report: NotebookReport): SeverityCounts {
  const counts: SeverityCounts = { error: 0, warning: 0, info: 0 };
  for (const f of report.files) {
    for (const d of f.diagnostics) counts[d.severity]++;
    for (const b of f.blocks) for (const d of b.diagnostics) counts[d.severity]++;
  }
  return counts;
}
