/** `vitrine report`: charts rendered to SVG in Node, the HTML report, and optionally CSV and PNG. */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { figureSpec, stabilityMapSpecs, toVega } from '../core/charts/index.js';
import { summarise, type BlockReport, type NotebookReport } from '../core/index.js';
import { buildHtmlReport, summaryCsv } from '../core/report/index.js';
import { renderSvg } from '../node/renderSvg.js';

export interface ReportOptions {
  readonly output: string;
  readonly csv?: string;
  readonly png?: string;
  readonly title: string;
}

/** Writes the files and returns one line per file written. */
export async function writeReport(runs: ReadonlyArray<{ report: NotebookReport }>, options: ReportOptions): Promise<string[]> {
  const report: NotebookReport = { files: runs.flatMap((r) => r.report.files) };
  const charts = new Map<BlockReport, string>();
  const pngs: Array<{ name: string; svg: string }> = [];
  for (const f of report.files) {
    for (const b of f.blocks) {
      if (!b.figure) continue;
      const svg = await renderSvg(toVega(figureSpec(`${b.kind} ${b.id ?? ''}`, b.figure)));
      charts.set(b, svg);
      pngs.push({ name: `${b.kind}-${(b.id ?? 'block').replace(/[^A-Za-z0-9._-]/g, '_')}`, svg });
    }
  }
  const summary = runs.flatMap((r) => summarise(r.report));
  const maps: Array<{ name: string; svg: string }> = [];
  for (const m of stabilityMapSpecs(summary, report)) maps.push({ name: m.name, svg: await renderSvg(toVega(m.spec)) });
  pngs.push(...maps.map((m) => ({ name: `map-${m.name}`, svg: m.svg })));
  const html = buildHtmlReport({ title: options.title, report, charts, summary, maps });
  fs.mkdirSync(path.dirname(options.output), { recursive: true });
  fs.writeFileSync(options.output, html);
  const lines = [`wrote ${options.output} (${charts.size} block charts, ${maps.length} maps, ${summary.length} films)`];
  if (options.csv) {
    fs.writeFileSync(options.csv, summaryCsv(summary));
    lines.push(`wrote ${options.csv}`);
  }
  if (options.png) {
    const { Resvg } = await import('@resvg/resvg-js');
    fs.mkdirSync(options.png, { recursive: true });
    for (const p of pngs) fs.writeFileSync(path.join(options.png, `${p.name}.png`), new Resvg(p.svg, { fitTo: { mode: 'width', value: 1000 }, background: 'white' }).render().asPng());
    lines.push(`wrote ${pngs.length} PNG files to ${options.png}`);
  }
  return lines;
}
