/**
 * Sums a spectrum into at most `maxBins` bins of equal whole-channel width
 * w = ceil(channels / maxBins); bin i holds channels [i·w, (i+1)·w − 1], the last bin what is left.
 * Writes into `out` at `offset` (so many detectors fill one flat array) and returns the width.
 */
export function rebinCounts(counts: ArrayLike<number>, maxBins: number, out: Float64Array, offset: number): number {
  const n = counts.length;
  const w = Math.max(1, Math.ceil(n / Math.max(1, maxBins)));
  const bins = Math.ceil(n / w);
  for (let b = 0; b < bins; b++) {
    let s = 0;
    const hi = Math.min(n, (b + 1) * w);
    for (let ch = b * w; ch < hi; ch++) s += counts[ch]!;
    out[offset + b] = s;
  }
  return w;
}

/** Number of bins `rebinCounts` makes of `channels` channels. */
export function rebinnedLength(channels: number, maxBins: number): number {
  const w = Math.max(1, Math.ceil(channels / Math.max(1, maxBins)));
  return Math.ceil(channels / w);
}
