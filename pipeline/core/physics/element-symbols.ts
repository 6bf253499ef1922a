/**
 * Element symbols by atomic number Z, as in the IUPAC periodic table (Z = 1..118), with
 * `n` at Z = 0 for the free neutron so that nuclide names such as `1n` parse like any other.
 */
export const ELEMENT_SYMBOLS: readonly string[] = [
  'n',
  'H', 'He', 'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne',
  'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar', 'K', 'Ca',
  'Sc', 'Ti', 'V', 'Cr', 'Mn', 'Fe', 'Co', 'Ni', 'Cu', 'Zn',
  'Ga', 'Ge', 'As', 'Se', 'Br', 'Kr', 'Rb', 'Sr', 'Y', 'Zr',
  'Nb', 'Mo', 'Tc', 'Ru', 'Rh', 'Pd', 'Ag', 'Cd', 'In', 'Sn',
  'Sb', 'Te', 'I', 'Xe', 'Cs', 'Ba', 'La', 'Ce', 'Pr', 'Nd',
  'Pm', 'Sm', 'Eu', 'Gd', 'Tb', 'Dy', 'Ho', 'Er', 'Tm', 'Yb',
  'Lu', 'Hf', 'Ta', 'W', 'Re', 'Os', 'Ir', 'Pt', 'Au', 'Hg',
  'Tl', 'Pb', 'Bi', 'Po', 'At', 'Rn', 'Fr', 'Ra', 'Ac', 'Th',
  'Pa', 'U', 'Np', 'Pu', 'Am', 'Cm', 'Bk', 'Cf', 'Es', 'Fm',
  'Md', 'No', 'Lr', 'Rf', 'Db', 'Sg', 'Bh', 'Hs', 'Mt', 'Ds',
  'Rg', 'Cn', 'Nh', 'Fl', 'Mc', 'Lv', 'Ts', 'Og',
];

const Z_BY_SYMBOL = new Map<string, number>(ELEMENT_SYMBOLS.map((s, z) => [s, z]));

/** Atomic number of an element symbol spelled as in the periodic table (`Au`, not `AU`); `n` gives 0. */
export function elementZ(symbol: string): number | undefined {
  return Z_BY_SYMBOL.get(symbol);
}

/** Element symbol for atomic number `z` (0 gives `n`, the neutron); undefined outside 0..118. */
export function elementSymbol(z: number): string | undefined {
  return Number.isInteger(z) ? ELEMENT_SYMBOLS[z] : undefined;
}
