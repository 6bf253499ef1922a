// Internal-standard normalization with the thin-target yield equation: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 3.4, applied to two layers of one target in one spectrum.
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { NetCounts } from '../../pipeline/core/counting/net-counts.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import type { NormalizingNuclide, SharedUncertainties } from './reference-solid-angle-model.js';
import { referenceYieldExposure } from './reference-yield-exposure.js';

export interface InternalReferenceInput {
  /** The sample run: its beam-energy uncertainty enters σ_R,ref. */
  run: RunRecord;
  detector: string;
  angleUncDeg: number;
  /** Net counts of the reference layer's elastic peak, measured in the sample run's spectrum. */
  referencePeak: NetCounts;
  /** Live fraction of that spectrum (it cancels; it is an input so that the cancellation is shown). */
  live: LiveFraction;
  /** The reference layer's isotopes with σ_R at the layer's own effective energy. */
  nuclides: NormalizingNuclide[];
  shared: SharedUncertainties;
}

/**
 * A reference layer (role: reference) inside the sample target, seen in the same spectrum as
 * the sample peak: both share the beam particles N_beam, the solid angle ΔΩ and the live
 * fraction f, so for a sample peak of Y counts on n atoms/cm²
 *
 *   dσ/dΩ = σ_R,ref(E_ref,eff, θ) · (Y / Y_ref) · (n_ref / n)
 *
 * and charge, solid angle and live time cancel. As an exposure (dσ/dΩ = Y/(f n L)):
 *   L = Y_ref / (f · Σ_i n_ref,i σ_R,i · 10⁻²⁷)   (sr; σ in mb/sr, n in atoms/cm²).
 * Inputs: Y_ref (reference_counting, run class, key `<run>/<detector>`: every peak of this
 * spectrum shares it), f (live_time, the same quantity as the sample peak's), δE of the run,
 * δθ of the detector, δs, and the reference layer's thickness (reference_areal_density).
 */
export function internalReferenceExposure(x: InternalReferenceInput): RowNormalization {
  const y = referenceYieldExposure(x.run, x.detector, x.angleUncDeg, x.referencePeak, x.live, x.nuclides, x.shared);
  const exposure: MeasurementModel = { inputs: y.inputs, parts: [], evaluate: (v, _p, ops) => y.evaluate(v, ops) };
  const flags = x.referencePeak.net > 0 ? [] : ['reference-net-not-positive'];
  return { method: 'internal-reference', exposure, referenceRuns: [], weights: [], solidAngleMsr: Number.NaN, flags };
}
