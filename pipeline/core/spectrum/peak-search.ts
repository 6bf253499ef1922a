// Smoothed second differences: M.A. Mariscotti, "A method for automatic identification of peaks in the presence of background and its application to spectrum analysis", Nucl. Instrum. Methods 50, 309-320 (1967).
/**
 * Candidate peaks of a spectrum by Mariscotti's generalized second difference:
 *   S_i = Σ_j C_j n_{i+j},   F_i = Σ_j C_j² n_{i+j} (its variance for Poisson counts),
 * the kernel C being the second difference (1, −2, 1) convolved z times with a w-point box (a running
 * sum). C sums to zero and has zero first moment, so S vanishes on any linear background; on a peak
 * S is negative. A candidate is a local maximum of the significance −S_i/√F_i at or above
 * `threshold`; its centroid is refined by a parabola through −S at the maximum and its neighbours.
 * Defaults follow Mariscotti's recommendation as remembered (from memory): z = 5 passes and a
 * box of w ≈ 0.6·FWHM channels, taken as the odd w = 2·round(0.3·FWHM) + 1, at least 3.
 * The area estimate divides −S at the centroid by the filter's response to a unit-area Gaussian of
 * the given FWHM (channels).
 */
export interface PeakCandidate {
  /** Fractional channel. */
  centroidChannel: number;
  /** −S/√F at the maximum, standard deviations. */
  significance: number;
  /** Rough peak area, counts (for start values and line assignment). */
  areaEstimate: number;
}

export interface PeakSearchOptions {
  /** Expected FWHM, channels. */
  fwhmChannels: number;
  /** Minimum significance −S/√F. Default 5 (common practice for an automatic search). */
  threshold?: number;
  /** Smoothing passes z. Default 5. */
  passes?: number;
  /** Box width w (odd, channels). Default the odd number nearest 0.6·FWHM, at least 3. */
  boxWidth?: number;
}

export function secondDifferenceKernel(boxWidth: number, passes: number): Float64Array {
  let k = Float64Array.from([1, -2, 1]);
  for (let p = 0; p < passes; p++) {
    const next = new Float64Array(k.length + boxWidth - 1);
    for (let i = 0; i < k.length; i++) for (let b = 0; b < boxWidth; b++) next[i + b] += k[i]!;
    k = next;
  }
  return k;
}

export function searchPeaks(counts: ArrayLike<number>, options: PeakSearchOptions): PeakCandidate[] {
  const fwhm = options.fwhmChannels;
  if (!(fwhm > 0)) throw new RangeError(`peak search needs fwhmChannels > 0, got ${fwhm}`);
  const passes = options.passes ?? 5;
  const w = options.boxWidth ?? Math.max(3, 2 * Math.round(0.3 * fwhm) + 1);
  const threshold = options.threshold ?? 5;
  const c = secondDifferenceKernel(w, passes);
  const half = (c.length - 1) / 2;
  const n = counts.length;
  const s = new Float64Array(n);
  const sig = new Float64Array(n);
  for (let i = half; i < n - half; i++) {
    let si = 0;
    let fi = 0;
    for (let j = 0; j < c.length; j++) {
      const v = counts[i - half + j]!;
      si += c[j]! * v;
      fi += c[j]! * c[j]! * v;
    }
    s[i] = si;
    sig[i] = fi > 0 ? -si / Math.sqrt(fi) : 0;
  }
  // Response of the filter at the centre of a unit-area Gaussian of this FWHM.
  const sigma = fwhm / (2 * Math.sqrt(2 * Math.LN2));
  let unit = 0;
  for (let j = 0; j < c.length; j++) unit += c[j]! * Math.exp(-0.5 * ((j - half) / sigma) ** 2) / (sigma * Math.sqrt(2 * Math.PI));
  const out: PeakCandidate[] = [];
  for (let i = half + 1; i < n - half - 1; i++) {
    if (sig[i]! < threshold || sig[i]! < sig[i - 1]! || sig[i]! <= sig[i + 1]!) continue;
    const ym = -s[i - 1]!;
    const y0 = -s[i]!;
    const yp = -s[i + 1]!;
    const denom = ym - 2 * y0 + yp;
    const shift = denom < 0 ? (0.5 * (ym - yp)) / denom : 0;
    out.push({ centroidChannel: i + Math.max(-0.5, Math.min(0.5, shift)), significance: sig[i]!, areaEstimate: y0 / -unit });
  }
  return out;
}
