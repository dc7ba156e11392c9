/**
 * The `vitrine` command line: a thin host over the core.
 *
 *   vitrine check PATH... [--summary]   file:line:col: severity: message [code]
 *   vitrine analyze PATH... --json      the results contract of DESIGN.md
 *
 * A directory is a notebook root (every .md below it); a file is analysed with the other
 * markdown files of its folder as its root, so its references resolve.
 * Exit status: 0 no errors (warnings allowed), 1 errors found, 2 usage or internal failure,
 * 141 when the reader of the output goes away (bin.ts).
 */
import * as path from 'node:path';
import { countDiagnostics, formatDiagnosticLine, summarise, toLazyJsonReport, type LazyJsonFile } from '../core/index.js';
import { loadRoot, rootsOf, RootError, type RootRun } from '../node/notebookRoots.js';
import { ioErrorText } from '../node/notebookText.js';
import { progressBar, type Progress } from './progress.js';
import { InitRefused, writeStarter } from './init.js';
import { isOutputError } from './outputError.js';
import { summaryTable } from './summaryTable.js';
import { terminalText, writeTerminalJson } from './terminalText.js';
import { VERSION } from './version.js';

const USAGE = `usage: vitrine <command> PATH... [options]

commands:
  check PATH...            check notebooks; print file:line:col: severity: message [code]
  analyze PATH... --json   print every result and diagnostic as JSON
  report PATH... -o FILE   write the HTML report: a self-contained lab record with charts
  init [DIR]               write a small starting notebook into DIR (default: the current folder)

options:
  --root DIR               the notebook folder; PATHs inside it are reported, and references
                           and data paths resolve across the whole folder
  --summary                with check: print a table of the figures of merit per film
  --quiet                  with check: print errors only
  --verbose                with check: list every place a finding names (all the bad cells of a
                           data file), each on its own line
  -o, --output FILE        with report: the HTML file to write
  --csv FILE               with report: also write the summary per film as CSV (every
                           figure with its uncertainty, °C beside K, method, technique)
  --csv-long FILE          with report: also write every figure as one row per block and
                           figure (tidy CSV for data frames)
  --png DIR                with report: also write every chart as PNG into DIR
  --svg DIR                with report: also write every chart as SVG into DIR
  --print                  with --svg: draw the SVG files one journal column wide, with
                           print-size text
  -h, --help               show this help
  --version                print the version

A directory is a notebook root: every .md file below it is read (hidden folders and
node_modules are skipped) and references are resolved across them. A file named here is read
whatever its extension, with the other files of its folder, unless --root names the notebook
folder. report never writes over a notebook file or through a symbolic link, and writes
nothing when any of its outputs fails. Exit status: 0 no errors, 1 errors found, 2 usage error,
refused output, or a failure, 141 when the reader of the output stops early (| head).`;

export interface CliIo {
  readonly out: (text: string) => void;
  readonly err: (text: string) => void;
  readonly cwd: string;
  /** Standard error is a terminal (a progress bar may be drawn). */
  readonly errIsTty?: boolean;
  /** The clock of the report's date (tests pass a fixed one). */
  readonly now?: () => Date;
}


class UsageError extends Error {}

/** Reads and analyses each notebook root that the PATH arguments name. */
function runs(paths: readonly string[], cwd: string, progress: Progress | null = null, rootOption?: string): RootRun[] {
  try {
    return rootsOf(paths, cwd, rootOption).map(({ root, only }) => loadRoot(root, only, progress ?? undefined));
  } catch (e) {
    if (e instanceof RootError) throw new UsageError(e.message);
    throw e;
  }
}

function totals(all: readonly RootRun[]): { error: number; warning: number } {
  const sum = { error: 0, warning: 0 };
  for (const r of all) {
    const c = countDiagnostics(r.report);
    sum.error += c.error;
    sum.warning += c.warning;
  }
  return sum;
}

function displayPath(root: string, rel: string, cwd: string): string {
  const shown = path.relative(cwd, path.join(root, ...rel.split('/')));
  return shown.split(path.sep).join('/');
}

