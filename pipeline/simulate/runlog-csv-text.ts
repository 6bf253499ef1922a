import { csvField, trimmed } from './format-number.js';
import type { PlannedRun } from './schedule-runs.js';

export const RUNLOG_HEADER = 'run,started_at,kind,target,beam_energy_keV,beam_energy_unc_keV,charge_uC,real_time_s,note';

/**
 * One runlog.csv line (DESIGN.md columns). charge_uC is what the integrator reads: the true
 * charge times `chargeReadingFactor`; started_at is ISO 8601 UTC to the second.
 */
export function runlogLine(run: PlannedRun, target: string, beamEnergyUncKeV: number, chargeReadingFactor: number): string {
  const startedAt = new Date(run.startedAtMs).toISOString().replace(/\.\d{3}Z$/, 'Z');
  return [
    run.run, startedAt, run.kind, csvField(target), trimmed(run.beamEnergyKeV, 3), trimmed(beamEnergyUncKeV, 3),
    trimmed(run.trueChargeUC * chargeReadingFactor, 4), trimmed(run.realTimeS, 3), '',
  ].join(',');
}
