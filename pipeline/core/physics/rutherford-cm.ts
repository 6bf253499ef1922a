// Rutherford cross section, CM frame: E. Rutherford, Phil. Mag. 21, 669 (1911).
import { COULOMB_CONSTANT_KEV_FM } from './codata2018.js';
import { FM2_TO_MB, degToRad } from './units.js';

/**
 * Rutherford differential cross section in the centre-of-mass frame, mb/sr:
 *
 *   dσ/dΩcm = ( Z1 Z2 e² / (4 Ecm) )² / sin⁴(θcm/2)
 *
 * with e² = e²/(4π ε0) = 1.43996448 MeV fm (CODATA 2018); fm² → mb by ×10.
 * @param z1 projectile atomic number
 * @param z2 target atomic number
 * @param energyCmKeV kinetic energy in the CM frame, keV (Ecm = E_lab M2/(M1+M2))
 * @param thetaCmDeg CM scattering angle, degrees, in (0, 180]
 */
export function rutherfordCmMbPerSr(z1: number, z2: number, energyCmKeV: number, thetaCmDeg: number): number {
  if (!(energyCmKeV > 0)) throw new RangeError(`CM energy must be positive, got ${energyCmKeV} keV`);
  if (!(thetaCmDeg > 0 && thetaCmDeg <= 180)) {
    throw new RangeError(`CM angle must be within (0, 180] deg, got ${thetaCmDeg}`);
  }
  const lengthFm = (z1 * z2 * COULOMB_CONSTANT_KEV_FM) / (4 * energyCmKeV);
  const s = Math.sin(degToRad(thetaCmDeg) / 2);
  return (lengthFm * lengthFm * FM2_TO_MB) / (s * s * s * s);
}
