// Kinematic factor: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 2.5.
import { degToRad } from './units.js';

/**
 * Elastic kinematic factor K = E1/E0 (non-relativistic):
 *
 *   K = [ (sqrt(M2^2 - M1^2 sin^2 θ) + M1 cos θ) / (M1 + M2) ]^2
 *
 * @param projectileMass M1, any mass unit (the same as targetMass; u, MeV, or mass numbers).
 *   Tables are usually computed with atomic masses; the ratio differs from the nuclear-mass
 *   ratio by ~1e-4 relative at most, which is far below the usual energy resolution.
 * @param targetMass M2, same unit as projectileMass
 * @param thetaLabDeg lab scattering angle θ of the projectile, degrees, 0..180
 *
 * For M1 > M2 scattering is possible only up to θmax = asin(M2/M1) (90° for M1 = M2): beyond it
 * a RangeError is thrown. Within range, for M1 > M2 two energies are possible at each angle;
 * this returns the higher-energy (+) branch written above.
 */
export function elasticKinematicFactor(projectileMass: number, targetMass: number, thetaLabDeg: number): number {
  if (!(projectileMass > 0) || !(targetMass > 0)) {
    throw new RangeError(`masses must be positive, got projectile ${projectileMass} and target ${targetMass}`);
  }
  if (!(thetaLabDeg >= 0 && thetaLabDeg <= 180)) {
    throw new RangeError(`lab angle must be within 0..180 deg, got ${thetaLabDeg}`);
  }
  const m1 = projectileMass;
  const m2 = targetMass;
  if (m1 >= m2) {
    const maxDeg = (Math.asin(m2 / m1) * 180) / Math.PI;
    if (thetaLabDeg > maxDeg) {
      throw new RangeError(
        `elastic scattering of a projectile of mass ${m1} on a target of mass ${m2} reaches at most ${maxDeg.toFixed(4)} deg; got ${thetaLabDeg} deg`,
      );
    }
  }
  const theta = degToRad(thetaLabDeg);
  const sin = Math.sin(theta);
  const root = Math.sqrt(Math.max(0, m2 * m2 - m1 * m1 * sin * sin));
  const ratio = (root + m1 * Math.cos(theta)) / (m1 + m2);
  return ratio * ratio;
}
