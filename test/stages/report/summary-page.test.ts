import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeArchiveIndex } from '../../../pipeline/engine/export/write-archive-index.js';
import { pickSpectra, report, type ReportInput } from '../../../stages/report/index.js';
import { rebinCounts, rebinnedLength } from '../../../stages/report/spectra/rebin-counts.js';
import { escapeHtml } from '../../../pipeline/core/text/escape-html.js';
import { HOSTILE, hostileReportInput } from './hostile-report-input.js';

// The page contract is this project's own (README, "Summary page and exports"); the Content-Security-Policy
// hash source follows the W3C CSP Level 3 recommendation ('sha256-' + base64 of the script's UTF-8 bytes).

const page = async (i: ReportInput) => new TextDecoder().decode((await report(i)).files.find((f) => f.name === 'summary.html')!.bytes);

describe('summary.html: sections, charts, script', () => {
  it('has every section and every chart the page promises, with inline SVG marks', async () => {
    const html = await page(hostileReportInput());
    for (const id of ['overview', 'excitation', 'angular', 'spectra', 'normalization', 'runs-qc', 'budget', 'cross-sections', 'diagnostics', 'provenance', 'numbers']) {
      expect(html, id).toContain(`<section id="${id}">`);
    }
    const charts = [...html.matchAll(/data-chart="([^"]+)"/g)].map((m) => m[1]);
    expect(charts).toEqual(expect.arrayContaining(['angular', 'normalization', 'dead-time', 'gain-drift', 'budget']));
    expect(charts.filter((c) => c!.startsWith('excitation-lab:'))).toHaveLength(1);
    expect(charts.filter((c) => c!.startsWith('excitation-ratio:'))).toHaveLength(1);
    expect(html.match(/<figure class="spectrum"/g)).toHaveLength(8);
    expect(html).toContain('All 8 run × detector spectra of the reduced runs are embedded.');
  }, 60_000);

  it('runs only its one script, allowed by a CSP sha256 of exactly that script (W3C CSP Level 3 hash source)', async () => {
    const html = await page(hostileReportInput());
    const scripts = [...html.matchAll(/<script>([\s\S]*?)<\/script>/g)].map((m) => m[1]!);
    expect(scripts).toHaveLength(1);
    expect(html.match(/<script/gi)).toHaveLength(1);
    const hash = createHash('sha256').update(scripts[0]!, 'utf8').digest('base64');
    const csp = /http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(html)![1]!.replace(/&#39;/g, "'");
    expect(csp).toContain(`script-src 'sha256-${hash}'`);
    expect(csp).toContain("default-src 'none'");
  }, 60_000);

  it('escapes every user-supplied string: title, peak label, run note, diagnostic file and message', async () => {
    const html = await page(hostileReportInput());
    for (const s of Object.values(HOSTILE)) {
      expect(html).not.toContain(s);
      expect(html).toContain(escapeHtml(s));
    }
    // Quoted attribute values are escaped (no raw quote inside), so with them blanked out any
    // remaining on…= would be a real event-handler attribute.
    const outsideValues = html.replace(/"[^"]*"/g, '""');
    expect(outsideValues).not.toMatch(/<img|<[a-z]+\s[^>]*\bon[a-z]+=/i);
    expect(html.match(/.{0,30}https?:\/\/.{0,30}/g) ?? []).toEqual([]);
  }, 60_000);

  it('says which spectra the cap left out (report.max_spectra)', async () => {
    const base = hostileReportInput();
    const html = await page({ ...base, config: { ...base.config, report: { max_spectra: 3 } } as typeof base.config, spectra: base.spectra!.slice(0, 3) });
    expect(html.match(/<figure class="spectrum"/g)).toHaveLength(3);
    expect(html).toContain('Embedded: 3 of 8 run × detector spectra (report.max_spectra = 3');
    expect(html).toContain('Not embedded: 5 spectra of 3 runs (r002, r003, r004)');
  }, 60_000);

  it('the page is byte-identical for the same input (no clock time)', async () => {
    expect(await page(hostileReportInput())).toBe(await page(hostileReportInput()));
  }, 60_000);
});

describe('spectra for the page: choice and rebinning', () => {
  it('pickSpectra: all when they fit; else every detector of runs spread end to end; else the first detectors of the first run', () => {
    const runs = Array.from({ length: 10 }, (_, i) => `r${i}`);
    expect([...pickSpectra(runs.slice(0, 2), ['a', 'b'], 4)]).toEqual([['r0', ['a', 'b']], ['r1', ['a', 'b']]]);
    expect([...pickSpectra(runs, ['a', 'b', 'c', 'd'], 12).keys()]).toEqual(['r0', 'r5', 'r9']);
    expect([...pickSpectra(runs, ['a', 'b', 'c', 'd'], 2)]).toEqual([['r0', ['a', 'b']]]);
    expect(pickSpectra(runs, ['a'], 0).size).toBe(0);
  });

  it('rebinCounts sums whole channels, the last bin partial, and conserves the total (common practice)', () => {
    const counts = Uint32Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    const out = new Float64Array(2 + rebinnedLength(10, 4));
    expect(rebinnedLength(10, 4)).toBe(4);
    expect(rebinCounts(counts, 4, out, 2)).toBe(3);
    expect([...out]).toEqual([0, 0, 6, 15, 24, 10]);
    const one = new Float64Array(10);
    expect(rebinCounts(counts, 512, one, 0)).toBe(1);
    expect([...one]).toEqual([...counts]);
  });
});

describe('archive index (writeArchiveIndex)', () => {
  it('lists every series sorted, escapes names and statuses, and links relatively with encoded segments', () => {
    const root = mkdtempSync(join(tmpdir(), 'xsred-index-'));
    const path = writeArchiveIndex(root, [
      { series: 'zeta-2026', status: 'ok', summaryPath: join(root, 'zeta-2026/current/summary.html'), version: 'v0003' },
      { series: 'alpha "<b>"', status: `failed <script>alert(1)</script>`, summaryPath: '' },
      { series: 'my series#1', status: 'set-aside 2', summaryPath: 'my series#1/current/summary.html' },
    ]);
    expect(path).toBe(join(root, 'index.html'));
    const html = readFileSync(path, 'utf8');
    expect(html).not.toMatch(/<script|<b>/);
    expect(html).toContain('failed &lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('<a href="zeta-2026/current/summary.html">zeta-2026</a>');
    expect(html).toContain('<a href="my%20series%231/current/summary.html">my series#1</a>');
    expect(html).toContain('alpha &quot;&lt;b&gt;&quot;</td>');
    expect(html.indexOf('alpha')).toBeLessThan(html.indexOf('my series')); 
    expect(html.indexOf('my series')).toBeLessThan(html.indexOf('zeta-2026'));
    expect(html).not.toMatch(/href="\/|file:/);
  });
});
