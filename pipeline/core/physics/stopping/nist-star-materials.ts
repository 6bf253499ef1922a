/**
 * The NIST PSTAR/ASTAR materials (nist-star-tables.ts, generated) as StoppingTables in
 * eV/(1e15 atoms/cm²) at keV. Per-atom values use the project's molar masses (IUPAC 2013
 * abundances x AME2020 masses); they differ from the atomic weights NIST used by < 1e-4, below
 * the tables' 4-figure rounding.
 */
import { elementZ, molarMassGPerMol } from '../nuclides.js';
import { massStoppingToEvPer1e15 } from './mass-stopping-to-atomic.js';
import { ASTAR_ENERGIES_MEV, NIST_STAR_MATERIALS, PSTAR_ENERGIES_MEV, type NistStarRecord } from './nist-star-tables.js';
import type { StoppingTable } from './stopping-table.js';

export interface NistMaterial {
  id: string;
  nistName: string;
  composition: Readonly<Record<string, number>>;
  elementDefault: boolean;
  meanExcitationEV: number;
  densityGPerCm3: number;
  /** Mean molar mass per atom, g/mol. */
  molarMassPerAtomGPerMol: number;
  /** Proton table (PSTAR). */
  pstar: StoppingTable;
  /** Alpha-particle table (ASTAR). */
  astar: StoppingTable;
}

const numbers = (text: string) => Float64Array.from(text.split(' '), Number);

function build(r: NistStarRecord): NistMaterial {
  const entries = Object.entries(r.composition);
  const atoms = entries.reduce((s, [, n]) => s + n, 0);
  const molar = entries.reduce((s, [el, n]) => s + n * molarMassGPerMol(el), 0) / atoms;
  const meanZ = entries.reduce((s, [el, n]) => s + n * elementZ(el)!, 0) / atoms;
  const source = entries.length === 1 ? 'nist-element' : 'nist-compound';
  const table = (name: 'PSTAR' | 'ASTAR', grid: string, el: string, nu: string, projectile: string): StoppingTable => ({
    label: `${name} ${r.nistName}`,
    source,
    projectile,
    energiesKeV: numbers(grid).map((e) => e * 1000),
    electronicEvPer1e15: numbers(el).map((s) => massStoppingToEvPer1e15(s, molar)),
    nuclearEvPer1e15: numbers(nu).map((s) => massStoppingToEvPer1e15(s, molar)),
    meanTargetMassU: molar,
    bethe: { meanZ, meanExcitationEV: r.meanExcitationEV },
  });
  return {
    id: r.id,
    nistName: r.nistName,
    composition: r.composition,
    elementDefault: r.elementDefault,
    meanExcitationEV: r.meanExcitationEV,
    densityGPerCm3: r.densityGPerCm3,
    molarMassPerAtomGPerMol: molar,
    pstar: table('PSTAR', PSTAR_ENERGIES_MEV, r.pstarElectronic, r.pstarNuclear, '1H'),
    astar: table('ASTAR', ASTAR_ENERGIES_MEV, r.astarElectronic, r.astarNuclear, '4He'),
  };
}

let cache: Map<string, NistMaterial> | undefined;

/** All 32 NIST materials by xsred id (element symbol, `C-graphite`, `H2O-liquid`, `polyethylene`, `mylar`, `kapton`, `SiO2`, `Al2O3`). */
export function nistMaterials(): ReadonlyMap<string, NistMaterial> {
  cache ??= new Map(NIST_STAR_MATERIALS.map((r) => [r.id, build(r)]));
  return cache;
}

/** The default NIST table for an element symbol (amorphous carbon for C), or undefined if NIST has none (e.g. Ni, Ta). */
export function nistElementMaterial(symbol: string): NistMaterial | undefined {
  const m = nistMaterials().get(symbol);
  return m !== undefined && m.elementDefault ? m : undefined;
}

/**
 * The NIST compound whose atom fractions equal `fractions` (element symbol -> atom fraction, summing
 * to 1) within 1e-9 each, with the same set of elements; undefined when none matches.
 */
export function matchNistCompound(fractions: ReadonlyMap<string, number>): NistMaterial | undefined {
  for (const m of nistMaterials().values()) {
    const entries = Object.entries(m.composition);
    if (entries.length < 2 || entries.length !== fractions.size) continue;
    const total = entries.reduce((s, [, n]) => s + n, 0);
    if (entries.every(([el, n]) => Math.abs((fractions.get(el) ?? Number.NaN) - n / total) <= 1e-9)) return m;
  }
  return undefined;
}
