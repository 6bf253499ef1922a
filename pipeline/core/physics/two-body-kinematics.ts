// Q-equation (non-relativistic two-body kinematics): J.B. Marion, F.C. Young, Nuclear Reaction Analysis: Graphs and Tables (North-Holland, 1968), kinematics section.
import { ATOMIC_MASS_UNIT_KEV } from './codata2018.js';
import { degToRad } from './units.js';
import type { Nuclide } from './nuclides.js';

export interface TwoBodyParams {
  /** m_a, beam particle mass, u */
  projectileMassU: number;
  /** m_A, target mass, u */
  targetMassU: number;
  /** m_b, detected (ejectile) mass, u */
  ejectileMassU: number;
  /** m_B, residual nucleus mass, u */
  residualMassU: number;
  /** E_a, beam kinetic energy in the lab, keV */
  beamEnergyKeV: number;
  /** Q-value of the reaction to the final state, keV (Q_ground − Ex) */
  qValueKeV: number;
}

/**
 * Lab kinetic energies of the ejectile b in A(a,b)B at lab angle θ (non-relativistic):
 *
 *   sqrt(E_b) = [ sqrt(m_a m_b E_a) cos θ ± sqrt(m_a m_b E_a cos²θ + (m_B + m_b)(m_B Q + (m_B − m_a) E_a)) ] / (m_B + m_b)
 *
 * Returns the physical solutions (real sqrt(E_b) >= 0): none (forbidden, e.g. below threshold or
 * beyond the maximum angle), one, or two, sorted descending, in keV. Masses in u, energies in keV,
 * thetaLabDeg in degrees (0..180).
 */
export function ejectileEnergiesNonRelKeV(p: TwoBodyParams & { thetaLabDeg: number }): number[] {
  const { projectileMassU: ma, ejectileMassU: mb, residualMassU: mB, beamEnergyKeV: ea, qValueKeV: q } = p;
  if (!(ma > 0) || !(p.targetMassU > 0) || !(mb > 0) || !(mB > 0)) {
    throw new RangeError('all four masses must be positive (u)');
  }
  if (!(ea > 0)) throw new RangeError(`beam energy must be positive, got ${ea} keV`);
  if (!(p.thetaLabDeg >= 0 && p.thetaLabDeg <= 180)) {
    throw new RangeError(`lab angle must be within 0..180 deg, got ${p.thetaLabDeg}`);
  }
  const cos = Math.cos(degToRad(p.thetaLabDeg));
  const a = Math.sqrt(ma * mb * ea) * cos;
  const disc = ma * mb * ea * cos * cos + (mB + mb) * (mB * q + (mB - ma) * ea);
  if (disc < 0) return [];
  const root = Math.sqrt(disc);
  const out: number[] = [];
  const plus = (a + root) / (mB + mb);
  if (plus >= 0) out.push(plus * plus);
  const minus = (a - root) / (mB + mb);
  if (root > 0 && minus > 0) out.push(minus * minus);
  return out;
}

/**
 * Q-value of A(a,b)B in keV from AME2020 atomic masses, for B left at excitation Ex:
 *
 *   Q = (M_a + M_A − M_b − M_B) u c² − Ex
 *
 * Atomic masses are used; the electron masses cancel because charge is conserved (checked, with
 * mass number). @param excitationKeV excitation energy of the residual nucleus, keV
 */
export function qValueKeV(projectile: Nuclide, target: Nuclide, ejectile: Nuclide, residual: Nuclide, excitationKeV = 0): number {
  if (projectile.z + target.z !== ejectile.z + residual.z || projectile.a + target.a !== ejectile.a + residual.a) {
    throw new RangeError(
      `${target.name}(${projectile.name},${ejectile.name})${residual.name} does not conserve charge and mass number`,
    );
  }
  return (projectile.massU + target.massU - ejectile.massU - residual.massU) * ATOMIC_MASS_UNIT_KEV - excitationKeV;
}
