// Bethe formula: H. Bethe, Ann. Phys. 397, 325 (1930); relativistic form with T_max as in Particle Data Group, R.L. Workman et al., Prog. Theor. Exp. Phys. 2022, 083C01, eq. 34.5 (equation number from memory).
import { CODATA2018 } from '../codata2018.js';

/** 4 pi r_e^2 m_e c^2 = 4 pi alpha^2 (hbar c)^2 / (m_e c^2), in eV per (1e15 atoms/cm^2) (PDG's K / N_A: 0.307075 MeV cm²/mol). */
const BETHE_PREFACTOR_EV_PER_1E15 =
  (4 * Math.PI * CODATA2018.fineStructureConstant ** 2 * (CODATA2018.hbarCMeVFm * 1e-13) ** 2 * 1e6 * 1e15) / CODATA2018.electronMassMeV;

/**
 * Electronic stopping cross section per atom from the Bethe formula, shell, density-effect, Barkas
 * and Bloch corrections all omitted:
 *
 *   S = K' z^2 Z2 / beta^2 [ 1/2 ln(2 m_e c^2 beta^2 gamma^2 T_max / I^2) - beta^2 ],
 *   T_max = 2 m_e c^2 beta^2 gamma^2 / (1 + 2 gamma m_e/M + (m_e/M)^2),  K' = 4 pi r_e^2 m_e c^2.
 *
 * Used by xsred only above a NIST table's top energy (10 GeV protons, 1 GeV alphas), stitched there.
 * @param projectileZ z, the projectile's charge number (bare ion)
 * @param projectileMassMeV M c^2 of the projectile, MeV
 * @param meanZ2 mean atomic number per atom of the material
 * @param meanExcitationEV mean excitation energy I of the material, eV
 * @param energyKeV kinetic energy of the projectile, keV
 * @returns eV/(1e15 atoms/cm²); NaN where the logarithm is not positive (far below Bethe's range)
 */
export function betheElectronicEvPer1e15(projectileZ: number, projectileMassMeV: number, meanZ2: number, meanExcitationEV: number, energyKeV: number): number {
  const me = CODATA2018.electronMassMeV;
  const gamma = 1 + energyKeV / 1000 / projectileMassMeV;
  const beta2 = 1 - 1 / (gamma * gamma);
  const ratio = me / projectileMassMeV;
  const tMaxMeV = (2 * me * beta2 * gamma * gamma) / (1 + 2 * gamma * ratio + ratio * ratio);
  const iMeV = meanExcitationEV * 1e-6;
  const bracket = 0.5 * Math.log((2 * me * beta2 * gamma * gamma * tMaxMeV) / (iMeV * iMeV)) - beta2;
  if (!(bracket > 0)) return Number.NaN;
  return (BETHE_PREFACTOR_EV_PER_1E15 * projectileZ * projectileZ * meanZ2 * bracket) / beta2;
}
