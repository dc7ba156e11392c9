/**
 * End-to-end: the packaged extension in a real VS Code (code-server) in headless Chromium, on a
 * copy of the demo notebook. Run with `npm run test:e2e` (which builds, packages and installs
 * what is missing first). Screenshots go to test/e2e/out/; so do the logs of each run.
 * VITRINE_VSIX=path/to.vsix tests another package than dist/vitrine-<version>.vsix.
 */
import assert from 'node:assert/strict';
import { mkdirSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { CodeServer, OUT_DIR, REPO } from './harness/codeServer.js';
import { STEP_TIMEOUT, Workbench, luminance } from './harness/workbench.js';

const NOTEBOOK_DAY = 'days/2026-03-02.md';
const TYPED_FILE = 'days/e2e.md';
const UNIT_FILE = 'days/e2e-unit.md';

/** A deposition block without its required "rate", typed into TYPED_FILE. */
const BLOCK_WITHOUT_RATE = ['```deposition D-99', 'material: amberine-3', 'substrate_temperature: 270 K', 'duration: 100 s', '```'];

/** A complete deposition block whose substrate temperature is a bare number (K is assumed). */
const UNIT_TEXT = ['# A bare number', '', '```deposition D-98', 'material: amberine-3', 'substrate_temperature: 270', 'rate: 0.2 nm/s', 'duration: 100 s', '```', ''].join('\n');
const BARE_LINE = UNIT_TEXT.split('\n').findIndex((l) => l.startsWith('substrate_temperature:')) + 1;

/** What this suite writes into test/e2e/out/ (cleared before each run). */
const OWN_OUTPUT = /^(workbench|lens|markdown-preview|diagnostics|quick-fix|quick-fix-applied|editor-lenses|preview-dark|failure-.*)\.png$|^code-server-logs$/;

function vsixPath(): string {
  if (process.env.VITRINE_VSIX) return process.env.VITRINE_VSIX;
  const { version } = JSON.parse(readFileSync(join(REPO, 'package.json'), 'utf8')) as { version: string };
  return join(REPO, `dist/vitrine-${version}.vsix`);
}

/** Retries `read` until `ok` holds for its value (a wait on a condition, not a fixed sleep). */
async function until<T>(what: string, read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = STEP_TIMEOUT): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: T | undefined;
  let error: unknown;
  for (;;) {
    try {
      last = await read();
      if (ok(last)) return last;
    } catch (e) {
      error = e;
    }
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}; last value: ${JSON.stringify(last)}${error ? `; last error: ${String(error)}` : ''}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

describe('Vitrine in VS Code (code-server)', function () {
  this.timeout(3 * STEP_TIMEOUT);
  let server: CodeServer | undefined;
  let wb: Workbench;
  let failures = 0;

  before(async function () {
    this.timeout(5 * STEP_TIMEOUT);
    // Only this suite's own files: other tools write their pictures into out/ too.
    mkdirSync(OUT_DIR, { recursive: true });
    for (const f of readdirSync(OUT_DIR)) if (OWN_OUTPUT.test(f)) rmSync(join(OUT_DIR, f), { recursive: true, force: true });
    server = new CodeServer({ vsix: vsixPath(), extraFiles: { [TYPED_FILE]: '# Typed by the end-to-end test\n\n', [UNIT_FILE]: UNIT_TEXT } });
    await server.prepare();
    await server.start();
    wb = await Workbench.open(server.url, OUT_DIR, server.browserEnv);
    await wb.ready('days');
    await wb.screenshot('workbench.png');
  });

  beforeEach(async () => {
    await wb.settle();
  });

  afterEach(async function () {
    if (this.currentTest?.state !== 'failed') return;
    failures++;
    const slug = this.currentTest.title.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '').toLowerCase().slice(0, 60);
    await wb?.screenshot(`failure-${slug}.png`).catch(() => undefined);
  });

  after(async function () {
    this.timeout(2 * STEP_TIMEOUT);
    await wb?.close().catch(() => undefined);
    if (!server) return;
    await server.stop();
    server.keepLogs(join(OUT_DIR, 'code-server-logs'));
    if (failures === 0 && this.test?.parent?.tests.every((t) => t.state === 'passed')) server.remove();
    else console.log(`  run folder kept: ${server.root}`);
  });

  it('shows the ramp\'s figures in a code lens ("Tg …")', async () => {
    await wb.openFile(NOTEBOOK_DAY);
    await wb.editor().locator('.view-lines').click();
    await wb.page.keyboard.press('Control+End');
    const lens = wb.editor().locator('.codelens-decoration a', { hasText: /^\s*Tg / }).first();
    await lens.waitFor();
    const text = (await lens.textContent())!.trim();
    assert.match(text, /^Tg \d+(\.\d+)? ± \d+(\.\d+)? K/, `lens text: ${text}`);
    await wb.screenshot('lens.png');
  });

  it('logs how long its activation took', async () => {
    // The extension writes "activated in N ms" to its log channel; VS Code keeps it under the run folder.
    const found = (dir: string): string[] =>
      readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? found(join(dir, e.name)) : e.name === 'Vitrine charts.log' ? [join(dir, e.name)] : []));
    let line: string | undefined;
    for (let i = 0; i < 60 && !line; i++) {
      line = found(join(server!.root, 'ud/logs')).map((f) => readFileSync(f, 'utf8')).join('\n').match(/activated in [\d.]+ ms/)?.[0];
      if (!line) await new Promise((r) => setTimeout(r, 500));
    }
    assert.ok(line, 'no activation time in the log');
    console.log(`    extension ${line}`);
  });

  it('renders data blocks as a chart and figures in the markdown preview', async () => {
    await wb.closeAllEditors();
    await wb.openFile(NOTEBOOK_DAY);
    await wb.command('Markdown: Open Preview to the Side');
    await wb.tab(/Preview/).first().waitFor();
    // The block's chart, then its figures table (the block first shows "computing…").
    const chart = wb.webview().locator('.vitrine-block .vitrine-chart svg').first();
    await chart.waitFor({ state: 'attached' });
    const block = wb.webview().locator('.vitrine-block:has(.vitrine-chart svg)').first();
    await block.locator('.vitrine-figures').waitFor({ state: 'attached' });
    await block.evaluate((el: { scrollIntoView(options: { block: string }): void }) => el.scrollIntoView({ block: 'start' }));
    await chart.waitFor();
    await wb.screenshot('markdown-preview.png');
  });

  it('marks a missing required key as an error, in the editor and in Problems', async () => {
    await wb.closeAllEditors();
    await wb.openFile(TYPED_FILE);
    await wb.editor().locator('.view-lines').click();
    await wb.page.keyboard.press('Control+End');
    for (const line of BLOCK_WITHOUT_RATE) {
      await wb.page.keyboard.type(line);
      await wb.page.keyboard.press('Enter');
    }
    await wb.page.keyboard.press('Control+S');
    await wb.page.locator('.tabs-container .tab.active.dirty').waitFor({ state: 'detached' });
    await wb.editor().locator('.squiggly-error').first().waitFor({ state: 'attached' });
    await wb.command('Focus on Problems View');
    // The demo notebook has findings of its own: keep the list short enough to show this one.
    await wb.page.locator('.part.panel .viewpane-filter input').fill('rate');
    const row = wb.page.locator('.markers-panel .monaco-list-row', { hasText: /needs "rate"/ }).first();
    await row.waitFor();
    assert.match((await row.textContent())!, /"rate"/);
    await wb.screenshot('diagnostics.png');
    await wb.page.locator('.part.panel .viewpane-filter input').fill('');
    const onDisk = readFileSync(join(server!.workspace, TYPED_FILE), 'utf8');
    assert.ok(onDisk.includes('```deposition D-99\nmaterial: amberine-3\n'), `saved text:\n${onDisk}`);
  });

  it('writes the unit of a bare number with a quick fix (Ctrl+.)', async () => {
    await wb.closeAllEditors();
    await wb.openFile(UNIT_FILE);
    await wb.editor().locator('.squiggly-warning').first().waitFor({ state: 'attached' });
    const column = UNIT_TEXT.split('\n')[BARE_LINE - 1].indexOf('270') + 2;
    await wb.goTo(BARE_LINE, column);
    await wb.page.keyboard.press('Control+.');
    await wb.page.locator('.action-widget .monaco-list-row', { hasText: 'Write the unit: 270 K' }).first().waitFor();
    await wb.screenshot('quick-fix.png');
    await wb.chooseAction('Write the unit: 270 K');
    await wb.editor().locator('.view-line', { hasText: /substrate_temperature:\s270\sK/ }).first().waitFor();
    await wb.page.keyboard.press('Control+S');
    const saved = await until(
      `"270 K" in ${UNIT_FILE} on disk`,
      async () => readFileSync(join(server!.workspace, UNIT_FILE), 'utf8'),
      (text) => text.includes('substrate_temperature: 270 K\n'),
    );
    assert.ok(!saved.includes('substrate_temperature: 270\n'), saved);
    await wb.screenshot('quick-fix-applied.png');
  });

  it('opens the chart preview from the lens, with the ramp\'s chart', async () => {
    await wb.closeAllEditors();
    await wb.hidePanel();
    await wb.openFile(NOTEBOOK_DAY);
    await wb.editor().locator('.view-lines').click();
    await wb.page.keyboard.press('Control+End');
    const lens = wb.editor().locator('.codelens-decoration a', { hasText: /^\s*Tg / }).first();
    await lens.click();
    await wb.tab(/^\s*Vitrine charts/).first().waitFor();
    const chart = wb.webview().locator('svg', { hasText: 'Tg' }).first();
    await chart.waitFor();
    assert.match((await chart.textContent())!, /Tg/);
    await wb.screenshot('editor-lenses.png');
  });

  it('follows a dark colour theme in the chart preview', async () => {
    if ((await wb.tab(/^\s*Vitrine charts/).count()) === 0) {
      await wb.openFile(NOTEBOOK_DAY);
      await wb.command('Vitrine: Open Chart Preview');
      await wb.tab(/^\s*Vitrine charts/).first().waitFor();
    }
    await wb.webview().locator('svg').first().waitFor();
    await wb.command('Preferences: Color Theme');
    await wb.page.locator('.quick-input-widget input').fill('Dark Modern');
    await wb.quickPick('Dark Modern');
    await wb.page.locator('.monaco-workbench.vs-dark').waitFor({ state: 'attached' });
    await wb.webview().locator('body.vscode-dark').waitFor({ state: 'attached' });
    const background = await until(
      'a dark chart background (luminance < 0.3)',
      () => wb.webview().locator('svg').first().evaluate(chartBackground),
      (color) => (luminance(color) ?? 1) < 0.3,
    );
    assert.ok(luminance(background)! < 0.3, background);
    await wb.screenshot('preview-dark.png');
  });
});

/**
 * The colour a chart is drawn on: the fill of the svg's first rect (a chart's background), else
 * the first opaque background behind the svg (the card or page). Runs in the webview, so it
 * defines no inner functions (the TypeScript loader would wrap them in a helper missing there).
 */
function chartBackground(svg: DomElement): string {
  const rect = svg.querySelector('rect');
  const candidates = rect ? [getComputedStyle(rect).fill] : [];
  for (let el: DomElement | null = svg; el; el = el.parentElement) candidates.push(getComputedStyle(el).backgroundColor);
  for (const c of candidates) if (c !== '' && c !== 'none' && c !== 'transparent' && !c.startsWith('url(') && !/^rgba\(.*,\s*0\)$/.test(c)) return c;
  return 'rgb(255, 255, 255)';
}

/** The little of the DOM that chartBackground uses (the project's TypeScript settings have no DOM library). */
interface DomElement {
  querySelector(selector: string): DomElement | null;
  readonly parentElement: DomElement | null;
}
declare function getComputedStyle(element: DomElement): { fill: string; backgroundColor: string };
