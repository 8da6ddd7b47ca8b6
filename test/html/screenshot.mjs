// Screenshot of a page (or one element of it) in headless Chromium, for the README's picture:
//   node test/html/screenshot.mjs PAGE.html OUT.png [CSS-SELECTOR] [WIDTH]
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium } from 'playwright-core';

const [page, out, selector, width = '1100'] = process.argv.slice(2);
if (page === undefined || out === undefined) {
  process.stderr.write('usage: node test/html/screenshot.mjs PAGE.html OUT.png [CSS-SELECTOR] [WIDTH]\n');
  process.exit(2);
}
const profile = mkdtempSync(join(tmpdir(), 'fray-chromium-'));
const flags = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];
const context = await chromium.launchPersistentContext(profile, {
  executablePath: process.env.FRAY_CHROMIUM ?? '/usr/bin/chromium',
  headless: true,
  args: flags,
  viewport: { width: Number(width), height: 900 },
  deviceScaleFactor: 1,
});
try {
  const tab = await context.newPage();
  await tab.goto(`file://${resolve(page)}`, { waitUntil: 'load' });
  if (selector !== undefined && selector !== '') await tab.locator(selector).screenshot({ path: out });
  else await tab.screenshot({ path: out, fullPage: true });
} finally {
  await context.close();
  rmSync(profile, { recursive: true, force: true });
}
