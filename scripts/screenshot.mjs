// Takes a screenshot of an HTML file in headless Chromium (Debian's /usr/bin/chromium).
// Usage: node scripts/screenshot.mjs demo-report.html out.png [width] [--dark] [--top PX] [--at SELECTOR]
//   --dark        the page is shown with prefers-color-scheme: dark
//   --top PX      only the first PX pixels of the page (default: the whole page)
//   --at SELECTOR a screenshot of the first element that matches, instead of the page
import { chromium } from 'playwright-core';
import { pathToFileURL } from 'node:url';
import { resolve } from 'node:path';

const argv = process.argv.slice(2);
const option = (name) => {
  const i = argv.indexOf(name);
  if (i < 0) return undefined;
  const [, value] = argv.splice(i, 2);
  return value;
};
const darkAt = argv.indexOf('--dark');
if (darkAt >= 0) argv.splice(darkAt, 1);
const top = option('--top');
const at = option('--at');
const [file = 'demo-report.html', out = 'demo-report.png', width = '1280'] = argv;
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
try {
  const page = await browser.newPage({ viewport: { width: Number(width), height: 900 }, colorScheme: darkAt >= 0 ? 'dark' : 'light' });
  await page.route('**/*', (route) => (route.request().url().startsWith('file:') ? route.continue() : route.abort()));
  await page.goto(pathToFileURL(resolve(file)).href);
  if (at) await page.locator(at).first().screenshot({ path: out });
  else if (top) await page.screenshot({ path: out, clip: { x: 0, y: 0, width: Number(width), height: Number(top) } });
  else await page.screenshot({ path: out, fullPage: true });
} finally {
  await browser.close();
}
