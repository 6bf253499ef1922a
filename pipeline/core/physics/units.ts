/**
 * The one unit-conversion module of xsred. Every conversion between the units used at the
 * boundaries (mb/sr, cm^2, fm^2, deg/rad, uC, ug/cm^2, atoms/cm^2) goes through here.
 * Constants from CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)).
 */
import { CODATA2018 } from './codata2018.js';

/** 1 fm^2 = 10 mb (1 b = 100 fm^2). */
export const FM2_TO_MB = 10;
/** 1 mb = 1e-27 cm^2. */
export const MB_TO_CM2 = 1e-27;
/** 1 MeV = 1000 keV. */
export const MEV_TO_KEV = 1000;
/** Areal densities in the series files are often given in units of 1e15 atoms/cm^2. */
export const ATOMS_PER_CM2_PER_1E15 = 1e15;

/** Degrees to radians. */
export function degToRad(deg: number): number {
  return (deg * Math.PI) / 180;
}

/** Radians to degrees. */
export function radToDeg(rad: number): number {
  return (rad * 180) / Math.PI;
}

/**
 * Number of beam particles carried by an integrated charge: N = Q / (q e).
 * @param chargeUC integrated beam charge in uC
 * @param chargeState charge state q of the beam ions (positive integer, elementary charges)
 */
export function microCoulombToParticles(chargeUC: number, chargeState: number): number {
  if (!(chargeState > 0)) {
    throw new RangeError(`charge state must be positive, got ${chargeState}`);
  }
  return (chargeUC * 1e-6) / (chargeState * CODATA2018.elementaryChargeC);
}

/**
 * Areal density in atoms/cm^2 from ug/cm^2: n = (m * 1e-6 g/ug) N_A / M.
 * @param ugPerCm2 areal mass density in ug/cm^2
 * @param molarMassGPerMol molar mass of the atoms (or mean molar mass per atom of a compound) in g/mol
 */
export function arealDensityUgPerCm2ToAtomsPerCm2(ugPerCm2: number, molarMassGPerMol: number): number {
  if (!(molarMassGPerMol > 0)) {
    throw new RangeError(`molar mass must be positive, got ${molarMassGPerMol} g/mol`);
  }
  return (ugPerCm2 * 1e-6 * CODATA2018.avogadro) / molarMassGPerMol;
}

/**
 * Inverse of arealDensityUgPerCm2ToAtomsPerCm2: ug/cm^2 from atoms/cm^2.
 * @param atomsPerCm2 areal density in atoms/cm^2
 * @param molarMassGPerMol molar mass in g/mol
 */
export function arealDensityAtomsPerCm2ToUgPerCm2(atomsPerCm2: number, molarMassGPerMol: number): number {
  if (!(molarMassGPerMol > 0)) {
    throw new RangeError(`molar mass must be positive, got ${molarMassGPerMol} g/mol`);
  }
  return (atomsPerCm2 * molarMassGPerMol) / (CODATA2018.avogadro * 1e-6);
}
