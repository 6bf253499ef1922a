import { existsSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { report } from '../../stages/report/index.js';
import { REPO_ROOT, runCli } from '../e2e/run-cli.js';
import { HOSTILE, hostileReportInput } from '../stages/report/hostile-report-input.js';

// The page is checked in a real browser (Debian's Chromium driven by playwright-core): it must load
// from a file URL with no console error and no request outside file:/data:, draw every plot, and run
// nothing a user-supplied string could inject. The contract is this project's own (README, "Summary page and exports").

const CHROMIUM = '/usr/bin/chromium';
const inCi = ['1', 'true'].includes((process.env.CI ?? '').toLowerCase());
const haveChromium = existsSync(CHROMIUM);
if (!haveChromium && !inCi) {
  console.warn(`\n!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n!!! BROWSER CHECKS SKIPPED: ${CHROMIUM} is missing (apt-get install -y chromium).\n!!! Under CI (CI=1) they run and fail instead.\n!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n`);
}

interface Opened {
  page: Page;
  consoleErrors: string[];
  foreignRequests: string[];
  dialogs: string[];
}

describe.skipIf(!haveChromium && !inCi)('summary.html in headless Chromium', () => {
  let context: BrowserContext;
  let demoPage: string;
  let hostilePage: string;
  const artifacts = join(REPO_ROOT, 'test-artifacts');

  beforeAll(async () => {
    const work = mkdtempSync(join(tmpdir(), 'xsred-browser-'));
    const r = await runCli(['reduce', join(REPO_ROOT, 'sample-runs/fval-2026-c12-alpha'), '--out', join(work, 'out'), '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    demoPage = join(work, 'out/fval-2026-c12-alpha/summary.html');
    hostilePage = join(work, 'hostile.html');
    writeFileSync(hostilePage, (await report(hostileReportInput())).files.find((f) => f.name === 'summary.html')!.bytes);
    const { chromium } = await import('playwright-core');
    context = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'xsred-chromium-')), {
      executablePath: CHROMIUM,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      viewport: { width: 1280, height: 900 },
    });
    // Every request is routed: file: and data: go on, anything else is recorded and refused.
    await context.route('**/*', (route) => {
      const url = route.request().url();
      return url.startsWith('file:') || url.startsWith('data:') ? route.continue() : route.abort();
    });
  }, 300_000);

  afterAll(async () => {
    await context?.close();
  });

  async function open(path: string): Promise<Opened> {
    const page = await context.newPage();
    const o: Opened = { page, consoleErrors: [], foreignRequests: [], dialogs: [] };
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') o.consoleErrors.push(`${m.type()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => o.consoleErrors.push(`pageerror: ${e.message}`));
    page.on('request', (q) => {
      if (!q.url().startsWith('file:') && !q.url().startsWith('data:')) o.foreignRequests.push(q.url());
    });
    page.on('dialog', (d) => {
      o.dialogs.push(d.message());
      void d.dismiss();
    });
    await page.goto(pathToFileURL(path).href, { waitUntil: 'load' });
    return o;
  }

  /** Drawn marks (children of vega's role-mark groups) in one chart figure. */
  const marks = (page: Page, chartId: string) => page.locator(`figure[data-chart="${chartId}"] .role-mark > *`).count();

  it('the demo page loads with no console error and no request outside file:/data:, every plot drawn; screenshot kept', async () => {
    const o = await open(demoPage);
    const { page } = o;
    for (const id of ['excitation-ratio:12C elastic', 'excitation-lab:12C elastic', 'excitation-ratio:16O elastic', 'excitation-lab:16O elastic', 'angular', 'normalization', 'dead-time', 'gain-drift', 'budget']) {
      expect(await marks(page, id), id).toBeGreaterThan(0);
    }
    // the demo series has 17 sample runs × 4 detectors = 68 points per peak, each drawn as three
    // marks (total bar, statistical bar, point)
    expect(await marks(page, 'excitation-ratio:12C elastic')).toBe(3 * 68);
    const spectra = page.locator('figure.spectrum');
    expect(await spectra.count()).toBe(64);
    expect(await page.locator('figure.spectrum .role-mark > *').count()).toBeGreaterThan(64);
    mkdirSync(artifacts, { recursive: true });
    await page.screenshot({ path: join(artifacts, 'summary.png'), fullPage: true });
    expect(o.consoleErrors).toEqual([]);
    expect(o.foreignRequests).toEqual([]);
    await page.close();
  });

  it('the picker switches the spectrum (run and detector), and a #spectrum-… link selects one', async () => {
    const { page, consoleErrors } = await open(demoPage);
    await expect.poll(() => page.locator('#spectrum-picker').isVisible()).toBe(true);
    const visible = () => page.locator('figure.spectrum:visible');
    expect(await visible().count()).toBe(1);
    const first = await visible().first().getAttribute('id');
    const runs = await page.locator('#pick-run option').evaluateAll((os) => os.map((o) => (o as unknown as { value: string }).value));
    await page.selectOption('#pick-run', runs[runs.length - 1]!);
    await page.selectOption('#pick-detector', 'd03');
    expect(await visible().count()).toBe(1);
    expect(await visible().first().getAttribute('data-run')).toBe(runs[runs.length - 1]);
    expect(await visible().first().getAttribute('data-detector')).toBe('d03');
    expect(await visible().first().getAttribute('id')).not.toBe(first);
    await page.selectOption('#pick-run', '*');
    expect(await visible().count()).toBe(16); // every embedded run of d03
    await page.evaluate(() => ((globalThis as unknown as { location: { hash: string } }).location.hash = '#spectrum-r001-d02'));
    await expect.poll(() => visible().first().getAttribute('id')).toBe('spectrum-r001-d02');
    expect(consoleErrors).toEqual([]);
    await page.close();
  });

  it('without scripts the overview and every spectrum still show (no-script fallback)', async () => {
    const page = await context.newPage();
    const cdp = await context.newCDPSession(page);
    await cdp.send('Emulation.setScriptExecutionDisabled', { value: true });
    await page.goto(pathToFileURL(demoPage).href);
    expect(await page.locator('#overview').isVisible()).toBe(true);
    expect(await page.locator('figure.spectrum:visible').count()).toBe(64);
    expect(await page.locator('#spectrum-picker').isVisible()).toBe(false);
    await page.close();
  });

  it('hostile title, labels, notes and file names render as text and run nothing', async () => {
    const o = await open(hostilePage);
    const { page } = o;
    expect(await page.locator('#series-title').textContent()).toBe(HOSTILE.title);
    expect(await page.title()).toBe('hostile-strings — xsred summary');
    const body = (await page.locator('body').textContent()) ?? '';
    for (const s of Object.values(HOSTILE)) expect(body).toContain(s);
    expect(await page.locator('img').count()).toBe(0);
    expect(await page.locator('b[onmouseover], svg[onload], [onerror]').count()).toBe(0);
    expect(await page.locator('script').count()).toBe(1);
    expect(await page.evaluate(() => (globalThis as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    await page.locator('b', { hasText: 'bold' }).count().then((n) => expect(n).toBe(0));
    await page.mouse.move(10, 10);
    expect(o.dialogs).toEqual([]);
    expect(o.consoleErrors).toEqual([]);
    expect(o.foreignRequests).toEqual([]);
    await page.close();
  });
});
