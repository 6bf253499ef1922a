// Electron screening of Rutherford scattering: J. L'Ecuyer, J.A. Davies, N. Matsunami, Nucl. Instrum. Methods 160, 337 (1979).
/**
 * L'Ecuyer screening factor F = σ_screened / σ_Rutherford (angle-independent, for backward angles):
 *
 *   F = 1 − 0.049 Z1 Z2^{4/3} / Ecm     (Ecm in keV)
 *
 * @param z1 projectile atomic number
 * @param z2 target atomic number
 * @param energyCmKeV CM kinetic energy, keV
 * Throws RangeError where F <= 0.5: the formula is a first-order correction and not valid there.
 */
export function lecuyerScreeningFactor(z1: number, z2: number, energyCmKeV: number): number {
  if (!(energyCmKeV > 0)) throw new RangeError(`CM energy must be positive, got ${energyCmKeV} keV`);
  const f = 1 - (0.049 * z1 * Math.pow(z2, 4 / 3)) / energyCmKeV;
  if (!(f > 0.5)) {
    const minKeV = 2 * 0.049 * z1 * Math.pow(z2, 4 / 3);
    throw new RangeError(
      `L'Ecuyer screening factor ${f.toFixed(3)} for Z1 = ${z1}, Z2 = ${z2} at Ecm = ${energyCmKeV} keV is <= 0.5, where the formula is not valid; it needs Ecm > ${minKeV.toFixed(1)} keV`,
    );
  }
  return f;
}

/** d ln F / d Ecm in 1/keV: (0.049 Z1 Z2^{4/3} / Ecm²) / F. Same arguments and validity as lecuyerScreeningFactor. */
export function lecuyerScreeningLogDerivativePerKeV(z1: number, z2: number, energyCmKeV: number): number {
  const f = lecuyerScreeningFactor(z1, z2, energyCmKeV);
  return (0.049 * z1 * Math.pow(z2, 4 / 3)) / (energyCmKeV * energyCmKeV) / f;
}
