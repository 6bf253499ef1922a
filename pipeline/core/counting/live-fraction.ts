import type { LiveScaler } from '../model/series-model.js';

/**
 * Live fraction of a detector's acquisition, f = live/real, and its standard uncertainty.
 *
 * - live-time clock: f = t_live / t_real; the clocks' own uncertainty is negligible
 *   against counting statistics (common practice), so u(f) = 0.
 * - pulser: f = n_counted / n_sent. Each pulse is recorded with probability f, so
 *   n_counted is binomial and u(f) = sqrt(f (1 − f) / n_sent) (binomial variance;
 *   e.g. Knoll, Radiation Detection and Measurement, 4th ed. 2010, §4.IV, dead-time by pulser).
 */
export interface LiveFraction {
  value: number;
  unc: number;
  source: 'live-time' | 'pulser' | 'none';
}

export function liveFraction(scaler: LiveScaler | undefined, realTimeS: number): LiveFraction {
  if (scaler === undefined) return { value: 1, unc: 0, source: 'none' };
  if (scaler.mode === 'live-time') return { value: scaler.liveTimeS / realTimeS, unc: 0, source: 'live-time' };
  const f = scaler.pulserCounted / scaler.pulserSent;
  return { value: f, unc: Math.sqrt((f * (1 - f)) / scaler.pulserSent), source: 'pulser' };
}
