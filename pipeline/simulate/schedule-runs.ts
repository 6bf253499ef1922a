import type { SimulationSpec } from './simulation-spec.js';
import { sampleEnergiesKeV } from './sample-energies.js';

export interface PlannedRun {
  /** 1-based position in runlog.csv. */
  index: number;
  run: string;
  /** calibration: inserted by insertCalibrationRuns (spec.calibration_runs), never by scheduleRuns. */
  kind: 'sample' | 'reference' | 'calibration';
  target: string;
  beamEnergyKeV: number;
  /** True integrated charge (the runlog gets this × charge_reading_factor). */
  trueChargeUC: number;
  /** real_time_s = charge / current, rounded to the 1 ms it is written with. */
  realTimeS: number;
  startedAtMs: number;
  /** Index into spec.calibrations of the version in force. */
  calibration: number;
  scalerMode: 'live_time' | 'pulser';
}

/**
 * The run plan: a reference run first, then each energy's sample runs in order, a reference run
 * after every `reference_every` sample runs, and a reference run last. A reference run takes the
 * fixed reference energy if one is given, else the energy of the sample run before it (the
 * first one: of the sample run after it).
 */
export function scheduleRuns(spec: SimulationSpec): PlannedRun[] {
  const s = spec.schedule;
  const kinds: { kind: 'sample' | 'reference'; energyKeV: number }[] = [];
  const energies = sampleEnergiesKeV(spec.energies_keV);
  const samples = energies.flatMap((e) => Array.from({ length: s.samples_per_energy }, () => e));
  const refEnergy = (e: number) => s.reference_beam_energy_keV ?? e;
  samples.forEach((e, i) => {
    if (i === 0) kinds.push({ kind: 'reference', energyKeV: refEnergy(e) });
    kinds.push({ kind: 'sample', energyKeV: e });
    if ((i + 1) % s.reference_every === 0 || i === samples.length - 1) kinds.push({ kind: 'reference', energyKeV: refEnergy(e) });
  });
  const width = Math.max(3, String(kinds.length).length);
  let clockMs = Math.round(Date.parse(s.start_at) / 1000) * 1000;
  return kinds.map((k, i) => {
    const index = i + 1;
    const isSample = k.kind === 'sample';
    const trueChargeUC = isSample ? spec.charge.sample_uC : spec.charge.reference_uC;
    const currentNA = isSample ? spec.charge.beam_current_nA.sample : spec.charge.beam_current_nA.reference;
    const realTimeS = Math.round((trueChargeUC * 1e6) / currentNA) / 1000;
    const run: PlannedRun = {
      index,
      run: `r${String(index).padStart(width, '0')}`,
      kind: k.kind,
      // checkSimulationSpec requires a reference target: the plan always holds reference runs.
      target: isSample ? s.sample_target : spec.normalization.reference_target!,
      beamEnergyKeV: k.energyKeV,
      trueChargeUC,
      realTimeS,
      startedAtMs: clockMs,
      calibration: lastStartingAtOrBefore(spec.calibrations, index),
      scalerMode: spec.scalers.modes[lastStartingAtOrBefore(spec.scalers.modes, index)]!.mode,
    };
    clockMs += Math.round(realTimeS + s.changeover_s) * 1000;
    return run;
  });
}

/** Index of the last entry whose from_run_index <= runIndex (entries sorted by from_run_index). */
function lastStartingAtOrBefore(entries: readonly { from_run_index: number }[], runIndex: number): number {
  let found = 0;
  entries.forEach((e, i) => {
    if (e.from_run_index <= runIndex) found = i;
  });
  return found;
}
