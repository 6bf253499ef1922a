import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { seriesPeakPlanner } from '../core/kinematics/series-peak-planner.js';
import type { CalibrationVersion, RunRecord } from '../core/model/series-model.js';
import { ingest } from '../../stages/ingest/index.js';
import { ingestSpectrum } from '../../stages/ingest/ingest-spectrum.js';
import { chooseVersion, covers } from '../../stages/calibrate/choose-version.js';
import { fitDetectorCalibration } from '../../stages/calibrate/fit-detector-calibration.js';
import { sourceLines } from '../../stages/calibrate/source-lines.js';
import { calibrationFileText, type FittedDetector } from './calibrate/calibration-file-text.js';
import { formatCalibrationReport } from './calibrate/format-calibration-report.js';
import { writeNewFileAtomic } from './calibrate/write-new-file.js';
import { EXIT } from './exit-codes.js';
import { readSeriesFiles } from './read-series-files.js';

export interface CalibrateOptions {
  seriesDir: string;
  /** Fit and report, write nothing. */
  dryRun?: boolean;
}

export interface CalibratedRun {
  run: string;
  source: string;
  version: string;
  file: string;
  validToRun: string | undefined;
  supersedes: string[];
  detectors: FittedDetector[];
  written: boolean;
}

export interface CalibrateResult {
  exitCode: number;
  diagnostics: Diagnostic[];
  calibrated: CalibratedRun[];
  /** Human-readable residual report. */
  report: string;
}

/**
 * `xsred calibrate <series-dir>`: every run of kind calibration whose target is a
 * `calibration_sources` entry is fitted detector by detector (stages/calibrate), and each run
 * gives a new calibration version in calibrations/: valid from that run up to the run before the
 * next calibration run (open-ended for the last), superseding every existing version that covers
 * a run in that range. Files are written atomically and never over an existing file; a run any of
 * whose detectors fails gives no file (the reduction would set its runs aside) and exit code 3.
 */
