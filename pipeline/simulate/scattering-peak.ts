import {
  cmVelocityRatio, elasticKinematicFactor, ejectileEnergiesNonRelKeV, labToCmAngleDeg, lecuyerScreeningFactor,
  rutherfordLabMbPerSr, solidAngleJacobianLabPerCm, type Nuclide,
} from '../core/physics/index.js';
import { energyCurveValue, type PeakTruth } from './truth-model.js';

export interface ScatteringPeak {
  /** Lab energy of the scattered projectile, keV. */
  peakEnergyKeV: number;
  thetaCmDeg: number;
  /** dΩlab/dΩcm. */
  jacobianLabPerCm: number;
  rutherfordLabMbPerSr: number;
  screeningFactor: number;
  dsigmaLabMbPerSr: number;
  dsigmaCmMbPerSr: number;
  /** σ_lab / (σ_R,lab · F). */
  sigmaOverRutherford: number;
}

/**
 * The true cross section and kinematics of the projectile scattered into lab angle θ,
 * elastically (Q = 0) or leaving the target nucleus excited (Q = −Ex, or a peak's q_value_keV).
 * Scattering of the projectile itself is simulated (ejectile = projectile, ground-state masses
 * in the Q-equation).
 *
 *   elastic, ratio model:  σ_lab = r(E) · σ_R,lab(E, θ) · F,   F = L'Ecuyer factor at E_cm = E·M2/(M1+M2) (or 1)
 *   CM model (isotropic):  σ_lab = σ_cm(E) / (dΩlab/dΩcm)
 *   always:                σ_cm  = σ_lab · dΩlab/dΩcm
 *
 * Returns null where nothing reaches the detector or the case is outside what is simulated:
 * target not heavier than the projectile, below threshold, or γ = V_cm/v_cm >= 1 (two lab
 * energies at one angle).
 * @param qValueKeV Q of the final state, keV (0 elastic, negative for an excited state)
 * @param beamEnergyKeV lab beam energy, keV;  @param thetaLabDeg detector angle, degrees
 * @param truth the declared model; undefined means σ/σ_R = 1 (elastic only)
 */
export function scatteringPeak(
  projectile: Nuclide, target: Nuclide, qValueKeV: number, beamEnergyKeV: number, thetaLabDeg: number,
  truth: PeakTruth | undefined, screening: 'lecuyer' | 'none',
): ScatteringPeak | null {
  const m1 = projectile.massU;
  const m2 = target.massU;
  if (!(m2 > m1)) return null;
  const params = { projectileMassU: m1, targetMassU: m2, ejectileMassU: m1, residualMassU: m2, beamEnergyKeV, qValueKeV };
  let peakEnergyKeV: number;
  let gamma: number;
  if (qValueKeV === 0) {
    peakEnergyKeV = elasticKinematicFactor(m1, m2, thetaLabDeg) * beamEnergyKeV;
    gamma = m1 / m2;
  } else {
    const energies = ejectileEnergiesNonRelKeV({ ...params, thetaLabDeg });
    if (energies.length !== 1) return null;
    try {
      gamma = cmVelocityRatio(params);
    } catch {
      return null;
    }
    if (gamma >= 1) return null;
    peakEnergyKeV = energies[0]!;
  }
  const thetaCmDeg = labToCmAngleDeg(thetaLabDeg, gamma);
  const jacobian = solidAngleJacobianLabPerCm(thetaCmDeg, gamma);
  const sigmaR = rutherfordLabMbPerSr(projectile.z, target.z, m1, m2, beamEnergyKeV, thetaLabDeg);
  const screeningFactor = screening === 'lecuyer' ? lecuyerScreeningFactor(projectile.z, target.z, (beamEnergyKeV * m2) / (m1 + m2)) : 1;
  let dsigmaLab: number;
  if (truth !== undefined && 'cm_mb_per_sr' in truth) {
    dsigmaLab = energyCurveValue(truth.cm_mb_per_sr, beamEnergyKeV) / jacobian;
  } else {
    const ratio = truth === undefined ? 1 : energyCurveValue(truth.ratio_to_rutherford, beamEnergyKeV);
    dsigmaLab = ratio * sigmaR * screeningFactor;
  }
  return {
    peakEnergyKeV,
    thetaCmDeg,
    jacobianLabPerCm: jacobian,
    rutherfordLabMbPerSr: sigmaR,
    screeningFactor,
    dsigmaLabMbPerSr: dsigmaLab,
    dsigmaCmMbPerSr: dsigmaLab * jacobian,
    sigmaOverRutherford: dsigmaLab / (sigmaR * screeningFactor),
  };
}
