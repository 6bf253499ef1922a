import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';
import { formatWithUncertainty } from '../../../pipeline/core/text/round-to-uncertainty.js';
import type { RenderedChart, SummaryInput } from '../summary-input.js';
import { chartFigure, htmlTable } from './html-table.js';
import { driftRows } from './drift-rows.js';

const MAX_LISTED = 100;
const fig = (c: RenderedChart | null, none: string) => (c ? chartFigure(c.id, c.caption, c.svg) : `<p>${h(none)}</p>`);

/** Per calibration version: how many runs the reduction took it for, and the first and last of them (run order). */
export function calibrationUse(x: Pick<SummaryInput, 'qc' | 'runs' | 'provenance'>): { version: string; runs: number; first: string; last: string }[] {
  const order = new Map(x.runs.map((r) => [r.run, r.index]));
  const byVersion = new Map<string, Set<string>>(x.provenance.calibrationVersions.map((v) => [v, new Set()]));
  for (const q of x.qc) {
    if (q.calibrationVersion === '' || q.status !== 'reduced') continue;
    let s = byVersion.get(q.calibrationVersion);
    if (s === undefined) byVersion.set(q.calibrationVersion, (s = new Set()));
    s.add(q.run);
  }
  return [...byVersion].map(([version, runs]) => {
    const sorted = [...runs].sort((a, b) => (order.get(a) ?? 0) - (order.get(b) ?? 0));
    return { version, runs: sorted.length, first: sorted[0] ?? '', last: sorted[sorted.length - 1] ?? '' };
  });
}

/**
 * "Dead time, drift and calibrations": dead time per run, the strongest peak's centroid shift, the
 * drift-tracking shift with its tolerance (when drift.mode is track or correct) and the run × detector
 * pairs beyond it, and the calibration versions the reduction used. Every string escaped.
 */
export function calibrationDriftSection(x: SummaryInput): string {
  const ch = x.charts;
  const use = calibrationUse(x);
  const calTable = use.length
    ? htmlTable(['calibration version', 'runs reduced with it', 'first run', 'last run'], use.map((u) => [h(u.version), h(String(u.runs)), h(u.first || '—'), h(u.last || '—')]), 1)
    : '<p>No calibration version was used.</p>';
  const drift = x.config.drift;
  let tracking = '';
  if (drift.mode !== 'off') {
    const rows = driftRows(x.qc);
    const beyond = rows.filter((q) => Math.abs(q.driftShiftKeV) > drift.tolerance_keV);
    const untracked = x.qc.filter((q) => q.status === 'reduced' && q.flags.includes('drift-not-tracked'));
    const list = beyond.length
      ? `<p class="warn" id="drift-beyond">${beyond.length} run × detector pair${beyond.length === 1 ? '' : 's'} beyond the tolerance of ±${h(String(drift.tolerance_keV))} keV (flag gain-drift${drift.mode === 'correct' ? '; measured with a corrected gain, flag gain-corrected' : ''}):</p>
${htmlTable(['run', 'detector', 'tracking peak', 'shift (keV)', 'gain factor'], beyond.slice(0, MAX_LISTED).map((q) => [h(q.run), h(q.detector), h(q.driftTrackingPeak), h(formatWithUncertainty(q.driftShiftKeV, q.driftShiftUncKeV)), h(Number.isFinite(q.gainCorrection) ? q.gainCorrection.toFixed(6) : '—')]), 3)}${beyond.length > MAX_LISTED ? `<p class="note">First ${MAX_LISTED} of ${beyond.length}; all are in qc.arrow.</p>` : ''}`
      : `<p id="drift-beyond">No run × detector beyond the tolerance of ±${h(String(drift.tolerance_keV))} keV.</p>`;
    tracking = `<h3>Gain drift (drift.mode ${h(drift.mode)})</h3>
<p class="note">The tracking peak (drift.tracking_peak in sample runs, the reference peak in reference runs) is fitted in every run and detector; its shift is the fitted centroid minus the energy the calibration predicts (columns drift_shift_keV, drift_shift_unc_keV of qc.arrow).</p>
${fig(ch.driftTracking, 'No tracking peak could be fitted.')}
${list}
${untracked.length ? `<p class="note">No tracking peak found in ${untracked.length} run × detector pair${untracked.length === 1 ? '' : 's'} (flag drift-not-tracked).</p>` : ''}`;
  }
  return `<section id="runs-qc"><h2>Dead time, drift and calibrations</h2>
${fig(ch.deadTime, 'No live fractions to show.')}
${fig(ch.drift, 'No measured peak centroid to show.')}
${tracking}
<h3>Calibrations</h3>
<p class="note" id="calibration-note">Energy calibrations are the versions in calibrations/*.yaml. <code>xsred calibrate</code> fits new versions from calibration runs (alpha sources or elastic peaks of a target) and reports each detector's coefficients, χ²/ν and every point's residual in keV and in standard deviations — printed, and in the comments of each version file it writes. The reduction used these versions (the superseding one wherever two cover a run):</p>
${calTable}
</section>`;
}
