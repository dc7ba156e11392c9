/**
 * `vitrine report`: charts rendered to SVG in Node (each in the light and the dark theme, so the
 * page can follow the reader's colour scheme), the HTML report, and optionally the summary CSV,
 * the long CSV, PNG files and SVG files (at publication size with `--print`).
 *
 * Writing is all or nothing, and only where the user asked:
 * 1. every output path is checked first: never a markdown file under a notebook root, never a
 *    symbolic link, never the same file twice (`-o` equal to `--csv`, a chart named like `-o`);
 * 2. everything is rendered in memory (a chart that cannot be drawn becomes a short message in
 *    its card, and has no PNG);
 * 3. each file is written to a temporary file in its own folder, then all are renamed into
 *    place; when a write fails, the temporary files are removed and nothing is replaced.
 */
import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { blockChartSpec, notebookMaterials, relaxationMapSpec, stabilityMaps, toVega, tsubSeriesSpec, type ChartOptions, type MapChart, type VegaLiteSpec } from '../core/charts/index.js';
import { PRINT } from '../core/charts/tokens.js';
import { summarise, type BlockReport, type NotebookReport } from '../core/index.js';
import { buildHtmlReport, longCsv, summaryCsv, type ChartImage, type MapEntry, type ReportRecord } from '../core/report/index.js';
import { isInside } from '../node/insidePath.js';
import { fileTypeName, ioErrorText } from '../node/notebookText.js';
import { renderSvg } from '../node/renderSvg.js';
import { OutputError, isOutputError } from './outputError.js';

