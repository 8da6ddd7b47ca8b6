/// <reference lib="dom" />
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { loadCircuit } from '../../src/api/loadCircuit.js';
import { scheduleCircuit } from '../../src/api/simulate.js';
import { fray } from '../helpers/cli.js';

/**
 * The HTML report opened in a real browser: Debian's headless Chromium (`.ci/run` installs
 * it), driven by playwright-core. Without the browser this file says plainly that it did not
 * run; under CI=true a missing browser is a failure, never a skip.
 */
const BROWSER = process.env['FRAY_CHROMIUM'] ?? '/usr/bin/chromium';
const HAVE_BROWSER = existsSync(BROWSER);
const IN_CI = process.env['CI'] === 'true';

/** Chromium flags for a closed network and a throwaway profile. */
const FLAGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

const DEMO = 'circuits/qpe3-asap.yaml';

if (!HAVE_BROWSER && !IN_CI) {
  process.stderr.write(`\nNOT RUN: the browser tests of the HTML report (test/html/browser.test.ts) need Chromium at ${BROWSER}; install it with 'apt-get install chromium' (or set FRAY_CHROMIUM).\n\n`);
}

describe.skipIf(!HAVE_BROWSER && !IN_CI)('the HTML report in headless Chromium', () => {
  let context: BrowserContext;
  let page: Page;
  let json: Record<string, any>;
  let htmlText: string;
  const errors: string[] = [];
  const requests: string[] = [];
  const profile = mkdtempSync(join(tmpdir(), 'fray-chromium-'));

  beforeAll(async () => {
    if (!HAVE_BROWSER) throw new Error(`CI=true but there is no Chromium at ${BROWSER}: .ci/run must install it (apt-get install chromium)`);
    const out = join(mkdtempSync(join(tmpdir(), 'fray-html-')), 'report.html');
    const r = await fray('run', DEMO, '--json', '--html', out);
    expect(r.code).toBe(0);
    json = JSON.parse(r.out);
    htmlText = readFileSync(out, 'utf8');
    context = await chromium.launchPersistentContext(profile, { executablePath: BROWSER, headless: true, args: FLAGS, viewport: { width: 1100, height: 900 } });
    page = await context.newPage();
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') errors.push(`${m.type()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => errors.push(`page error: ${e.message}`));
    page.on('request', (q) => requests.push(q.url()));
    await page.goto(`file://${out}`, { waitUntil: 'load' });
  }, 60_000);

  afterAll(async () => {
    await context?.close();
    rmSync(profile, { recursive: true, force: true });
  });

  it('loads with no console errors and fetches nothing but itself', () => {
    expect(errors).toEqual([]);
    expect(requests.length).toBe(1);
    expect(requests[0]).toMatch(/^file:\/\/.*report\.html$/);
  });

  it('parses as HTML and as XML without errors', async () => {
    const parsed = await page.evaluate((text) => {
      const xml = new DOMParser().parseFromString(text, 'application/xhtml+xml');
      const html = new DOMParser().parseFromString(text, 'text/html');
      return { xmlErrors: xml.getElementsByTagName('parsererror').length, svgs: html.querySelectorAll('svg').length };
    }, htmlText);
    expect(parsed.xmlErrors).toBe(0);
    expect(parsed.svgs).toBeGreaterThanOrEqual(3);
  });

  it('draws one lane per qubit and one box per scheduled operation on each of its qubits', async () => {
    const loaded = loadCircuit(DEMO);
    const schedule = scheduleCircuit(loaded.circuit, loaded.profile);
    const expected = schedule.items.filter((i) => i.op.kind !== 'barrier' && i.op.kind !== 'idle').reduce((n, i) => n + i.op.qubits.length, 0);
    const lanes = await page.locator('#timeline g.lanes_marks line').count();
    const boxes = await page.locator('#timeline g.boxes_marks path').count();
    expect(lanes).toBe(json.qubits);
    expect(boxes).toBe(expected);
    const firstTitle = await page.locator('#timeline g.boxes_marks path title').first().textContent();
    expect(firstTitle).toMatch(/^step 1: x on t · 0 ns → 35 ns \(35 ns\)/);
  });

  it('shows the fidelity of the JSON', async () => {
    const shown = await page.locator('[data-figure="state-fidelity"]').textContent();
    expect(Number(shown)).toBeCloseTo(json.fidelity.state, 6);
    expect(shown).toBe(json.fidelity.state.toFixed(6));
  });

  it('renders a timeline picture that is not blank', async () => {
    const png = await page.locator('#timeline figure').screenshot();
    const stats = await page.evaluate(async (b64) => {
      const img = new Image();
      img.src = `data:image/png;base64,${b64}`;
      await img.decode();
      const c = document.createElement('canvas');
      c.width = img.width;
      c.height = img.height;
      const g = c.getContext('2d')!;
      g.drawImage(img, 0, 0);
      const d = g.getImageData(0, 0, c.width, c.height).data;
      const colours = new Set<number>();
      let inked = 0;
      for (let i = 0; i < d.length; i += 4) {
        colours.add((d[i]! << 16) | (d[i + 1]! << 8) | d[i + 2]!);
        if (d[i]! + d[i + 1]! + d[i + 2]! < 600) inked++;
      }
      return { width: c.width, height: c.height, colours: colours.size, inked: inked / (d.length / 4) };
    }, png.toString('base64'));
    expect(stats.width).toBeGreaterThan(600);
    expect(stats.height).toBeGreaterThan(150);
    expect(stats.colours).toBeGreaterThan(20);
    expect(stats.inked).toBeGreaterThan(0.05);
  });
});
