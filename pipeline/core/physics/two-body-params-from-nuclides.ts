// Q-values from atomic masses: AME2020, Wang et al., Chinese Physics C 45, 030003 (2021).
import { elementSymbol, nuclide, type Nuclide } from './nuclides.js';
import { qValueKeV } from './two-body-kinematics.js';
import type { TwoBodyParams } from './two-body-kinematics.js';

/**
 * Two-body parameters for A(a,b)B from nuclides: the residual B follows from charge and mass-number
 * conservation (Z_B = Z_a + Z_A − Z_b, A_B = A_a + A_A − A_b), Q = (M_a + M_A − M_b − M_B) u c² − Ex
 * from AME2020 atomic masses (exactly −Ex when b, B are a, A in either order) unless `qOverrideKeV` is given.
 *
 * Scattering is ejectile = projectile (residual = target, Q = −Ex); elastic recoil detection is
 * ejectile = target (residual = projectile, Q = 0). Atomic masses in u; energies in keV.
 * @param beamEnergyKeV lab kinetic energy of the projectile, keV
 * @param excitationKeV excitation energy left in the residual, keV (>= 0)
 * @param qOverrideKeV Q-value to use instead of the AME2020 one, keV
 * Throws RangeError when the residual would have Z < 0 or A < 1, or is not in AME2020.
 */
export function twoBodyParamsFromNuclides(
  projectile: Nuclide, target: Nuclide, ejectile: Nuclide, beamEnergyKeV: number, excitationKeV = 0, qOverrideKeV?: number,
): TwoBodyParams & { residual: Nuclide } {
  if (!(excitationKeV >= 0)) throw new RangeError(`excitation energy must be >= 0 keV, got ${excitationKeV}`);
  const z = projectile.z + target.z - ejectile.z;
  const a = projectile.a + target.a - ejectile.a;
  const symbol = elementSymbol(z);
  if (symbol === undefined || a < 1 || a < z) {
    throw new RangeError(`${target.name}(${projectile.name},${ejectile.name}) leaves no nuclide (Z = ${z}, A = ${a})`);
  }
  let residual: Nuclide;
  try {
    residual = nuclide(`${a}${symbol}`);
  } catch (e) {
    throw new RangeError(`${target.name}(${projectile.name},${ejectile.name}) leaves ${a}${symbol}: ${(e as Error).message}`);
  }
  // Scattering and recoil leave the same pair of nuclei: Q = −Ex exactly, with no rounding from the masses.
  const samePair = (ejectile.name === projectile.name && residual.name === target.name)
    || (ejectile.name === target.name && residual.name === projectile.name);
  const q = qOverrideKeV ?? (samePair ? 0 - excitationKeV : qValueKeV(projectile, target, ejectile, residual, excitationKeV));
  return {
    projectileMassU: projectile.massU,
    targetMassU: target.massU,
    ejectileMassU: ejectile.massU,
    residualMassU: residual.massU,
    beamEnergyKeV,
    qValueKeV: q,
    residual,
  };
}
