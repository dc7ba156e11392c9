/* global process */
/**
 * Checks the chart preview's page script in a real browser, outside VS Code: builds
 * dist/webview/webview.js and dist/webview/webview.css, serves a page like the one the extension makes (same
 * Content Security Policy, nonce, stylesheet and script tags) on 127.0.0.1, stands in for
 * `acquireVsCodeApi`, posts the demo notebook's charts, and takes screenshots in light, dark,
 * high-contrast and forced-light themes into test/e2e/out/.
 *
 * Usage: npx tsx scripts/webview-check.ts   (needs Debian's /usr/bin/chromium; not part of npm test)
 * Exits 1 when a check fails: a CSP violation or another console error, a page error, a missing
 * chart, a message not posted.
 */
import { randomBytes } from 'node:crypto';
import * as fs from 'node:fs';
import * as http from 'node:http';
import type { AddressInfo } from 'node:net';
import * as path from 'node:path';
import { execFileSync } from 'node:child_process';
import { chromium, type Page } from 'playwright-core';
import { figureSpec, stabilityMapSpecs, toVega } from '../extension/core/charts/index.js';
import { SURFACE } from '../extension/core/charts/tokens.js';
import { LineIndex, SUMMARY_TABLE_COLUMNS, summarise, summaryCell, type BlockReport } from '../extension/core/index.js';
import type { BlockChart, SummaryResult } from '../extension/protocol/server.js';
import type { ChartTheme, FromWebview, ToWebview } from '../extension/protocol/webview.js';
import { chartTitle } from '../extension/server/charts.js';
import { figureRows } from '../extension/server/figures.js';
import { loadNotebook, REPO } from '../test/support/loadNotebook.js';

const OUT = path.join(REPO, 'test', 'e2e', 'out');

// ── the bundle: the project's own build ─────────────────────────────────────────────────────────

function buildWebview(): void {
  execFileSync(process.execPath, [path.join(REPO, 'scripts', 'build.mjs')], { cwd: REPO, stdio: 'inherit' });
}

// ── the demo notebook's charts, as the language server answers `vitrine/charts` ─────────────────

function demoCharts(theme: 'light' | 'dark'): { uri: string; fileName: string; blocks: BlockChart[] } {
  const { notebook } = loadNotebook('fixtures/demo');
  const report = notebook.analyze();
  const byId = new Map<string, BlockReport>();
  for (const f of report.files) for (const b of f.blocks) if (b.id) byId.set(b.id, b);
  // The file with the most charts.
  const file = [...report.files].sort((a, b) => b.blocks.filter((x) => x.figure).length - a.blocks.filter((x) => x.figure).length)[0];
  const lines = new LineIndex(file.text);
  const blocks = file.blocks.map((b): BlockChart => {
    const film = typeof b.metadata.film === 'string' ? byId.get(b.metadata.film) : undefined;
    const title = chartTitle(b, film);
    return {
      kind: b.kind,
      id: b.id,
      line: lines.positionAt(b.span.start).line,
      endLine: lines.positionAt(b.span.end).line,
      title,
      vega: b.figure ? toVega(figureSpec(title, b.figure, theme)) : null,
      figures: figureRows(b),
      diagnostics: b.diagnostics.filter((d) => d.phase !== 'save').map((d) => ({ severity: d.severity, code: d.code, message: d.message, line: lines.positionAt(d.span.start).line })),
    };
  });
  // Cases the demo does not have: markup in every text field, a chart that cannot be drawn, and a
  // block with diagnostics only.
  const last = blocks.at(-1)?.endLine ?? 0;
  blocks.push({
    kind: 'ramp',
    id: 'X-<b>1</b>',
    line: last + 2,
    endLine: last + 8,
    title: 'ramp <img src=x id=injected> & "quotes"',
    vega: { marks: 'not a list', scales: 7 },
    figures: [{ name: 'tg', label: '<i>Tg</i>', text: '1 < 2 & 3 > 2', method: '<script>alert(1)</script>', meaning: '' }],
    diagnostics: [],
  });
  blocks.push({
    kind: 'dsc',
    id: null,
    line: last + 10,
    endLine: last + 14,
    title: 'dsc (no data yet)',
    vega: null,
    figures: [],
    diagnostics: [
      { severity: 'error', code: 'table.no-data', message: 'The block has no data: add a table after a line `---`, or `data: <file>`.', line: last + 11 },
      { severity: 'warning', code: 'quantity.bare-number', message: 'rate: 10 has no unit; K/min was assumed.', line: last + 12 },
      { severity: 'info', code: 'meta.missing-recommended', message: 'Recommended: mass.', line: last + 10 },
    ],
  });
  return { uri: `file:///notebook/${file.path}`, fileName: path.basename(file.path), blocks };
}

