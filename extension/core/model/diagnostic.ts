/**
 * Diagnostics are data: a stable code, a severity the user can change, a message built in
 * `messages.ts`, and a span in the markdown document (0-based offsets, end-exclusive).
 */
import type { DiagnosticCode } from './codes.js';
import type { Span } from './span.js';

export type Severity = 'error' | 'warning' | 'info';

/** When an editor should show it: while typing, or only once the file is saved. */
export type DiagnosticPhase = 'typing' | 'save';

/** Where else a diagnostic points, e.g. the cell of a data file: 0-based line and UTF-16 character. */
export interface RelatedLocation {
  /** Root-relative path of the file. */
  readonly path: string;
  readonly line: number;
  readonly character: number;
  readonly message: string;
}

/** What a message builder returns: everything but the place. */
export interface Message {
  readonly code: DiagnosticCode;
  readonly severity: Severity;
  readonly message: string;
  readonly phase?: DiagnosticPhase;
}

/** An edit that repairs the problem, offered by editors as a quick fix (never applied silently). */
export interface Fix {
  readonly title: string;
  readonly span: Span;
  readonly newText: string;
}

export interface Diagnostic extends Message {
  readonly span: Span;
  readonly related?: readonly RelatedLocation[];
  readonly fix?: Fix;
}

export function at(message: Message, span: Span, related?: readonly RelatedLocation[]): Diagnostic {
  return related && related.length > 0 ? { ...message, span, related } : { ...message, span };
}

/** Severity overrides from settings: a code mapped to a new severity, or 'off' to drop it. */
export type SeverityOverrides = Readonly<Record<string, Severity | 'off'>>;

export function applyOverrides(diagnostics: readonly Diagnostic[], overrides: SeverityOverrides | undefined): Diagnostic[] {
  if (!overrides) return diagnostics.slice();
  const out: Diagnostic[] = [];
  for (const d of diagnostics) {
    const o = overrides[d.code];
    if (o === 'off') continue;
    out.push(o ? { ...d, severity: o } : d);
  }
  return out;
}
