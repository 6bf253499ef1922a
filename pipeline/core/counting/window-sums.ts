import type { ChannelRange } from './peak-window.js';

/** Raw sums over one peak window and its background windows, as measured in a spectrum. */
export interface WindowSums {
  gross: number;
  /** Σ ch·counts over the peak window (for the centroid). */
  grossMoment: number;
  left: number;
  right: number;
}

function sum(counts: Float64Array, r: ChannelRange | null): number {
  if (r === null) return 0;
  let s = 0;
  for (let i = r.lo; i <= r.hi; i++) s += counts[i]!;
  return s;
}

export function measureWindowSums(counts: Float64Array, peak: ChannelRange | null, left: ChannelRange | null, right: ChannelRange | null): WindowSums {
  let gross = 0;
  let moment = 0;
  if (peak !== null) {
    for (let i = peak.lo; i <= peak.hi; i++) {
      const c = counts[i]!;
      gross += c;
      moment += c * i;
    }
  }
  return { gross, grossMoment: moment, left: sum(counts, left), right: sum(counts, right) };
}
