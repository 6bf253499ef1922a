import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { IngestedSeries, RunRecord } from '../../pipeline/core/model/series-model.js';
import { readCalibrations, type CalibrationFileText } from './read-calibrations.js';
import { checkStoppingMaterials, readStoppingTables } from './read-stopping-tables.js';
import { readRunlog } from './read-runlog.js';
import { readScalers } from './read-scalers.js';
import { readSeriesConfig } from './read-series-config.js';

export { ingestSpectrum, type IngestedSpectrum } from './ingest-spectrum.js';

/** The text of a series' metadata files, read by the engine (paths relative to the series folder). */
export interface IngestInput {
  seriesDir: string;
  seriesYaml: { file: string; text: string } | null;
  runlog: { file: string; text: string } | null;
  scalers: { file: string; text: string } | null;
  calibrations: CalibrationFileText[];
  /** File names found in spectra/. */
  spectra: string[];
  /** Reads another file of the series folder (path relative to it), e.g. a stopping table series.yaml names; null if absent. */
  readFile: (rel: string) => { file: string; text: string } | null;
}

export type IngestOutput = { ok: true; series: IngestedSeries } | { ok: false; diagnostics: Diagnostic[] };

function setAside(map: Map<string, Diagnostic[]>, run: string, ds: Diagnostic[]) {
  if (ds.length === 0) return;
  map.set(run, [...(map.get(run) ?? []), ...ds]);
}

/**
 * ingest: read and validate a run series (series.yaml, runlog.csv, scalers.csv,
 * calibrations/*.yaml, the spectra listing). Every problem is a diagnostic with its file
 * position. A bad run is set aside with its reasons; series-level problems (unreadable
 * series.yaml or runlog.csv, no usable reference run) make the output `ok: false`.
 * Spectra themselves are read per run by `ingestSpectrum` as the engine streams them.
 */
