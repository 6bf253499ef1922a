import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow, DetectorNormalization, QcRow, ReferencePoint, YieldRow } from '../../pipeline/core/model/result-rows.js';
import { buildTable, tableToIpcFile } from '../../pipeline/core/tables/arrow-table.js';
import { NORMALIZATION_COLUMNS, QC_COLUMNS, YIELD_COLUMNS } from './audit-columns.js';
import { CROSS_SECTION_COLUMNS } from './cross-section-columns.js';
import { renderCharts } from './charts/render-charts.js';
import { reportSettings } from './report-settings.js';
import type { ReportSpectrum } from './spectra/report-spectrum.js';
import { attachFitCurves } from './spectra/fit-curves.js';
import type { ReportChanges, ReportChangesInput } from './changes/report-changes.js';
import type { ReportRun, SummaryInput } from './summary-input.js';
import { summaryHtml } from './summary-html.js';
import { budgetFromColumns, type RowBudget } from './uncertainty-budget.js';
import { UNCERTAINTY_BUDGET_COLUMNS, type BudgetTableRow } from '../../pipeline/core/tables/uncertainty-budget-columns.js';
import { COVARIANCE_COLUMNS, type CovarianceTableRow } from '../../pipeline/core/tables/covariance-columns.js';
import { COMBINED_COLUMNS, type CombinedTableRow } from '../../pipeline/core/tables/combined-columns.js';
import { MONTE_CARLO_COLUMNS, type MonteCarloTableRow } from '../../pipeline/core/tables/monte-carlo-columns.js';
import { DRIFT_QC_COLUMNS, FIT_COLUMNS, FIT_RESIDUAL_COLUMNS, type FitResidualRow, type FitRow } from './fits-columns.js';

export { CROSS_SECTION_COLUMNS } from './cross-section-columns.js';
export { NORMALIZATION_COLUMNS, QC_COLUMNS, YIELD_COLUMNS } from './audit-columns.js';
export { reportSettings, reportSettingsSchema, REPORT_DEFAULTS, type ReportSettings } from './report-settings.js';
export { pickSpectra } from './spectra/pick-spectra.js';
export type { ReportSpectrum, SpectrumCurve } from './spectra/report-spectrum.js';
export type { ReportRun } from './summary-input.js';
export type { ReportChanges, ReportChangesInput } from './changes/report-changes.js';
export type { RowBudget, UncertaintyComponent } from './uncertainty-budget.js';
export { archiveIndexHtml, type ArchiveEntry } from './archive-index-html.js';

export interface ReportInput {
  config: SeriesConfig;
  rows: readonly CrossSectionRow[];
  referenceElement: string;
  points: readonly ReferencePoint[];
  detectors: readonly DetectorNormalization[];
  yields: readonly YieldRow[];
  qc: readonly QcRow[];
  diagnostics: readonly Diagnostic[];
  /** Everything manifest.json records (the engine supplies hashes, versions, command line, times). */
  manifest: Record<string, unknown> & {
    software: { name: string; version: string };
    config_sha256: string;
    inputs_sha256: string;
    editions: Record<string, string>;
    calibration_versions: string[];
    input_files?: Record<string, string>;
    command_line?: string[];
  };
  /** The runs of runlog.csv (overview, run notes, run order of the dead-time and drift plots). */
  runs?: readonly ReportRun[];
  /** Compact spectra to embed (the engine keeps at most report.max_spectra of them). */
  spectra?: readonly ReportSpectrum[];
  /** Uncertainty budget by component per row; without it, the stat/sys columns give the components. */
  budgets?: readonly RowBudget[];
  /** Write summary.html (vega loads only then). */
  html: boolean;
  /**
   * Issue 5 tables (README, "Normalization methods and uncertainties"): uncertainty_budget.arrow and
   * combined.arrow always when given; covariance.arrow unless null (too many rows);
   * monte_carlo.arrow with --mc only.
   */
  uncertainty?: {
    budget: readonly BudgetTableRow[];
    covariance: readonly CovarianceTableRow[] | null;
    combined: readonly CombinedTableRow[];
    monteCarlo: readonly MonteCarloTableRow[] | null;
  };
  /** Peak fits (method: fit): fits.arrow and fit_residuals.arrow are written only when given. */
  fits?: readonly FitRow[];
  fitResiduals?: readonly FitResidualRow[];
  /**
   * Archive versions (nightly, rereduce): the changes since the previous version, or a function of the
   * new cross_sections.arrow bytes that gives them; absent for a plain `xsred reduce`.
   */
  changes?: ReportChangesInput;
}

export interface OutputFile {
  name: string;
  bytes: Uint8Array;
}

/**
 * report: the Arrow tables, manifest.json, diagnostics.json and the HTML summary, as bytes. The engine writes
 * them (atomically). Tables hold no clock time, so the same inputs give identical bytes.
 */
