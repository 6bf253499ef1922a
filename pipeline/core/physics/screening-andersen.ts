// Angle-dependent screening of Rutherford scattering: H.H. Andersen, F. Besenbacher, P. Loftager, W. Möller, Phys. Rev. A 21, 1891 (1980).
import { degToRad } from './units.js';

/**
 * V1 of Andersen et al. (1980) in keV, the potential-energy shift of the screened (Lenz–Jensen)
 * Coulomb interaction at small distances (from memory: coefficient and exponents as usually quoted):
 *
 *   V1 = 48.73 Z1 Z2 sqrt(Z1^{2/3} + Z2^{2/3}) eV
 *
 * @param z1 projectile atomic number (>= 1)
 * @param z2 target atomic number (>= 1)
 */
export function andersenScreeningPotentialKeV(z1: number, z2: number): number {
  if (!(z1 >= 1) || !(z2 >= 1)) throw new RangeError(`atomic numbers must be >= 1, got Z1 = ${z1}, Z2 = ${z2}`);
  return 48.73e-3 * z1 * z2 * Math.sqrt(Math.pow(z1, 2 / 3) + Math.pow(z2, 2 / 3));
}

/** Largest V1/Ecm accepted: the formula is a correction to first order in V1/Ecm (at 180° F ≈ 1 − V1/Ecm > 0.5, as for L'Ecuyer). */
const MAX_V1_OVER_ECM = 0.5;

/**
 * Andersen screening factor F = σ_screened / σ_Rutherford, CM frame (from memory, as usually quoted):
 *
 *   F = (1 + V1/(2 Ecm))² / [1 + V1/Ecm + (V1 / (2 Ecm sin(θcm/2)))²]²
 *
 * At θcm = 180° this is 1/(1 + V1/(2 Ecm))² ≈ 1 − V1/Ecm, close to L'Ecuyer's 1 − 0.049 Z1 Z2^{4/3}/Ecm;
 * towards small angles the correction grows.
 * @param z1 projectile atomic number
 * @param z2 target atomic number
 * @param energyCmKeV CM kinetic energy, keV
 * @param thetaCmDeg CM scattering angle, degrees, in (0, 180]
 * Throws RangeError for bad arguments and where V1/Ecm >= 0.5 (outside the first-order validity).
 */
export function andersenScreeningFactor(z1: number, z2: number, energyCmKeV: number, thetaCmDeg: number): number {
  const { x, s } = check(z1, z2, energyCmKeV, thetaCmDeg);
  const numerator = 1 + x / 2;
  const y = x / (2 * s);
  const denominator = 1 + x + y * y;
  return (numerator * numerator) / (denominator * denominator);
}

/**
 * d ln F / d Ecm in 1/keV, same arguments and validity as andersenScreeningFactor. With x = V1/Ecm,
 * s = sin(θcm/2): d ln F/dx = 1/(1 + x/2) − 2 (1 + x/(2 s²)) / (1 + x + x²/(4 s²)), and dx/dEcm = −x/Ecm.
 */
export function andersenScreeningLogDerivativePerKeV(z1: number, z2: number, energyCmKeV: number, thetaCmDeg: number): number {
  const { x, s } = check(z1, z2, energyCmKeV, thetaCmDeg);
  const perX = 1 / (1 + x / 2) - (2 * (1 + x / (2 * s * s))) / (1 + x + (x * x) / (4 * s * s));
  return (-x / energyCmKeV) * perX;
}

function check(z1: number, z2: number, energyCmKeV: number, thetaCmDeg: number): { x: number; s: number } {
  if (!(energyCmKeV > 0) || !Number.isFinite(energyCmKeV)) throw new RangeError(`CM energy must be positive, got ${energyCmKeV} keV`);
  if (!(thetaCmDeg > 0 && thetaCmDeg <= 180)) throw new RangeError(`CM angle must be within (0, 180] deg, got ${thetaCmDeg}`);
  const v1 = andersenScreeningPotentialKeV(z1, z2);
  const x = v1 / energyCmKeV;
  if (!(x < MAX_V1_OVER_ECM)) {
    throw new RangeError(
      `Andersen screening for Z1 = ${z1}, Z2 = ${z2} at Ecm = ${energyCmKeV} keV has V1/Ecm = ${x.toFixed(3)} >= ${MAX_V1_OVER_ECM}, outside the first-order validity; it needs Ecm > ${(v1 / MAX_V1_OVER_ECM).toFixed(1)} keV`,
    );
  }
  return { x, s: Math.sin(degToRad(thetaCmDeg) / 2) };
}
