import type { SeriesConfig } from '../../core/config/series-schema.js';
import type { PeakRequest } from '../../core/counting/peak-window.js';
import { isElasticPeak } from '../../core/kinematics/peak-kinematics.js';
import { planFits, type DriftTask, type FitSettings, type FitTask } from './fit-plan.js';

/** The fit settings of a series from its extract.fit_* keys. */
export function fitSettings(config: SeriesConfig): FitSettings {
  const x = config.extract;
  return {
    regionFwhm: x.fit_region_fwhm, background: x.fit_background, step: x.fit_step, positions: x.fit_positions, widths: x.fit_widths,
    tail: x.fit_tail, tailFraction: x.fit_tail_fraction, tailLengthFwhm: x.fit_tail_length_fwhm, flagProbability: x.fit_flag_probability,
  };
}

/**
 * What a run's measure task needs beyond its windows: the multiplets to fit (sample runs, peaks
 * with method: fit) and the drift tracking (drift.mode track | correct). Tracking candidates:
 * a reference run's reference peaks; a sample run's `drift.tracking_peak`, or else its configured
 * elastic peaks (the strongest is chosen per detector when measuring). Absent keys leave the task
 * as it was, so a series without fits or drift measures exactly as before.
 * @param labels configured peak label of each request (a reference run: the request keys)
 */
export function measurePlan(config: SeriesConfig, kind: 'reference' | 'sample', requests: readonly PeakRequest[], labels: readonly string[]): { fits?: FitTask[]; fitSettings?: FitSettings; drift?: DriftTask } {
  const fits = kind === 'sample' ? planFits(config.peaks, requests, labels) : [];
  const out: { fits?: FitTask[]; fitSettings?: FitSettings; drift?: DriftTask } = fits.length ? { fits, fitSettings: fitSettings(config) } : {};
  const d = config.drift;
  if (d.mode === 'off') return out;
  const byLabel = new Map(config.peaks.map((p) => [p.label, p]));
  const candidates: number[] = [];
  requests.forEach((r, i) => {
    if (kind === 'reference') candidates.push(i);
    else if (d.tracking_peak !== undefined) {
      if (labels[i] === d.tracking_peak) candidates.push(i);
    } else {
      const p = byLabel.get(labels[i]!);
      if (p !== undefined && isElasticPeak(p) && p.detect === 'ejectile' && (p.ejectile === undefined || p.ejectile === config.beam.projectile)) candidates.push(i);
    }
  });
  return { ...out, drift: { mode: d.mode, toleranceKeV: d.tolerance_keV, candidates, regionFwhm: Math.max(2, config.extract.fit_region_fwhm) } };
}
