/**
 * Driving VS Code's workbench in headless Chromium. The selectors are VS Code's own class names
 * (checked against code-server 4.100.3 / VS Code 1.100.3): re-check them when the version changes.
 * Every step waits for what it needs to see; nothing sleeps for a fixed time.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type FrameLocator, type Locator, type Page } from 'playwright-core';

/** The little of the DOM used in page functions (the project's TypeScript settings have no DOM library). */
declare const document: { activeElement: unknown; body: unknown };

export const STEP_TIMEOUT = 60_000;

const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE 127.0.0.1',
];

/** Only the local code-server may be reached; data: and blob: URLs never leave the browser. */
function isLocal(url: string): boolean {
  return /^(https?|wss?):\/\/127\.0\.0\.1(:\d+)?\//.test(url) || /^(data|blob):/.test(url);
}

export class Workbench {
  private constructor(
    private readonly browser: Browser,
    readonly context: BrowserContext,
    readonly page: Page,
    private readonly shotsDir: string,
  ) {}

  /** `env`: the browser's environment (point XDG_CONFIG_HOME into the run folder to keep the home folder clean). */
  static async open(url: string, shotsDir: string, env?: Record<string, string>): Promise<Workbench> {
    const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS, timeout: STEP_TIMEOUT, env: { ...process.env, ...env } });
    try {
      const context = await browser.newContext({ viewport: { width: 1400, height: 900 } });
      context.setDefaultTimeout(STEP_TIMEOUT);
      await context.route('**/*', (route) => (isLocal(route.request().url()) ? route.continue() : route.abort()));
      const page = await context.newPage();
      await page.goto(url);
      mkdirSync(shotsDir, { recursive: true });
      return new Workbench(browser, context, page, shotsDir);
    } catch (e) {
      await browser.close();
      throw e;
    }
  }

  async close(): Promise<void> {
    await this.browser.close();
  }

  /** The workbench is usable once the explorer lists the workspace (keys pressed before are lost). */
  async ready(explorerEntry: string): Promise<void> {
    await this.page.locator('.monaco-workbench').waitFor();
    await this.page.locator('.explorer-folders-view .monaco-list-row', { hasText: explorerEntry }).first().waitFor();
  }

  async screenshot(name: string): Promise<string> {
    const path = join(this.shotsDir, name);
    await this.page.screenshot({ path });
    return path;
  }

  /** Runs a command by its title through the command palette (F1). */
  async command(title: string): Promise<void> {
    await this.focusWorkbench();
    await this.page.keyboard.press('F1');
    const input = this.page.locator('.quick-input-widget input');
    await input.waitFor();
    await input.fill(`>${title}`);
    await this.quickPick(title);
  }

  /**
   * Waits for a row of the open quick input whose label contains `label`, and picks it. Returns
   * once that list is gone: the quick input closes, or shows the next list (a picker command).
   */
  async quickPick(label: string): Promise<void> {
    const row = this.page.locator('.quick-input-widget .quick-input-list .monaco-list-row', { hasText: label }).first();
    await row.waitFor();
    await row.click();
    await row.waitFor({ state: 'hidden' });
  }

  /**
   * Chooses an entry of the open code action list (Ctrl+.) with the keyboard, as a pointer block
   * over the list swallows clicks for a moment after it opens. Returns once the list is gone.
   */
  async chooseAction(label: string): Promise<void> {
    const rows = this.page.locator('.action-widget .monaco-list-row.action');
    const target = rows.filter({ hasText: label }).first();
    await target.waitFor();
    const count = await rows.count();
    for (let i = 0; i <= count && !/\bfocused\b/.test((await target.getAttribute('class')) ?? ''); i++) await this.page.keyboard.press('ArrowDown');
    await this.page.keyboard.press('Enter');
    await this.page.locator('.action-widget').waitFor({ state: 'hidden' });
  }

  /** Closes whatever floats over the workbench (quick input, menus, action lists, hovers). */
  async settle(): Promise<void> {
    const floating = this.page.locator('.quick-input-widget:visible, .action-widget:visible, .context-view .monaco-menu:visible, .monaco-hover:visible');
    for (let i = 0; i < 5 && (await floating.count()) > 0; i++) await this.page.keyboard.press('Escape');
  }

  /** Opens a workspace file with Quick Open (Ctrl+P) and waits for its tab to be the active one. */
  async openFile(relativePath: string): Promise<void> {
    const name = relativePath.split('/').pop()!;
    await this.focusWorkbench();
    await this.page.keyboard.press('Control+P');
    const input = this.page.locator('.quick-input-widget input');
    await input.waitFor();
    await input.fill(relativePath);
    // Enter only once the list has caught up with the text: the focused row is the file.
    await this.page.locator('.quick-input-widget .quick-input-list .monaco-list-row.focused', { hasText: name }).waitFor();
    await this.page.keyboard.press('Enter');
    await this.activeTab(name).waitFor();
    await this.editor().locator('.view-lines').waitFor();
  }

  activeTab(name: string): Locator {
    return this.page.locator('.tabs-container .tab.active', { hasText: name });
  }

  tab(name: string | RegExp): Locator {
    return this.page.locator('.tabs-container .tab', { hasText: name });
  }

  /** The text editor that has (or last had) focus. */
  editor(): Locator {
    return this.page.locator('.editor-group-container.active .monaco-editor').first();
  }

  /** Puts the cursor on a line (1-based) and column (1-based) with Go to Line (Ctrl+G). */
  async goTo(line: number, column = 1): Promise<void> {
    await this.editor().locator('.view-lines').click();
    await this.page.keyboard.press('Control+G');
    const input = this.page.locator('.quick-input-widget input');
    await input.waitFor();
    await input.fill(`:${line}:${column}`);
    await this.page.keyboard.press('Enter');
    await this.page.locator('.quick-input-widget').waitFor({ state: 'hidden' });
  }

  /** The content of the webview shown last (two iframes deep: VS Code's host frame, then the page). */
  webview(): FrameLocator {
    return this.page.frameLocator('iframe.webview.ready').last().frameLocator('iframe#active-frame');
  }

  /** Hides the panel (Problems, Output…) to give the editors the whole height. */
  async hidePanel(): Promise<void> {
    if (!(await this.page.locator('.part.panel').isVisible())) return;
    await this.command('View: Hide Panel');
    await this.page.locator('.part.panel').waitFor({ state: 'hidden' });
  }

  /** Closes every editor, so that the next step starts from an empty editor area. */
  async closeAllEditors(): Promise<void> {
    if ((await this.page.locator('.tabs-container .tab').count()) === 0) return;
    await this.command('View: Close All Editors');
    await this.page.locator('.tabs-container .tab').first().waitFor({ state: 'detached' });
  }

  /** Makes sure keys reach the workbench: closes what floats over it; clicks a harmless label if nothing has focus. */
  private async focusWorkbench(): Promise<void> {
    await this.settle();
    const focused = await this.page.evaluate(() => document.activeElement !== null && document.activeElement !== document.body);
    if (!focused) await this.page.locator('.part.sidebar .composite.title .title-label').first().click();
  }
}

/** Relative luminance (WCAG 2) of a CSS colour string such as `rgb(31, 31, 31)` or `#1f1f1f`; undefined if unparsed. */
export function luminance(color: string): number | undefined {
  let rgb: number[] | undefined;
  const hex = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(color.trim());
  if (hex) {
    const h = hex[1].length === 3 ? [...hex[1]].map((c) => c + c).join('') : hex[1];
    rgb = [0, 2, 4].map((i) => parseInt(h.slice(i, i + 2), 16));
  }
  const fn = /^rgba?\(\s*([\d.]+)[\s,]+([\d.]+)[\s,]+([\d.]+)/i.exec(color.trim());
  if (fn) rgb = [fn[1], fn[2], fn[3]].map(Number);
  if (!rgb) return undefined;
  const [r, g, b] = rgb.map((v) => {
    const c = v / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
