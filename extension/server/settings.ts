/** The server's settings (`vitrine.*`), read defensively: anything malformed falls back to the default and is said. */
import { DIAGNOSTIC_CODES, type SeverityOverrides } from '../core/index.js';
import type { VitrineSettings } from '../protocol/server.js';

export const DEFAULT_SETTINGS: VitrineSettings = { diagnostics: { run: 'onType', severity: {} } };

const SEVERITIES = new Set(['error', 'warning', 'info', 'off']);
const CODES: ReadonlySet<string> = new Set(DIAGNOSTIC_CODES);

/** Settings from whatever the client sent, and a sentence for each part that was ignored. */
export function readSettings(raw: unknown): { settings: VitrineSettings; problems: string[] } {
  const problems: string[] = [];
  const root = isRecord(raw) ? raw : {};
  const diagnostics = isRecord(root.diagnostics) ? root.diagnostics : {};
  let run: VitrineSettings['diagnostics']['run'] = 'onType';
  if (diagnostics.run === 'onSave' || diagnostics.run === 'onType') run = diagnostics.run;
  else if (diagnostics.run !== undefined) problems.push(`vitrine.diagnostics.run must be "onType" or "onSave", not ${JSON.stringify(diagnostics.run)}; using "onType".`);
  const severity: Record<string, 'error' | 'warning' | 'info' | 'off'> = {};
  if (isRecord(diagnostics.severity)) {
    for (const [code, level] of Object.entries(diagnostics.severity)) {
      if (!CODES.has(code)) problems.push(`vitrine.diagnostics.severity: "${code}" is not a Vitrine diagnostic code; it is ignored (the README lists the codes).`);
      else if (typeof level !== 'string' || !SEVERITIES.has(level)) problems.push(`vitrine.diagnostics.severity: "${code}" must be "error", "warning", "info" or "off"; it is ignored.`);
      else severity[code] = level as 'error' | 'warning' | 'info' | 'off';
    }
  } else if (diagnostics.severity !== undefined) {
    problems.push('vitrine.diagnostics.severity must be an object of code → severity; it is ignored.');
  }
  return { settings: { diagnostics: { run, severity } }, problems };
}

export function severityOverrides(settings: VitrineSettings): SeverityOverrides {
  return settings.diagnostics.severity;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}
