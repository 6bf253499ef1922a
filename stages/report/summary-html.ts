import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { formatDiagnostic } from '../../pipeline/core/diagnostics/format-diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow, QcRow, ReferencePoint } from '../../pipeline/core/model/result-rows.js';
import { escapeHtml as h } from '../../pipeline/core/text/escape-html.js';
import { formatWithUncertainty } from '../../pipeline/core/text/round-to-uncertainty.js';

export interface SummaryInput {
  config: SeriesConfig;
  rows: readonly CrossSectionRow[];
  points: readonly ReferencePoint[];
  qc: readonly QcRow[];
  diagnostics: readonly Diagnostic[];
  charts: { title: string; svg: string }[];
  provenance: { softwareVersion: string; configHash: string; inputHash: string; editions: Record<string, string>; calibrationVersions: string[] };
}

const MAX_TABLE_ROWS = 400;
const MAX_DIAGNOSTICS = 300;

const STYLE = `body{font:14px/1.45 system-ui,sans-serif;margin:2rem auto;max-width:1100px;padding:0 1rem;color:#222}
h1{font-size:1.5rem}h2{font-size:1.15rem;margin-top:2rem;border-bottom:1px solid #ddd}
table{border-collapse:collapse;font-size:12px;margin:.5rem 0}td,th{border:1px solid #ddd;padding:2px 6px;text-align:right}
th{background:#f3f3f3}td.t,th.t{text-align:left}.note{color:#555;font-size:12px}pre{white-space:pre-wrap;font-size:12px;background:#f7f7f7;padding:.5rem}
.warn{color:#8a5300}.err{color:#a00}figure{margin:1rem 0}svg{max-width:100%;height:auto}
@media print{body{margin:0;max-width:none}h2{break-after:avoid}figure,table{break-inside:avoid}}`;

function table(headers: string[], body: string[][], textCols: number): string {
  const th = headers.map((x, i) => `<th${i < textCols ? ' class="t"' : ''}>${h(x)}</th>`).join('');
  const tr = body.map((r) => `<tr>${r.map((c, i) => `<td${i < textCols ? ' class="t"' : ''}>${c}</td>`).join('')}</tr>`).join('\n');
  return `<table><thead><tr>${th}</tr></thead><tbody>\n${tr}\n</tbody></table>`;
}

const num = (v: number, digits = 4) => (Number.isFinite(v) ? h(v.toPrecision(digits)) : '—');

