import { peakKinematics } from '../core/kinematics/peak-kinematics.js';
import { screenedRutherfordLab, type ScreeningModel } from '../core/kinematics/screened-rutherford.js';
import type { Nuclide } from '../core/physics/index.js';
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
  truth: PeakTruth | undefined, screening: ScreeningModel,
): ScatteringPeak | null {
  if (!(target.massU > projectile.massU)) return null;
  // The same kinematics and Rutherford code the reduction uses (pipeline/core/kinematics).
  const kin = peakKinematics(projectile, target.name, 0, qValueKeV, beamEnergyKeV, thetaLabDeg);
  if (!kin.ok || !(kin.value.gamma < 1)) return null;
  const { energyKeV: peakEnergyKeV, thetaCmDeg, jacobianLabPerCm: jacobian } = kin.value;
  const r = screenedRutherfordLab(projectile, target, beamEnergyKeV, thetaLabDeg, screening);
  const sigmaR = r.sigmaMbPerSr / r.screeningFactor;
  let dsigmaLab: number;
  if (truth !== undefined && 'cm_mb_per_sr' in truth) {
    dsigmaLab = energyCurveValue(truth.cm_mb_per_sr, beamEnergyKeV) / jacobian;
  } else {
    const ratio = truth === undefined ? 1 : energyCurveValue(truth.ratio_to_rutherford, beamEnergyKeV);
    dsigmaLab = ratio * r.sigmaMbPerSr;
  }
  return {
    peakEnergyKeV,
    thetaCmDeg,
    jacobianLabPerCm: jacobian,
    rutherfordLabMbPerSr: sigmaR,
    screeningFactor: r.screeningFactor,
    dsigmaLabMbPerSr: dsigmaLab,
    dsigmaCmMbPerSr: dsigmaLab * jacobian,
    sigmaOverRutherford: dsigmaLab / r.sigmaMbPerSr,
  };
}
