/**
 * `vitrine report`: charts rendered to SVG in Node, the HTML report, and optionally CSV and PNG.
 *
 * Writing is all or nothing, and only where the user asked:
 * 1. every output path is checked first: never a markdown file under a notebook root, never a
 *    symbolic link, never the same file twice (`-o` equal to `--csv`);
 * 2. everything is rendered in memory (a chart that cannot be drawn becomes a short message in
 *    its card, and has no PNG);
 * 3. each file is written to a temporary file in its own folder, then all are renamed into
 *    place; when a write fails, the temporary files are removed and nothing is replaced.
 */
import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { figureSpec, stabilityMapSpecs, toVega } from '../core/charts/index.js';
import { summarise, type BlockReport, type NotebookReport } from '../core/index.js';
import { buildHtmlReport, summaryCsv, type ChartFailure } from '../core/report/index.js';
import { isInside } from '../node/insidePath.js';
import { fileTypeName, ioErrorText } from '../node/notebookText.js';
import { renderSvg } from '../node/renderSvg.js';

export interface ReportOptions {
  readonly output: string;
  readonly csv?: string;
  readonly png?: string;
  readonly title: string;
  /** The notebook roots read: no markdown file below them is ever written. */
  readonly roots: readonly string[];
}

/** An output Vitrine refuses to write, or could not write; nothing has been written. */
export class OutputError extends Error {}

export interface ReportWritten {
  /** One line per file or folder written. */
  readonly lines: string[];
  /** Charts that could not be drawn, one line each. */
  readonly warnings: string[];
}

const MARKDOWN = /\.(md|markdown)$/i;

/** The real path a (maybe not yet existing) file would have: its nearest existing folder resolved. */
function realTarget(file: string): string {
  const rest: string[] = [];
  let dir = path.resolve(file);
  for (;;) {
    try {
      return path.join(fs.realpathSync(dir), ...rest.reverse());
    } catch {
      const parent = path.dirname(dir);
      if (parent === dir) return path.resolve(file);
      rest.push(path.basename(dir));
      dir = parent;
    }
  }
}

function lstatOrNull(file: string): fs.Stats | null {
  try {
    return fs.lstatSync(file);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') return null;
    throw new OutputError(`cannot write ${file}: ${ioErrorText(e)}`);
  }
}

/** Refuses an output file that is a link, not a regular file, or a notebook file. */
function checkOutputFile(file: string, option: string, realRoots: readonly string[]): void {
  const stat = lstatOrNull(file);
  if (stat?.isSymbolicLink()) throw new OutputError(`${option} ${file} is a symbolic link; Vitrine does not write through links. Remove the link or choose another name.`);
  if (stat && !stat.isFile()) throw new OutputError(`${option} ${file} is ${fileTypeName(stat)}; name a file to write.`);
  const real = realTarget(file);
  const root = realRoots.find((r) => isInside(r, real));
  if (root !== undefined && MARKDOWN.test(real)) {
    throw new OutputError(`${option} ${file} is a markdown file in the notebook folder ${root}; Vitrine never writes over notebook files. Choose another name.`);
  }
}

/** Names that differ for different ids: `R:1` and `R_1` do not share a PNG. */
function uniqueNames(wanted: readonly string[]): string[] {
  const used = new Set<string>();
  return wanted.map((name) => {
    const safe = name.replace(/[^A-Za-z0-9._-]/g, '_').slice(0, 120);
    // An id that had to change gets a short hash of itself, so its name stays the same from run to run.
    let candidate = safe === name ? safe : `${safe}-${createHash('sha256').update(name).digest('hex').slice(0, 8)}`;
    // File systems that ignore case would still merge `R-1` and `r-1`.
    for (let k = 2; used.has(candidate.toLowerCase()); k++) candidate = `${safe}-${k}`;
    used.add(candidate.toLowerCase());
    return candidate;
  });
}

function failureText(e: unknown): string {
  const text = (e instanceof Error ? e.message : String(e)).split('\n')[0].trim();
  return text.length > 160 ? `${text.slice(0, 159)}…` : text || 'unknown error';
}

interface Planned {
  readonly target: string;
  readonly bytes: string | Uint8Array;
}

