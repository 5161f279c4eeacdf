// Opens a report's HTML page in headless Chromium (Debian's `chromium` package) and saves a
// full-page screenshot, to look at the page as a reader would. Not part of `npm test`:
//   npm run test:browser
// or, for any report folder,
//   node test/browser/screenshotReport.mjs <report folder>/report.html screenshot.png
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

const [page = 'termsplit-demo/report.html', out = 'report.png'] = process.argv.slice(2);
const executablePath = process.env.CHROMIUM ?? '/usr/bin/chromium';
if (!existsSync(executablePath)) {
  console.error(`no Chromium at ${executablePath}: install Debian's chromium package or set CHROMIUM`);
  process.exit(2);
}
const browser = await chromium.launch({
  executablePath,
  args: [
    '--headless',
    '--no-sandbox',
    '--disable-gpu',
    '--disable-quic',
    '--no-first-run',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
  ],
});
try {
  const tab = await browser.newPage({ viewport: { width: 1200, height: 900 } });
  const errors = [];
  tab.on('pageerror', (e) => errors.push(e.message));
  tab.on('requestfailed', (r) => errors.push(`request failed: ${r.url()}`));
  await tab.goto(pathToFileURL(resolve(page)).href);
  await tab.screenshot({ path: out, fullPage: true });
  const figures = await tab.locator('figure svg').count();
  console.log(`${page}: ${figures} figures, ${errors.length} errors; screenshot in ${out}`);
  for (const e of errors) console.log(`  ${e}`);
  if (errors.length > 0) process.exitCode = 1;
} finally {
  await browser.close();
}
