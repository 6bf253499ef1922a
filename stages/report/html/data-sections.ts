import { formatDiagnostic } from '../../../pipeline/core/diagnostics/format-diagnostic.js';
import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';
import { formatWithUncertainty } from '../../../pipeline/core/text/round-to-uncertainty.js';
import { formatPercent, formatStatSys, formatToUncertainty } from '../format/format-stat-sys.js';
import type { SummaryInput } from '../summary-input.js';
import { summarizeBudget } from '../uncertainty-budget.js';
import { htmlTable } from './html-table.js';
import { spectrumAnchor } from './spectra-section.js';

const MAX_TABLE_ROWS = 400;
const MAX_DIAGNOSTICS = 300;

/** The cross-section table (first rows; the full table is the Arrow file), each run linked to its spectrum when embedded. */
export function crossSectionTable(x: SummaryInput): string {
  const embedded = new Set(x.charts.spectra.map((s) => spectrumAnchor(s.run, s.detector)));
  const angleUnc = new Map(x.config.detectors.map((d) => [d.id, d.angle_unc_deg]));
  const body = x.rows.slice(0, MAX_TABLE_ROWS).map((r) => {
    const a = spectrumAnchor(r.run, r.detector);
    return [
      embedded.has(a) ? `<a href="#${h(a)}">${h(r.run)}</a>` : h(r.run),
      h(r.detector),
      h(r.peak),
      h(formatToUncertainty(r.beamEnergyKeV, r.beamEnergyUncKeV)),
      h(formatToUncertainty(r.angleCmDeg, angleUnc.get(r.detector) ?? Number.NaN)),
      Number.isFinite(r.netCounts) ? h(formatWithUncertainty(r.netCounts, r.netCountsUnc)) : '—',
      h(formatStatSys(r.crossSectionLabMbPerSr, r.crossSectionLabStatMbPerSr, r.crossSectionLabSysMbPerSr)),
      h(formatStatSys(r.crossSectionCmMbPerSr, r.crossSectionCmStatMbPerSr, r.crossSectionCmSysMbPerSr)),
      Number.isFinite(r.ratioToRutherford) ? h(formatStatSys(r.ratioToRutherford, r.ratioToRutherfordStat, r.ratioToRutherfordSys)) : '—',
      h(r.flags.join(' ')),
    ];
  });
  const more = x.rows.length > MAX_TABLE_ROWS ? `<p class="note">First ${MAX_TABLE_ROWS} of ${x.rows.length} rows; the full table is cross_sections.arrow (or \`xsred export\`).</p>` : '';
  return `<section id="cross-sections"><h2>Cross sections</h2>${more}
${htmlTable(['run', 'detector', 'peak', 'E beam (keV)', 'θ cm (deg)', 'net counts', 'dσ/dΩ lab (mb/sr) ± stat ± sys', 'dσ/dΩ CM (mb/sr) ± stat ± sys', 'σ/σ_R ± stat ± sys', 'flags'], body, 3)}</section>`;
}

/** The reference runs' effective solid angles (first rows). */
export function normalizationTable(x: SummaryInput): string {
  const means = htmlTable(
    ['detector', 'nominal Ω (msr)', 'mean Ω eff (msr)', 'χ²/ndf'],
    x.detectors.map((d) => [h(d.detector), h(String(d.nominalMsr)), d.meanMsr === null ? '—' : h(Number(d.meanMsr.toPrecision(4)).toString()), d.ndf > 0 ? h((d.chi2 / d.ndf).toFixed(2)) : '—']),
    1,
  );
  const body = x.points.slice(0, MAX_TABLE_ROWS).map((p) => [
    h(p.run),
    h(p.detector),
    h(String(p.beamEnergyKeV)),
    Number.isFinite(p.netCounts) ? h(formatWithUncertainty(p.netCounts, p.netCountsUnc)) : '—',
    h(formatWithUncertainty(p.liveFraction, p.liveFractionUnc)),
    p.solidAngleMsr === null ? '—' : h(formatWithUncertainty(p.solidAngleMsr, p.solidAngleMsr * Math.hypot(p.relCounting, p.relLive, p.relEnergy))),
    h([...p.flags].sort().join(' ')),
  ]);
  return `${means}<details><summary>Reference runs (${x.points.length} run × detector rows)</summary>${htmlTable(['run', 'detector', 'E beam (keV)', 'net counts', 'live fraction', 'Ω eff (msr) ± run unc.', 'flags'], body, 2)}</details>`;
}

/** The budget table: median relative uncertainty (%) of each component per peak and detector. */
export function budgetTable(x: SummaryInput): string {
  const bars = summarizeBudget(x.budgets);
  const components = [...new Set(bars.map((b) => b.component))];
  const keys = [...new Set(bars.map((b) => `${b.peak}\u0000${b.detector}`))];
  const body = keys.map((k) => {
    const [peak, detector] = k.split('\u0000') as [string, string];
    return [h(peak), h(detector), ...components.map((c) => h(formatPercent((bars.find((b) => b.peak === peak && b.detector === detector && b.component === c)?.percent ?? Number.NaN) / 100)))];
  });
  return body.length ? htmlTable(['peak', 'detector', ...components.map((c) => `${c} (%)`)], body, 2) : '<p>No rows with uncertainties.</p>';
}

/** Every diagnostic, one line each (first few hundred). */
export function diagnosticsSection(x: SummaryInput): string {
  const lines = x.diagnostics
    .slice(0, MAX_DIAGNOSTICS)
    .map((d) => `<span class="${d.severity === 'error' ? 'err' : d.severity === 'warning' ? 'warn' : ''}">${h(formatDiagnostic(d))}</span>`)
    .join('\n');
  const more = x.diagnostics.length > MAX_DIAGNOSTICS ? `\n… ${x.diagnostics.length - MAX_DIAGNOSTICS} more in diagnostics.json` : '';
  return `<section id="diagnostics"><h2>Diagnostics (${x.diagnostics.length})</h2><pre>${lines}${more}</pre></section>`;
}

/** Provenance: software, hashes, calibration versions, editions, command line, input files. */
export function provenanceSection(x: SummaryInput): string {
  const p = x.provenance;
  const files = Object.entries(p.inputFiles);
  const listed = files.slice(0, 60).map(([f, s]) => [h(f), `<code>${h(s)}</code>`]);
  return `<section id="provenance"><h2>Provenance</h2>
${htmlTable(['what', 'value'], [
    ['software', h(`xsred ${p.softwareVersion}`)],
    ['configuration sha256 (parsed series.yaml, canonical JSON)', `<code>${h(p.configHash)}</code>`],
    ['inputs sha256 (listing of every input file hash)', `<code>${h(p.inputHash)}</code>`],
    ['calibration versions', h(p.calibrationVersions.join(', '))],
    ...Object.entries(p.editions).map(([k, v]) => [h(`edition: ${k}`), h(v)]),
    ['command line', `<code>${h(p.commandLine.join(' '))}</code>`],
  ], 2)}
${files.length ? `<details><summary>Input files (${files.length})</summary>${htmlTable(['file', 'sha256'], listed, 2)}${files.length > 60 ? `<p class="note">… ${files.length - 60} more in manifest.json</p>` : ''}</details>` : ''}
<p class="note">Start and finish times are in manifest.json; the page holds none, so the same inputs give the same page.</p></section>`;
}