function demoSummary(theme: 'light' | 'dark'): SummaryResult {
  const { notebook } = loadNotebook('fixtures/demo');
  const report = notebook.analyze();
  const films = summarise(report);
  const rows = films.map((row) => {
    const loc = notebook.definitionOf(row.film);
    const text = report.files.find((f) => f.path === row.file)?.text ?? '';
    return { film: row.film, uri: `file:///notebook/${row.file}`, line: loc ? new LineIndex(text).positionAt(loc.span.start).line : 0, cells: SUMMARY_TABLE_COLUMNS.map((c) => summaryCell(c, row)) };
  });
  const maps = stabilityMapSpecs(films, report, theme).map((m) => ({ title: m.name, vega: toVega(m.spec) }));
  return { columns: SUMMARY_TABLE_COLUMNS.map((c) => c.header), rows, maps };
}

// ── the page, as the extension makes it ─────────────────────────────────────────────────────────

/** A few of the variables VS Code sets on the page, with values of its default themes. */
const THEMES: Record<string, { bodyClass: string; vars: Record<string, string> }> = {
  light: {
    bodyClass: 'vscode-light',
    vars: {
      '--vscode-editor-background': '#ffffff',
      '--vscode-editor-foreground': '#3b3b3b',
      '--vscode-foreground': '#3b3b3b',
      '--vscode-descriptionForeground': '#3b3b3b',
      '--vscode-panel-border': '#e5e5e5',
      '--vscode-focusBorder': '#005fb8',
      '--vscode-button-secondaryBackground': '#e5e5e5',
      '--vscode-button-secondaryForeground': '#3b3b3b',
      '--vscode-button-secondaryHoverBackground': '#cccccc',
      '--vscode-editorError-foreground': '#e51400',
      '--vscode-editorWarning-foreground': '#bf8803',
      '--vscode-editorInfo-foreground': '#1a85ff',
      '--vscode-errorForeground': '#f85149',
      '--vscode-textLink-foreground': '#005fb8',
      '--vscode-list-hoverBackground': '#f2f2f2',
      '--vscode-sideBarSectionHeader-background': '#f8f8f8',
    },
  },
  dark: {
    bodyClass: 'vscode-dark',
    vars: {
      '--vscode-editor-background': '#1f1f1f',
      '--vscode-editor-foreground': '#cccccc',
      '--vscode-foreground': '#cccccc',
      '--vscode-descriptionForeground': '#9d9d9d',
      '--vscode-panel-border': '#2b2b2b',
      '--vscode-focusBorder': '#0078d4',
      '--vscode-button-secondaryBackground': '#313131',
      '--vscode-button-secondaryForeground': '#cccccc',
      '--vscode-button-secondaryHoverBackground': '#3c3c3c',
      '--vscode-editorError-foreground': '#f14c4c',
      '--vscode-editorWarning-foreground': '#cca700',
      '--vscode-editorInfo-foreground': '#3794ff',
      '--vscode-errorForeground': '#f85149',
      '--vscode-textLink-foreground': '#4daafc',
      '--vscode-list-hoverBackground': '#2a2d2e',
      '--vscode-sideBarSectionHeader-background': '#181818',
    },
  },
  'high-contrast': {
    bodyClass: 'vscode-high-contrast',
    vars: {
      '--vscode-editor-background': '#000000',
      '--vscode-editor-foreground': '#ffffff',
      '--vscode-foreground': '#ffffff',
      '--vscode-descriptionForeground': '#ffffff',
      '--vscode-panel-border': '#6fc3df',
      '--vscode-focusBorder': '#f38518',
      '--vscode-button-secondaryBackground': '#000000',
      '--vscode-button-secondaryForeground': '#ffffff',
      '--vscode-button-border': '#6fc3df',
      '--vscode-editorError-foreground': '#f48771',
      '--vscode-editorWarning-foreground': '#ffd370',
      '--vscode-editorInfo-foreground': '#3794ff',
      '--vscode-errorForeground': '#f48771',
      '--vscode-textLink-foreground': '#21a6ff',
      '--vscode-list-hoverBackground': '#000000',
    },
  },
};

