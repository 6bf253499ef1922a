/**
 * Polynomial background b₀ + b₁t + b₂t² in counts per channel, t = x − r (channels from a reference
 * channel r). Integrated over the bin of channel x, [x − ½, x + ½] (exact, common practice):
 *   ∫ 1 = 1,   ∫ t = t_x,   ∫ t² = t_x² + 1/12.
 * These are also the derivatives of the bin content with respect to b₀, b₁, b₂.
 */
export interface PolynomialBackground {
  /** Parameter indices of b₀ (counts/channel), b₁ (counts/channel²), b₂ (counts/channel³); 1 to 3 entries. */
  params: readonly number[];
  /** r, channels. */
  referenceChannel: number;
}

/** The bin basis functions for degree 0..2 at channel x; `out` must hold 3 values. */
export function polynomialBinBasis(x: number, referenceChannel: number, out: Float64Array): void {
  const t = x - referenceChannel;
  out[0] = 1;
  out[1] = t;
  out[2] = t * t + 1 / 12;
}
