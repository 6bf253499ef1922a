import { rutherfordCmMbPerSr } from '../physics/rutherford-cm.js';
import { andersenScreeningFactor, andersenScreeningLogDerivativePerKeV } from '../physics/screening-andersen.js';
import { lecuyerScreeningFactor, lecuyerScreeningLogDerivativePerKeV } from '../physics/screening-lecuyer.js';
import type { KinematicsAt } from './peak-path.js';
import type { Reaction } from './reaction-of-peak.js';
import { screenedRutherfordLabIfValid, type ScreenedRutherford, type ScreeningModel } from './screened-rutherford.js';

export type RutherfordForPeak = { ok: true; value: ScreenedRutherford } | { ok: false; flag: string };

const D_THETA_DEG = 0.01;

/**
 * The screened Rutherford cross section in the lab for the particle an elastic peak's detector
 * sees, at the reaction energy E:
 *
 *   projectile detected, lighter than the target, one kinematic branch: the exact lab form with
 *   recoil (screened-rutherford.ts), as for every thin-target series;
 *   otherwise (elastic recoils, inverse kinematics):  σ_lab = F · σ_R,cm(E_cm, θ_cm,a) / (dΩ_lab/dΩ_cm),
 *   with θ_cm,a the projectile's CM angle (180° − θ_cm of a detected target nucleus) and the
 *   Jacobian of the detected particle on its branch (relativistic kinematics). There ∂lnσ/∂E =
 *   −2/E + (∂lnF/∂E_cm)·M2/(M1+M2) (σ_cm ∝ E_cm⁻² at fixed θ_cm), and ∂lnσ/∂θ is a central
 *   difference over ±0.01° of the same expression.
 * Identical nuclei (e.g. 1H on 1H) scatter with Mott interference, not Rutherford: refused.
 */
export function rutherfordForPeak(reaction: Reaction, kinematics: KinematicsAt, branch: string, reactionEnergyKeV: number, thetaLabDeg: number, screening: ScreeningModel): RutherfordForPeak {
  const { projectile, target, detected } = reaction;
  if (projectile.name === target.name) return { ok: false, flag: 'identical-nuclei-not-rutherford' };
  const detectsProjectile = detected.name === projectile.name;
  if (detectsProjectile && projectile.massU < target.massU && branch === 'single') {
    const r = screenedRutherfordLabIfValid(projectile, target, reactionEnergyKeV, thetaLabDeg, screening);
    return r === null ? { ok: false, flag: 'rutherford-not-valid' } : { ok: true, value: r };
  }
  const cmPerLab = target.massU / (projectile.massU + target.massU);
  const eCm = reactionEnergyKeV * cmPerLab;
  const at = (theta: number): { sigma: number; f: number; dLnF: number } | null => {
    const k = kinematics(reactionEnergyKeV, theta);
    const s = k.ok ? k.solutions.find((x) => x.branch === branch) : undefined;
    if (s === undefined) return null;
    const thetaCmA = detectsProjectile ? s.thetaCmDeg : 180 - s.thetaCmDeg;
    try {
      const sigmaCm = rutherfordCmMbPerSr(projectile.z, target.z, eCm, thetaCmA);
      let f = 1;
      let dLnF = 0;
      if (screening === 'lecuyer') {
        f = lecuyerScreeningFactor(projectile.z, target.z, eCm);
        dLnF = lecuyerScreeningLogDerivativePerKeV(projectile.z, target.z, eCm);
      } else if (screening === 'andersen') {
        f = andersenScreeningFactor(projectile.z, target.z, eCm, thetaCmA);
        dLnF = andersenScreeningLogDerivativePerKeV(projectile.z, target.z, eCm, thetaCmA);
      }
      return { sigma: (f * sigmaCm) / s.jacobianLabPerCm, f, dLnF };
    } catch (e) {
      if (e instanceof RangeError) return null;
      throw e;
    }
  };
  const here = at(thetaLabDeg);
  if (here === null) return { ok: false, flag: 'rutherford-not-valid' };
  const up = at(thetaLabDeg + D_THETA_DEG);
  const down = at(thetaLabDeg - D_THETA_DEG);
  const dTheta = up !== null && down !== null ? (Math.log(up.sigma) - Math.log(down.sigma)) / (2 * D_THETA_DEG) : 0;
  return {
    ok: true,
    value: {
      sigmaMbPerSr: here.sigma,
      screeningFactor: here.f,
      dLnSigmaDEnergyPerKeV: -2 / reactionEnergyKeV + here.dLnF * cmPerLab,
      dLnSigmaDThetaPerDeg: dTheta,
    },
  };
}
