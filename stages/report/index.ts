import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow, DetectorNormalization, QcRow, ReferencePoint, YieldRow } from '../../pipeline/core/model/result-rows.js';
import { buildTable, tableToIpcFile } from '../../pipeline/core/tables/arrow-table.js';
import { NORMALIZATION_COLUMNS, QC_COLUMNS, YIELD_COLUMNS } from './audit-columns.js';
import { CROSS_SECTION_COLUMNS } from './cross-section-columns.js';
import { renderCharts } from './charts/render-charts.js';
import { reportSettings } from './report-settings.js';
import type { ReportSpectrum } from './spectra/report-spectrum.js';
import type { ReportRun, SummaryInput } from './summary-input.js';
import { summaryHtml } from './summary-html.js';
import { budgetFromColumns, type RowBudget } from './uncertainty-budget.js';

export { CROSS_SECTION_COLUMNS } from './cross-section-columns.js';
export { NORMALIZATION_COLUMNS, QC_COLUMNS, YIELD_COLUMNS } from './audit-columns.js';
export { reportSettings, reportSettingsSchema, REPORT_DEFAULTS, type ReportSettings } from './report-settings.js';
export { pickSpectra } from './spectra/pick-spectra.js';
export type { ReportSpectrum, SpectrumCurve } from './spectra/report-spectrum.js';
export type { ReportRun } from './summary-input.js';
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
  const files: OutputFile[] = [
    { name: 'cross_sections.arrow', bytes: tableToIpcFile(buildTable(CROSS_SECTION_COLUMNS, input.rows, meta('cross sections: one row per sample run × detector × peak'))) },
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
    { name: 'qc.arrow', bytes: tableToIpcFile(buildTable(QC_COLUMNS, input.qc, meta('quality control: one row per run × detector'))) },
  ];
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
      spectra: input.spectra ?? [],
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
    };
    const html = summaryHtml({ ...page, charts: await renderCharts(page) });
    files.push({ name: 'summary.html', bytes: new TextEncoder().encode(html) });
  }
  files.push({ name: 'diagnostics.json', bytes: new TextEncoder().encode(`${JSON.stringify(input.diagnostics, null, 1)}\n`) });
  files.push({ name: 'manifest.json', bytes: new TextEncoder().encode(`${JSON.stringify(input.manifest, null, 2)}\n`) });
  return { files };
}
