/** Engine diagnostics as LSP diagnostics: range, code, source, related locations, and a link to the list of codes. */
import { DiagnosticSeverity, DiagnosticTag, type Diagnostic as LspDiagnostic } from 'vscode-languageserver';
import { visibleSpan, type Diagnostic } from '../core/index.js';
import type { DocumentText } from './documentText.js';

const SEVERITY = { error: DiagnosticSeverity.Error, warning: DiagnosticSeverity.Warning, info: DiagnosticSeverity.Information } as const;

/** Where the README's list of codes is (a file URI with its anchor), set once at start. */
let codesHref: string | null = null;

export function setCodesHref(href: string | null): void {
  codesHref = href;
}

export function toLspDiagnostic(d: Diagnostic, text: DocumentText, relatedUri: (rel: string) => string): LspDiagnostic {
  const out: LspDiagnostic = {
    range: text.range(visibleSpan(d.span, text.text.length)),
    severity: SEVERITY[d.severity],
    code: d.code,
    source: 'vitrine',
    message: d.message,
  };
  if (codesHref) out.codeDescription = { href: codesHref };
  if (d.code === 'meta.unknown-key') out.tags = [DiagnosticTag.Unnecessary];
  if (d.related && d.related.length > 0) {
    out.relatedInformation = d.related.map((r) => ({
      location: { uri: relatedUri(r.path), range: { start: { line: r.line, character: r.character }, end: { line: r.line, character: r.character + 1 } } },
      message: r.message,
    }));
  }
  return out;
}
