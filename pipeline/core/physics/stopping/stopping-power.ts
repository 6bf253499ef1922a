// Bragg's additivity rule: W.H. Bragg, R. Kleeman, Phil. Mag. 10, 318 (1905) (from memory).
/**
 * Stopping cross section of a material for a light ion: the public entry point of the stopping
 * module. Sources, in order of precedence:
 *   1. `options.material`: a user table of that name, or a NIST material id (`C-graphite`, `kapton`, ...),
 *      for the whole material (method `user-table`, `nist-element` or `nist-compound`);
 *   2. if a user table is named after an element (or nuclide key) of the composition: Bragg's rule over
 *      the user and NIST element tables (`bragg`, or `user-table` for a single element);
 *   3. a NIST compound table when the atom fractions equal one of the six compounds exactly (`nist-compound`);
 *   4. Bragg's rule over the NIST element tables, S = sum_i f_i S_i with atom fractions f_i (`bragg`;
 *      `nist-element` for one element). W.H. Bragg & R. Kleeman, Phil. Mag. 10, 318 (1905).
 * Bragg's rule neglects chemical and phase effects: for liquid water built from the gaseous H and O
 * tables it is 2-4% high at 0.5-2 MeV protons and ~18% high at 100 keV (see the tests; the size of
 * such deviations near the stopping maximum is discussed by Ziegler & Manoyan, NIM B 35, 215 (1988)).
 * Protons and 4He read PSTAR/ASTAR directly; 2H, 3H and 3He read them at the same velocity
 * (same-velocity-scaling.ts). Above a NIST table's top energy the Bethe formula is stitched on
 * (method `bethe`); below any table, or for other projectiles, the result is a failure.
 */
import { CODATA2018 } from '../codata2018.js';
import { nuclearMassMeV, nuclide, type Nuclide } from '../nuclides.js';
import { compositionFractions, type CompositionPart } from './composition-fractions.js';
import { matchNistCompound, nistElementMaterial, nistMaterials } from './nist-star-materials.js';
import { readStoppingTable, type BetheProjectile } from './read-stopping-table.js';
import { tableReadFactors, type TableReadFactors } from './same-velocity-scaling.js';
import { stoppingFailure, type StoppingFailure, type StoppingMethod, type StoppingResult } from './stopping-result.js';
import type { StoppingTable } from './stopping-table.js';
import type { UserStoppingTables } from './user-stopping-table.js';

export interface StoppingOptions {
  /** Tables from parseUserStoppingTables. */
  userTables?: UserStoppingTables;
  /** Name of a user table or a NIST material id giving the whole material's stopping. */
  material?: string;
}

export interface PreparedStopping {
  /** Full result at a kinetic energy in keV. */
  at(energyKeV: number): StoppingResult;
  /** Total stopping in eV/(1e15 atoms/cm²), NaN outside the valid range: for integrators. */
  totalEvPer1e15(energyKeV: number): number;
  /** The method every value reports below the NIST tables' top energies. */
  method: StoppingMethod;
  tables: string[];
}

interface Part {
  fraction: number;
  table: StoppingTable;
  factors: TableReadFactors;
  bethe: BetheProjectile | null;
}

const massU = (n: Nuclide) => nuclearMassMeV(n) / CODATA2018.atomicMassUnitMeV;

function nistTableFor(ion: Nuclide, m: { pstar: StoppingTable; astar: StoppingTable }): StoppingTable | null {
  if (ion.z === 1) return m.pstar;
  if (ion.z === 2 && (ion.a === 3 || ion.a === 4)) return m.astar;
  return null;
}

function userTableFor(ion: Nuclide, list: readonly StoppingTable[] | undefined): StoppingTable | undefined {
  return list?.find((t) => t.projectile === ion.name) ?? list?.find((t) => nuclide(t.projectile).z === ion.z);
}

function makePart(ion: Nuclide, table: StoppingTable, fraction: number, targetMassU: number): Part {
  const ref = nuclide(table.projectile);
  const bethe = table.bethe === null ? null : { z: ref.z, massMeV: nuclearMassMeV(ref) };
  return { fraction, table, factors: tableReadFactors(massU(ion), massU(ref), targetMassU, table.meanTargetMassU), bethe };
}

const UNSUPPORTED = (ion: Nuclide) =>
  stoppingFailure('stopping-unsupported-projectile', `no NIST table serves ${ion.name}: PSTAR covers 1H (and 2H, 3H at the same velocity), ASTAR 4He (and 3He); supply a user table for ${ion.name}`);

