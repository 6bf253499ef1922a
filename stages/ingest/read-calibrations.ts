import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { loadYaml, zodIssuesToDiagnostics } from '../../pipeline/core/formats/yaml-source.js';
import { calibrationSchema } from '../../pipeline/core/config/calibration-schema.js';
import type { EnergyCalibration } from '../../pipeline/core/calibration/energy-calibration.js';
import type { CalibrationVersion, RunRecord } from '../../pipeline/core/model/series-model.js';
import { parseTimestampMs } from './parse-timestamp.js';

export interface CalibrationFileText {
  file: string;
  text: string;
}

/** Parses every calibrations/*.yaml; a broken file is a diagnostic and contributes no version. */
export function readCalibrations(files: readonly CalibrationFileText[], runs: ReadonlyMap<string, RunRecord>, detectorIds: ReadonlySet<string>): { versions: CalibrationVersion[]; diagnostics: Diagnostic[] } {
  const diagnostics: Diagnostic[] = [];
  const versions: CalibrationVersion[] = [];
  const byName = new Map<string, string>();
  for (const { file, text } of files) {
    const loaded = loadYaml(text, file);
    diagnostics.push(...loaded.diagnostics);
    if (loaded.source === null) continue;
    const src = loaded.source;
    const parsed = calibrationSchema.safeParse(src.value);
    if (!parsed.success) {
      diagnostics.push(...zodIssuesToDiagnostics(parsed.error.issues, src, 'ingest', 'calibration'));
      continue;
    }
    const c = parsed.data;
    const at = (path: (string | number)[]) => ({ file, ...(src.locate(path) ?? {}), stage: 'ingest' as const });
    const problems: Diagnostic[] = [];
    if (byName.has(c.version)) {
      problems.push({ severity: 'error', rule: 'calibration-duplicate-version', message: `version "${c.version}" is also defined in ${byName.get(c.version)}; this file is not used`, hint: 'a revision is a new version with its own name that supersedes the old one', ...at(['version']) });
    }
    const runIndex = (key: 'valid_from_run' | 'valid_to_run'): number | undefined => {
      const id = c[key];
      if (id === undefined) return undefined;
      const r = runs.get(id);
      if (r === undefined) {
        problems.push({ severity: 'error', rule: 'calibration-unknown-run', message: `${key} names run "${id}", which runlog.csv does not list; this version is not used`, ...at([key]) });
        return undefined;
      }
      return r.index;
    };
    const time = (key: 'valid_from' | 'valid_to'): number | undefined => {
      const t = c[key];
      if (t === undefined) return undefined;
      const ms = parseTimestampMs(t);
      if (ms === null) problems.push({ severity: 'error', rule: 'calibration-bad-time', message: `${key} "${t}" is not an ISO 8601 date-time`, ...at([key]) });
      return ms ?? undefined;
    };
    if ((c.valid_from_run !== undefined || c.valid_to_run !== undefined) && (c.valid_from !== undefined || c.valid_to !== undefined)) {
      problems.push({ severity: 'error', rule: 'calibration-mixed-validity', message: 'give the validity either by run (valid_from_run/valid_to_run) or by time (valid_from/valid_to), not both', ...at([]) });
    }
    const fromIndex = runIndex('valid_from_run');
    const toIndex = runIndex('valid_to_run');
    const fromMs = time('valid_from');
    const toMs = time('valid_to');
    if (fromIndex !== undefined && toIndex !== undefined && toIndex < fromIndex) {
      problems.push({ severity: 'error', rule: 'calibration-empty-range', message: `valid_to_run ${c.valid_to_run} comes before valid_from_run ${c.valid_from_run} in runlog.csv`, ...at(['valid_to_run']) });
    }
    const detectors = new Map<string, EnergyCalibration>();
    c.detectors.forEach((d, i) => {
      const n = d.quadratic_keV_per_channel2 === undefined ? 2 : 3;
      let cov: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
      if (d.covariance !== undefined) {
        const ok = d.covariance.length === n && d.covariance.every((r) => r.length === n) && d.covariance.every((r, k) => r[k]! >= 0);
        if (!ok) {
          problems.push({ severity: 'error', rule: 'calibration-bad-covariance', message: `covariance of detector ${d.id} must be a ${n}×${n} matrix with a non-negative diagonal (order [offset, gain${n === 3 ? ', quadratic' : ''}])`, detector: d.id, ...at(['detectors', i, 'covariance']) });
        } else cov = d.covariance;
      }
      if (!detectorIds.has(d.id)) {
        diagnostics.push({ severity: 'warning', rule: 'calibration-unknown-detector', message: `detector "${d.id}" is not in series.yaml; its calibration is ignored`, detector: d.id, ...at(['detectors', i, 'id']) });
      }
      if (detectors.has(d.id)) problems.push({ severity: 'error', rule: 'calibration-duplicate-detector', message: `detector ${d.id} is listed twice`, detector: d.id, ...at(['detectors', i, 'id']) });
      detectors.set(d.id, { version: c.version, offsetKeV: d.offset_keV, gainKeVPerChannel: d.gain_keV_per_channel, quadraticKeVPerChannel2: d.quadratic_keV_per_channel2 ?? 0, covariance: cov });
    });
    diagnostics.push(...problems);
    if (problems.length > 0) continue;
    byName.set(c.version, file);
    versions.push({ version: c.version, file, fromIndex, toIndex, fromMs, toMs, supersedes: c.supersedes, detectors });
  }
  return { versions, diagnostics };
}