export interface ReportOptions {
  readonly output: string;
  readonly csv?: string;
  /** The long CSV: one row per block × figure. */
  readonly csvLong?: string;
  readonly png?: string;
  /** A folder for one SVG file per chart. */
  readonly svg?: string;
  /** With `svg`: draw at one journal column's width with the print font size. */
  readonly print?: boolean;
  /** The notebook's name, in the header band. */
  readonly title: string;
  /** Date, version and folders for the record's header. */
  readonly record?: ReportRecord;
  /** The notebook roots read: no markdown file below them is ever written. */
  readonly roots: readonly string[];
  /** How a chart is drawn; the SVG renderer unless a test stands in for it. */
  readonly draw?: typeof renderSvg;
}

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
    if (isOutputError(e)) throw e;
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
export async function writeReport(runs: ReadonlyArray<{ report: NotebookReport; root?: string }>, options: ReportOptions): Promise<ReportWritten> {
  const draw = options.draw ?? renderSvg;
  const realRoots = options.roots.map((r) => realTarget(r));
  const output = path.resolve(options.output);
  const csv = options.csv ? path.resolve(options.csv) : undefined;
  const csvLong = options.csvLong ? path.resolve(options.csvLong) : undefined;
  const png = options.png ? path.resolve(options.png) : undefined;
  const svgDir = options.svg ? path.resolve(options.svg) : undefined;
  const files: Array<[string, string | undefined, string | undefined]> = [
    ['-o', output, options.output],
    ['--csv', csv, options.csv],
    ['--csv-long', csvLong, options.csvLong],
  ];
  const named = files.filter((f): f is [string, string, string] => f[1] !== undefined);
  for (const [i, [option, file, given]] of named.entries()) {
    const twin = named.slice(0, i).find((other) => realTarget(other[1]) === realTarget(file));
    if (twin) throw new OutputError(`${twin[0]} and ${option} name the same file (${given}); give each output its own name.`);
  }
  for (const [option, file] of named) checkOutputFile(file, option, realRoots);
  for (const [option, dir, given] of [['--png', png, options.png], ['--svg', svgDir, options.svg]] as const) {
    if (dir === undefined) continue;
    const stat = lstatOrNull(dir);
    if (stat && !stat.isDirectory() && !(stat.isSymbolicLink() && fs.statSync(dir, { throwIfNoEntry: false })?.isDirectory())) {
      throw new OutputError(`${option} ${given} is ${stat.isFile() ? 'a file' : fileTypeName(stat)}, not a folder; name a folder for the ${option === '--png' ? 'PNG' : 'SVG'} files.`);
    }
  }
  if (options.print && svgDir === undefined) throw new OutputError('--print sets the size of the SVG files: add --svg DIR.');

  // Over several notebook folders each file says its folder, so that same-id films stay apart.
  const parts: NotebookReport[] = runs.map((r) => (runs.length > 1 && r.root !== undefined ? { files: r.report.files.map((f) => ({ ...f, root: r.root })) } : r.report));
  const report: NotebookReport = { files: parts.flatMap((p) => p.files) };
  const charts = new Map<BlockReport, ChartImage>();
  const warnings: string[] = [];
  /** Every chart drawn, light, for the PNG and SVG files; `print` is its spec at publication size. */
  const drawn: Array<{ wanted: string; svg: string; print: () => VegaLiteSpec | null }> = [];
  for (const f of report.files) {
    for (const b of f.blocks) {
      if (!b.figure) continue;
      const label = `${b.kind} ${b.id ?? ''}`.trim();
      try {
        const light = await draw(toVega(blockChartSpec(b, report, { theme: 'light' })!));
        const dark = await draw(toVega(blockChartSpec(b, report, { theme: 'dark' })!));
        charts.set(b, { light, dark });
        drawn.push({ wanted: `${b.kind}-${b.id ?? 'block'}`, svg: light, print: () => blockChartSpec(b, report, { theme: 'light', print: true }) });
      } catch (e) {
        charts.set(b, { failed: failureText(e) });
        warnings.push(`the chart of ${label} (${f.path}) could not be drawn: ${failureText(e)}`);
      }
    }
  }
  const summary = parts.flatMap((p) => summarise(p));
  /**
   * Draws notebook-wide charts in both themes. A chart the notebook has too little data for comes
   * as a note: shown in its place when `notes`, else left out.
   */
  const drawAll = async (make: (o: ChartOptions) => MapChart[], prefix: string, what: string, notes: boolean): Promise<MapEntry[]> => {
    const out: MapEntry[] = [];
    const darkOnes = new Map(make({ theme: 'dark' }).map((m) => [m.name, m]));
    for (const m of make({ theme: 'light' })) {
      if (!('spec' in m)) {
        if (notes) out.push({ name: m.name, title: m.title, note: m.note });
        continue;
      }
      try {
        const light = await draw(toVega(m.spec));
        const darkOne = darkOnes.get(m.name);
        const dark = darkOne && 'spec' in darkOne ? await draw(toVega(darkOne.spec)) : light;
        out.push({ name: m.name, title: m.title, svg: { light, dark } });
        drawn.push({
          wanted: `${prefix}${m.name}`,
          svg: light,
          print: () => {
            const p = make({ theme: 'light', print: true }).find((x) => x.name === m.name);
            return p && 'spec' in p ? p.spec : null;
          },
        });
      } catch (e) {
        out.push({ name: m.name, title: m.title, failed: failureText(e) });
        warnings.push(`the ${what} ${m.name} could not be drawn: ${failureText(e)}`);
      }
    }
    return out;
  };
  const maps = await drawAll((o) => stabilityMaps(summary, report, o), 'map-', 'stability map', true);
  const materials = notebookMaterials(report);
  const materialFigures = await drawAll((o) => materials.flatMap((m) => [tsubSeriesSpec(m, report, o), relaxationMapSpec(m, report, o)]), '', 'figure', false);
  const html = buildHtmlReport({ title: options.title, ...(options.record ? { record: options.record } : {}), report, charts, summary, maps, materialFigures });
  const blockCharts = [...charts.values()].filter((c) => typeof c === 'string' || 'light' in c).length;
  const mapCount = maps.filter((m) => 'svg' in m).length;
  const materialCount = materialFigures.filter((m) => 'svg' in m).length;

  const planned: Planned[] = [{ target: output, bytes: html }];
  const lines = [`wrote ${output} (${plural(blockCharts, 'block chart')}, ${plural(mapCount, 'map')}, ${plural(materialCount, 'material figure')}, ${plural(summary.length, 'film')})`];
  if (csv !== undefined) {
    planned.push({ target: csv, bytes: summaryCsv(summary) });
    lines.push(`wrote ${csv}`);
  }
  if (csvLong !== undefined) {
    planned.push({ target: csvLong, bytes: longCsv(report) });
    lines.push(`wrote ${csvLong}`);
  }
  const names = uniqueNames(drawn.map((d) => d.wanted));
  const planChart = (target: string, option: string, bytes: () => string | Uint8Array): void => {
    if (planned.some((p) => realTarget(p.target) === realTarget(target))) throw new OutputError(`${target} would be written twice (as a chart and as another output); choose other names.`);
    checkOutputFile(target, option, realRoots);
    planned.push({ target, bytes: bytes() });
  };
  if (png !== undefined) {
    const { Resvg } = await import('@resvg/resvg-js');
    for (const [i, d] of drawn.entries()) {
      planChart(path.join(png, `${names[i]}.png`), '--png', () => new Resvg(d.svg, { fitTo: { mode: 'width', value: 1000 }, background: 'white' }).render().asPng());
    }
    lines.push(`wrote ${drawn.length} PNG files to ${png}`);
  }
  if (svgDir !== undefined) {
    for (const [i, d] of drawn.entries()) {
      let svg = d.svg;
      const printSpec = options.print ? d.print() : null;
      if (printSpec) {
        try {
          svg = await draw(toVega(printSpec), { physicalSize: true });
        } catch (e) {
          warnings.push(`the print-size chart ${names[i]} could not be drawn (${failureText(e)}); its screen size was written`);
        }
      }
      planChart(path.join(svgDir, `${names[i]}.svg`), '--svg', () => svg);
    }
    lines.push(`wrote ${drawn.length} SVG files${options.print ? ` at print size (${PRINT.width} × ${PRINT.height} px, ${PRINT.fontSize} px text, sized in cm)` : ''} to ${svgDir}`);
  }
  const folders = [...new Set([path.dirname(output), ...named.slice(1).map((f) => path.dirname(f[1])), ...(png !== undefined ? [png] : []), ...(svgDir !== undefined ? [svgDir] : [])])];
  writeAll(planned, folders);
  return { lines, warnings };
}

/** `1 map`, `4 maps`. */
function plural(n: number, noun: string): string {
  return `${n} ${noun}${n === 1 ? '' : 's'}`;
}