const COMMON_VARS = {
  '--vscode-font-family': '-apple-system, BlinkMacSystemFont, "Segoe WPC", "Segoe UI", "Ubuntu", "Droid Sans", sans-serif',
  '--vscode-font-size': '13px',
  '--vscode-editor-font-family': '"Droid Sans Mono", "monospace", monospace',
  '--vscode-editor-font-size': '14px',
};

/** The policy the extension's page declares (`origin` stands for the webview's cspSource). */
function csp(origin: string, nonce: string): string {
  return `default-src 'none'; img-src data:; style-src ${origin}; script-src 'nonce-${nonce}'; font-src ${origin}`;
}

function pageHtml(origin: string, nonce: string, themeName: string): string {
  const theme = THEMES[themeName];
  const vars = { ...COMMON_VARS, ...theme.vars };
  // In VS Code the host sets the variables and the body class by script; the stand-in does the same
  // (an inline style attribute would be refused by this CSP).
  const stub = `
    window.__posted = []; window.__state = null; window.__violations = []; let acquired = false;
    document.addEventListener('securitypolicyviolation', (e) => window.__violations.push(e.violatedDirective + ' ' + e.blockedURI));
    window.acquireVsCodeApi = () => {
      if (acquired) throw new Error('acquireVsCodeApi called twice');
      acquired = true;
      return { postMessage: (m) => window.__posted.push(m), getState: () => window.__state, setState: (s) => { window.__state = s; } };
    };
    for (const [k, v] of Object.entries(${JSON.stringify(vars)})) document.documentElement.style.setProperty(k, v);
    document.body.classList.add(${JSON.stringify(theme.bodyClass)});`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="UTF-8">
<meta http-equiv="Content-Security-Policy" content="${csp(origin, nonce)}">
<meta name="viewport" content="width=device-width, initial-scale=1.0">
<link rel="stylesheet" href="${origin}/dist/webview/webview.css">
<title>Vitrine charts</title>
</head>
<body>
<script nonce="${nonce}">${stub}</script>
<main id="vitrine-root" aria-live="polite"></main>
<script nonce="${nonce}" src="${origin}/dist/webview/webview.js"></script>
</body>
</html>`;
}

function serve(): Promise<{ origin: string; server: http.Server; pages: Map<string, string> }> {
  const pages = new Map<string, string>();
  const files: Record<string, string> = { '/dist/webview/webview.js': 'text/javascript', '/dist/webview/webview.css': 'text/css' };
  const server = http.createServer((req, res) => {
    const url = req.url ?? '/';
    const page = pages.get(url);
    if (page) {
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(page);
    } else if (files[url]) {
      res.writeHead(200, { 'content-type': files[url] }).end(fs.readFileSync(path.join(REPO, url)));
    } else {
      res.writeHead(404).end();
    }
  });
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve({ origin: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, server, pages })));
}

// ── the checks ──────────────────────────────────────────────────────────────────────────────────

const failures: string[] = [];

function check(ok: boolean, what: string): void {
  console.log(`${ok ? 'ok  ' : 'FAIL'} ${what}`);
  if (!ok) failures.push(what);
}

async function post(page: Page, message: ToWebview): Promise<void> {
  await page.evaluate((m) => (globalThis as unknown as { postMessage(m: unknown, o: string): void }).postMessage(m, '*'), message as unknown);
}

async function posted(page: Page): Promise<FromWebview[]> {
  return (await page.evaluate('window.__posted')) as FromWebview[];
}

async function waitForPosted(page: Page, type: FromWebview['type'], count: number): Promise<FromWebview[]> {
  await page.waitForFunction(([t, n]) => ((globalThis as unknown as { __posted: Array<{ type: string }> }).__posted.filter((m) => m.type === t).length >= (n as number)), [type, count] as const, { timeout: 15_000 }).catch(() => undefined);
  return (await posted(page)).filter((m) => m.type === type);
}

async function openPage(origin: string, pages: Map<string, string>, themeName: string, browser: import('playwright-core').Browser): Promise<{ page: Page; problems: string[] }> {
  const nonce = randomBytes(16).toString('base64');
  const url = `/preview-${themeName}-${pages.size}.html`;
  pages.set(url, pageHtml(origin, nonce, themeName));
  const page = await browser.newPage({ viewport: { width: 860, height: 1000 } });
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  // Nothing leaves the machine: only the local server answers.
  await page.route('**/*', (route) => (route.request().url().startsWith(origin) ? route.continue() : route.abort()));
  await page.goto(origin + url);
  return { page, problems };
}

/** The first chart's background colour (Vega sets it on the SVG element's style) as `#rrggbb`. */
async function chartBackground(page: Page): Promise<string> {
  const rgb = await page.locator('.chart svg').first().evaluate((svg) => svg.style.getPropertyValue('background-color'));
  const m = /^rgb\((\d+), (\d+), (\d+)\)$/.exec(rgb);
  return m ? `#${m.slice(1).map((v) => Number(v).toString(16).padStart(2, '0')).join('')}` : rgb;
}

async function settle(page: Page): Promise<void> {
  await page.waitForFunction('document.querySelectorAll(".chart.is-drawing").length === 0', undefined, { timeout: 15_000 }).catch(() => undefined);
  await page.waitForTimeout(100);
}

async function chartsRun(browser: import('playwright-core').Browser, origin: string, pages: Map<string, string>, themeName: ChartTheme, forceLight: boolean, shot: string): Promise<void> {
  const label = `${themeName}${forceLight ? ' (forced light)' : ''}`;
  const { page, problems } = await openPage(origin, pages, themeName, browser);
  const ready = await waitForPosted(page, 'ready', 1);
  check(ready.length === 1, `${label}: posts ready once`);
  const server = themeName === 'light' || forceLight ? 'light' : 'dark';
  const charts = demoCharts(server);
  await post(page, { type: 'show', uri: charts.uri, fileName: charts.fileName, version: 3, blocks: charts.blocks, theme: themeName, forceLight });
  await settle(page);
  const drawable = charts.blocks.filter((b) => b.vega !== null).length - 1; // one is broken on purpose
  check((await page.locator('.card').count()) === charts.blocks.length, `${label}: one card per block (${charts.blocks.length})`);
  check((await page.locator('.chart svg').count()) === drawable, `${label}: ${drawable} charts drawn as SVG`);
  check((await page.locator('.chart-failed').count()) === 1, `${label}: the broken chart shows a message`);
  check((await page.locator('#injected, .card i, .card b, .card script').count()) === 0, `${label}: markup in titles and figures stays text`);
  check((await page.getByText('ramp <img src=x id=injected> & "quotes"').count()) === 1, `${label}: the title with markup is shown as written`);
  check(JSON.stringify(await page.evaluate('window.__state')) === JSON.stringify({ uri: charts.uri, view: 'charts' }), `${label}: keeps the uri and view in the webview state`);
  // Light and dark editors draw charts on Vitrine's own sheet colour; high contrast keeps the editor's.
  const bg = forceLight ? SURFACE.light.sheet : themeName === 'light' || themeName === 'dark' ? SURFACE[themeName].sheet : THEMES[themeName].vars['--vscode-editor-background'];
  const firstBg = await chartBackground(page);
  check(firstBg.toLowerCase() === bg, `${label}: chart background ${firstBg} is ${bg}`);

  // A stale answer (older version) is dropped.
  await post(page, { type: 'show', uri: charts.uri, fileName: 'stale.md', version: 2, blocks: [], theme: themeName, forceLight });
  await page.waitForTimeout(100);
  check((await page.locator('.page-title').textContent()) === charts.fileName, `${label}: drops a show for an older version`);
  // Something that is not a message of ours is dropped.
  await post(page, { type: 'bogus' } as unknown as ToWebview);

  await page.screenshot({ path: path.join(OUT, `${shot}.png`), fullPage: true });

  // Cursor: the card of the block holding the line is marked and scrolled to.
  const target = charts.blocks[Math.min(2, charts.blocks.length - 1)];
  await post(page, { type: 'cursor', uri: charts.uri, line: target.line + 1 });
  await page.waitForTimeout(600);
  const current = page.locator('.card.is-current');
  check((await current.count()) === 1 && (await current.getAttribute('data-line')) === String(target.line), `${label}: cursor marks the card of line ${target.line + 1}`);
  check(await current.isVisible(), `${label}: the marked card is in view`);
  if (themeName === 'dark' && !forceLight) await page.screenshot({ path: path.join(OUT, `${shot}-cursor.png`) });

  // Reveal on a click on a chart.
  await page.locator('.chart').first().click();
  const reveals = await waitForPosted(page, 'reveal', 1);
  check(reveals.length === 1 && reveals[0].type === 'reveal' && reveals[0].uri === charts.uri && reveals[0].line === charts.blocks.find((b) => b.vega)!.line, `${label}: a click on a chart posts reveal`);

  // Exports.
  const card = page.locator('.card').filter({ has: page.locator('.chart svg') }).first();
  await card.locator('button.export[data-format="svg"]').click();
  await card.locator('button.export[data-format="png"]').click();
  const exports = await waitForPosted(page, 'export', 2);
  const svg = exports.find((m) => m.type === 'export' && m.format === 'svg');
  const png = exports.find((m) => m.type === 'export' && m.format === 'png');
  check(svg?.type === 'export' && svg.data.startsWith('<svg') && svg.data.toLowerCase().includes(`fill="${bg}"`), `${label}: SVG export with its background`);
  check(png?.type === 'export' && png.data.startsWith('data:image/png;base64,'), `${label}: PNG export as a data URL`);
  if (svg?.type === 'export') fs.writeFileSync(path.join(OUT, `${shot}-export.svg`), svg.data);
  if (png?.type === 'export') fs.writeFileSync(path.join(OUT, `${shot}-export.png`), Buffer.from(png.data.slice('data:image/png;base64,'.length), 'base64'));

  const errors = (await posted(page)).filter((m) => m.type === 'error');
  check(errors.length === 1, `${label}: one error posted (the broken chart): ${JSON.stringify(errors)}`);
  const violations = (await page.evaluate('window.__violations')) as string[];
  check(violations.length === 0, `${label}: no CSP violations ${JSON.stringify(violations)}`);
  check(problems.length === 0, `${label}: no console errors or page errors ${JSON.stringify(problems)}`);
  await page.close();
}

async function themeSwitchRun(browser: import('playwright-core').Browser, origin: string, pages: Map<string, string>): Promise<void> {
  const { page, problems } = await openPage(origin, pages, 'dark', browser);
  await waitForPosted(page, 'ready', 1);
  const charts = demoCharts('dark');
  await post(page, { type: 'show', uri: charts.uri, fileName: charts.fileName, version: 1, blocks: charts.blocks, theme: 'dark', forceLight: false });
  await settle(page);
  const heightBefore = await page.locator('.chart').first().evaluate((el) => el.offsetHeight);
  // The editor switches to a light theme: VS Code changes the variables and the body class.
  await page.evaluate(`(() => {
    for (const [k, v] of Object.entries(${JSON.stringify(THEMES.light.vars)})) document.documentElement.style.setProperty(k, v);
    document.body.classList.replace('vscode-dark', 'vscode-light');
  })()`);
  await post(page, { type: 'theme', theme: 'light', forceLight: false });
  await settle(page);
  const fill = await chartBackground(page);
  check(fill === SURFACE.light.sheet, `theme switch: charts redrawn on the light background (${fill})`);
  check((await page.locator('.chart svg').count()) === charts.blocks.filter((b) => b.vega).length - 1, 'theme switch: every chart drawn again');
  const heightAfter = await page.locator('.chart').first().evaluate((el) => el.offsetHeight);
  check(heightAfter === heightBefore, `theme switch: a chart keeps its height (${heightBefore} → ${heightAfter} px)`);
  // The file is shown again after an edit: the reader stays where they were.
  await page.evaluate('window.scrollTo(0, 1200)');
  const scrolled = (await page.evaluate('window.scrollY')) as number;
  await post(page, { type: 'show', uri: charts.uri, fileName: charts.fileName, version: 2, blocks: charts.blocks, theme: 'light', forceLight: false });
  await settle(page);
  const after = (await page.evaluate('window.scrollY')) as number;
  check(scrolled > 0 && after === scrolled, `a new version of the same file keeps the scroll position (${scrolled} → ${after})`);
  check(problems.length === 0, `theme switch: no console errors ${JSON.stringify(problems)}`);
  await page.screenshot({ path: path.join(OUT, 'webview-theme-switch.png') });
  await page.close();
}

async function summaryRun(browser: import('playwright-core').Browser, origin: string, pages: Map<string, string>, themeName: ChartTheme): Promise<void> {
  const { page, problems } = await openPage(origin, pages, themeName, browser);
  await waitForPosted(page, 'ready', 1);
  const summary = demoSummary(themeName === 'light' ? 'light' : 'dark');
  await post(page, { type: 'summary', summary, theme: themeName, forceLight: false });
  await settle(page);
  check((await page.locator('.films tbody tr').count()) === summary.rows.length, `summary ${themeName}: one row per film (${summary.rows.length})`);
  check((await page.locator('.maps .chart svg').count()) === summary.maps.length, `summary ${themeName}: ${summary.maps.length} maps drawn`);
  check(JSON.stringify(await page.evaluate('window.__state')) === JSON.stringify({ uri: null, view: 'summary' }), `summary ${themeName}: state says summary`);
  await page.screenshot({ path: path.join(OUT, `webview-summary-${themeName}.png`), fullPage: true });
  await page.locator('.films tbody tr').first().click();
  const reveals = await waitForPosted(page, 'reveal', 1);
  check(reveals.length === 1 && reveals[0].type === 'reveal' && reveals[0].uri === summary.rows[0].uri && reveals[0].line === summary.rows[0].line, `summary ${themeName}: a click on a film posts reveal`);
  const violations = (await page.evaluate('window.__violations')) as string[];
  check(violations.length === 0 && problems.length === 0, `summary ${themeName}: no CSP violations or console errors ${JSON.stringify([...violations, ...problems])}`);
  await page.close();
}

/** The checks above are only worth something if the policy is in force: code from strings and scripts without the nonce are refused. */
async function policyRun(browser: import('playwright-core').Browser, origin: string, pages: Map<string, string>): Promise<void> {
  const nonce = randomBytes(16).toString('base64');
  pages.set('/policy.html', `<!DOCTYPE html><html><head><meta http-equiv="Content-Security-Policy" content="${csp(origin, nonce)}"></head><body>
<script nonce="${nonce}">try { new Function('return 1')(); window.__codegen = 'allowed'; } catch (e) { window.__codegen = 'refused'; }</script>
<script>window.__inline = 'ran';</script></body></html>`);
  const page = await browser.newPage();
  await page.goto(`${origin}/policy.html`);
  check((await page.evaluate('window.__codegen')) === 'refused', 'the page policy refuses new Function');
  check((await page.evaluate('window.__inline')) === undefined, 'the page policy refuses a script without the nonce');
  await page.close();
}

async function main(): Promise<void> {
  fs.mkdirSync(OUT, { recursive: true });
  buildWebview();
  const { origin, server, pages } = await serve();
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
  });
  try {
    await policyRun(browser, origin, pages);
    await chartsRun(browser, origin, pages, 'light', false, 'webview-light');
    await chartsRun(browser, origin, pages, 'dark', false, 'webview-dark');
    await chartsRun(browser, origin, pages, 'dark', true, 'webview-dark-forced-light');
    await chartsRun(browser, origin, pages, 'high-contrast', false, 'webview-high-contrast');
    await themeSwitchRun(browser, origin, pages);
    await summaryRun(browser, origin, pages, 'dark');
    await summaryRun(browser, origin, pages, 'light');
  } finally {
    await browser.close();
    server.close();
  }
  console.log(`screenshots in ${path.relative(REPO, OUT)}/`);
  console.log(`${failures.length === 0 ? 'all checks passed' : `${failures.length} checks failed`}`);
  process.exitCode = failures.length === 0 ? 0 : 1;
}

await main();
