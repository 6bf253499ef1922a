import type { PlannedRun } from './schedule-runs.js';
import type { SimulationSpec } from './simulation-spec.js';

export interface SeriesRun {
  run: PlannedRun;
  /** 1-based index in the plan without calibration runs (what from_run_index, defects and gain_drift count); 0 for a calibration run. */
  planIndex: number;
}

/**
 * The runs of a series with spec.calibration_runs: a calibration run (kind calibration, target
 * the source id) before the first run of every calibration version, runs renumbered in runlog
 * order and later start times moved by the inserted run's real time and changeover. Without
 * calibration_runs the plan is returned as it is (same ids, same random streams).
 */
export function insertCalibrationRuns(spec: SimulationSpec, plan: readonly PlannedRun[]): SeriesRun[] {
  const c = spec.calibration_runs;
  if (c === undefined) return plan.map((run) => ({ run, planIndex: run.index }));
  const out: { run: PlannedRun; planIndex: number }[] = [];
  let delayMs = 0;
  let lastVersion = -1;
  const stepMs = Math.round(c.real_time_s + spec.schedule.changeover_s) * 1000;
  for (const r of plan) {
    if (r.calibration !== lastVersion) {
      lastVersion = r.calibration;
      out.push({
        planIndex: 0,
        run: { ...r, kind: 'calibration', target: c.source_id, beamEnergyKeV: 0, trueChargeUC: 0, realTimeS: c.real_time_s, startedAtMs: r.startedAtMs + delayMs },
      });
      delayMs += stepMs;
    }
    out.push({ planIndex: r.index, run: { ...r, startedAtMs: r.startedAtMs + delayMs } });
  }
  const width = Math.max(3, String(out.length).length);
  out.forEach((s, i) => {
    s.run.index = i + 1;
    s.run.run = `r${String(i + 1).padStart(width, '0')}`;
  });
  return out;
}
