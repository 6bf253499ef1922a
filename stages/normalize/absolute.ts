// Absolute normalization with the thin-target yield equation Y = N_beam n σ ΔΩ f: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 3.4.
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import { chargeScale, modelInput } from '../../pipeline/core/normalization/shared-inputs.js';
import { microCoulombToParticles } from '../../pipeline/core/physics/units.js';
import type { SharedUncertainties } from './reference-solid-angle-model.js';

export interface AbsoluteInput {
  run: RunRecord;
  chargeState: number;
  detector: string;
  /** The detector's nominal solid angle from series.yaml, msr. */
  solidAngleMsr: number;
  /** Relative standard uncertainty of the nominal solid angle. */
  solidAngleUncRel: number;
  shared: SharedUncertainties;
}

/**
 * Nothing but the charge integrator and the geometry:
 *   L = g · N_beam · ΔΩ_nom (1 + δΩ) / 10³  (sr),  N_beam = Q/(q e)
 * Inputs: g (charge, series class: the integrator's scale, u = charge_unc_rel) and δΩ (the
 * nominal solid angle's relative error, u = solid_angle_unc_rel: solid_angle, detector class,
 * key `<detector>`). Nothing cancels: this is the method with the largest
 * systematic uncertainty.
 */
export function absoluteExposure(x: AbsoluteInput): RowNormalization {
  const beam = microCoulombToParticles(x.run.chargeUC, x.chargeState);
  const omega = x.solidAngleMsr;
  const exposure: MeasurementModel = {
    inputs: [chargeScale(x.shared.series, x.shared.chargeUncRel), modelInput('solid_angle', 'detector', x.detector, 0, x.solidAngleUncRel)],
    parts: [],
    evaluate<T>(v: readonly T[], _p: readonly T[], ops: ScalarOps<T>): T {
      return ops.scale(ops.mul(v[0]!, ops.add(ops.k(1), v[1]!)), (beam * omega) / 1000);
    },
  };
  return { method: 'absolute', exposure, referenceRuns: [], weights: [], solidAngleMsr: omega, flags: [] };
}
