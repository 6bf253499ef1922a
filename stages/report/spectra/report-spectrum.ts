/**
 * A spectrum as the summary page draws it: counts rebinned to at most a few hundred bins
 * (so a page of many spectra stays small), the run's energy calibration for the energy axis,
 * and any curves drawn over it. Windows come from yields.arrow rows of the same run and detector.
 */
export interface ReportSpectrum {
  run: string;
  detector: string;
  /** Channels in the original spectrum. */
  channelCount: number;
  /** Channels per bin: bin i sums channels [i·w, (i+1)·w − 1] (the last bin may be partial). */
  binWidthChannels: number;
  /** Counts per bin. */
  counts: ArrayLike<number>;
  /** E(ch) = offset + gain·ch + quadratic·ch², keV, at the centre of channel ch (absent: channel axis). */
  calibration?: { offsetKeV: number; gainKeVPerChannel: number; quadraticKeVPerChannel2: number };
  /** Curves over the counts, in counts per channel at channel positions: a fitted model, its background. */
  curves?: readonly SpectrumCurve[];
}

export interface SpectrumCurve {
  /** Legend text, e.g. "fit: 12C elastic". */
  label: string;
  role: 'model' | 'background';
  /** Channel positions (fractional allowed). */
  channel: ArrayLike<number>;
  /** Model value at each position, counts per channel. */
  countsPerChannel: ArrayLike<number>;
}