export function calibrateSeries(opts: CalibrateOptions): CalibrateResult {
  const seriesDir = resolve(opts.seriesDir);
  const files = readSeriesFiles(seriesDir);
  const ing = ingest(files.input);
  if (!ing.ok) return { exitCode: EXIT.usage, diagnostics: [...files.diagnostics, ...ing.diagnostics], calibrated: [], report: '' };
  const { config, runs, calibrations } = ing.series;
  const diagnostics: Diagnostic[] = [];
  const sources = new Map(config.calibration_sources.map((s) => [s.id, s]));
  const calibrationRuns = runs.filter((r) => r.kind === 'calibration');
  const usable = calibrationRuns.filter((r) => {
    if (sources.has(r.target)) return true;
    diagnostics.push({ severity: 'error', stage: 'calibrate', rule: 'calibration-run-unknown-source', file: 'runlog.csv', line: r.line, run: r.run, message: `calibration run ${r.run} names target "${r.target}", which is not a calibration_sources id`, expected: [...sources.keys()].join(', ') || '(series.yaml has no calibration_sources)' });
    return false;
  });
  if (usable.length === 0) {
    diagnostics.push({ severity: 'error', stage: 'calibrate', rule: 'calibration-no-runs', file: 'runlog.csv', message: 'no run of kind calibration names a calibration source', hint: 'add calibration_sources to series.yaml and runs of kind calibration whose target is one of their ids' });
    return { exitCode: EXIT.usage, diagnostics, calibrated: [], report: '' };
  }
  const planner = seriesPeakPlanner(config, ing.series.stoppingTables);
  const listed = new Map(files.input.spectra.map((n) => [n.toLowerCase(), n]));
  const usedNames = new Set(calibrations.map((v) => v.version));
  const calibrated: CalibratedRun[] = [];
  let failed = 0;
  usable.forEach((run, k) => {
    const next = usable[k + 1];
    const validTo = next === undefined ? undefined : runs[next.index - 1]!;
    const prior = priorVersion(calibrations, run);
    const where = { stage: 'calibrate' as const, run: run.run };
    const name = listed.get(`${run.run}.csv`.toLowerCase());
    if (prior === null || name === undefined) {
      diagnostics.push({ severity: 'error', rule: prior === null ? 'calibration-no-prior' : 'run-missing-spectrum', ...where, message: prior === null ? 'calibrations/ holds no version to start the search from (its gain sets the search range)' : `spectrum file spectra/${run.run}.csv is missing` });
      failed++;
      return;
    }
    const file = `spectra/${name}`;
    const ingested = ingestSpectrum(readFileSync(join(seriesDir, file)), file, run.run, config.detectors.map((d) => d.id));
    diagnostics.push(...ingested.diagnostics);
    if (ingested.spectrum === null) {
      failed++;
      return;
    }
    const source = sources.get(run.target)!;
    const detectors: FittedDetector[] = [];
    config.detectors.forEach((det, di) => {
      let lines;
      try {
        lines = sourceLines(config, source, det, planner, run.beamEnergyKeV, run.beamEnergyUncKeV);
      } catch (e) {
        diagnostics.push({ severity: 'error', rule: 'calibration-source-lines', ...where, detector: det.id, message: (e as Error).message });
        return;
      }
      const r = fitDetectorCalibration(ingested.spectrum!.counts[di]!, lines, {
        fwhmKeV: det.resolution_fwhm_keV,
        prior: prior.detectors.get(det.id) ?? [...prior.detectors.values()][0]!,
        degree: config.calibrate.degree === 2 ? 2 : 1,
        searchThreshold: config.calibrate.search_threshold,
        matchToleranceKeV: config.calibrate.match_tolerance_keV,
        gainRangeRel: config.calibrate.gain_range_rel,
      });
      diagnostics.push(...r.diagnostics.map((d) => ({ ...d, ...where, detector: det.id })));
      if (r.ok) detectors.push({ id: det.id, fit: r.fit!, labels: r.points.map((p) => p.label ?? '') });
    });
    if (detectors.length < config.detectors.length) {
      diagnostics.push({ severity: 'error', rule: 'calibration-run-failed', ...where, message: `calibration run ${run.run}: ${config.detectors.length - detectors.length} of ${config.detectors.length} detectors could not be calibrated; no version written for it` });
      failed++;
      return;
    }
    let version = `cal-${run.run}`;
    for (let n = 2; usedNames.has(version) || existsSync(join(seriesDir, 'calibrations', `${version}.yaml`)); n++) version = `cal-${run.run}-${n}`;
    usedNames.add(version);
    const inRange = runs.filter((r) => r.index >= run.index && (validTo === undefined || r.index <= validTo.index));
    const supersedes = calibrations.filter((v) => inRange.some((r) => covers(v, r))).map((v) => v.version).sort();
    const text = calibrationFileText({ version, fromRun: run.run, validToRun: validTo?.run, supersedes, source: source.id, detectors });
    const path = join(seriesDir, 'calibrations', `${version}.yaml`);
    const written = opts.dryRun ? false : writeNewFileAtomic(path, new TextEncoder().encode(text));
    if (!opts.dryRun && !written) {
      diagnostics.push({ severity: 'error', rule: 'calibration-file-exists', ...where, file: `calibrations/${version}.yaml`, message: `calibrations/${version}.yaml appeared while fitting; not overwritten` });
      failed++;
    }
    calibrated.push({ run: run.run, source: source.id, version, file: `calibrations/${version}.yaml`, validToRun: validTo?.run, supersedes, detectors, written });
  });
  return { exitCode: failed > 0 ? EXIT.someSetAside : EXIT.ok, diagnostics, calibrated, report: formatCalibrationReport(calibrated, opts.dryRun ?? false) };
}

/** The version covering the run, else the latest-starting one before it, else the first: the start of the search. */
function priorVersion(versions: readonly CalibrationVersion[], run: RunRecord): CalibrationVersion | null {
  const choice = chooseVersion(versions, run);
  if (choice.ok) return choice.version;
  return versions[0] ?? null;
}
