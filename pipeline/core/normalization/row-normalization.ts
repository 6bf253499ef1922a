import type { MeasurementModel } from './measurement-model.js';

export const NORMALIZATION_METHODS = ['reference-run', 'internal-reference', 'monitor', 'absolute'] as const;
export type NormalizationMethod = (typeof NORMALIZATION_METHODS)[number];

/**
 * How one sample run × detector is normalized, as a model: the exposure L, the number of beam
 * particles times the solid angle (sr) that the sample's peak counts saw, so that for every
 * method
 *
 *   dσ/dΩ_lab = N_net / (f · n · L)     (N_net counts, f live fraction, n atoms/cm², L in sr)
 *
 * (internal-reference: L carries 1/f itself, and f cancels). `exposure` evaluates L in sr.
 */
export interface RowNormalization {
  method: NormalizationMethod;
  exposure: MeasurementModel;
  /** Reference runs whose measurements enter L (empty for internal-reference and absolute). */
  referenceRuns: string[];
  /** Weight of each reference run in L (same order). */
  weights: number[];
  /** Effective solid angle ΔΩ_eff, msr, where the method defines one (NaN otherwise). */
  solidAngleMsr: number;
  flags: string[];
}
