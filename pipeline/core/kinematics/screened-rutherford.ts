import type { Nuclide } from '../physics/nuclides.js';
import { rutherfordLabLogDerivatives, rutherfordLabMbPerSr } from '../physics/rutherford-lab.js';
import { lecuyerScreeningFactor, lecuyerScreeningLogDerivativePerKeV } from '../physics/screening-lecuyer.js';

export type ScreeningModel = 'lecuyer' | 'none';

/**
 * The lab Rutherford cross section with recoil times the chosen screening factor F(Ecm),
 * with its logarithmic derivatives in beam energy and lab angle (for uncertainty
 * propagation): ∂lnσ/∂E = ∂lnσ_R/∂E + (∂lnF/∂Ecm)(M2/(M1+M2)).
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
  const f = lecuyerScreeningFactor(projectile.z, target.z, eCm);
  return {
    sigmaMbPerSr: sigma * f,
    screeningFactor: f,
    dLnSigmaDEnergyPerKeV: d.dLnSigmaDEnergyPerKeV + lecuyerScreeningLogDerivativePerKeV(projectile.z, target.z, eCm) * cmPerLab,
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
