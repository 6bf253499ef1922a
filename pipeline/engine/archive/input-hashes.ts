import { createHash } from 'node:crypto';
import { canonicalJson } from '../canonical-json.js';
import type { ReduceDetail } from '../reduce-series.js';

export interface RunHashes {
  /** sha256 of the run's own inputs. */
  own: string;
  /** `own` plus the own hashes of the reference runs that normalize it (sample runs); = own otherwise. */
  input: string;
  calibrationVersion: string;
  referenceRuns: string[];
}

const sha = (s: string) => createHash('sha256').update(s).digest('hex');

/**
 * The unit of change of the archive ledger, per run: a content hash of
 *  - the software version and the sha256 of series.yaml (any edit re-reduces the whole series),
 *  - the run's runlog row (every field but its line and position),
 *  - its scalers rows (per detector, without line numbers),
 *  - the sha256 of its spectrum file (`pending` while it is still being written),
 *  - the content of the calibration version that applies to it (name and coefficients);
 * and for a sample run, the own hashes of the reference runs its bracketing normalization used
 * — so a changed or newly added reference run re-reduces exactly the sample runs it normalizes.
 * @param fileSha sha256 by path relative to the series folder, for runs not measured
 */
export function runInputHashes(detail: ReduceDetail, seriesYamlSha: string, softwareVersion: string, heldBack: ReadonlySet<string>, fileSha: ReadonlyMap<string, string>): Map<string, RunHashes> {
  const own = new Map<string, string>();
  const s = detail.series;
  for (const r of s.runs) {
    const { index: _i, line: _l, targetColumn: _c, ...row } = r;
    const scalers = s.scalers?.get(r.run);
    const cal = detail.calibrationByRun.get(r.run);
    const file = s.spectrumFiles.get(r.run);
    own.set(
      r.run,
      sha(
        canonicalJson({
          software: softwareVersion,
          config: seriesYamlSha,
          row,
          scalers: scalers ? [...scalers].sort(([a], [b]) => (a < b ? -1 : 1)).map(([d, { line: _x, ...v }]) => [d, v]) : null,
          spectrum: heldBack.has(r.run) ? 'pending' : (detail.spectrumSha256.get(r.run) || (file === undefined ? '' : (fileSha.get(file) ?? ''))),
          calibration: cal ? { version: cal.version, detectors: [...cal.detectors].sort(([a], [b]) => (a < b ? -1 : 1)) } : null,
        }),
      ),
    );
  }
  const out = new Map<string, RunHashes>();
  for (const r of s.runs) {
    const refs = detail.referenceRuns.get(r.run) ?? [];
    const mine = own.get(r.run)!;
    out.set(r.run, {
      own: mine,
      input: refs.length === 0 ? mine : sha(`${mine}\n${refs.map((x) => `${x} ${own.get(x) ?? ''}`).join('\n')}`),
      calibrationVersion: detail.calibrationByRun.get(r.run)?.version ?? '',
      referenceRuns: refs,
    });
  }
  return out;
}