function resolveParts(ion: Nuclide, parts: CompositionPart[], fractions: Map<string, number>, options: StoppingOptions): Part[] | StoppingFailure {
  const user = options.userTables;
  if (options.material !== undefined) {
    const list = user?.get(options.material);
    if (list !== undefined) {
      const t = userTableFor(ion, list);
      if (t === undefined) return stoppingFailure('stopping-no-table', `user tables for ${options.material} cover ${list.map((x) => x.projectile).join(', ')}, not ${ion.name} or another isotope of its element`);
      return [makePart(ion, t, 1, Number.NaN)];
    }
    const m = nistMaterials().get(options.material);
    if (m === undefined) return stoppingFailure('stopping-no-table', `no user table and no NIST material named ${JSON.stringify(options.material)}; NIST ids: ${[...nistMaterials().keys()].join(', ')}`);
    const t = nistTableFor(ion, m);
    return t === null ? UNSUPPORTED(ion) : [makePart(ion, t, 1, m.molarMassPerAtomGPerMol)];
  }
  const overridden = parts.some((p) => user?.has(p.key) || user?.has(p.element));
  if (!overridden && fractions.size > 1) {
    const compound = matchNistCompound(fractions);
    if (compound !== undefined) {
      const t = nistTableFor(ion, compound);
      return t === null ? UNSUPPORTED(ion) : [makePart(ion, t, 1, compound.molarMassPerAtomGPerMol)];
    }
  }
  const out: Part[] = [];
  for (const p of parts) {
    const list = user?.get(p.key) ?? user?.get(p.element);
    if (list !== undefined) {
      const t = userTableFor(ion, list);
      if (t === undefined) return stoppingFailure('stopping-no-table', `user tables for ${p.key} cover ${list.map((x) => x.projectile).join(', ')}, not ${ion.name}`);
      out.push(makePart(ion, t, p.atomFraction, p.massU));
      continue;
    }
    const m = nistElementMaterial(p.element);
    if (m === undefined) {
      const have = [...nistMaterials().values()].filter((x) => x.elementDefault).map((x) => x.id);
      return stoppingFailure('stopping-no-table', `NIST PSTAR/ASTAR have no table for ${p.element} (they have ${have.join(' ')}); supply a user table for ${p.element}`);
    }
    const t = nistTableFor(ion, m);
    if (t === null) return UNSUPPORTED(ion);
    out.push(makePart(ion, t, p.atomFraction, p.massU));
  }
  return out;
}

/** Prepares the stopping of `projectile` in a material once, for many energies. */
export function prepareStopping(projectile: Nuclide, composition: Readonly<Record<string, number>>, options: StoppingOptions = {}): { ok: true; stopping: PreparedStopping } | StoppingFailure {
  const fr = compositionFractions(composition);
  if (!fr.ok) return fr;
  const parts = resolveParts(projectile, fr.parts, fr.elementFractions, options);
  if (!Array.isArray(parts)) return parts;
  const tables = [...new Set(parts.map((p) => p.table.label))];
  const method: StoppingMethod = tables.length > 1 ? 'bragg' : parts[0]!.table.source;
  const scaled = parts.find((p) => p.table.projectile !== projectile.name)?.table.projectile;
  const at = (energyKeV: number): StoppingResult => {
    if (!(Number.isFinite(energyKeV) && energyKeV > 0)) return stoppingFailure('stopping-bad-input', `energy ${energyKeV} keV is not a positive finite number`);
    let electronic = 0;
    let nuclear = 0;
    let usedBethe = false;
    let mismatch = 0;
    for (const p of parts) {
      const r = readStoppingTable(p.table, p.factors, energyKeV, p.bethe, projectile.name);
      if (!r.ok) return r;
      electronic += p.fraction * r.electronic;
      nuclear += p.fraction * r.nuclear;
      if (r.usedBethe) {
        usedBethe = true;
        if (Math.abs(r.betheMismatchAtTop) > Math.abs(mismatch)) mismatch = r.betheMismatchAtTop;
      }
    }
    return {
      ok: true,
      value: electronic + nuclear,
      electronic,
      nuclear,
      method: usedBethe ? 'bethe' : method,
      tables,
      ...(scaled !== undefined ? { scaledFrom: scaled } : {}),
      ...(usedBethe ? { betheMismatchAtTop: mismatch } : {}),
    };
  };
  const totalEvPer1e15 = (energyKeV: number): number => {
    let total = 0;
    for (const p of parts) {
      const r = readStoppingTable(p.table, p.factors, energyKeV, p.bethe, projectile.name);
      if (!r.ok) return Number.NaN;
      total += p.fraction * (r.electronic + r.nuclear);
    }
    return total;
  };
  return { ok: true, stopping: { at, totalEvPer1e15, method, tables } };
}

/**
 * Stopping cross section per atom of the material, eV/(1e15 atoms/cm²), of `projectile` at
 * `energyKeV` (kinetic energy, keV) in a material of the given composition (atom ratios; keys are
 * element symbols or nuclide names).
 */
export function stoppingPowerEvPer1e15(projectile: Nuclide, composition: Readonly<Record<string, number>>, energyKeV: number, options: StoppingOptions = {}): StoppingResult {
  const prepared = prepareStopping(projectile, composition, options);
  return prepared.ok ? prepared.stopping.at(energyKeV) : prepared;
}

