import { energyToChannel, type EnergyCalibration } from '../calibration/energy-calibration.js';

/**
 * Where to integrate a peak: a channel window centred on the expected energy, and a
 * background window on each side (widths in units of the expected FWHM). A channel
 * belongs to a window when its centre energy lies inside the window's energy interval
 * (common practice for window sums).
 */
export interface WindowWidths {
  peak_half_width_fwhm: number;
  background_gap_fwhm: number;
  background_width_fwhm: number;
}

/** Inclusive channel range. */
export interface ChannelRange {
  lo: number;
  hi: number;
}

export interface PeakWindow {
  expectedEnergyKeV: number;
  expectedChannel: number;
  fwhmKeV: number;
  peak: ChannelRange | null;
  left: ChannelRange | null;
  right: ChannelRange | null;
  /** Energy intervals of the windows (keV), for overlap checks and plots. */
  peakKeV: [number, number];
  leftKeV: [number, number];
  rightKeV: [number, number];
  flags: string[];
}

function channelRange(cal: EnergyCalibration, channelCount: number, eLoKeV: number, eHiKeV: number): { range: ChannelRange | null; clipped: boolean } {
  const lo = Math.ceil(energyToChannel(cal, eLoKeV) - 1e-9);
  const hi = Math.floor(energyToChannel(cal, eHiKeV) + 1e-9);
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { range: null, clipped: true };
  const cLo = Math.max(lo, 0);
  const cHi = Math.min(hi, channelCount - 1);
  if (cHi < cLo) return { range: null, clipped: true };
  return { range: { lo: cLo, hi: cHi }, clipped: cLo !== lo || cHi !== hi };
}

export function planPeakWindow(
  cal: EnergyCalibration,
  channelCount: number,
  expectedEnergyKeV: number,
  fwhmKeV: number,
  widths: WindowWidths,
): PeakWindow {
  const h = widths.peak_half_width_fwhm * fwhmKeV;
  const g = widths.background_gap_fwhm * fwhmKeV;
  const w = widths.background_width_fwhm * fwhmKeV;
  const e = expectedEnergyKeV;
  const peakKeV: [number, number] = [e - h, e + h];
  const leftKeV: [number, number] = [e - h - g - w, e - h - g];
  const rightKeV: [number, number] = [e + h + g, e + h + g + w];
  const flags: string[] = [];
  const peak = channelRange(cal, channelCount, ...peakKeV);
  const left = channelRange(cal, channelCount, ...leftKeV);
  const right = channelRange(cal, channelCount, ...rightKeV);
  const expectedChannel = energyToChannel(cal, e);
  if (peak.range === null || !(expectedChannel >= 0 && expectedChannel <= channelCount - 1)) flags.push('peak-outside-spectrum');
  else if (peak.clipped) flags.push('peak-window-clipped');
  if (left.range === null || left.clipped || right.range === null || right.clipped) {
    if (left.range === null && right.range === null) flags.push('no-background-window');
    else flags.push('background-window-clipped');
  }
  return {
    expectedEnergyKeV: e,
    expectedChannel,
    fwhmKeV,
    peak: flags.includes('peak-outside-spectrum') ? null : peak.range,
    left: left.range,
    right: right.range,
    peakKeV,
    leftKeV,
    rightKeV,
    flags,
  };
}

/** A peak a stage wants measured in one detector of one run: where it should be and how wide. */
export interface PeakRequest {
  /** Peak label, or `reference <element>` for the normalizing peak. */
  key: string;
  detector: string;
  expectedEnergyKeV: number;
  fwhmKeV: number;
}

/** A measured peak: the window actually used (after clipping to the spectrum) and its net counts. */
export interface MeasuredPeak {
  request: PeakRequest;
  window: PeakWindow;
  /** null when the window lies outside the spectrum. */
  net: import('./net-counts.js').NetCounts | null;
  /** Centroid shift from the expected energy, keV (NaN when not measurable). */
  shiftKeV: number;
  /** Present when the peak was fitted (method: fit): its multiplet, fit quality and area correlations with the group's other peaks. */
  fit?: MeasuredFit;
}

/** Summary of the fit a fitted peak comes from (full results in fits.arrow). */
export interface MeasuredFit {
  groupKey: string;
  converged: boolean;
  deviancePerDof: number;
  flags: string[];
  correlations: { key: string; rho: number }[];
}
