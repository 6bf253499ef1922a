/**
 * Reads user-supplied stopping tables from CSV text. Header (names are exact, any column order):
 *
 *   material,projectile,energy_keV,stopping_eV_per_1e15_atoms_per_cm2
 *
 * - `material`: a name the series refers to (e.g. `TiN`), or an element symbol (`Ni`), whose table
 *   then replaces NIST's for that element in every composition (and supplies one NIST lacks).
 * - `projectile`: the nuclide the values are for (`1H`, `4He`, ...). A table serves other isotopes of
 *   the same element at the same velocity (2H and 3H from a 1H table).
 * - `energy_keV`: kinetic energy of the projectile, keV; rows may come in any order.
 * - `stopping_eV_per_1e15_atoms_per_cm2`: total (electronic + nuclear) stopping cross section per atom
 *   of the material, eV/(1e15 atoms/cm²), counting every atom of a compound.
 *
 * A table is one (material, projectile) pair with at least two energies. Bad rows are left out, each
 * with a diagnostic at its line; a user table is never read outside its energy range.
 */
import type { Diagnostic } from '../../diagnostics/diagnostic.js';
import { readCsv, requireColumns, type CsvCell } from '../../formats/csv-reader.js';
import { nuclide } from '../nuclides.js';
import type { StoppingTable } from './stopping-table.js';

/** Material name -> its tables (one per projectile). */
export type UserStoppingTables = ReadonlyMap<string, readonly StoppingTable[]>;

export const USER_STOPPING_COLUMNS = ['material', 'projectile', 'energy_keV', 'stopping_eV_per_1e15_atoms_per_cm2'] as const;

function bad(file: string, cell: CsvCell, rule: string, message: string, expected: string, hint: string): Diagnostic {
  return { severity: 'error', message, file, line: cell.line, column: cell.column, rule, expected, actual: JSON.stringify(cell.text), hint };
}

/**
 * @param text the CSV file's content
 * @param file its path, for diagnostics
 */
export function parseUserStoppingTables(text: string, file: string): { tables: UserStoppingTables; diagnostics: Diagnostic[] } {
  const { table, diagnostics } = readCsv(text, file);
  const tables = new Map<string, StoppingTable[]>();
  if (table === null) return { tables, diagnostics };
  const missing = requireColumns(table, [...USER_STOPPING_COLUMNS], 'stopping-table-missing-column');
  if (missing.length > 0) return { tables, diagnostics: [...diagnostics, ...missing] };
  const [mi, pi, ei, si] = USER_STOPPING_COLUMNS.map((c) => table.header.findIndex((h) => h.text === c));
  const groups = new Map<string, { material: string; projectile: string; points: { e: number; s: number; cell: CsvCell }[] }>();
  for (const row of table.rows) {
    if (row.cells.length !== table.header.length) continue; // reported by readCsv as a ragged row
    const [m, p, e, s] = [mi, pi, ei, si].map((i) => row.cells[i!]!);
    if (m!.text === '') {
      diagnostics.push(bad(file, m!, 'stopping-table-bad-row', 'empty material name', 'a material name or element symbol', 'name the material, e.g. TiN or Ni'));
      continue;
    }
    try {
      nuclide(p!.text);
    } catch {
      diagnostics.push(bad(file, p!, 'stopping-table-bad-row', `projectile ${JSON.stringify(p!.text)} is not a nuclide`, 'a nuclide name such as 1H, 2H, 3He, 4He', 'write mass number then symbol, e.g. 4He'));
      continue;
    }
    const energy = Number(e!.text);
    const stopping = Number(s!.text);
    if (e!.text === '' || !(Number.isFinite(energy) && energy > 0)) {
      diagnostics.push(bad(file, e!, 'stopping-table-bad-row', `energy_keV ${JSON.stringify(e!.text)} is not a positive number`, 'a positive number of keV', 'write the energy in keV, e.g. 1500'));
      continue;
    }
    if (s!.text === '' || !(Number.isFinite(stopping) && stopping > 0)) {
      diagnostics.push(bad(file, s!, 'stopping-table-bad-row', `stopping ${JSON.stringify(s!.text)} is not a positive number`, 'a positive number of eV/(1e15 atoms/cm²)', 'write the stopping cross section in eV/(1e15 atoms/cm²), e.g. 45.2'));
      continue;
    }
    const key = `${m!.text}\u0000${p!.text}`;
    const g = groups.get(key) ?? { material: m!.text, projectile: p!.text, points: [] };
    g.points.push({ e: energy, s: stopping, cell: e! });
    groups.set(key, g);
  }
  for (const g of groups.values()) {
    g.points.sort((a, b) => a.e - b.e || a.cell.line - b.cell.line);
    const kept = g.points.filter((pt, i) => {
      if (i === 0 || pt.e !== g.points[i - 1]!.e) return true;
      diagnostics.push(bad(file, pt.cell, 'stopping-table-duplicate-energy', `${g.material} / ${g.projectile}: energy ${pt.e} keV appears again (first at line ${g.points[i - 1]!.cell.line})`, 'one row per energy', 'remove one of the two rows'));
      return false;
    });
    if (kept.length < 2) {
      diagnostics.push(bad(file, kept[0]!.cell, 'stopping-table-too-short', `${g.material} / ${g.projectile} has ${kept.length} energy; a table needs at least two`, 'at least two energies per material and projectile', 'add rows that span the energies the beam has in this material'));
      continue;
    }
    const list = tables.get(g.material) ?? [];
    list.push({
      label: `user ${g.material} ${g.projectile} (${file})`,
      source: 'user-table',
      projectile: g.projectile,
      energiesKeV: Float64Array.from(kept, (pt) => pt.e),
      electronicEvPer1e15: Float64Array.from(kept, (pt) => pt.s),
      nuclearEvPer1e15: null,
      meanTargetMassU: Number.NaN,
      bethe: null,
    });
    tables.set(g.material, list);
  }
  return { tables, diagnostics };
}