/** The self-contained HTML summary of one reduction (inline CSS and SVG, no script, no network). */
export function summaryHtml(x: SummaryInput): string {
  const c = x.config;
  const byStatus = (s: QcRow['status']) => new Set(x.qc.filter((q) => q.status === s).map((q) => q.run));
  const reduced = byStatus('reduced');
  const aside = byStatus('set-aside');
  const asideRows = [...aside].map((run) => {
    const q = x.qc.find((r) => r.run === run && r.status === 'set-aside')!;
    return [h(run), h(q.kind), h(q.rule), h(q.reason)];
  });
  const detectors = table(
    ['detector', 'angle (deg)', 'resolution FWHM (keV)', 'nominal Ω (msr)'],
    c.detectors.map((d) => [h(d.id), num(d.angle_deg), num(d.resolution_fwhm_keV), num(d.solid_angle_msr)]),
    1,
  );
  const targets = c.targets
    .map((t) => `<li>${h(t.id)}: ${t.layers.map((l) => `${h(Object.entries(l.composition).map(([k, v]) => `${k}${v === 1 ? '' : v}`).join(''))} ${l.areal_density_1e15_per_cm2 !== undefined ? `${h(String(l.areal_density_1e15_per_cm2))}×10¹⁵ at/cm²` : `${h(String(l.areal_density_ug_per_cm2))} µg/cm²`} (±${h((l.areal_density_unc_rel * 100).toFixed(1))} %)`).join(' / ')}</li>`)
    .join('');
  const shown = x.rows.slice(0, MAX_TABLE_ROWS);
  const xsTable = table(
    ['run', 'detector', 'peak', 'E beam (keV)', 'θ cm (deg)', 'net counts', 'dσ/dΩ lab (mb/sr) ± stat', 'sys', 'σ/σ_R ± stat', 'sys', 'flags'],
    shown.map((r) => [
      h(r.run),
      h(r.detector),
      h(r.peak),
      num(r.beamEnergyKeV, 5),
      num(r.angleCmDeg),
      Number.isFinite(r.netCounts) ? h(formatWithUncertainty(r.netCounts, r.netCountsUnc)) : '—',
      h(formatWithUncertainty(r.crossSectionLabMbPerSr, r.crossSectionLabStatMbPerSr)),
      num(r.crossSectionLabSysMbPerSr, 2),
      Number.isFinite(r.ratioToRutherford) ? h(formatWithUncertainty(r.ratioToRutherford, r.ratioToRutherfordStat)) : '—',
      num(r.ratioToRutherfordSys, 2),
      h(r.flags.join(' ')),
    ]),
    3,
  );
  const normTable = table(
    ['run', 'detector', 'E beam (keV)', 'net counts', 'live fraction', 'Ω eff (msr) ± run unc.', 'flags'],
    x.points.slice(0, MAX_TABLE_ROWS).map((p) => [
      h(p.run),
      h(p.detector),
      num(p.beamEnergyKeV, 5),
      Number.isFinite(p.netCounts) ? h(formatWithUncertainty(p.netCounts, p.netCountsUnc)) : '—',
      num(p.liveFraction),
      p.solidAngleMsr === null ? '—' : h(formatWithUncertainty(p.solidAngleMsr, p.solidAngleMsr * Math.hypot(p.relCounting, p.relLive, p.relEnergy))),
      h([...p.flags].sort().join(' ')),
    ]),
    2,
  );
  const diags = x.diagnostics.slice(0, MAX_DIAGNOSTICS).map((d) => `<span class="${d.severity === 'error' ? 'err' : d.severity === 'warning' ? 'warn' : ''}">${h(formatDiagnostic(d))}</span>`).join('\n');
  const charts = x.charts.map((ch) => `<figure><figcaption>${h(ch.title)}</figcaption>${ch.svg}</figure>`).join('\n');
  const p = x.provenance;
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${h(c.series)} — xsred summary</title><style>${STYLE}</style></head>
<body>
<h1>${h(c.series)}</h1>
<p>${h(c.title)}</p>
<h2>Overview</h2>
<p>Beam ${h(c.beam.projectile)}<sup>${h(String(c.beam.charge_state))}+</sup>; normalization ${h(c.normalization.method)} on target ${h(c.normalization.reference_target)} (screening ${h(c.normalization.screening)}, rule ${h(c.normalization.reference_rule)}).
Runs reduced: ${reduced.size}; set aside: ${aside.size}; cross-section rows: ${x.rows.length}.</p>
${detectors}
<ul>${targets}</ul>
${asideRows.length ? `<h2>Runs set aside</h2>${table(['run', 'kind', 'rule', 'reason'], asideRows, 4)}` : ''}
<h2>Excitation functions</h2>
<p class="note">Dark bars: statistical uncertainty; light bars: statistical and systematic combined.</p>
${charts || '<p>No rows to plot.</p>'}
<h2>Cross sections</h2>
${x.rows.length > MAX_TABLE_ROWS ? `<p class="note">First ${MAX_TABLE_ROWS} of ${x.rows.length} rows; the full table is cross_sections.arrow.</p>` : ''}
${xsTable}
<h2>Normalization</h2>
${normTable}
<h2>Diagnostics (${x.diagnostics.length})</h2>
<pre>${diags}${x.diagnostics.length > MAX_DIAGNOSTICS ? `\n… ${x.diagnostics.length - MAX_DIAGNOSTICS} more in qc.arrow and the log` : ''}</pre>
<h2>Provenance</h2>
<p class="note">xsred ${h(p.softwareVersion)}; config sha256 ${h(p.configHash.slice(0, 16))}…; inputs sha256 ${h(p.inputHash.slice(0, 16))}…; calibration versions ${h(p.calibrationVersions.join(', '))};
${h(Object.entries(p.editions).map(([k, v]) => `${k}: ${v}`).join('; '))}. Full details in manifest.json.</p>
<p class="note">These results need expert review before use; local practice and codes rule.</p>
</body></html>
`;
}
