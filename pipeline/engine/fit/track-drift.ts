import { channelToEnergyKeV, type EnergyCalibration } from '../../core/calibration/energy-calibration.js';
import { netCounts } from '../../core/counting/net-counts.js';
import { planPeakWindow, type PeakRequest, type WindowWidths } from '../../core/counting/peak-window.js';
import { measureWindowSums } from '../../core/counting/window-sums.js';
import { fitGroup } from './fit-group.js';
import { type DriftOutcome, type DriftTask, type FitSettings } from './fit-plan.js';

const TRACKING_FIT: Omit<FitSettings, 'regionFwhm'> = {
  background: 'linear', step: 'none', positions: 'free', widths: 'shared', tail: 'none', tailFraction: 0, tailLengthFwhm: 1, flagProbability: 0.001,
};

/**
 * Gain drift of one run, per detector: among the candidate requests of the detector the one
 * with the most net window counts is the tracking peak; a single Gaussian on a linear
 * background, centroid free, is fitted around its expected energy (Poisson ML, fit-group.ts),
 * and the shift is E(c) − E_expected (keV) through the run's calibration, with u = (dE/dch)·u(c).
 * `correct`, where |shift| exceeds the tolerance: the gain factor k = (E_expected − offset)/(E(c) − offset)
 * rescales gain and quadratic coefficients so the tracking peak sits at its expected energy (offset
 * kept; common practice for a gain-only drift); otherwise, and with `track`, k = 1.
 */
export function trackDrift(
  spectra: readonly Float64Array[], detectorIds: readonly string[], calibrations: Readonly<Record<string, EnergyCalibration>>,
  requests: readonly PeakRequest[], widths: WindowWidths, drift: DriftTask,
): DriftOutcome {
  const values = new Float64Array(detectorIds.length * 3).fill(Number.NaN);
  const requestIndex = detectorIds.map((detector, di) => {
    const counts = spectra[di]!;
    const cal = calibrations[detector]!;
    let best = -1;
    let bestNet = 0;
    for (const i of drift.candidates) {
      const r = requests[i]!;
      if (r.detector !== detector || !Number.isFinite(r.expectedEnergyKeV)) continue;
      const w = planPeakWindow(cal, counts.length, r.expectedEnergyKeV, r.fwhmKeV, widths);
      if (w.peak === null) continue;
      const net = netCounts(measureWindowSums(counts, w.peak, w.left, w.right), w.peak, w.left, w.right).net;
      if (net > bestNet) {
        bestNet = net;
        best = i;
      }
    }
    values[3 * di + 2] = 1;
    if (best < 0) return -1;
    const fit = fitGroup(counts, cal, requests, { groupKey: 'tracking', detector, requestIndices: [best] }, { ...TRACKING_FIT, regionFwhm: drift.regionFwhm });
    const area = fit.peaks[0]!;
    if (fit.problem !== '' || !fit.converged || !(area > 0) || !(fit.peaks[3]! > 0)) return -1;
    const c = fit.peaks[2]!;
    const measuredKeV = channelToEnergyKeV(cal, c);
    const expectedKeV = requests[best]!.expectedEnergyKeV;
    const slope = cal.gainKeVPerChannel + 2 * cal.quadraticKeVPerChannel2 * c;
    values[3 * di] = measuredKeV - expectedKeV;
    values[3 * di + 1] = slope * fit.peaks[3]!;
    if (drift.mode === 'correct' && Math.abs(measuredKeV - expectedKeV) > drift.toleranceKeV) values[3 * di + 2] = (expectedKeV - cal.offsetKeV) / (measuredKeV - cal.offsetKeV);
    return best;
  });
  return { detectors: [...detectorIds], requestIndex, values };
}

/** The calibration with its gain and quadratic coefficients scaled by k (covariance rows and columns too). */
export function scaledGainCalibration(cal: EnergyCalibration, k: number): EnergyCalibration {
  if (k === 1 || !Number.isFinite(k)) return cal;
  const scale = (i: number) => (i === 0 ? 1 : k);
  return {
    ...cal,
    gainKeVPerChannel: cal.gainKeVPerChannel * k,
    quadraticKeVPerChannel2: cal.quadraticKeVPerChannel2 * k,
    covariance: cal.covariance.map((row, i) => row.map((v, j) => v * scale(i) * scale(j))),
  };
}

