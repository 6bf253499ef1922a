import type { QcRow } from '../../../pipeline/core/model/result-rows.js';
import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';
import { formatWithUncertainty } from '../../../pipeline/core/text/round-to-uncertainty.js';
import { formatToUncertainty } from '../format/format-stat-sys.js';
import type { SummaryInput } from '../summary-input.js';
import { htmlTable } from './html-table.js';

const MAX_RUN_ROWS = 400;

/** Overview: beam, method, detectors, targets, peaks, run counts, the runs set aside with their reasons, run notes. */
export function overviewSection(x: SummaryInput): string {
  const c = x.config;
  const statusOf = new Map<string, QcRow>();
  for (const q of x.qc) if (!statusOf.has(q.run) || q.status === 'set-aside') statusOf.set(q.run, q);
  const count = (s: QcRow['status']) => [...statusOf.values()].filter((q) => q.status === s).length;
  const detectors = htmlTable(
    ['detector', 'angle (deg)', 'resolution FWHM (keV)', 'nominal Ω (msr)'],
    c.detectors.map((d) => [h(d.id), h(formatWithUncertainty(d.angle_deg, d.angle_unc_deg)), h(String(d.resolution_fwhm_keV)), h(String(d.solid_angle_msr))]),
    1,
  );
  const layer = (l: SummaryInput['config']['targets'][number]['layers'][number]) => {
    const comp = Object.entries(l.composition).map(([k, v]) => `${k}${v === 1 ? '' : v}`).join(' ');
    const dens = l.areal_density_1e15_per_cm2 !== undefined ? `${l.areal_density_1e15_per_cm2}×10¹⁵ at/cm²` : `${l.areal_density_ug_per_cm2} µg/cm²`;
    return h(`${comp} ${dens} (±${Number((l.areal_density_unc_rel * 100).toPrecision(2))} %)`);
  };
  const targets = htmlTable(['target', 'layers (beam side first)'], c.targets.map((t) => [h(t.id), t.layers.map(layer).join(' / ')]), 2);
  const peaks = htmlTable(
    ['peak', 'target nuclide', 'excitation (keV)', 'method'],
    c.peaks.map((p) => [h(p.label), h(p.target_nuclide), h(String(p.excitation_keV)), h(p.method)]),
    2,
  );
  const aside = [...statusOf.values()].filter((q) => q.status === 'set-aside');
  const asideTable = aside.length
    ? `<h3 id="set-aside">Runs set aside (${aside.length})</h3>${htmlTable(['run', 'kind', 'rule', 'reason'], aside.map((q) => [h(q.run), h(q.kind), h(q.rule), h(q.reason)]), 4)}`
    : '<p>No run was set aside.</p>';
  const runs = x.runs.slice(0, MAX_RUN_ROWS);
  const runTable = runs.length
    ? `<details><summary>All runs (${x.runs.length}${x.runs.length > MAX_RUN_ROWS ? `, first ${MAX_RUN_ROWS} shown` : ''})</summary>${htmlTable(
        ['run', 'kind', 'target', 'beam energy (keV)', 'started at', 'status', 'note'],
        runs.map((r) => [h(r.run), h(r.kind), h(r.target), h(formatToUncertainty(r.beamEnergyKeV, r.beamEnergyUncKeV)), h(r.startedAt), h(statusOf.get(r.run)?.status ?? ''), h(r.note)]),
        3,
      )}</details>`
    : '';
  const noted = x.runs.filter((r) => r.note.trim() !== '');
  const notes = noted.length
    ? `<h3>Run notes</h3>${htmlTable(['run', 'note'], noted.slice(0, MAX_RUN_ROWS).map((r) => [h(r.run), h(r.note)]), 2)}`
    : '';
  const n = c.normalization;
  return `<section id="overview"><h2>Overview</h2>
<p>Beam <b>${h(c.beam.projectile)}</b>, charge state ${h(String(c.beam.charge_state))}+. Normalization: ${h(n.method)}${n.reference_target !== undefined ? ` on target <b>${h(n.reference_target)}</b>` : ''}${n.reference_element ? ` (element ${h(n.reference_element)})` : ''}, screening ${h(n.screening)}, rule ${h(n.reference_rule)}.
Peaks are measured by window integration above a linear background.</p>
<p>Runs: <span class="badge">${count('reduced')} reduced</span> <span class="badge">${count('set-aside')} set aside</span> <span class="badge">${count('not-reduced')} not reduced (calibration, background)</span>; ${x.rows.length} cross-section rows.</p>
<h3>Detectors</h3>${detectors}
<h3>Targets</h3>${targets}
<h3>Peaks</h3>${peaks}
${asideTable}
${notes}
${runTable}
</section>`;
}
