import type { Nuclide } from '../physics/nuclides.js';
import { rutherfordLabLogDerivatives, rutherfordLabMbPerSr } from '../physics/rutherford-lab.js';
import { lecuyerScreeningFactor, lecuyerScreeningLogDerivativePerKeV } from '../physics/screening-lecuyer.js';
import { andersenScreeningFactor, andersenScreeningLogDerivativePerKeV } from '../physics/screening-andersen.js';
import { labToCmAngleDeg } from '../physics/lab-cm.js';

export type ScreeningModel = 'lecuyer' | 'andersen' | 'none';

/**
 * The lab Rutherford cross section with recoil times the chosen screening factor — L'Ecuyer
 * F(Ecm), or Andersen F(Ecm, θcm) with θcm from the elastic lab angle — with its logarithmic
 * derivatives in beam energy and lab angle (for uncertainty propagation):
 * ∂lnσ/∂E = ∂lnσ_R/∂E + (∂lnF/∂Ecm)(M2/(M1+M2)); the angle dependence of Andersen's F is
 * left out of ∂lnσ/∂θ (it is below 1e-3 per degree at backward angles, common practice).
 */
export interface ScreenedRutherford {
  sigmaMbPerSr: number;
  screeningFactor: number;
  dLnSigmaDEnergyPerKeV: number;
  dLnSigmaDThetaPerDeg: number;
}

export function screenedRutherfordLab(projectile: Nuclide, target: Nuclide, beamEnergyKeV: number, thetaLabDeg: number, screening: ScreeningModel): ScreenedRutherford {
  const m1 = projectile.massU;
  const m2 = target.massU;
  const sigma = rutherfordLabMbPerSr(projectile.z, target.z, m1, m2, beamEnergyKeV, thetaLabDeg);
  const d = rutherfordLabLogDerivatives(projectile.z, target.z, m1, m2, beamEnergyKeV, thetaLabDeg);
  if (screening === 'none') return { sigmaMbPerSr: sigma, screeningFactor: 1, ...d };
  const cmPerLab = m2 / (m1 + m2);
  const eCm = beamEnergyKeV * cmPerLab;
  let f: number;
  let dLnF: number;
  if (screening === 'andersen') {
    const thetaCmDeg = labToCmAngleDeg(thetaLabDeg, m1 / m2);
    f = andersenScreeningFactor(projectile.z, target.z, eCm, thetaCmDeg);
    dLnF = andersenScreeningLogDerivativePerKeV(projectile.z, target.z, eCm, thetaCmDeg);
  } else {
    f = lecuyerScreeningFactor(projectile.z, target.z, eCm);
    dLnF = lecuyerScreeningLogDerivativePerKeV(projectile.z, target.z, eCm);
  }
  return {
    sigmaMbPerSr: sigma * f,
    screeningFactor: f,
    dLnSigmaDEnergyPerKeV: d.dLnSigmaDEnergyPerKeV + dLnF * cmPerLab,
    dLnSigmaDThetaPerDeg: d.dLnSigmaDThetaPerDeg,
  };
}

/**
 * The same, or null where the Rutherford form or the screening formula is outside its validity
 * (a RangeError: projectile not lighter than the target, or screening at too low an energy), so
 * callers flag the value instead of failing the series.
 */
export function screenedRutherfordLabIfValid(projectile: Nuclide, target: Nuclide, beamEnergyKeV: number, thetaLabDeg: number, screening: ScreeningModel): ScreenedRutherford | null {
  try {
    return screenedRutherfordLab(projectile, target, beamEnergyKeV, thetaLabDeg, screening);
  } catch (e) {
    if (e instanceof RangeError) return null;
    throw e;
  }
}
