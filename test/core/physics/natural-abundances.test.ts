import { describe, expect, it } from 'vitest';
import { NATURAL_ABUNDANCES, STANDARD_ATOMIC_WEIGHTS_2013 } from '../../../pipeline/core/physics/natural-abundances.js';
import { naturalIsotopes, standardAtomicWeight } from '../../../pipeline/core/physics/nuclides.js';

const REQUIRED = (
  'H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Ti V Cr Mn Fe Co Ni Cu Zn Ga Ge As Se Br Kr Rb Sr Y Zr Nb Mo ' +
  'Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce Pr Nd Sm Eu Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Th U'
).split(' ');

/**
 * Tolerance 0.01 u, except Pb: its IUPAC 2013 standard atomic weight is 207.2(1) because natural
 * lead varies that much (from memory), so the representative composition may sit 0.02 u away.
 */
const TOLERANCE_U: Record<string, number> = { Pb: 0.1 };

describe('natural isotopic compositions (IUPAC CIAAW 2013, Meija et al., Pure Appl. Chem. 88, 293 (2016), from memory)', () => {
  it('covers every element the pipeline needs', () => {
    for (const el of REQUIRED) expect(NATURAL_ABUNDANCES[el], el).toBeDefined();
    expect(Object.keys(STANDARD_ATOMIC_WEIGHTS_2013).sort()).toEqual(Object.keys(NATURAL_ABUNDANCES).sort());
  });

  it.each(Object.keys(NATURAL_ABUNDANCES))('%s: fractions sum to 1 within 1e-4, isotopes are measured AME2020 nuclides', (el) => {
    const isotopes = naturalIsotopes(el);
    const sum = isotopes.reduce((s, i) => s + i.abundance, 0);
    expect(Math.abs(sum - 1)).toBeLessThan(1e-4);
    for (const i of isotopes) {
      expect(i.abundance).toBeGreaterThan(0);
      expect(i.nuclide.estimated).toBe(false);
    }
  });

  it.each(Object.keys(NATURAL_ABUNDANCES))(
    '%s: derived atomic weight agrees with the IUPAC 2013 standard atomic weight (from memory)',
    (el) => {
      const tolerance = TOLERANCE_U[el] ?? 0.01;
      expect(Math.abs(standardAtomicWeight(el) - STANDARD_ATOMIC_WEIGHTS_2013[el])).toBeLessThan(tolerance);
    },
  );
});