/** Writes every planned file to a temporary file beside it, then renames them all into place. */
function writeAll(files: readonly Planned[], folders: readonly string[]): void {
  const made: string[] = [];
  const temps: Array<{ temp: string; target: string }> = [];
  const cleanUp = (): void => {
    for (const t of temps) fs.rmSync(t.temp, { force: true });
    for (const d of made.reverse()) {
      try {
        fs.rmdirSync(d);
      } catch {
        // not empty, or already gone: leave it
      }
    }
  };
  let step = '';
  try {
    for (const folder of folders) {
      step = `cannot create the folder ${folder}`;
      const first = fs.mkdirSync(folder, { recursive: true });
      // Every folder created, from the first (outermost) down to this one, to remove on failure.
      if (first !== undefined) {
        const chain: string[] = [];
        for (let d = folder; d !== first && path.dirname(d) !== d; d = path.dirname(d)) chain.push(d);
        made.push(first, ...chain.reverse());
      }
    }
    for (const [i, f] of files.entries()) {
      step = `cannot write ${f.target}`;
      const temp = path.join(path.dirname(f.target), `.${path.basename(f.target)}.${process.pid}.${i}.tmp`);
      // 'wx': never an existing file, never through a link.
      fs.writeFileSync(temp, f.bytes, { flag: 'wx' });
      temps.push({ temp, target: f.target });
    }
    for (const t of temps) {
      step = `cannot write ${t.target}`;
      if (lstatOrNull(t.target)?.isSymbolicLink()) throw new OutputError(`${t.target} became a symbolic link while the report was written; nothing was replaced.`);
    }
  } catch (e) {
    cleanUp();
    if (e instanceof OutputError) throw e;
    throw new OutputError(`${step}: ${ioErrorText(e)}; nothing was written.`);
  }
  for (const [i, t] of temps.entries()) {
    try {
      fs.renameSync(t.temp, t.target);
    } catch (e) {
      for (const rest of temps.slice(i)) fs.rmSync(rest.temp, { force: true });
      throw new OutputError(`cannot write ${t.target}: ${ioErrorText(e)}${i > 0 ? `; ${temps.slice(0, i).map((x) => x.target).join(', ')} already written` : '; nothing was written'}.`);
    }
  }
}

/** Checks the outputs, renders everything, then writes it; returns what was written. */
export async function writeReport(runs: ReadonlyArray<{ report: NotebookReport }>, options: ReportOptions): Promise<ReportWritten> {
  const realRoots = options.roots.map((r) => realTarget(r));
  const output = path.resolve(options.output);
  const csv = options.csv ? path.resolve(options.csv) : undefined;
  const png = options.png ? path.resolve(options.png) : undefined;
  if (csv !== undefined && realTarget(csv) === realTarget(output)) throw new OutputError(`-o and --csv name the same file (${options.output}); give the CSV its own name.`);
  checkOutputFile(output, '-o', realRoots);
  if (csv !== undefined) checkOutputFile(csv, '--csv', realRoots);
  if (png !== undefined) {
    const stat = lstatOrNull(png);
    if (stat && !stat.isDirectory() && !(stat.isSymbolicLink() && fs.statSync(png, { throwIfNoEntry: false })?.isDirectory())) {
      throw new OutputError(`--png ${options.png} is ${stat.isFile() ? 'a file' : fileTypeName(stat)}, not a folder; name a folder for the PNG files.`);
    }
  }

  const report: NotebookReport = { files: runs.flatMap((r) => r.report.files) };
  const charts = new Map<BlockReport, string | ChartFailure>();
  const warnings: string[] = [];
  const drawn: Array<{ wanted: string; svg: string }> = [];
  for (const f of report.files) {
    for (const b of f.blocks) {
      if (!b.figure) continue;
      const label = `${b.kind} ${b.id ?? ''}`.trim();
      try {
        const svg = await renderSvg(toVega(figureSpec(`${b.kind} ${b.id ?? ''}`, b.figure)));
        charts.set(b, svg);
        drawn.push({ wanted: `${b.kind}-${b.id ?? 'block'}`, svg });
      } catch (e) {
        charts.set(b, { failed: failureText(e) });
        warnings.push(`the chart of ${label} (${f.path}) could not be drawn: ${failureText(e)}`);
      }
    }
  }
  const summary = runs.flatMap((r) => summarise(r.report));
  const maps: Array<{ name: string; svg: string } | { name: string; failed: string }> = [];
  for (const m of stabilityMapSpecs(summary, report)) {
    try {
      const svg = await renderSvg(toVega(m.spec));
      maps.push({ name: m.name, svg });
      drawn.push({ wanted: `map-${m.name}`, svg });
    } catch (e) {
      maps.push({ name: m.name, failed: failureText(e) });
      warnings.push(`the stability map ${m.name} could not be drawn: ${failureText(e)}`);
    }
  }
  const html = buildHtmlReport({ title: options.title, report, charts, summary, maps });
  const blockCharts = [...charts.values()].filter((c) => typeof c === 'string').length;
  const mapCount = maps.filter((m) => 'svg' in m).length;

  const planned: Planned[] = [{ target: output, bytes: html }];
  const lines = [`wrote ${output} (${blockCharts} block charts, ${mapCount} maps, ${summary.length} films)`];
  if (csv !== undefined) {
    planned.push({ target: csv, bytes: summaryCsv(summary) });
    lines.push(`wrote ${csv}`);
  }
  if (png !== undefined) {
    const { Resvg } = await import('@resvg/resvg-js');
    const names = uniqueNames(drawn.map((d) => d.wanted));
    for (const [i, d] of drawn.entries()) {
      const target = path.join(png, `${names[i]}.png`);
      if (planned.some((p) => realTarget(p.target) === realTarget(target))) throw new OutputError(`${target} would be written twice (as a chart and as -o or --csv); choose other names.`);
      checkOutputFile(target, '--png', realRoots);
      planned.push({ target, bytes: new Resvg(d.svg, { fitTo: { mode: 'width', value: 1000 }, background: 'white' }).render().asPng() });
    }
    lines.push(`wrote ${drawn.length} PNG files to ${png}`);
  }
  const folders = [...new Set([path.dirname(output), ...(csv !== undefined ? [path.dirname(csv)] : []), ...(png !== undefined ? [png] : [])])];
  writeAll(planned, folders);
  return { lines, warnings };
}
