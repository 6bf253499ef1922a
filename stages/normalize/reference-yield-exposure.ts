// Thin-target yield equation: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 3.4.
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { NetCounts } from '../../pipeline/core/counting/net-counts.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { ModelInput } from '../../pipeline/core/normalization/measurement-model.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import { angleOffset, beamEnergyOffset, liveFractionInput, modelInput, screeningOffset } from '../../pipeline/core/normalization/shared-inputs.js';
import { MB_TO_CM2 } from '../../pipeline/core/physics/units.js';
import { sumNSigma, type NormalizingNuclide, type SharedUncertainties } from './reference-solid-angle-model.js';

/**
 * A Rutherford peak of the reference element seen in a spectrum of a sample run measures that
 * spectrum's beam particles × solid angle:
 *
 *   L = Y_ref / (f · Σ_i n_i σ_R,i · 10⁻²⁷)   (sr; σ in mb/sr, n in atoms/cm²)
 *
 * The inputs, in this order: Y_ref (reference_counting, run class, key `<run>/<detector>`: every
 * peak of this spectrum shares it), f (live_time), δE of the run, δθ of the detector, δs, then
 * one thickness per layer holding the reference isotopes (reference_areal_density or the
 * sample's own layer, the same quantity where they share a layer). The internal-reference and
 * monitor methods build their exposures on it.
 */
export function referenceYieldExposure(run: RunRecord, detector: string, angleUncDeg: number, peak: NetCounts, live: LiveFraction, nuclides: readonly NormalizingNuclide[], shared: SharedUncertainties): {
  inputs: ModelInput[];
  evaluate<T>(v: readonly T[], ops: ScalarOps<T>): T;
} {
  const inputs = [
    modelInput('reference_counting', 'run', `${run.run}/${detector}`, peak.net, Math.sqrt(peak.netVariance)),
    liveFractionInput(run.run, detector, live),
    beamEnergyOffset(run.run, run.beamEnergyUncKeV),
    angleOffset(detector, angleUncDeg),
    screeningOffset(shared.series, shared.screeningUncFrac),
  ];
  const thick = new Map<string, number>();
  for (const n of nuclides) for (const l of n.layers) if (!thick.has(l.thickness.key)) thick.set(l.thickness.key, inputs.push(l.thickness) - 1);
  return {
    inputs,
    evaluate<T>(v: readonly T[], ops: ScalarOps<T>): T {
      const [y, f, dE, dTheta, dS] = v as [T, T, T, T, T];
      const nSigma = sumNSigma(ops, nuclides, (l) => v[thick.get(l.thickness.key)!]!, dE, dTheta, dS);
      return ops.div(y, ops.scale(ops.mul(f, nSigma), MB_TO_CM2));
    },
  };
}
