/**
 * The custom requests behind the chart preview: the compiled Vega of a file's blocks (or of the
 * block at a line) with their figures and diagnostics, and the workspace summary with its maps.
 * The chart library is loaded on the first request, never at start.
 */
import { summarise, SUMMARY_TABLE_COLUMNS, summaryCell, type NotebookReport } from '../core/index.js';
import type { BlockChart, ChartsParams, ChartsResult, SummaryParams, SummaryResult } from '../protocol/server.js';
import { chartTitle } from '../core/charts/titles.js';
import { figureRows } from './figures.js';
import type { Workspace } from './workspace.js';

type Charts = typeof import('../core/charts/index.js');
let charts: Promise<Charts> | null = null;

function loadCharts(): Promise<Charts> {
  charts ??= import('../core/charts/index.js');
  return charts;
}

async function renderSvg(spec: Record<string, unknown>): Promise<string> {
  const { renderSvg: render } = await import('../node/renderSvg.js');
  return render(spec);
}

/**
 * A chart title that says what the block shows: block id, film, material and substrate
 * temperature ("R-02 · film D-02 · amberine-3 · Tsub 270.0 K (-3.2 °C)"), given the film's deposition block.
 * The titles module carries no chart library, so the server can load it at start.
 */
export { chartTitle };

export async function fileCharts(ws: Workspace, params: ChartsParams): Promise<ChartsResult | null> {
  const place = ws.placeOf(params.uri);
  const text = ws.textOf(params.uri);
  if (!place || !text) return null;
  const engine = place.folder.engine;
  const file = engine.analyze({ only: [place.rel] }).files[0];
  if (!file) return null;
  const lib = await loadCharts();
  const wanted = params.line === undefined ? file.blocks : file.blocks.filter((b) => text.position(b.span.start).line <= params.line! && text.position(b.span.end).line >= params.line!);
  const blocks: BlockChart[] = [];
  for (const b of wanted) {
    const filmId = typeof b.metadata.film === 'string' ? b.metadata.film : null;
    const filmLoc = filmId ? engine.definitionOf(filmId) : undefined;
    const film = filmLoc ? engine.analyze({ only: [filmLoc.path] }).files[0]?.blocks.find((x) => x.span.start === filmLoc.span.start) : undefined;
    const title = chartTitle(b, film);
    let vega: unknown = null;
    if (b.figure) {
      try {
        vega = lib.toVega(lib.figureSpec(title, b.figure, { theme: params.theme }));
      } catch {
        vega = null;
      }
    }
    let svg: string | null | undefined;
    if (params.svg) {
      try {
        svg = vega ? await renderSvg(vega as Record<string, unknown>) : null;
      } catch {
        svg = null;
      }
    }
    blocks.push({
      ...(svg !== undefined ? { svg } : {}),
      kind: b.kind,
      id: b.id,
      line: text.position(b.span.start).line,
      endLine: text.position(b.span.end).line,
      title,
      vega,
      figures: figureRows(b),
      diagnostics: b.diagnostics.filter((d) => d.phase !== 'save').map((d) => ({ severity: d.severity, code: d.code, message: d.message, line: text.position(d.span.start).line })),
    });
  }
  return { uri: params.uri, version: ws.versionOf(params.uri), blocks };
}

export async function workspaceSummary(ws: Workspace, params: SummaryParams): Promise<SummaryResult> {
  const lib = await loadCharts();
  const rows: SummaryResult['rows'][number][] = [];
  const maps: SummaryResult['maps'][number][] = [];
  for (const folder of ws.allFolders()) {
    const report: NotebookReport = folder.engine.analyze();
    for (const row of summarise(report)) {
      const uri = ws.uriOf(folder, row.file);
      const loc = folder.engine.definitionOf(row.film);
      const text = ws.textOf(uri);
      rows.push({ film: row.film, uri, line: loc && text ? text.position(loc.span.start).line : 0, cells: SUMMARY_TABLE_COLUMNS.map((c) => summaryCell(c, row)) });
    }
    const films = summarise(report);
    if (films.length === 0) continue;
    // Maps that still need films are left out here (the summary table shows what there is).
    for (const m of lib.stabilityMapSpecs(films, report, { theme: params.theme })) {
      try {
        maps.push({ title: m.name, vega: lib.toVega(m.spec) });
      } catch {
        // A map that cannot be compiled is left out; the table still shows every film.
      }
    }
  }
  return { columns: SUMMARY_TABLE_COLUMNS.map((c) => c.header), rows, maps };
}
