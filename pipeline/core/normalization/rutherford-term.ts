// Linearized dependence of a cross section on beam energy and angle, and the screening correction as F = 1 − c: first-order model of JCGM 100:2008 §5.1.2 with exact sensitivities supplied by the caller.
import type { ScalarOps } from './scalar-ops.js';

/** A (screened) Rutherford cross section at the estimates with its logarithmic slopes. */
export interface RutherfordAt {
  /** σ_R · F at the nominal energy and angle, mb/sr. */
  sigmaMbPerSr: number;
  /** F (dimensionless). */
  screeningFactor: number;
  /** ∂ln σ/∂E, 1/keV. */
  dLnSigmaDEnergyPerKeV: number;
  /** ∂ln σ/∂θ, 1/deg. */
  dLnSigmaDThetaPerDeg: number;
}

/**
 * σ(δE, δθ, δs) = σ · exp(s_E δE) · exp(s_θ δθ) · (1 − c(1 + δs)) / (1 − c),  c = 1 − F,
 * where (1 − c(1 + δs))/(1 − c) = 1 − δs·c/F:
 * equal to σ at δ = 0 with exactly the slopes s_E, s_θ there, and the screening correction c
 * scaled by 1 + δs. δE in keV, δθ in deg, δs dimensionless; result in mb/sr.
 */
export function rutherfordTerm<T>(ops: ScalarOps<T>, r: RutherfordAt, dEnergyKeV: T, dThetaDeg: T, dScreening: T): T {
  const c = 1 - r.screeningFactor;
  const energy = ops.exp(ops.scale(dEnergyKeV, r.dLnSigmaDEnergyPerKeV));
  const angle = ops.exp(ops.scale(dThetaDeg, r.dLnSigmaDThetaPerDeg));
  const screen = ops.sub(ops.k(1), ops.scale(dScreening, c / r.screeningFactor));
  return ops.mul(ops.scale(ops.mul(energy, angle), r.sigmaMbPerSr), screen);
}
