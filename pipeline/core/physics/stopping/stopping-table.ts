/**
 * A stopping table in xsred's internal unit, eV/(1e15 atoms/cm²) per atom of the material, at
 * kinetic energies in keV of the projectile the table is for. NIST tables carry what the Bethe
 * formula needs above their top energy; user tables do not (a look-up above them fails).
 */
export interface StoppingTable {
  /** For reports: `PSTAR GOLD`, `ASTAR WATER, LIQUID`, `user TiN 1H (stopping.csv)`. */
  label: string;
  source: 'nist-element' | 'nist-compound' | 'user-table';
  /** Nuclide name of the projectile the table is for (`1H`, `4He`, or a user table's projectile). */
  projectile: string;
  /** Strictly rising kinetic energies of the projectile, keV. */
  energiesKeV: Float64Array;
  /** Electronic stopping (the total, for a user table), eV/(1e15 atoms/cm²). */
  electronicEvPer1e15: Float64Array;
  /** Nuclear stopping, eV/(1e15 atoms/cm²); null for a user table (its total is in electronicEvPer1e15). */
  nuclearEvPer1e15: Float64Array | null;
  /** Mean atomic mass per atom of the material in u (target mass for nuclear-stopping scaling); NaN if unknown. */
  meanTargetMassU: number;
  /** Mean Z per atom and mean excitation energy (eV) for the Bethe formula above the top energy; null: no Bethe. */
  bethe: { meanZ: number; meanExcitationEV: number } | null;
}
