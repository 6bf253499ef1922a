import { nuclide, type Nuclide } from '../physics/nuclides.js';
import { ejectileEnergiesNonRelKeV } from '../physics/two-body-kinematics.js';
import { cmVelocityRatio, labToCmAngleDeg, solidAngleJacobianLabPerCm } from '../physics/lab-cm.js';

/**
 * Where a peak sits and how its lab and CM frames relate, for a projectile scattered
 * (elastically, or leaving the target nucleus excited by `excitationKeV`) into a lab angle.
 * Non-relativistic two-body kinematics (pipeline/core/physics).
 */
export interface PeakKinematics {
  /** Lab energy of the detected particle, keV. */
  energyKeV: number;
  qValueKeV: number;
  thetaCmDeg: number;
  /** dΩ_lab/dΩ_cm: dσ/dΩ_cm = dσ/dΩ_lab × jacobianLabPerCm. */
  jacobianLabPerCm: number;
  gamma: number;
}

export type PeakKinematicsResult = { ok: true; value: PeakKinematics } | { ok: false; reason: string };

export function peakKinematics(projectile: Nuclide, targetNuclide: string, excitationKeV: number, qOverrideKeV: number | undefined, beamEnergyKeV: number, thetaLabDeg: number): PeakKinematicsResult {
  const target = nuclide(targetNuclide);
  // Scattering (elastic or inelastic): ejectile = projectile, residual = the target nucleus,
  // so the ground-state masses cancel and Q = −Ex exactly.
  const q = qOverrideKeV ?? (excitationKeV === 0 ? 0 : -excitationKeV);
  // One object literal of a fixed shape (an object spread here cost more than the physics).
  const params = {
    projectileMassU: projectile.massU,
    targetMassU: target.massU,
    ejectileMassU: projectile.massU,
    residualMassU: target.massU,
    beamEnergyKeV,
    qValueKeV: q,
    thetaLabDeg,
  };
  let energies: number[];
  try {
    energies = ejectileEnergiesNonRelKeV(params);
  } catch (e) {
    return { ok: false, reason: (e as Error).message };
  }
  if (energies.length === 0) return { ok: false, reason: `kinematically forbidden at ${beamEnergyKeV} keV and ${thetaLabDeg}° (Q = ${q.toFixed(1)} keV)` };
  if (energies.length > 1) return { ok: false, reason: `two kinematic solutions at ${thetaLabDeg}° (projectile heavier than ${targetNuclide}); inverse kinematics is not supported yet` };
  const gamma = cmVelocityRatio(params);
  let thetaCmDeg: number;
  try {
    thetaCmDeg = labToCmAngleDeg(thetaLabDeg, gamma);
  } catch (e) {
    return { ok: false, reason: (e as Error).message };
  }
  return { ok: true, value: { energyKeV: energies[0]!, qValueKeV: q, thetaCmDeg, jacobianLabPerCm: solidAngleJacobianLabPerCm(thetaCmDeg, gamma), gamma } };
}

/** An elastic-scattering peak: no excitation and no Q-value other than 0. */
export function isElasticPeak(peak: { excitation_keV: number; q_value_keV?: number }): boolean {
  return peak.excitation_keV === 0 && (peak.q_value_keV === undefined || peak.q_value_keV === 0);
}
