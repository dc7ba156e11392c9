/**
 * VS Code's own markdown preview: each data block renders as its chart (SVG drawn by the server)
 * and a compact table of its figures, with the block's text folded beneath. Until the server has
 * the figures, the block shows as text with a quiet "computing" mark. Nothing rendered here runs
 * script; every text is escaped.
 */
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import type { BlockChart, ChartsParams, ChartsResult } from '../protocol/server.js';
import { serverTheme } from './theme.js';

const KINDS = new Set(['material', 'deposition', 'ramp', 'isotherm', 'dsc', 'relaxation', 'results']);

interface FenceToken {
  readonly info: string;
  readonly content: string;
  readonly map: [number, number] | null;
}

type FenceRule = (tokens: FenceToken[], idx: number, options: unknown, env: unknown, self: unknown) => string;

interface MarkdownIt {
  renderer: { rules: { fence?: FenceRule } };
}

interface Entry {
  readonly theme: 'light' | 'dark';
  readonly blocks: readonly BlockChart[];
}

export function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

export class PreviewCharts {
  private readonly cache = new Map<string, Entry>();
  private readonly inFlight = new Set<string>();
  /** Documents whose figures changed again while a request for them was under way. */
  private readonly again = new Set<string>();

  constructor(
    private readonly client: () => LanguageClient | undefined,
    private readonly log: vscode.LogOutputChannel,
  ) {}

  extendMarkdownIt<M>(md: M): M {
    const it = md as unknown as MarkdownIt;
    const fallback = it.renderer.rules.fence;
    it.renderer.rules.fence = (tokens, idx, options, env, self) => {
      const token = tokens[idx];
      const [kind, id] = token.info.trim().split(/\s+/);
      if (!KINDS.has(kind)) return fallback ? fallback(tokens, idx, options, env, self) : `<pre><code>${escapeHtml(token.content)}</code></pre>`;
      const doc = (env as { currentDocument?: vscode.Uri } | undefined)?.currentDocument;
      return this.render(kind, id ?? null, token, doc?.toString() ?? null);
    };
    return md;
  }

  /**
   * The figures of these documents (all when omitted) are out of date: fetch them again. The
   * preview keeps showing the old ones until the new ones arrive, so it never flickers back to
   * "computing…".
   */
  invalidate(uris?: readonly string[]): void {
    for (const uri of uris ?? [...this.cache.keys()]) if (this.cache.has(uri)) void this.fetch(uri);
  }

  private render(kind: string, id: string | null, token: FenceToken, uri: string | null): string {
    const source = `<details class="vitrine-source"><summary>${escapeHtml(`${kind} ${id ?? ''}`.trim())}</summary><pre><code>${escapeHtml(token.content)}</code></pre></details>`;
    const entry = uri ? this.cache.get(uri) : undefined;
    if (uri && (!entry || entry.theme !== serverTheme())) void this.fetch(uri);
    const block = entry ? this.find(entry.blocks, kind, id, token.map?.[0]) : undefined;
    if (!block) return `<div class="vitrine-block vitrine-computing"><span class="vitrine-mark">computing…</span>${source}</div>`;
    const chart = block.svg ? `<div class="vitrine-chart">${block.svg}</div>` : '';
    const rows = block.figures.map((f) => `<tr><th scope="row" title="${escapeHtml(f.meaning)}">${escapeHtml(f.label)}</th><td>${escapeHtml(f.text)}</td></tr>`).join('');
    const table = rows ? `<table class="vitrine-figures"><tbody>${rows}</tbody></table>` : '';
    const errors = block.diagnostics.filter((d) => d.severity === 'error');
    const problems = errors.length > 0 ? `<p class="vitrine-problems">${escapeHtml(`${errors.length} error${errors.length === 1 ? '' : 's'}: ${errors[0].message}`)}</p>` : '';
    return `<div class="vitrine-block" data-line="${block.line}"><p class="vitrine-title">${escapeHtml(block.title)}</p>${chart}${table}${problems}${source}</div>`;
  }

  private find(blocks: readonly BlockChart[], kind: string, id: string | null, line: number | undefined): BlockChart | undefined {
    if (id) {
      const byId = blocks.find((b) => b.kind === kind && b.id === id);
      if (byId) return byId;
    }
    return line === undefined ? undefined : blocks.find((b) => b.kind === kind && b.line === line);
  }

  private async fetch(uri: string): Promise<void> {
    const client = this.client();
    if (!client) return;
    if (this.inFlight.has(uri)) {
      this.again.add(uri);
      return;
    }
    this.inFlight.add(uri);
    try {
      const theme = serverTheme();
      const params: ChartsParams = { uri, theme, svg: true };
      const result = await client.sendRequest<ChartsResult | null>('vitrine/charts', params);
      if (result) {
        this.cache.set(uri, { theme, blocks: result.blocks });
        void vscode.commands.executeCommand('markdown.preview.refresh');
      }
    } catch (e) {
      this.log.warn(`markdown preview: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      this.inFlight.delete(uri);
      if (this.again.delete(uri)) void this.fetch(uri);
    }
  }
}
