/**
 * Smooth background continuum in counts per keV per µC of true charge:
 *
 *   b(E) = flat + amplitude · exp(−E / decay)      (E in keV, E >= 0; nothing below 0 keV)
 *
 * Channel contents are the exact integral over each channel's energy interval,
 * [offset + gain·(ch − ½), offset + gain·(ch + ½)], times the charge:
 *
 *   content(ch) += Q · [ flat · (E_hi − E_lo) + amplitude · decay · (e^{−E_lo/decay} − e^{−E_hi/decay}) ]
 */
export interface BackgroundModel {
  flatPerKeVPerUC: number;
  exponentialPerKeVPerUC: number;
  exponentialDecayKeV: number;
}

/**
 * @param out expected counts per channel, modified in place
 * @param model background continuum (counts/keV/µC)
 * @param chargeUC true integrated charge, µC
 * @param offsetKeV, gainKeVPerChannel the channel → energy calibration (centre of channel)
 */
export function addBackgroundOverChannels(
  out: Float64Array, model: BackgroundModel, chargeUC: number, offsetKeV: number, gainKeVPerChannel: number,
): void {
  const { flatPerKeVPerUC: flat, exponentialPerKeVPerUC: amp, exponentialDecayKeV: decay } = model;
  if (flat === 0 && amp === 0) return;
  let lowerKeV = Math.max(0, offsetKeV - 0.5 * gainKeVPerChannel);
  let lowerExp = amp > 0 ? Math.exp(-lowerKeV / decay) : 0;
  for (let ch = 0; ch < out.length; ch++) {
    const upperKeV = Math.max(0, offsetKeV + (ch + 0.5) * gainKeVPerChannel);
    const upperExp = amp > 0 ? Math.exp(-upperKeV / decay) : 0;
    out[ch] = out[ch]! + chargeUC * (flat * (upperKeV - lowerKeV) + amp * decay * (lowerExp - upperExp));
    lowerKeV = upperKeV;
    lowerExp = upperExp;
  }
}
