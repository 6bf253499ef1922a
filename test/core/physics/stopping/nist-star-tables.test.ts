import { describe, expect, it } from 'vitest';
import { CODATA2018 } from '../../../../pipeline/core/physics/codata2018.js';
import { molarMassGPerMol, nuclide } from '../../../../pipeline/core/physics/nuclides.js';
import { massStoppingToEvPer1e15 } from '../../../../pipeline/core/physics/stopping/mass-stopping-to-atomic.js';
import { nistMaterials } from '../../../../pipeline/core/physics/stopping/nist-star-materials.js';
import { ASTAR_ENERGIES_MEV, NIST_STAR_MATERIALS, PSTAR_ENERGIES_MEV } from '../../../../pipeline/core/physics/stopping/nist-star-tables.js';
import { stoppingPowerEvPer1e15 } from '../../../../pipeline/core/physics/stopping/stopping-power.js';

const proton = nuclide('1H');
const alpha = nuclide('4He');

// Rows of NIST PSTAR/ASTAR (SRD 124, ICRU Report 49 data): table, element, T (MeV), Se, Sn in MeV cm²/g,
// as printed by NIST's web text tables (4 significant figures).
const NIST_POINTS: [string, string, number, number, number][] = [
  ['PSTAR', 'C', 1, 226.1, 0.1594],
  ['PSTAR', 'C', 5, 70.1, 0.03685],
  ['PSTAR', 'Si', 2, 111.7, 0.0759],
  ['PSTAR', 'Si', 10, 34.58, 0.01798],
  ['PSTAR', 'Au', 0.5, 84.05, 0.1024],
  ['PSTAR', 'Au', 3, 36.92, 0.02486],
  ['ASTAR', 'C', 2, 1372, 1.189],
  ['ASTAR', 'Si', 1, 1295, 1.897],
  ['ASTAR', 'Si', 6, 547, 0.4098],
  ['ASTAR', 'Au', 0.5, 354.3, 1.387],
  ['ASTAR', 'Au', 1, 388.7, 0.8394],
  ['ASTAR', 'Au', 10, 165, 0.1315],
];

describe('NIST PSTAR/ASTAR tables shipped in the project', () => {
  it('hold the 26 elements and 6 compounds of the reference copy, on 132 PSTAR and 121 ASTAR energies (NIST SRD 124 default grids)', () => {
    expect(NIST_STAR_MATERIALS).toHaveLength(32);
    expect(PSTAR_ENERGIES_MEV.split(' ')).toHaveLength(132);
    expect(ASTAR_ENERGIES_MEV.split(' ')).toHaveLength(121);
    expect(PSTAR_ENERGIES_MEV.split(' ').at(-1)).toBe('1.000E+04');
    expect(ASTAR_ENERGIES_MEV.split(' ').at(-1)).toBe('1.000E+03');
    for (const r of NIST_STAR_MATERIALS) {
      for (const col of [r.pstarElectronic, r.pstarNuclear]) expect(col.split(' ')).toHaveLength(132);
      for (const col of [r.astarElectronic, r.astarNuclear]) expect(col.split(' ')).toHaveLength(121);
    }
  });

  it('reproduce NIST table points exactly (electronic and nuclear, converted to eV/(1e15 atoms/cm²))', () => {
    for (const [table, el, tMeV, se, sn] of NIST_POINTS) {
      const r = stoppingPowerEvPer1e15(table === 'PSTAR' ? proton : alpha, { [el]: 1 }, tMeV * 1000);
      expect(r.ok).toBe(true);
      if (!r.ok) continue;
      expect(r.method).toBe('nist-element');
      // Back to MeV cm²/g with the same molar mass: equal to NIST's printed value to rounding of doubles.
      const back = (x: number) => (x * CODATA2018.avogadro) / (molarMassGPerMol(el) * 1e21);
      expect(back(r.electronic)).toBeCloseTo(se, 9);
      expect(back(r.nuclear) / sn).toBeCloseTo(1, 12);
    }
  });

  it('NIST spot values quoted in the reference folder: protons in graphite 1, 2, 5 MeV = 229.5, 140.8, 70.65; alphas in gold 2, 5, 8 MeV = 346.8, 233.4, 185.5 MeV cm²/g', () => {
    const graphite = nistMaterials().get('C-graphite')!;
    const gold = nistMaterials().get('Au')!;
    const at = (t: typeof graphite.pstar, keV: number) => t.electronicEvPer1e15[t.energiesKeV.indexOf(keV)]!;
    expect(at(graphite.pstar, 1000)).toBe(massStoppingToEvPer1e15(229.5, graphite.molarMassPerAtomGPerMol));
    expect(at(graphite.pstar, 2000)).toBe(massStoppingToEvPer1e15(140.8, graphite.molarMassPerAtomGPerMol));
    expect(at(graphite.pstar, 5000)).toBe(massStoppingToEvPer1e15(70.65, graphite.molarMassPerAtomGPerMol));
    expect(at(gold.astar, 2000)).toBe(massStoppingToEvPer1e15(346.8, gold.molarMassPerAtomGPerMol));
    expect(at(gold.astar, 5000)).toBe(massStoppingToEvPer1e15(233.4, gold.molarMassPerAtomGPerMol));
    expect(at(gold.astar, 8000)).toBe(massStoppingToEvPer1e15(185.5, gold.molarMassPerAtomGPerMol));
  });

  it('carry the ICRU 37/49 mean excitation energies NIST uses (Au 790 eV, Si 173 eV, water 75 eV, graphite 78 eV)', () => {
    const I = (id: string) => nistMaterials().get(id)!.meanExcitationEV;
    expect([I('Au'), I('Si'), I('H2O-liquid'), I('C-graphite'), I('C')]).toEqual([790, 173, 75, 78, 81]);
  });

  it('convert MeV cm²/g to eV/(1e15 atoms/cm²) as S M / N_A: 2 MeV alphas in Si, 1023 MeV cm²/g x 28.085 g/mol / 6.022e23 = 47.71 (hand calculation)', () => {
    expect(massStoppingToEvPer1e15(1023, 28.085)).toBeCloseTo((1023 * 28.085 * 1e21) / 6.02214076e23, 10);
    expect(massStoppingToEvPer1e15(1023, 28.085)).toBeCloseTo(47.71, 2);
  });
});
