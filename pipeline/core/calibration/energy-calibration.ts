/**
 * Channel ↔ energy: E(ch) = offset + gain·ch + quadratic·ch² is the energy at the centre
 * of channel ch (DESIGN.md). The covariance of the coefficients, in the order
 * [offset, gain(, quadratic)], gives var E(ch) = J C Jᵀ with J = [1, ch, ch²].
 */
export interface EnergyCalibration {
  version: string;
  offsetKeV: number;
  gainKeVPerChannel: number;
  quadraticKeVPerChannel2: number;
  /** Square, order [offset, gain(, quadratic)]; zeros when the file gives none. */
  covariance: number[][];
}

export function channelToEnergyKeV(cal: EnergyCalibration, channel: number): number {
  return cal.offsetKeV + channel * (cal.gainKeVPerChannel + channel * cal.quadraticKeVPerChannel2);
}

/** The channel (fractional) whose centre has energy `energyKeV`, on the rising branch. */
export function energyToChannel(cal: EnergyCalibration, energyKeV: number): number {
  const a = cal.quadraticKeVPerChannel2;
  const b = cal.gainKeVPerChannel;
  const c = cal.offsetKeV - energyKeV;
  if (a === 0) return -c / b;
  const disc = b * b - 4 * a * c;
  if (disc < 0) return a < 0 ? -b / (2 * a) : Number.NaN;
  // Numerically stable root of the branch where dE/dch = b + 2 a ch > 0.
  const q = -0.5 * (b + Math.sign(b) * Math.sqrt(disc));
  const r1 = q / a;
  const r2 = c / q;
  const rising = (ch: number) => b + 2 * a * ch > 0;
  if (rising(r2) && (!rising(r1) || Math.abs(r2) <= Math.abs(r1))) return r2;
  return rising(r1) ? r1 : r2;
}

/** Standard uncertainty of E(ch) from the coefficient covariance, keV. */
export function energyUncertaintyKeV(cal: EnergyCalibration, channel: number): number {
  const j = [1, channel, channel * channel];
  const n = cal.covariance.length;
  let v = 0;
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) v += j[i]! * cal.covariance[i]![k]! * j[k]!;
  return Math.sqrt(Math.max(v, 0));
}
