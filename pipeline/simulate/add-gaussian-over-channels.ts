import { normalUpperTail } from '../core/math/normal-cdf.js';

/** FWHM = 2 √(2 ln 2) σ for a Gaussian (common practice). */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/** Beyond this many σ from the centre a channel receives < 1e-18 of the yield and is skipped. */
const REACH_SIGMA = 9;

/**
 * Adds a Gaussian peak of total expected counts `yieldCounts` to a histogram of expected
 * counts, each channel receiving the exact integral of the Gaussian over its energy interval:
 *
 *   content(ch) += Y · [Φ((E_hi − μ)/σ) − Φ((E_lo − μ)/σ)],   E_lo,hi = offset + gain·(ch ∓ ½)
 *
 * (E(ch) = offset + gain·ch is the centre of channel ch, DESIGN.md), σ = FWHM / (2√(2 ln 2)).
 * Each channel edge u is evaluated once, as the tail beyond |u|, T(u) = Q(|u|) = ½ erfc(|u|/√2);
 * a channel then holds T(a) − T(b) (both edges above the centre), T(b) − T(a) (both below) or
 * 1 − T(a) − T(b) (straddling), so neither tail loses relative precision.
 * The part of the peak outside channels 0…N−1 is lost, as in a real ADC.
 * @param out expected counts per channel, modified in place
 * @param yieldCounts total expected counts of the peak
 * @param centreKeV peak centroid μ, keV
 * @param fwhmKeV full width at half maximum, keV (> 0)
 * @param offsetKeV calibration offset, keV (energy at the centre of channel 0)
 * @param gainKeVPerChannel calibration gain, keV per channel (> 0)
 */
export function addGaussianOverChannels(
  out: Float64Array, yieldCounts: number, centreKeV: number, fwhmKeV: number, offsetKeV: number, gainKeVPerChannel: number,
): void {
  if (!(fwhmKeV > 0)) throw new RangeError(`peak FWHM must be positive, got ${fwhmKeV} keV`);
  if (!(gainKeVPerChannel > 0)) throw new RangeError(`calibration gain must be positive, got ${gainKeVPerChannel} keV/channel`);
  if (!(yieldCounts >= 0)) throw new RangeError(`peak yield must be >= 0, got ${yieldCounts}`);
  if (yieldCounts === 0) return;
  const sigma = fwhmKeV / FWHM_PER_SIGMA;
  const centreChannel = (centreKeV - offsetKeV) / gainKeVPerChannel;
  const reachChannels = (REACH_SIGMA * sigma) / gainKeVPerChannel;
  const first = Math.max(0, Math.floor(centreChannel - reachChannels));
  const last = Math.min(out.length - 1, Math.ceil(centreChannel + reachChannels));
  const sigmaChannels = sigma / gainKeVPerChannel;
  let lower = (first - 0.5 - centreChannel) / sigmaChannels;
  let lowerTail = normalUpperTail(Math.abs(lower));
  for (let ch = first; ch <= last; ch++) {
    const upper = (ch + 0.5 - centreChannel) / sigmaChannels;
    const upperTail = normalUpperTail(Math.abs(upper));
    let p: number;
    if (lower >= 0) p = lowerTail - upperTail;
    else if (upper <= 0) p = upperTail - lowerTail;
    else p = 1 - lowerTail - upperTail;
    out[ch] = out[ch]! + yieldCounts * p;
    lower = upper;
    lowerTail = upperTail;
  }
}
