// Takes a screenshot of an HTML file in headless Chromium (Debian's /usr/bin/chromium).
// Usage: node scripts/screenshot.mjs demo-report.html out.png [width]
import { chromium } from 'playwright-core';
import { pathToFileURL } from 'node:url';
import { resolve } from 'node:path';

const [file = 'demo-report.html', out = 'demo-report.png', width = '1280'] = process.argv.slice(2);
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
try {
  const page = await browser.newPage({ viewport: { width: Number(width), height: 900 } });
  await page.route('**/*', (route) => (route.request().url().startsWith('file:') ? route.continue() : route.abort()));
  await page.goto(pathToFileURL(resolve(file)).href);
  await page.screenshot({ path: out, fullPage: true });
} finally {
  await browser.close();
}
