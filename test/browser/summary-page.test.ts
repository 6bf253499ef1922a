import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { report } from '../../stages/report/index.js';
import { REPO_ROOT, runCli } from '../e2e/run-cli.js';
import { HOSTILE, hostileReportInput } from '../stages/report/hostile-report-input.js';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema } from '../../pipeline/simulate/simulation-spec.js';
import { smallSpec } from '../simulate/small-spec.js';
import { carbonDoubletSpec } from '../e2e/fitting/carbon-doublet-spec.js';

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
  let archivePage: string;
  let fittedPage: string;
  const artifacts = join(REPO_ROOT, 'test-artifacts');

  beforeAll(async () => {
    const work = mkdtempSync(join(tmpdir(), 'xsred-browser-'));
    const r = await runCli(['reduce', join(REPO_ROOT, 'sample-runs/fval-2026-c12-alpha'), '--out', join(work, 'out'), '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    demoPage = join(work, 'out/fval-2026-c12-alpha/summary.html');
    hostilePage = join(work, 'hostile.html');
    writeFileSync(hostilePage, (await report(hostileReportInput())).files.find((f) => f.name === 'summary.html')!.bytes);
    // An archive version with a previous one: rereduce, revise a calibration (offset + 3 keV), rereduce again.
    const arch = join(work, 'archive');
    const { seriesDir } = simulateSeries(simulationSpecSchema.parse(smallSpec({ series: 'brw-changes' })), join(arch, 'lab'));
    for (const pass of [0, 1]) {
      if (pass === 1) {
        const cal = join(seriesDir, 'calibrations', readdirSync(join(seriesDir, 'calibrations')).sort()[0]!);
        writeFileSync(cal, readFileSync(cal, 'utf8').replace(/offset_keV: ([-\d.]+)/, (_m, v: string) => `offset_keV: ${Number(v) + 3}`));
      }
      const a = await runCli(['rereduce', arch, '--out', join(work, 'archive-out'), '--settle-s', '0', '--quiet']);
      expect(a.code, a.stderr).toBe(0);
    }
    archivePage = join(work, 'archive-out/brw-changes/current/summary.html');
    // A series whose peaks are fitted (method: fit, fit_group carbon).
    const doublet = simulateSeries(simulationSpecSchema.parse(carbonDoubletSpec()), join(work, 'doublet'));
    const f = await runCli(['reduce', doublet.seriesDir, '--out', join(work, 'doublet-out'), '--quiet']);
    expect(f.code, f.stderr).toBe(0);
    fittedPage = join(work, 'doublet-out', carbonDoubletSpec().series, 'summary.html');
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

  it('an archive version page shows the changes since the previous version (a revised calibration moved rows)', async () => {
    const o = await open(archivePage);
    const { page } = o;
    const changes = page.locator('#changes');
    expect(await changes.isVisible()).toBe(true);
    const cells = await changes.locator('table').first().locator('tbody td').allTextContents();
    expect(cells.slice(0, 2)).toEqual(['v000001', 'v000002']);
    expect(Number(cells[5])).toBeGreaterThan(0); // moved rows
    expect(await page.locator('#changes-largest').textContent()).toMatch(/^Largest shift: run r\d+/);
    expect(await changes.locator('details tbody tr').count()).toBeGreaterThan(0);
    expect(o.consoleErrors).toEqual([]);
    expect(o.foreignRequests).toEqual([]);
    // a plain reduction's page says it is not an archive version
    const plain = await open(demoPage);
    expect(await plain.page.locator('#changes-none').textContent()).toContain('Not an archive version');
    await plain.page.close();
    await page.close();
  });

  it('a fitted spectrum draws the fitted model and its background as curves with drawn marks', async () => {
    const o = await open(fittedPage);
    const { page } = o;
    const figures = page.locator('figure.spectrum');
    expect(await figures.count()).toBeGreaterThan(0);
    const sample = page.locator('figure.spectrum:has(.fit_curves_marks > path)');
    expect(await sample.count()).toBeGreaterThan(0);
    // one model (solid) and one background (dashed) line per fitted group
    const dashes = await sample.first().locator('.fit_curves_marks > path').evaluateAll((ps) => ps.map((p) => p.getAttribute('stroke-dasharray')));
    expect(dashes.sort()).toEqual(['1,0', '4,2']);
    // shown through the picker (one spectrum at a time when scripts run), the curve has an extent on screen
    await expect.poll(() => page.locator('#spectrum-picker').isVisible()).toBe(true);
    await page.selectOption('#pick-run', (await sample.first().getAttribute('data-run'))!);
    await page.selectOption('#pick-detector', (await sample.first().getAttribute('data-detector'))!);
    const box = await sample.first().locator('.fit_curves_marks > path').first().boundingBox();
    expect(box!.width).toBeGreaterThan(2);
    expect(o.consoleErrors).toEqual([]);
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
