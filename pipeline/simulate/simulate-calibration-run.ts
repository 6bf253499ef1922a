import { alphaSourceLines } from '../core/spectrum/alpha-source-lines.js';
import { samplePoisson } from '../core/random/sample-poisson.js';
import { Xoshiro128StarStar } from '../core/random/xoshiro128-star-star.js';
import { addGaussianOverChannels } from './add-gaussian-over-channels.js';
import type { PlannedRun } from './schedule-runs.js';
import type { SimulationSpec } from './simulation-spec.js';

/**
 * One calibration run with a mixed alpha source: per detector, every line of the named emitters
 * (DDEP energies and emission probabilities, alpha-source-lines.ts) as a Gaussian of the
 * detector's FWHM at the alpha energy (a thin source, no energy loss), expected counts
 * N·I_α/100 with N = counts_per_nuclide, on a flat background; each channel Poisson-sampled
 * with the run's own streams (seed, run, 1 + detector), as simulateRun does.
 */
export function simulateCalibrationRun(spec: SimulationSpec, run: PlannedRun): Int32Array[] {
  const c = spec.calibration_runs!;
  const calibration = spec.calibrations[run.calibration]!;
  const lines = alphaSourceLines(c.lines_from);
  return spec.detectors.map((det, di) => {
    const cal = calibration.detectors.find((d) => d.id === det.id)!;
    const expected = new Float64Array(spec.channels).fill(c.background_per_channel);
    for (const l of lines) addGaussianOverChannels(expected, (c.counts_per_nuclide * l.intensityPercent) / 100, l.energyKeV, det.resolution_fwhm_keV, cal.offset_keV, cal.gain_keV_per_channel);
    const rng = Xoshiro128StarStar.fromSeed(spec.seed, run.index, 1 + di);
    const out = new Int32Array(spec.channels);
    for (let ch = 0; ch < out.length; ch++) out[ch] = samplePoisson(rng, expected[ch]!);
    return out;
  });
}

/** Its runlog.csv line: kind calibration, the source as target, no beam or charge. */
export function calibrationRunlogLine(run: PlannedRun): string {
  const startedAt = new Date(run.startedAtMs).toISOString().replace(/\.\d{3}Z$/, 'Z');
  return [run.run, startedAt, 'calibration', run.target, '', '', '', String(run.realTimeS), 'mixed alpha source'].join(',');
}
