import type { ChannelRange } from './peak-window.js';
import type { WindowSums } from './window-sums.js';

/**
 * Net peak counts above a linear background estimated from two side windows
 * (common practice in window analysis of pulse-height spectra; see e.g. Knoll,
 * Radiation Detection and Measurement, 4th ed. 2010, §4.VI on net area and its variance).
 *
 * With side sums S_L, S_R over n_L, n_R channels centred at x_L, x_R, the background level
 * per channel is the straight line through (x_L, S_L/n_L) and (x_R, S_R/n_R); summed over
 * the n_P peak channels centred at x_P:
 *   B = α S_L + β S_R,  α = (n_P/n_L)(1 − t),  β = (n_P/n_R) t,  t = (x_P − x_L)/(x_R − x_L)
 * and, counts being Poisson, var B = α² S_L + β² S_R, var N = G + var B for N = G − B.
 * With one side window only, the level is that window's mean (flat background).
 */
export interface NetCounts {
  gross: number;
  background: number;
  backgroundVariance: number;
  net: number;
  netVariance: number;
  /** Centroid of the net counts, fractional channel (NaN when net ≤ 0). */
  centroidChannel: number;
}

const width = (r: ChannelRange) => r.hi - r.lo + 1;
const centre = (r: ChannelRange) => 0.5 * (r.lo + r.hi);

export function netCounts(s: WindowSums, peak: ChannelRange, left: ChannelRange | null, right: ChannelRange | null): NetCounts {
  const nP = width(peak);
  const xP = centre(peak);
  let alpha = 0;
  let beta = 0;
  let slope = 0;
  let level = 0;
  if (left !== null && right !== null) {
    const t = (xP - centre(left)) / (centre(right) - centre(left));
    alpha = (nP / width(left)) * (1 - t);
    beta = (nP / width(right)) * t;
    slope = (s.right / width(right) - s.left / width(left)) / (centre(right) - centre(left));
    level = s.left / width(left) + slope * (xP - centre(left));
  } else if (left !== null) {
    alpha = nP / width(left);
    level = s.left / width(left);
  } else if (right !== null) {
    beta = nP / width(right);
    level = s.right / width(right);
  }
  const background = alpha * s.left + beta * s.right;
  const backgroundVariance = alpha * alpha * s.left + beta * beta * s.right;
  const net = s.gross - background;
  // Background moment Σ ch·(level + slope (ch − xP)) over the window = nP·xP·level + slope·Σ(ch − xP)².
  const sumSq = (nP * (nP * nP - 1)) / 12;
  const bgMoment = nP * xP * level + slope * sumSq;
  const centroidChannel = net > 0 ? (s.grossMoment - bgMoment) / net : Number.NaN;
  return { gross: s.gross, background, backgroundVariance, net, netVariance: s.gross + backgroundVariance, centroidChannel };
}
