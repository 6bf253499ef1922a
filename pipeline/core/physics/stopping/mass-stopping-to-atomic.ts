import { CODATA2018 } from '../codata2018.js';

/**
 * Mass stopping power (MeV cm²/g) to stopping cross section per atom in eV/(1e15 atoms/cm²):
 *   S_atom = S_mass M / N_A, times 1e6 eV/MeV and 1e15 atoms/cm² per unit.
 * @param sMeVCm2PerG mass stopping power, MeV cm²/g
 * @param molarMassPerAtomGPerMol mean molar mass per atom of the material, g/mol (the project's molar
 *   masses, so that S_atom x atoms/cm² equals S_mass x g/cm² for layers converted from µg/cm²)
 */
export function massStoppingToEvPer1e15(sMeVCm2PerG: number, molarMassPerAtomGPerMol: number): number {
  return (sMeVCm2PerG * molarMassPerAtomGPerMol * 1e21) / CODATA2018.avogadro;
}
