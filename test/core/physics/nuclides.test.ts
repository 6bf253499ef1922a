import { describe, expect, it } from 'vitest';
import {
  ABUNDANCE_EDITION, MASS_TABLE_EDITION, UnknownElementError, UnknownNuclideError, elementSymbol, elementZ,
  molarMassGPerMol, naturalIsotopes, nuclearMassMeV, nuclide, parseNuclideName, standardAtomicWeight,
} from '../../../pipeline/core/physics/nuclides.js';

describe('AME2020 atomic masses (Wang et al., Chinese Physics C 45, 030003 (2021), mass.mas20)', () => {
  // Values read from mass.mas20, column "ATOMIC MASS" (micro-u), divided by 1e6.
  it.each([
    ['1n', 0, 1.00866491590, 0.00000000047],
    ['1H', 1, 1.007825031898, 0.000000000014],
    ['2H', 1, 2.014101777844, 0.000000000015],
    ['4He', 2, 4.00260325413, 0.00000000016],
    ['12C', 6, 12, 0],
    ['13C', 6, 13.00335483534, 0.00000000025],
    ['16O', 8, 15.99491461926, 0.00000000032],
    ['28Si', 14, 27.97692653442, 0.00000000055],
    ['197Au', 79, 196.966570103, 0.000000581],
  ])('%s has the published atomic mass', (name, z, massU, uncU) => {
    const n = nuclide(name);
    expect(n.name).toBe(name);
    expect(n.z).toBe(z);
    expect(n.massU).toBe(massU); // digits copied exactly, so parsing gives the same double
    expect(n.massUncU).toBeCloseTo(uncU, 15);
    expect(n.estimated).toBe(false);
  });

  it('flags masses from systematics (# in mass.mas20): 3Li is 3030775# +- 2147# micro-u', () => {
    const li3 = nuclide('3Li');
    expect(li3.estimated).toBe(true);
    expect(li3.massU).toBeCloseTo(3.030775, 9);
    expect(li3.massUncU).toBeCloseTo(0.002147, 9);
  });

  it('holds the heaviest nuclide of the file, 295Og (A = 295, Z = 118, estimated)', () => {
    expect(nuclide('295Og').massU).toBeCloseTo(295.216178, 6);
    expect(nuclide('295Og').estimated).toBe(true);
  });

  it('nuclear mass = atomic mass - Z m_e: 4He vs CODATA 2018 alpha mass 3727.3794066 MeV', () => {
    // Electron binding of He (24.6 + 54.4 eV = 79 eV, from memory) is neglected, so we expect 79 eV less.
    expect(nuclearMassMeV(nuclide('4He')) - 3727.3794066).toBeCloseTo(-79.0e-6, 5);
    // proton: CODATA 2018 m_p c^2 = 938.27208816 MeV; 1H binding 13.6 eV neglected
    expect(nuclearMassMeV(nuclide('1H')) - 938.27208816).toBeCloseTo(-13.6e-6, 6);
  });

  it('records its editions', () => {
    expect(MASS_TABLE_EDITION).toBe('AME2020');
    expect(ABUNDANCE_EDITION).toBe('IUPAC CIAAW 2013');
  });
});

describe('nuclide names: mass number then symbol spelled as in the periodic table', () => {
  it.each([
    ['12C', 12, 'C'], ['4He', 4, 'He'], ['1H', 1, 'H'], ['197Au', 197, 'Au'], ['1n', 1, 'n'], ['295Og', 295, 'Og'],
  ])('parses %s', (text, a, symbol) => {
    expect(parseNuclideName(text)).toEqual({ a, symbol });
  });

  // Decision: case matters (12c, 12HE are rejected rather than guessed), no spaces, no symbol-first form.
  it.each(['12c', '12HE', 'C12', '12 C', ' 12C', '12C ', '', 'C', '12', '0C', '012C', '4Xx', '1C', '12C1', 'He-4', '4he'])(
    'rejects %j',
    (text) => {
      expect(parseNuclideName(text)).toBeNull();
    },
  );

  it('nuclide() throws UnknownNuclideError quoting the name and the accepted form', () => {
    expect(() => nuclide('12c')).toThrow(UnknownNuclideError);
    expect(() => nuclide('12c')).toThrow(/"12c".*e\.g\. 1H, 4He, 12C, 197Au/);
    // well-formed but not in AME2020 (no such nuclide known)
    expect(() => nuclide('40H')).toThrow(/"40H".*AME2020 has no mass/);
  });

  it('element symbols and Z (IUPAC periodic table)', () => {
    expect(elementZ('Au')).toBe(79);
    expect(elementZ('U')).toBe(92);
    expect(elementZ('AU')).toBeUndefined();
    expect(elementSymbol(14)).toBe('Si');
    expect(elementSymbol(118)).toBe('Og');
    expect(elementSymbol(119)).toBeUndefined();
    expect(elementSymbol(1.5)).toBeUndefined();
  });
});

describe('natural composition and molar mass (IUPAC CIAAW 2013, from memory)', () => {
  it('carbon: 12C 0.9893, 13C 0.0107', () => {
    const c = naturalIsotopes('C');
    expect(c.map((i) => [i.nuclide.name, i.abundance])).toEqual([['12C', 0.9893], ['13C', 0.0107]]);
  });

  it('molar mass of an element is its atomic weight; of a nuclide, its atomic mass', () => {
    expect(molarMassGPerMol('Si')).toBeCloseTo(28.0855, 3); // IUPAC 2013 conventional 28.085
    expect(molarMassGPerMol('28Si')).toBe(27.97692653442);
    expect(standardAtomicWeight('Au')).toBe(196.966570103);
    expect(() => molarMassGPerMol('Xx')).toThrow(UnknownNuclideError);
  });

  it('elements without stable isotopes or unknown symbols throw UnknownElementError', () => {
    expect(() => naturalIsotopes('Tc')).toThrow(UnknownElementError);
    expect(() => naturalIsotopes('Pm')).toThrow(/"Pm"/);
    expect(() => naturalIsotopes('toString')).toThrow(UnknownElementError);
  });
});
