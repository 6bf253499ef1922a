// Lab <-> CM transformation (non-relativistic): J.B. Marion, F.C. Young, Nuclear Reaction Analysis: Graphs and Tables (North-Holland, 1968), kinematics section.
import { degToRad, radToDeg } from './units.js';
import type { TwoBodyParams } from './two-body-kinematics.js';

/**
 * γ = V_cm / v_b,cm: speed of the centre of mass over the ejectile's speed in the CM frame,
 * non-relativistic, consistent with the Q-equation of ejectileEnergiesNonRelKeV:
 *
 *   γ = sqrt( m_a m_b E_a / ( m_B [ (m_b + m_B − m_a) E_a + (m_b + m_B) Q ] ) )
 *
 * Elastic scattering (m_b = m_a, m_B = m_A, Q = 0) gives γ = m_a/m_A. Masses in u, E_a and Q in
 * keV. Throws RangeError below threshold (no kinetic energy left in the CM frame).
 */
export function cmVelocityRatio(p: TwoBodyParams): number {
  const { projectileMassU: ma, ejectileMassU: mb, residualMassU: mB, beamEnergyKeV: ea, qValueKeV: q } = p;
  if (!(ma > 0) || !(p.targetMassU > 0) || !(mb > 0) || !(mB > 0)) {
    throw new RangeError('all four masses must be positive (u)');
  }
  if (!(ea > 0)) throw new RangeError(`beam energy must be positive, got ${ea} keV`);
  const denominator = mB * ((mb + mB - ma) * ea + (mb + mB) * q);
  if (!(denominator > 0)) {
    throw new RangeError(`beam energy ${ea} keV is below the threshold of a reaction with Q = ${q} keV`);
  }
  return Math.sqrt((ma * mb * ea) / denominator);
}

/** Largest lab angle the ejectile reaches, degrees: asin(1/γ) for γ > 1 (90° for γ = 1), else 180. */
export function maxLabAngleDeg(gamma: number): number {
  return gamma >= 1 ? radToDeg(Math.asin(1 / gamma)) : 180;
}

/**
 * CM angle from lab angle, forward (higher-energy) branch: θcm = θlab + asin(γ sin θlab).
 * @param thetaLabDeg lab angle, degrees, 0..180
 * @param gamma γ = V_cm / v_b,cm (see cmVelocityRatio), >= 0
 * Throws RangeError when γ >= 1 and θlab exceeds maxLabAngleDeg(γ).
 */
export function labToCmAngleDeg(thetaLabDeg: number, gamma: number): number {
  if (!(gamma >= 0)) throw new RangeError(`gamma must be >= 0, got ${gamma}`);
  if (!(thetaLabDeg >= 0 && thetaLabDeg <= 180)) {
    throw new RangeError(`lab angle must be within 0..180 deg, got ${thetaLabDeg}`);
  }
  const maxDeg = maxLabAngleDeg(gamma);
  if (gamma >= 1 && thetaLabDeg > maxDeg) {
    throw new RangeError(`with gamma = ${gamma} the lab angle cannot exceed ${maxDeg.toFixed(4)} deg; got ${thetaLabDeg} deg`);
  }
  const theta = degToRad(thetaLabDeg);
  const s = Math.min(1, gamma * Math.sin(theta));
  return radToDeg(theta + Math.asin(s));
}

/**
 * Lab angle from CM angle: θlab = atan2(sin θcm, cos θcm + γ), degrees.
 * @param thetaCmDeg CM angle, degrees, 0..180
 * @param gamma γ = V_cm / v_b,cm, >= 0
 */
export function cmToLabAngleDeg(thetaCmDeg: number, gamma: number): number {
  const theta = degToRad(thetaCmDeg);
  return radToDeg(Math.atan2(Math.sin(theta), Math.cos(theta) + gamma));
}

/**
 * Solid-angle Jacobian dΩlab/dΩcm = |1 + γ cos θcm| / (1 + γ² + 2γ cos θcm)^{3/2}.
 * Cross sections transform as dσ/dΩlab = dσ/dΩcm / (dΩlab/dΩcm).
 * @param thetaCmDeg CM angle, degrees
 * @param gamma γ = V_cm / v_b,cm, >= 0
 */
export function solidAngleJacobianLabPerCm(thetaCmDeg: number, gamma: number): number {
  const cos = Math.cos(degToRad(thetaCmDeg));
  const base = 1 + gamma * gamma + 2 * gamma * cos;
  return Math.abs(1 + gamma * cos) / Math.pow(base, 1.5);
}
