import type { SeriesRun } from './insert-calibration-runs.js';
import type { SimulationSpec } from './simulation-spec.js';

/**
 * Injects spec.gain_drift: for each drifting run, a copy of its calibration version (same name)
 * with the gain times gain_factor (all detectors or the one named) is appended to the spec's
 * calibrations and the run generated with it; the calibration files are written from the
 * original list, so the reduction sees the drift only in the spectra.
 */
export function withGainDrift(spec: SimulationSpec, runs: readonly SeriesRun[]): { spec: SimulationSpec; runs: SeriesRun[] } {
  if (spec.gain_drift.length === 0) return { spec, runs: [...runs] };
  const calibrations = [...spec.calibrations];
  const out = runs.map((s) => {
    const drift = spec.gain_drift.filter((d) => d.run_index === s.planIndex && s.planIndex > 0);
    if (drift.length === 0) return s;
    const base = spec.calibrations[s.run.calibration]!;
    const factor = (id: string) => drift.filter((d) => d.detector === undefined || d.detector === id).reduce((f, d) => f * d.gain_factor, 1);
    calibrations.push({ ...base, detectors: base.detectors.map((d) => ({ ...d, gain_keV_per_channel: d.gain_keV_per_channel * factor(d.id) })) });
    return { ...s, run: { ...s.run, calibration: calibrations.length - 1 } };
  });
  return { spec: { ...spec, calibrations }, runs: out };
}
