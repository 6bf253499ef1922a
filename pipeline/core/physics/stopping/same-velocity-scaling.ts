// Nuclear part: reduced-energy scaling of J.F. Ziegler, J.P. Biersack, U. Littmark, "The Stopping and Range of Ions in Solids" (Pergamon, 1985), ch. 2 (universal nuclear stopping in reduced units).
/**
 * How to read a table made for one projectile and target mass for another of the same Z.
 *
 * Electronic stopping depends on the projectile's velocity and charge, not its mass, so a table for
 * a reference ion of the same Z is read at the same velocity: E_ref = E M1_ref / M1 (2H and 3H from
 * protons, 3He from 4He; common practice, ICRU Report 49 (1993) gives the same rule; from memory).
 * Accuracy: exact in the Bethe regime; isotope effects of a few % are reported only below ~10 keV/u
 * (from memory), where xsred beams do not go.
 *
 * Nuclear stopping in universal reduced units, for the same Z1 and Z2, scales with the masses as
 *   eps proportional to M2 E / (M1 + M2),   S_n proportional to M1 / (M1 + M2) s_n(eps),
 * so S_n(M1, M2, E) = [M1 (M1r + M2r) / (M1r (M1 + M2))] S_n,ref(E M2 (M1r + M2r) / (M2r (M1 + M2))).
 * This holds exactly for any potential with a screening length that depends on Z1 and Z2 only.
 * For a compound table the mean atomic mass per atom is used for M2 (approximate; the nuclear part
 * is < 0.5% of the total above 25 keV/u for protons and < 2.5% above 25 keV/u for alphas in the NIST tables).
 */
export interface TableReadFactors {
  /** Multiply the ion's energy by this to read the electronic column. */
  electronicEnergyFactor: number;
  /** Multiply the ion's energy by this to read the nuclear column. */
  nuclearEnergyFactor: number;
  /** Multiply the nuclear value read by this. */
  nuclearValueFactor: number;
}

/**
 * @param ionMassU M1, mass of the ion, u
 * @param tableIonMassU M1_ref, mass of the projectile the table is for, u
 * @param targetMassU M2, atomic mass of the target atom, u
 * @param tableTargetMassU M2_ref, the table's (mean) target atomic mass, u; NaN: no nuclear scaling (factors 1)
 */
export function tableReadFactors(ionMassU: number, tableIonMassU: number, targetMassU: number, tableTargetMassU: number): TableReadFactors {
  const electronicEnergyFactor = tableIonMassU / ionMassU;
  if (!Number.isFinite(tableTargetMassU)) return { electronicEnergyFactor, nuclearEnergyFactor: electronicEnergyFactor, nuclearValueFactor: 1 };
  const m1 = ionMassU;
  const m1r = tableIonMassU;
  const m2 = targetMassU;
  const m2r = tableTargetMassU;
  return {
    electronicEnergyFactor,
    nuclearEnergyFactor: (m2 * (m1r + m2r)) / (m2r * (m1 + m2)),
    nuclearValueFactor: (m1 * (m1r + m2r)) / (m1r * (m1 + m2)),
  };
}
