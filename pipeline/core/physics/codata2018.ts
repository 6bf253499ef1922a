// Constants: CODATA 2018, E. Tiesinga, P.J. Mohr, D.B. Newell, B.N. Taylor, Rev. Mod. Phys. 93, 025010 (2021).
/**
 * Fundamental constants used by xsred, CODATA 2018 recommended values. Exact values (SI 2019
 * defining constants) say so; the others are the recommended values with their relative
 * standard uncertainty noted.
 */
export const CODATA2018 = {
  edition: 'CODATA 2018',
  /** e^2/(4 pi eps0) in MeV fm, = alpha * hbar c = 1.439 964 547 (derived from the two CODATA 2018 values below). */
  coulombConstantMeVFm: 1.439964547,
  /** Fine-structure constant alpha (rel. unc. 1.5e-10). */
  fineStructureConstant: 7.2973525693e-3,
  /** hbar c in MeV fm (exact in SI 2019; CODATA 2018 prints 197.326 980 4...). */
  hbarCMeVFm: 197.3269804,
  /** Atomic mass constant m_u c^2 = 1 u in MeV (rel. unc. 3.0e-10). */
  atomicMassUnitMeV: 931.49410242,
  /** Atomic mass constant m_u in kg (rel. unc. 3.0e-10). */
  atomicMassUnitKg: 1.6605390666e-27,
  /** Electron mass m_e c^2 in MeV (rel. unc. 3.0e-10). */
  electronMassMeV: 0.51099895,
  /** Electron mass in u (rel. unc. 2.9e-11). */
  electronMassU: 5.48579909065e-4,
  /** Elementary charge e in C (exact). */
  elementaryChargeC: 1.602176634e-19,
  /** Avogadro constant N_A in 1/mol (exact). */
  avogadro: 6.02214076e23,
  /** Speed of light in vacuum c in m/s (exact). */
  speedOfLightMPerS: 299792458,
  /** Molar mass constant M_u in g/mol (= 0.999 999 999 65 g/mol, rel. unc. 3.0e-10). */
  molarMassConstantGPerMol: 0.99999999965,
} as const;

/** 1 u in keV, the conversion used by every mass-to-energy step in xsred. */
export const ATOMIC_MASS_UNIT_KEV = CODATA2018.atomicMassUnitMeV * 1000;

/** e^2/(4 pi eps0) in keV fm. */
export const COULOMB_CONSTANT_KEV_FM = CODATA2018.coulombConstantMeVFm * 1000;
