import { describe, expect, it } from 'vitest';
import { escapeHtml } from '../../../pipeline/core/text/escape-html.js';
import { report, type ReportChanges, type ReportInput } from '../../../stages/report/index.js';
import type { QcRowWithDrift } from '../../../stages/report/fits-columns.js';
import { seriesSchema } from '../../../pipeline/core/config/series-schema.js';
import { HOSTILE, hostileReportInput } from './hostile-report-input.js';

// The page contract is this project's own (README, "Summary page and exports" and "Operating guide":
// the shift scale (new − old)/√(u_old² + u_new²), counts beyond 1σ and 3σ). Numbers below are test data.

const files = async (i: ReportInput) => (await report(i)).files;
const page = async (i: ReportInput) => new TextDecoder().decode((await files(i)).find((f) => f.name === 'summary.html')!.bytes);
const section = (html: string, id: string) => {
  const at = html.indexOf(`<section id="${id}">`);
  expect(at, id).toBeGreaterThan(-1);
  return html.slice(at, html.indexOf('</section>', at));
};

const changes: ReportChanges = {
  from: 'v000003', to: 'v000004', rowsFrom: 4, rowsTo: 4, matched: 4, moved: 2, relabelled: 1, added: 0, removed: 0, beyond1Sigma: 2, beyond3Sigma: 1,
  largest: { run: 'r002', detector: 'd01', peak: HOSTILE.peak, quantity: 'cross_section_lab', shiftSigma: 3.456 },
  top: [
    { run: 'r002', detector: 'd01', peak: HOSTILE.peak, change: 'moved', quantity: 'cross_section_lab', from: 207, to: 221.5, shiftSigma: 3.456 },
    { run: 'r003', detector: 'd02', peak: HOSTILE.peak, change: 'moved', quantity: 'ratio_to_rutherford', from: 1.1, to: 1.05, shiftSigma: -1.2 },
    { run: 'r003', detector: 'd01', peak: HOSTILE.peak, change: 'relabelled', quantity: null, from: null, to: null, shiftSigma: null },
  ],
};

describe('summary.html: changes since the previous version (archive versions)', () => {
  it('shows from/to, the counts, beyond 1σ and 3σ, and the largest shifts, every string escaped', async () => {
    const s = section(await page(hostileReportInput({ changes })), 'changes');
    expect(s).toContain('<td class="t">v000003</td><td class="t">v000004</td><td>4</td><td>4</td><td>4</td><td>2</td><td>1</td><td>0</td><td>0</td><td>2</td><td>1</td>');
    expect(s).toContain(`peak ${escapeHtml(HOSTILE.peak)}, dσ/dΩ lab moved +3.46σ`);
    expect(s).not.toContain(HOSTILE.peak);
    expect(s).toContain('<td>207</td><td>221.5</td><td>+3.46σ</td>');
    expect(s).toContain('<td>1.1</td><td>1.05</td><td>−1.20σ</td>');
    expect(s).toContain('<td class="t">relabelled</td><td class="t">—</td><td>—</td><td>—</td><td>—</td>');
    expect(s).toContain('Largest shifts (3)');
  }, 60_000);

  it('takes the summary as a function of the new cross_sections.arrow bytes (the engine diffs them), called once', async () => {
    let seen: Uint8Array | undefined;
    let calls = 0;
    const out = await files(hostileReportInput({ changes: (ipc) => ((seen = ipc), calls++, changes) }));
    expect(calls).toBe(1);
    expect(seen).toEqual(out.find((f) => f.name === 'cross_sections.arrow')!.bytes);
    expect(new TextDecoder().decode(out.find((f) => f.name === 'summary.html')!.bytes)).toContain('moved +3.46σ');
  }, 60_000);

  it('a plain reduction says it is not an archive version; a first version says there is nothing to compare', async () => {
    expect(section(await page(hostileReportInput()), 'changes')).toContain('Not an archive version');
    const first = section(await page(hostileReportInput({ changes: null })), 'changes');
    expect(first).toContain('The first version of this series');
    expect(first).not.toContain('<table>');
  }, 60_000);
});

describe('summary.html: calibrations and gain drift', () => {
  it('says xsred calibrate fits calibrations and reports residuals, and lists the versions used with their runs', async () => {
    const html = await page(hostileReportInput());
    expect(html).not.toContain('not fitted from calibration runs');
    const s = section(html, 'runs-qc');
    expect(s).toContain('<code>xsred calibrate</code> fits new versions from calibration runs');
    expect(s).toContain('residual');
    // every qc row of the hostile input uses cal-a: 4 runs, r001 … r004
    expect(s).toContain('<td class="t">cal-a</td><td>4</td><td>r001</td><td>r004</td>');
  }, 60_000);

  it('with drift columns: plots the tracking shift with bars and the tolerance band, and flags the runs beyond it', async () => {
    const base = hostileReportInput();
    const config = seriesSchema.parse({ ...JSON.parse(JSON.stringify(base.config)), drift: { mode: 'track', tolerance_keV: 3 } });
    const qc: QcRowWithDrift[] = base.qc.map((q, i) => ({ ...q, flags: [...q.flags], driftTrackingPeak: HOSTILE.peak, driftShiftKeV: i === 5 ? -4.2 : 0.3 * (i - 3), driftShiftUncKeV: 0.4, gainCorrection: 1 }));
    const html = await page({ ...base, config, qc });
    const s = section(html, 'runs-qc');
    const chart = s.slice(s.indexOf('data-chart="drift-tracking"'));
    expect(chart).toContain('tolerance_band_marks');
    expect(chart).toContain('unc_bars_marks');
    expect(chart.match(/outside_band_marks[^>]*>(<path[^>]*>)+/)?.[0].match(/<path/g)).toHaveLength(1); // one point beyond ±3 keV
    expect(s).toContain('1 run × detector pair beyond the tolerance of ±3 keV');
    expect(s).toContain(`<td class="t">${qc[5]!.run}</td><td class="t">${qc[5]!.detector}</td><td class="t">${escapeHtml(HOSTILE.peak)}</td><td>-4.2 ± 0.4</td>`);
    const off = await page(base);
    expect(off).not.toContain('data-chart="drift-tracking"');
  }, 60_000);
});
