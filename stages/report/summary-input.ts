import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow, DetectorNormalization, QcRow, ReferencePoint, YieldRow } from '../../pipeline/core/model/result-rows.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { ReportSettings } from './report-settings.js';
import type { ReportSpectrum } from './spectra/report-spectrum.js';
import type { RowBudget } from './uncertainty-budget.js';
import type { ReportChanges } from './changes/report-changes.js';

/** What the page says about each run of runlog.csv (the ingested run records fit). */
export type ReportRun = Pick<RunRecord, 'run' | 'index' | 'kind' | 'target' | 'beamEnergyKeV' | 'beamEnergyUncKeV' | 'startedAt' | 'note'>;

/** Provenance the page shows (from manifest.json; clock times stay in the manifest so the page is reproducible). */
export interface Provenance {
  softwareVersion: string;
  configHash: string;
  inputHash: string;
  inputFiles: Record<string, string>;
  commandLine: string[];
  editions: Record<string, string>;
  calibrationVersions: string[];
}

/** A chart already rendered to SVG, with the id checks find it by. */
export interface RenderedChart {
  id: string;
  caption: string;
  svg: string;
}

export interface RenderedCharts {
  excitation: RenderedChart[];
  angular: { chart: RenderedChart | null; shown: number; total: number };
  normalization: RenderedChart | null;
  deadTime: RenderedChart | null;
  drift: RenderedChart | null;
  /** Shift of the drift-tracking peak with its uncertainty and tolerance band (drift.mode track | correct). */
  driftTracking: RenderedChart | null;
  budget: RenderedChart | null;
  /** One SVG per embedded spectrum, in run order then detector order. */
  spectra: { run: string; detector: string; svg: string }[];
}

export interface SummaryInput {
  config: SeriesConfig;
  settings: ReportSettings;
  rows: readonly CrossSectionRow[];
  points: readonly ReferencePoint[];
  detectors: readonly DetectorNormalization[];
  yields: readonly YieldRow[];
  qc: readonly QcRow[];
  runs: readonly ReportRun[];
  spectra: readonly ReportSpectrum[];
  budgets: readonly RowBudget[];
  diagnostics: readonly Diagnostic[];
  charts: RenderedCharts;
  provenance: Provenance;
  /** Changes since the previous archive version: absent for a plain reduction, null for a first version. */
  changes?: ReportChanges | null;
}
