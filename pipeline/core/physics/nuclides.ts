// Masses: AME2020, Wang et al., Chinese Physics C 45, 030003 (2021). Abundances: IUPAC CIAAW 2013, Meija et al., Pure Appl. Chem. 88, 293-306 (2016).
/**
 * Nuclides by name (`12C`, `4He`, `197Au`), their AME2020 atomic masses, natural isotopic
 * compositions and the molar masses derived from them.
 */
import { AME2020_ATOMIC_MASSES } from './ame2020-masses.js';
import { ATOMIC_MASS_UNIT_KEV, CODATA2018 } from './codata2018.js';
import { elementSymbol, elementZ } from './element-symbols.js';
import { NATURAL_ABUNDANCES } from './natural-abundances.js';

export { elementSymbol, elementZ } from './element-symbols.js';

export const MASS_TABLE_EDITION = 'AME2020';
export const ABUNDANCE_EDITION = 'IUPAC CIAAW 2013';

export interface Nuclide {
  /** Mass number then element symbol, e.g. `12C`. */
  name: string;
  /** Element symbol as in the periodic table, e.g. `C` (`n` for the neutron). */
  symbol: string;
  z: number;
  a: number;
  /** Atomic (neutral-atom) mass in u, AME2020. */
  massU: number;
  /** Standard uncertainty of massU in u. */
  massUncU: number;
  /** True when AME2020 gives the mass from systematics (`#`), not from experiment. */
  estimated: boolean;
}

const ACCEPTED = 'a mass number followed by an element symbol spelled as in the periodic table, e.g. 1H, 4He, 12C, 197Au';

export class UnknownNuclideError extends Error {
  constructor(readonly nuclideName: string, reason: string) {
    super(`unknown nuclide "${nuclideName}": ${reason}; expected ${ACCEPTED}, for a nuclide listed in ${MASS_TABLE_EDITION}`);
    this.name = 'UnknownNuclideError';
  }
}

export class UnknownElementError extends Error {
  constructor(readonly elementSymbol: string) {
    super(`no natural isotopic composition for element "${elementSymbol}": expected the symbol of an element with stable isotopes (Z = 1..83 except Tc and Pm) or Th or U, spelled as in the periodic table (e.g. C, Si, Au)`);
    this.name = 'UnknownElementError';
  }
}

/**
 * Splits `12C` into `{ a: 12, symbol: 'C' }`. Strict: the symbol must be spelled as in the
 * periodic table (`12c`, `12 C`, `C12` are rejected) and A must be >= Z; returns null otherwise.
 */
export function parseNuclideName(text: string): { a: number; symbol: string } | null {
  const match = /^([1-9]\d{0,2})([A-Z][a-z]{0,2}|n)$/.exec(text);
  if (match === null) return null;
  const a = Number(match[1]);
  const z = elementZ(match[2]);
  if (z === undefined || a < z) return null;
  return { a, symbol: match[2] };
}

let table: Map<string, Nuclide> | undefined;

function nuclideTable(): Map<string, Nuclide> {
  if (table !== undefined) return table;
  table = new Map();
  for (const line of AME2020_ATOMIC_MASSES.split('\n')) {
    if (line.length === 0) continue;
    const [zText, aText, massText, uncText, flag] = line.split(' ');
    const z = Number(zText);
    const a = Number(aText);
    const symbol = elementSymbol(z) as string;
    const name = `${a}${symbol}`;
    table.set(name, { name, symbol, z, a, massU: Number(massText), massUncU: Number(uncText), estimated: flag === '#' });
  }
  return table;
}

/** The nuclide named `name` (e.g. `12C`); throws UnknownNuclideError if the name is malformed or not in AME2020. */
export function nuclide(name: string): Nuclide {
  const known = nuclideTable().get(name);
  if (known !== undefined) return known;
  const parsed = parseNuclideName(name);
  if (parsed === null) throw new UnknownNuclideError(name, 'not a nuclide name');
  const found = nuclideTable().get(name);
  if (found === undefined) throw new UnknownNuclideError(name, `${MASS_TABLE_EDITION} has no mass for it`);
  return found;
}

/** Natural isotopes of an element with their amount fractions (IUPAC 2013); throws UnknownElementError without data. */
export function naturalIsotopes(symbol: string): { nuclide: Nuclide; abundance: number }[] {
  const entry = Object.prototype.hasOwnProperty.call(NATURAL_ABUNDANCES, symbol) ? NATURAL_ABUNDANCES[symbol] : undefined;
  if (entry === undefined) throw new UnknownElementError(symbol);
  return entry.split(' ').map((pair) => {
    const [aText, fraction] = pair.split(':');
    return { nuclide: nuclide(`${aText}${symbol}`), abundance: Number(fraction) };
  });
}

/** Atomic weight of the natural element in u: sum of abundance x AME2020 atomic mass. */
export function standardAtomicWeight(symbol: string): number {
  return naturalIsotopes(symbol).reduce((sum, iso) => sum + iso.abundance * iso.nuclide.massU, 0);
}

/**
 * Molar mass in g/mol of an element (natural composition, key `Si`) or a nuclide (key `28Si`).
 * Uses M(X) = A_r(X) M_u with M_u = 1 g/mol; CODATA 2018 gives M_u = 0.999 999 999 65 g/mol,
 * a difference of 3.5e-10 that is neglected.
 */
export function molarMassGPerMol(key: string): number {
  if (parseNuclideName(key) !== null) return nuclide(key).massU;
  if (elementZ(key) !== undefined) return standardAtomicWeight(key);
  throw new UnknownNuclideError(key, 'neither an element symbol nor a nuclide name');
}

/**
 * Nuclear mass in MeV: M_nuc c^2 = M_atom u c^2 - Z m_e c^2 (AME2020 atomic mass, CODATA 2018
 * u and m_e). The total binding energy of the atom's electrons is neglected: it is 13.6 eV for H,
 * ~1 keV for C and ~0.5 MeV for Au (from memory, Lunney, Pearson & Thibault, Rev. Mod. Phys. 75,
 * 1021 (2003): 14.4381 Z^2.39 + 1.55468e-6 Z^5.35 eV), at most ~4e-6 of the nuclear mass (U).
 */
export function nuclearMassMeV(n: Nuclide): number {
  return n.massU * CODATA2018.atomicMassUnitMeV - n.z * CODATA2018.electronMassMeV;
}

/** Atomic mass of a nuclide in keV (M_atom u c^2), for Q-values. */
export function atomicMassKeV(n: Nuclide): number {
  return n.massU * ATOMIC_MASS_UNIT_KEV;
}
