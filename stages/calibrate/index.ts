import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { EnergyCalibration } from '../../pipeline/core/calibration/energy-calibration.js';
import type { CalibrationVersion, RunRecord } from '../../pipeline/core/model/series-model.js';
import { chooseVersion } from './choose-version.js';

export interface CalibrateInput {
  runs: readonly RunRecord[];
  versions: readonly CalibrationVersion[];
  detectorIds: readonly string[];
  runlogFile: string;
}

export interface RunCalibration {
  version: string;
  file: string;
  detectors: Map<string, EnergyCalibration>;
}

export interface CalibrateOutput {
  byRun: Map<string, RunCalibration>;
  /** Run → errors that set it aside. */
  setAside: Map<string, Diagnostic[]>;
}

/**
 * calibrate: pick, per run, the one calibration version whose validity covers it, and check
 * that it calibrates every detector. Channel ↔ energy itself is
 * pipeline/core/calibration/energy-calibration.ts, shared with the later stages.
 */
export function calibrate(input: CalibrateInput): CalibrateOutput {
  const byRun = new Map<string, RunCalibration>();
  const setAside = new Map<string, Diagnostic[]>();
  for (const run of input.runs) {
    const where = { file: input.runlogFile, line: run.line, run: run.run, stage: 'calibrate' as const };
    const choice = chooseVersion(input.versions, run);
    if (!choice.ok) {
      const message =
        choice.reason === 'none'
          ? `no calibration version covers run ${run.run} (position ${run.index + 1} in runlog.csv, started ${run.startedAt})`
          : choice.reason === 'ambiguous'
            ? `calibration versions ${choice.candidates.join(', ')} all cover run ${run.run} and none supersedes the other`
            : `calibration versions ${choice.candidates.join(', ')} supersede each other in a cycle`;
      const hint =
        choice.reason === 'none'
          ? 'add or extend a calibration version (valid_from_run / valid_to_run) to cover this run'
          : 'write a new version that lists the one it replaces in supersedes: [...]';
      setAside.set(run.run, [{ severity: 'error', rule: `calibration-${choice.reason}`, message, hint, ...where }]);
      continue;
    }
    const v = choice.version;
    const missing = input.detectorIds.filter((d) => !v.detectors.has(d));
    if (missing.length > 0) {
      setAside.set(run.run, [{ severity: 'error', rule: 'calibration-missing-detector', message: `calibration ${v.version} (${v.file}) has no entry for detector(s) ${missing.join(', ')}`, ...where }]);
      continue;
    }
    byRun.set(run.run, { version: v.version, file: v.file, detectors: v.detectors });
  }
  return { byRun, setAside };
}
