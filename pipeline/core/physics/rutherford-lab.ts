// Rutherford lab cross section with recoil: C.G. Darwin, Phil. Mag. 27, 499 (1914); W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), ch. 2.
import { COULOMB_CONSTANT_KEV_FM } from './codata2018.js';
import { FM2_TO_MB, degToRad } from './units.js';

/**
 * Rutherford differential cross section in the lab frame, exact (non-relativistic) with recoil, mb/sr:
 *
 *   dσ/dΩlab = (Z1 Z2 e² / (4E))² · 4/sin⁴θ · [sqrt(1 − x²) + cos θ]² / sqrt(1 − x²),   x = (M1/M2) sin θ
 *
 * evaluated for θ > 90° in the algebraically equal form 4 (1 − k²)² / ((r − cos θ)² r) with
 * k = M1/M2, r = sqrt(1 − x²), which has no cancellation near 180°.
 * @param z1 projectile atomic number
 * @param z2 target atomic number
 * @param projectileMassU M1, u
 * @param targetMassU M2, u (M1 < M2 only; inverse kinematics throws RangeError)
 * @param beamEnergyKeV E, lab kinetic energy of the projectile, keV
 * @param thetaLabDeg lab scattering angle, degrees, in (0, 180]
 */
export function rutherfordLabMbPerSr(
  z1: number, z2: number, projectileMassU: number, targetMassU: number, beamEnergyKeV: number, thetaLabDeg: number,
): number {
  const { k, theta } = checkArgs(projectileMassU, targetMassU, beamEnergyKeV, thetaLabDeg);
  const lengthFm = (z1 * z2 * COULOMB_CONSTANT_KEV_FM) / (4 * beamEnergyKeV);
  const sin = Math.sin(theta);
  const cos = Math.cos(theta);
  const r = Math.sqrt(1 - k * k * sin * sin);
  let angular: number;
  if (cos >= 0) {
    const t = r + cos;
    angular = (4 * t * t) / (sin * sin * sin * sin * r);
  } else {
    const u = r - cos;
    angular = (4 * (1 - k * k) * (1 - k * k)) / (u * u * r);
  }
  return lengthFm * lengthFm * FM2_TO_MB * angular;
}

/**
 * Logarithmic derivatives of rutherfordLabMbPerSr (same arguments):
 *   ∂lnσ/∂E = −2/E (per keV);
 *   ∂lnσ/∂θ = −4 cot θ + 2 (r' − sin θ)/(r + cos θ) − r'/r, with r' = −k² sin θ cos θ / r,
 *   (for θ > 90°: −2 (r' + sin θ)/(r − cos θ) − r'/r), converted to per degree.
 * Z1 and Z2 only scale σ and drop out; they are taken so the call matches rutherfordLabMbPerSr.
 */
export function rutherfordLabLogDerivatives(
  z1: number, z2: number, projectileMassU: number, targetMassU: number, beamEnergyKeV: number, thetaLabDeg: number,
): { dLnSigmaDEnergyPerKeV: number; dLnSigmaDThetaPerDeg: number } {
  const { k, theta } = checkArgs(projectileMassU, targetMassU, beamEnergyKeV, thetaLabDeg);
  const sin = Math.sin(theta);
  const cos = Math.cos(theta);
  const r = Math.sqrt(1 - k * k * sin * sin);
  const dr = (-k * k * sin * cos) / r;
  const perRad = cos >= 0
    ? (-4 * cos) / sin + (2 * (dr - sin)) / (r + cos) - dr / r
    : (-2 * (dr + sin)) / (r - cos) - dr / r;
  return { dLnSigmaDEnergyPerKeV: -2 / beamEnergyKeV, dLnSigmaDThetaPerDeg: (perRad * Math.PI) / 180 };
}

function checkArgs(m1: number, m2: number, energyKeV: number, thetaDeg: number): { k: number; theta: number } {
  if (!(m1 > 0) || !(m2 > 0)) throw new RangeError(`masses must be positive, got ${m1} u and ${m2} u`);
  if (!(m1 < m2)) {
    throw new RangeError(`lab Rutherford form needs projectile lighter than target; got M1 = ${m1} u >= M2 = ${m2} u`);
  }
  if (!(energyKeV > 0)) throw new RangeError(`beam energy must be positive, got ${energyKeV} keV`);
  if (!(thetaDeg > 0 && thetaDeg <= 180)) throw new RangeError(`lab angle must be within (0, 180] deg, got ${thetaDeg}`);
  return { k: m1 / m2, theta: degToRad(thetaDeg) };
}
