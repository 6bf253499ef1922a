import type { PeakRequest } from '../../core/counting/peak-window.js';

/** The fit settings of a series (extract.fit_*), as plain data a worker can take. */
export interface FitSettings {
  regionFwhm: number;
  background: 'none' | 'constant' | 'linear' | 'quadratic';
  step: 'none' | 'erfc';
  positions: 'tied' | 'tied-gain' | 'free';
  widths: 'shared' | 'free';
  tail: 'none' | 'fixed' | 'shared' | 'free';
  tailFraction: number;
  tailLengthFwhm: number;
  flagProbability: number;
}

/** One multiplet to fit in one detector of a run: the task's requests it holds (expected-energy order). */
export interface FitTask {
  /** The peaks' fit_group, or the label of a peak fitted alone. */
  groupKey: string;
  detector: string;
  requestIndices: number[];
}

/** Gain-drift tracking of a run: which requests may serve as the tracking peak, per detector the strongest of them. */
export interface DriftTask {
  mode: 'track' | 'correct';
  toleranceKeV: number;
  /** Request indices (any detector) that may be tracked. */
  candidates: number[];
  /** The tracking fit reaches this many expected FWHM either side of the expected energy. */
  regionFwhm: number;
}

/** Result of a group fit, plain data (numbers that may be NaN live in Float64Arrays so a JSON cache keeps them). */
export interface FitOutcome {
  groupKey: string;
  detector: string;
  requestIndices: number[];
  /** '' when the fit ran; else why it could not (peak outside the spectrum, region too short). */
  problem: string;
  firstChannel: number;
  channelCount: number;
  converged: boolean;
  stopReason: string;
  iterations: number;
  /** [deviance, dof, deviance/dof, upper-tail P of the deviance, residual runs, expected runs, runs z, runs P(too few)]. */
  quality: Float64Array;
  parameterNames: string[];
  /** Value and standard uncertainty per parameter, interleaved. */
  parameters: Float64Array;
  atBound: boolean[];
  /** Per line (requestIndices order): area, area unc, centroid (channel), its unc, σ (channel), its unc. */
  peaks: Float64Array;
  /** K×K correlation of the areas, row-major. */
  areaCorrelation: Float64Array;
  observed: Float64Array;
  model: Float64Array;
  /**
   * The fitted model's background per channel of the region (polynomial and step, the peaks' areas
   * set to zero), counts. Absent in results cached before it was kept.
   */
  background?: Float64Array;
  residuals: Float64Array;
  /** Quality flags of the whole fit (fit-not-converged, fit-poor-deviance, …). */
  flags: string[];
}

export const PEAK_VALUES_PER_LINE = 6;

/** Per detector of a run: the tracking peak's shift from the calibration's prediction and the gain factor applied. */
export interface DriftOutcome {
  detectors: string[];
  /** Tracked request index per detector (−1: none found). */
  requestIndex: number[];
  /** Per detector: shift keV, its unc keV, gain factor (1 when not corrected). */
  values: Float64Array;
}

/**
 * Groups the fitted peaks of one run: per detector, the requests whose peak has `method: fit`,
 * one group per `fit_group` (a peak without one is its own group). Requests are the run's
 * PeakRequests; `labels[i]` is the configured label of request i.
 */
export function planFits(peaks: readonly { label: string; method: string; fit_group?: string | undefined }[], requests: readonly PeakRequest[], labels: readonly string[]): FitTask[] {
  const byLabel = new Map(peaks.map((p) => [p.label, p]));
  const groups = new Map<string, FitTask>();
  requests.forEach((r, i) => {
    const peak = byLabel.get(labels[i]!);
    if (peak === undefined || peak.method !== 'fit' || !Number.isFinite(r.expectedEnergyKeV)) return;
    const groupKey = peak.fit_group ?? r.key;
    const key = `${r.detector}\t${groupKey}`;
    let g = groups.get(key);
    if (g === undefined) groups.set(key, (g = { groupKey, detector: r.detector, requestIndices: [] }));
    g.requestIndices.push(i);
  });
  for (const g of groups.values()) g.requestIndices.sort((a, b) => requests[a]!.expectedEnergyKeV - requests[b]!.expectedEnergyKeV || a - b);
  return [...groups.values()];
}