export function ingest(input: IngestInput): IngestOutput {
  const diagnostics: Diagnostic[] = [];
  if (input.seriesYaml === null) {
    return { ok: false, diagnostics: [{ severity: 'error', rule: 'series-missing-file', message: `no series.yaml in ${input.seriesDir}`, file: 'series.yaml', stage: 'ingest', hint: 'a series folder holds series.yaml, runlog.csv and spectra/ (see the README, "Input layout")' }] };
  }
  const cfg = readSeriesConfig(input.seriesYaml.text, input.seriesYaml.file);
  diagnostics.push(...cfg.diagnostics);
  if (input.runlog === null) {
    diagnostics.push({ severity: 'error', rule: 'series-missing-file', message: `no runlog.csv in ${input.seriesDir}`, file: 'runlog.csv', stage: 'ingest' });
  }
  if (cfg.config === null || input.runlog === null) return { ok: false, diagnostics };
  const config = cfg.config;

  const stopping = readStoppingTables(config.physics.stopping_tables, input.readFile);
  diagnostics.push(...stopping.diagnostics);
  const materials = checkStoppingMaterials(config, stopping.tables);
  diagnostics.push(...materials);
  if (stopping.fatal || materials.length > 0) return { ok: false, diagnostics };

  const log = readRunlog(input.runlog.text, input.runlog.file);
  diagnostics.push(...log.diagnostics);
  if (log.fatal) return { ok: false, diagnostics };
  const aside = new Map<string, Diagnostic[]>();
  for (const [run, ds] of log.rowErrors) setAside(aside, run, ds);

  const runsById = new Map<string, RunRecord>(log.runs.map((r) => [r.run, r]));
  const detectorIds = new Set(config.detectors.map((d) => d.id));
  const targetIds = new Set(config.targets.map((t) => t.id));
  const reduced = (r: RunRecord) => r.kind === 'reference' || r.kind === 'sample';

  let scalers: IngestedSeries['scalers'] = null;
  if (input.scalers !== null) {
    const sc = readScalers(input.scalers.text, input.scalers.file, runsById, detectorIds);
    diagnostics.push(...sc.diagnostics);
    for (const [run, ds] of sc.rowErrors) setAside(aside, run, ds);
    scalers = sc.scalers;
  } else {
    diagnostics.push({ severity: 'warning', rule: 'series-no-scalers', message: 'no scalers.csv: live fraction taken as 1 for every run (no dead-time correction)', file: 'scalers.csv', stage: 'ingest', hint: 'give live_time_s or pulser counts per run and detector to correct for dead time' });
  }

  const cal = readCalibrations(input.calibrations, runsById, detectorIds);
  diagnostics.push(...cal.diagnostics);
  if (input.calibrations.length === 0) {
    diagnostics.push({ severity: 'error', rule: 'series-no-calibration', message: 'calibrations/ holds no calibration file', file: 'calibrations/', stage: 'ingest' });
  }

  const spectrumFiles = new Map<string, string>();
  // File names compare without regard to case (r003.CSV from some acquisition PCs).
  const listed = new Map(input.spectra.map((n) => [n.toLowerCase(), n]));
  for (const r of log.runs) {
    if (!reduced(r)) continue;
    const rel = `spectra/${r.run}.csv`;
    const where = { file: input.runlog.file, line: r.line, run: r.run, stage: 'ingest' as const };
    const errs: Diagnostic[] = [];
    if (r.target !== '' && !targetIds.has(r.target)) {
      errs.push({ severity: 'error', rule: 'run-unknown-target', message: `target "${r.target}" is not defined in series.yaml`, expected: [...targetIds].join(', '), actual: r.target, ...where, column: r.targetColumn });
    } else if (r.kind === 'reference' && config.normalization.reference_target !== undefined && r.target !== config.normalization.reference_target) {
      errs.push({ severity: 'error', rule: 'run-reference-target', message: `reference run on target "${r.target}", but the reference target is "${config.normalization.reference_target}"`, hint: 'mark the run as sample, or fix its target', ...where, column: r.targetColumn });
    }
    const actual = listed.get(`${r.run}.csv`.toLowerCase());
    if (actual !== undefined) spectrumFiles.set(r.run, `spectra/${actual}`);
    else errs.push({ severity: 'error', rule: 'run-missing-spectrum', message: `spectrum file ${rel} is missing`, ...where });
    if (scalers !== null) {
      const per = scalers.get(r.run);
      const missing = config.detectors.filter((d) => !per?.has(d.id)).map((d) => d.id);
      if (missing.length > 0 && !aside.has(r.run)) {
        errs.push({ severity: 'error', rule: 'run-missing-scalers', message: `scalers.csv has no live time or pulser counts for run ${r.run}, detector(s) ${missing.join(', ')} (run listed on runlog.csv line ${r.line})`, file: input.scalers!.file, run: r.run, stage: 'ingest', hint: 'add a row per detector to scalers.csv' });
      }
    }
    setAside(aside, r.run, errs);
  }
  for (const name of input.spectra) {
    const run = name.replace(/\.csv$/i, '');
    if (!runsById.has(run)) diagnostics.push({ severity: 'info', rule: 'spectrum-unlisted', message: `spectra/${name} belongs to no run in runlog.csv; ignored`, file: `spectra/${name}`, stage: 'ingest' });
  }

  const usableReference = log.runs.filter((r) => r.kind === 'reference' && !aside.has(r.run));
  // internal-reference and absolute normalize without reference runs.
  const needsReferenceRuns = config.normalization.method === 'reference-run' || config.normalization.method === 'monitor';
  if (usableReference.length === 0 && needsReferenceRuns) {
    diagnostics.push({ severity: 'error', rule: 'series-no-reference-run', message: 'no usable reference run: the series cannot be normalized', file: input.runlog.file, stage: 'ingest', hint: `add runs of kind "reference" on target ${config.normalization.reference_target}` });
    for (const [, ds] of aside) diagnostics.push(...ds);
    return { ok: false, diagnostics };
  }

  return {
    ok: true,
    series: { seriesDir: input.seriesDir, config, runs: log.runs, scalers, calibrations: cal.versions, spectrumFiles, setAside: aside, diagnostics, stoppingTables: stopping.tables },
  };
}