/** A failure of the operating system (a file that cannot be read or written), not of Vitrine. */
function isSystemError(e: unknown): e is NodeJS.ErrnoException {
  return e instanceof Error && typeof (e as NodeJS.ErrnoException).code === 'string' && typeof (e as NodeJS.ErrnoException).syscall === 'string';
}

/**
 * Runs the command. Every line printed goes through `terminalText`: control characters from a
 * notebook (in a path, a key, a cell) are shown escaped, never sent to the terminal.
 */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const shown: CliIo = { ...io, out: (t) => io.out(terminalText(t)), err: (t) => io.err(terminalText(t)) };
  try {
    return await dispatch(argv, shown, io.err);
  } catch (e) {
    if (e instanceof UsageError) {
      shown.err(`vitrine: ${e.message}\n\n${USAGE}\n`);
      return 2;
    }
    if (isOutputError(e)) {
      shown.err(`vitrine: ${e.message}\n`);
      return 2;
    }
    if (isSystemError(e)) {
      shown.err(`vitrine: ${e.path ? `${e.path}: ` : ''}${ioErrorText(e)} (${e.code} in ${e.syscall})\n`);
      return 2;
    }
    shown.err(`vitrine: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 2;
  }
}

/** Takes `--name VALUE` (or `-o VALUE`) out of the arguments. */
function takeOption(args: string[], names: readonly string[]): string | undefined {
  const i = args.findIndex((a) => names.includes(a));
  if (i < 0) return undefined;
  const value = args[i + 1];
  if (value === undefined || value.startsWith('-')) throw new UsageError(`${args[i]} needs a value`);
  args.splice(i, 2);
  return value;
}

/** `rawErr` writes to standard error unescaped: only the progress bar's own carriage returns use it. */
async function dispatch(argv: readonly string[], io: CliIo, rawErr: (text: string) => void): Promise<number> {
  const args = [...argv];
  if (args.length === 0 || args.includes('-h') || args.includes('--help')) {
    io.out(USAGE + '\n');
    return args.length === 0 ? 2 : 0;
  }
  if (args.includes('--version')) {
    io.out(`vitrine ${VERSION}\n`);
    return 0;
  }
  const command = args.shift();
  const root = takeOption(args, ['--root']);
  if (command === 'report') return report(args, io, root, rawErr);
  if (command === 'init') return init(args, io);
  const flags = new Set(args.filter((a) => a.startsWith('-')));
  const paths = args.filter((a) => !a.startsWith('-'));
  const known = command === 'check' ? ['--summary', '--quiet', '--verbose'] : command === 'analyze' ? ['--json'] : [];
  if (command !== 'check' && command !== 'analyze') throw new UsageError(`unknown command "${command ?? ''}"`);

  for (const f of flags) if (!known.includes(f)) throw new UsageError(`unknown option "${f}" for ${command}`);
  if (paths.length === 0) throw new UsageError(`${command} needs at least one PATH`);
  if (command === 'analyze' && !flags.has('--json')) throw new UsageError('analyze writes JSON: add --json');

  const all = runs(paths, io.cwd, null, root);
  if (command === 'check') noteSkipped(all, io);
  const { error: errors, warning: warnings } = totals(all);
  // Each block's JSON is made when it is written (or its diagnostics printed), then dropped.
  const json: { files: LazyJsonFile[] } = { files: [] };
  for (const run of all) {
    const j = toLazyJsonReport(run.report);
    json.files.push(...j.files);
    if (command !== 'check') continue;
    for (const f of j.files) {
      const shown = displayPath(run.root, f.path, io.cwd);
      const diags = [...f.diagnostics, ...f.blocks.toJSON().flatMap((b) => b.diagnostics)].sort((a, b) => a.line - b.line || a.column - b.column);
      for (const d of diags) {
        if (flags.has('--quiet') && d.severity !== 'error') continue;
        io.out(formatDiagnosticLine(shown, d) + '\n');
        if (flags.has('--verbose')) for (const r of d.related ?? []) io.out(`  ${displayPath(run.root, r.path, io.cwd)}:${r.line}:${r.column}: ${r.message}\n`);
      }
    }
  }
  if (command === 'analyze') {
    // Block by block: the report is never one string of megabytes, nor one tree of objects.
    writeTerminalJson(json, io.out);
    io.out('\n');
  } else {
    const fileCount = json.files.length;
    const blockCount = json.files.reduce((n, f) => n + f.blocks.length, 0);
    io.out(`${fileCount} file${fileCount === 1 ? '' : 's'}, ${blockCount} data block${blockCount === 1 ? '' : 's'}: ${errors} error${errors === 1 ? '' : 's'}, ${warnings} warning${warnings === 1 ? '' : 's'}\n`);
    if (flags.has('--summary')) {
      const rows = all.flatMap((r) => summarise(r.report));
      io.out('\n' + (rows.length > 0 ? summaryTable(rows) : 'No films (deposition blocks) yet.') + '\n');
    }
  }
  return errors > 0 ? 1 : 0;
}

/** One line on standard error naming the tool folders that were not searched for notebooks. */
function noteSkipped(all: readonly RootRun[], io: CliIo): void {
  const names = [...new Set(all.flatMap((r) => (all.length === 1 ? r.skipped : r.skipped.map((s) => displayPath(r.root, s, io.cwd)))))];
  if (names.length === 0) return;
  const shown = names.length > 12 ? `${names.slice(0, 12).join(', ')} and ${names.length - 12} more` : names.join(', ');
  io.err(`vitrine: skipped ${shown} (hidden folders and node_modules are not searched for notebooks)\n`);
}

function init(args: string[], io: CliIo): number {
  const unknown = args.find((a) => a.startsWith('-'));
  if (unknown) throw new UsageError(`unknown option "${unknown}" for init`);
  if (args.length > 1) throw new UsageError('init takes one folder');
  const dir = path.resolve(io.cwd, args[0] ?? '.');
  try {
    const written = writeStarter(dir);
    for (const w of written) io.out(`wrote ${path.relative(io.cwd, w).split(path.sep).join('/') || w}\n`);
    const shown = path.relative(io.cwd, dir) || '.';
    io.out(`\nNext: vitrine check ${shown} --summary, then open ${shown} in your editor and make the blocks your own.\n`);
    return 0;
  } catch (e) {
    if (e instanceof InitRefused) {
      io.err(`vitrine: ${e.message}\n`);
      return 2;
    }
    throw e;
  }
}

/** `2026-12-02 14:52 UTC`: the report's date, in UTC so that it reads the same everywhere. */
function reportDate(now: Date): string {
  const iso = now.toISOString();
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

async function report(args: string[], io: CliIo, root: string | undefined, rawErr: (text: string) => void): Promise<number> {
  const output = takeOption(args, ['-o', '--output']);
  const csv = takeOption(args, ['--csv']);
  const csvLong = takeOption(args, ['--csv-long']);
  const png = takeOption(args, ['--png']);
  const svg = takeOption(args, ['--svg']);
  const printAt = args.indexOf('--print');
  if (printAt >= 0) args.splice(printAt, 1);
  const unknown = args.find((a) => a.startsWith('-'));
  if (unknown) throw new UsageError(`unknown option "${unknown}" for report`);
  if (!output) throw new UsageError('report needs -o FILE');
  if (args.length === 0) throw new UsageError('report needs at least one PATH');
  if (printAt >= 0 && !svg) throw new UsageError('--print sets the size of the SVG files: add --svg DIR');
  const progress = io.errIsTty ? progressBar(rawErr) : null;
  const all = runs(args, io.cwd, progress, root);
  const resolve = (p: string | undefined): string | undefined => (p ? path.resolve(io.cwd, p) : undefined);
  // The charts, the drawing library and the markdown renderer load only for a report.
  const { writeReport } = await import('./report.js');
  const written = await writeReport(all, {
    output: path.resolve(io.cwd, output),
    csv: resolve(csv),
    csvLong: resolve(csvLong),
    png: resolve(png),
    svg: resolve(svg),
    print: printAt >= 0,
    title: all.length === 1 ? path.basename(all[0].root) : 'Vitrine notebooks',
    record: { date: reportDate((io.now ?? (() => new Date()))()), version: VERSION, folders: all.map((r) => r.root) },
    roots: all.map((r) => r.root),
  });
  for (const w of written.warnings) io.err(`vitrine: ${w}\n`);
  for (const line of written.lines) io.out(line + '\n');
  return totals(all).error > 0 ? 1 : 0;
}