export async function report(input: ReportInput): Promise<{ files: OutputFile[] }> {
  const editions = input.manifest.editions;
  const extra = Object.fromEntries(Object.entries(editions).map(([k, v]) => [`xsred.edition.${k}`, v]));
  const meta = (table: string) => ({ table, extra: { ...extra, 'xsred.series': input.config.series, 'xsred.version': input.manifest.software.version } });
  const nominal = new Map(input.detectors.map((d) => [d.detector, d.nominalMsr]));
  const crossSections = tableToIpcFile(buildTable(CROSS_SECTION_COLUMNS, input.rows, meta('cross sections: one row per sample run × detector × peak')));
  const files: OutputFile[] = [
    { name: 'cross_sections.arrow', bytes: crossSections },
    {
      name: 'normalization.arrow',
      bytes: tableToIpcFile(
        buildTable(
          NORMALIZATION_COLUMNS,
          input.points.map((p) => ({ ...p, referenceElement: input.referenceElement, nominalMsr: nominal.get(p.detector) ?? Number.NaN })),
          meta('normalization: one row per reference run × detector'),
        ),
      ),
    },
    { name: 'yields.arrow', bytes: tableToIpcFile(buildTable(YIELD_COLUMNS, input.yields, meta('yields: one row per measured peak window'))) },
    { name: 'qc.arrow', bytes: tableToIpcFile(buildTable(input.config.drift.mode === 'off' ? QC_COLUMNS : [...QC_COLUMNS.slice(0, -1), ...DRIFT_QC_COLUMNS, QC_COLUMNS[QC_COLUMNS.length - 1]!], input.qc, meta('quality control: one row per run × detector'))) },
  ];
  if (input.fits !== undefined) {
    files.push({ name: 'fits.arrow', bytes: tableToIpcFile(buildTable(FIT_COLUMNS, input.fits, meta('peak fits: one row per run × detector × fitted peak'))) });
    files.push({ name: 'fit_residuals.arrow', bytes: tableToIpcFile(buildTable(FIT_RESIDUAL_COLUMNS, input.fitResiduals ?? [], meta('peak-fit residuals: one row per channel of each fit region'))) });
  }
  const u = input.uncertainty;
  if (u !== undefined) {
    files.push({ name: 'uncertainty_budget.arrow', bytes: tableToIpcFile(buildTable(UNCERTAINTY_BUDGET_COLUMNS, u.budget, meta('uncertainty budget: one entry per cross-section row × component (name, class, key), its contribution to dσ/dΩ_lab and σ/σ_R'))) });
    if (u.covariance !== null) files.push({ name: 'covariance.arrow', bytes: tableToIpcFile(buildTable(COVARIANCE_COLUMNS, u.covariance, meta('covariance of dσ/dΩ_lab between cross-section rows i <= j (long form; absent pairs are 0)'))) });
    files.push({ name: 'combined.arrow', bytes: tableToIpcFile(buildTable(COMBINED_COLUMNS, u.combined, meta('combined values: rows of one peak, lab angle and beam energy by the weighted mean'))) });
    if (u.monteCarlo !== null) files.push({ name: 'monte_carlo.arrow', bytes: tableToIpcFile(buildTable(MONTE_CARLO_COLUMNS, u.monteCarlo, meta('Monte Carlo propagation (JCGM 101) per cross-section row, beside the first-order values'))) });
  }
  if (input.html) {
    const m = input.manifest;
    const page: Omit<SummaryInput, 'charts'> = {
      config: input.config,
      settings: reportSettings(input.config),
      rows: input.rows,
      points: input.points,
      detectors: input.detectors,
      yields: input.yields,
      qc: input.qc,
      runs: input.runs ?? [],
      spectra: input.fitResiduals?.length ? attachFitCurves(input.spectra ?? [], input.fitResiduals) : (input.spectra ?? []),
      budgets: input.budgets ?? input.rows.filter((r) => Number.isFinite(r.crossSectionLabMbPerSr) && r.crossSectionLabMbPerSr !== 0).map(budgetFromColumns),
      diagnostics: input.diagnostics,
      provenance: {
        softwareVersion: m.software.version,
        configHash: m.config_sha256,
        inputHash: m.inputs_sha256,
        inputFiles: m.input_files ?? {},
        commandLine: m.command_line ?? [],
        editions,
        calibrationVersions: m.calibration_versions,
      },
      ...changesOf(input.changes, crossSections),
    };
    const html = summaryHtml({ ...page, charts: await renderCharts(page) });
    files.push({ name: 'summary.html', bytes: new TextEncoder().encode(html) });
  }
  files.push({ name: 'diagnostics.json', bytes: new TextEncoder().encode(`${JSON.stringify(input.diagnostics, null, 1)}\n`) });
  files.push({ name: 'manifest.json', bytes: new TextEncoder().encode(`${JSON.stringify(input.manifest, null, 2)}\n`) });
  return { files };
}

/** The page's changes field: left out for a plain reduction, else the summary (computed now when given as a function). */
function changesOf(changes: ReportChangesInput | undefined, crossSectionsIpc: Uint8Array): { changes?: ReportChanges | null } {
  if (changes === undefined) return {};
  return { changes: typeof changes === 'function' ? changes(crossSectionsIpc) : changes };
}
