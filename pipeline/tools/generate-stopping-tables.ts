/**
 * Writes pipeline/core/physics/stopping/nist-star-tables.ts from the NIST PSTAR/ASTAR stopping
 * tables (NIST Standard Reference Database 124, Berger, Coursey, Zucker & Chang; the ICRU Report 49
 * (1993) data): pstar.csv, astar.csv and materials.csv as described in the reference folder's SOURCE.md.
 *
 *   npx tsx pipeline/tools/generate-stopping-tables.ts [path/to/nist-star-folder]
 *
 * Values are copied as NIST prints them (4 significant figures, MeV cm²/g, energies in MeV); the
 * conversion to eV/(1e15 atoms/cm²) happens at run time in nist-star-materials.ts, so the generated
 * file can be compared with the published tables string for string.
 */
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { readCsv } from '../core/formats/csv-reader.js';

/** xsred id, NIST name, atom ratios, and whether the entry is the default table for its element. */
export const NIST_MATERIAL_IDS: readonly { id: string; nistName: string; composition: Record<string, number>; elementDefault: boolean }[] = [
  ...(
    [
      ['H', 'HYDROGEN'], ['He', 'HELIUM'], ['Be', 'BERYLLIUM'], ['C', 'CARBON (amorphous, density 2.0 g/cm3)'],
      ['N', 'NITROGEN'], ['O', 'OXYGEN'], ['Ne', 'NEON'], ['Al', 'ALUMINUM'], ['Si', 'SILICON'], ['Ar', 'ARGON'],
      ['Ti', 'TITANIUM'], ['Fe', 'IRON'], ['Cu', 'COPPER'], ['Ge', 'GERMANIUM'], ['Kr', 'KRYPTON'], ['Mo', 'MOLYBDENUM'],
      ['Ag', 'SILVER'], ['Sn', 'TIN'], ['Xe', 'XENON'], ['Gd', 'GADOLINIUM'], ['W', 'TUNGSTEN'], ['Pt', 'PLATINUM'],
      ['Au', 'GOLD'], ['Pb', 'LEAD'], ['U', 'URANIUM'],
    ] as const
  ).map(([id, nistName]) => ({ id, nistName, composition: { [id]: 1 }, elementDefault: true })),
  { id: 'C-graphite', nistName: 'CARBON (Graphite, density 1.7 g/cm3)', composition: { C: 1 }, elementDefault: false },
  // Chemical formulas of the six compounds; NIST gives their compositions as mass fractions that
  // correspond to these formulas (from memory).
  { id: 'H2O-liquid', nistName: 'WATER, LIQUID', composition: { H: 2, O: 1 }, elementDefault: false },
  { id: 'polyethylene', nistName: 'POLYETHYLENE', composition: { C: 1, H: 2 }, elementDefault: false },
  { id: 'mylar', nistName: 'POLYETHYLENE TEREPHTHALATE (MYLAR)', composition: { C: 10, H: 8, O: 4 }, elementDefault: false },
  { id: 'kapton', nistName: 'KAPTON POLYIMIDE FILM', composition: { C: 22, H: 10, N: 2, O: 5 }, elementDefault: false },
  { id: 'SiO2', nistName: 'SILICON DIOXIDE', composition: { Si: 1, O: 2 }, elementDefault: false },
  { id: 'Al2O3', nistName: 'ALUMINUM OXIDE', composition: { Al: 2, O: 3 }, elementDefault: false },
];

interface StarColumns {
  energiesMeV: string[];
  byMaterial: Map<string, { electronic: string[]; nuclear: string[] }>;
}

/** Reads pstar.csv or astar.csv; throws if a column is missing, a value is not a number, or the materials' energy grids differ. */
export function parseStarCsv(text: string, file: string): StarColumns {
  const { table, diagnostics } = readCsv(text, file);
  const errors = diagnostics.filter((d) => d.severity === 'error');
  if (table === null || errors.length > 0) throw new Error(`${file}: ${errors.map((d) => `${d.line}:${d.column}: ${d.message}`).join('; ')}`);
  const names = ['material', 'kinetic_energy_MeV', 'electronic_MeV_cm2_per_g', 'nuclear_MeV_cm2_per_g'];
  const idx = names.map((n) => table.header.findIndex((c) => c.text === n));
  if (idx.some((i) => i < 0)) throw new Error(`${file}: header must hold ${names.join(', ')}`);
  const byMaterial = new Map<string, { energies: string[]; electronic: string[]; nuclear: string[] }>();
  for (const row of table.rows) {
    const [material, energy, electronic, nuclear] = idx.map((i) => row.cells[i]!.text);
    for (const v of [energy, electronic, nuclear]) {
      if (!/^\d\.\d{3}E[+-]\d{2}$/.test(v!)) throw new Error(`${file}:${row.line}: ${JSON.stringify(v)} is not a NIST number like 2.295E+02`);
    }
    const entry = byMaterial.get(material!) ?? { energies: [], electronic: [], nuclear: [] };
    entry.energies.push(energy!);
    entry.electronic.push(electronic!);
    entry.nuclear.push(nuclear!);
    byMaterial.set(material!, entry);
  }
  const grids = [...byMaterial.values()].map((m) => m.energies.join(' '));
  if (grids.length === 0 || grids.some((g) => g !== grids[0])) throw new Error(`${file}: materials do not share one energy grid`);
  const energiesMeV = [...byMaterial.values()][0]!.energies;
  for (let i = 1; i < energiesMeV.length; i++) {
    if (!(Number(energiesMeV[i]) > Number(energiesMeV[i - 1]))) throw new Error(`${file}: energies not rising at ${energiesMeV[i]}`);
  }
  return { energiesMeV, byMaterial: new Map([...byMaterial].map(([k, v]) => [k, { electronic: v.electronic, nuclear: v.nuclear }])) };
}

/** materials.csv: NIST name → density and mean excitation energy (ICRU 49 values). */
export function parseMaterialsCsv(text: string, file: string): Map<string, { densityGPerCm3: number; meanExcitationEV: number }> {
  const { table } = readCsv(text, file);
  if (table === null) throw new Error(`${file}: unreadable`);
  const col = (n: string) => table.header.findIndex((c) => c.text === n);
  const [m, rho, ie] = [col('material'), col('density_g_cm3'), col('mean_excitation_eV')];
  if (m < 0 || rho < 0 || ie < 0) throw new Error(`${file}: header must hold material, density_g_cm3, mean_excitation_eV`);
  const out = new Map<string, { densityGPerCm3: number; meanExcitationEV: number }>();
  for (const row of table.rows) out.set(row.cells[m]!.text, { densityGPerCm3: Number(row.cells[rho]!.text), meanExcitationEV: Number(row.cells[ie]!.text) });
  return out;
}

export interface StarInputs {
  pstar: string;
  astar: string;
  materials: string;
}

export function renderStoppingModule(inputs: StarInputs): string {
  const pstar = parseStarCsv(inputs.pstar, 'pstar.csv');
  const astar = parseStarCsv(inputs.astar, 'astar.csv');
  const meta = parseMaterialsCsv(inputs.materials, 'materials.csv');
  const known = new Set(NIST_MATERIAL_IDS.map((m) => m.nistName));
  for (const name of [...pstar.byMaterial.keys(), ...astar.byMaterial.keys()]) {
    if (!known.has(name)) throw new Error(`no xsred id for NIST material ${JSON.stringify(name)}`);
  }
  const sha = (t: string) => createHash('sha256').update(t).digest('hex');
  const records = NIST_MATERIAL_IDS.map((m) => {
    const p = pstar.byMaterial.get(m.nistName);
    const a = astar.byMaterial.get(m.nistName);
    const md = meta.get(m.nistName);
    if (p === undefined || a === undefined || md === undefined) throw new Error(`NIST material ${JSON.stringify(m.nistName)} is missing from pstar, astar or materials`);
    return `  {
    id: ${JSON.stringify(m.id)},
    nistName: ${JSON.stringify(m.nistName)},
    composition: ${JSON.stringify(m.composition)},
    elementDefault: ${m.elementDefault},
    densityGPerCm3: ${md.densityGPerCm3},
    meanExcitationEV: ${md.meanExcitationEV},
    pstarElectronic: '${p.electronic.join(' ')}',
    pstarNuclear: '${p.nuclear.join(' ')}',
    astarElectronic: '${a.electronic.join(' ')}',
    astarNuclear: '${a.nuclear.join(' ')}',
  },`;
  });
  return `// Generated by pipeline/tools/generate-stopping-tables.ts — do not edit by hand.
// Source: NIST Standard Reference Database 124, PSTAR and ASTAR (M.J. Berger, J.S. Coursey, M.A. Zucker,
// J. Chang), the data of ICRU Report 49 (1993), web text tables https://physics.nist.gov/PhysRefData/Star/Text/
// Inputs: pstar.csv sha256 ${sha(inputs.pstar)}, astar.csv sha256 ${sha(inputs.astar)},
// materials.csv sha256 ${sha(inputs.materials)}.
/**
 * Electronic and nuclear mass stopping powers in MeV cm²/g at kinetic energies in MeV, each value
 * NIST's printed string (4 significant figures), space-separated, on the shared grid of its table.
 * Density (g/cm³) and mean excitation energy I (eV) are the ICRU 37/49 values NIST uses.
 */
export interface NistStarRecord {
  /** xsred name: element symbol, or C-graphite, H2O-liquid, polyethylene, mylar, kapton, SiO2, Al2O3. */
  id: string;
  nistName: string;
  /** Atom ratios. */
  composition: Readonly<Record<string, number>>;
  /** True for the table used for that element in compositions (amorphous carbon for C). */
  elementDefault: boolean;
  densityGPerCm3: number;
  meanExcitationEV: number;
  pstarElectronic: string;
  pstarNuclear: string;
  astarElectronic: string;
  astarNuclear: string;
}

export const NIST_STAR_EDITION = 'NIST SRD 124 PSTAR/ASTAR (ICRU Report 49, 1993)';

/** PSTAR kinetic energies in MeV (${pstar.energiesMeV.length} points). */
export const PSTAR_ENERGIES_MEV = '${pstar.energiesMeV.join(' ')}';

/** ASTAR kinetic energies in MeV (${astar.energiesMeV.length} points). */
export const ASTAR_ENERGIES_MEV = '${astar.energiesMeV.join(' ')}';

export const NIST_STAR_MATERIALS: readonly NistStarRecord[] = [
${records.join('\n')}
];
`;
}

function main(): void {
  const here = dirname(fileURLToPath(import.meta.url));
  // Default: the reference copy beside the checkout (../shared/reference-data/nist-star/).
  const folder = resolve(process.argv[2] ?? resolve(here, '../../../shared/reference-data/nist-star'));
  const read = (n: string) => readFileSync(resolve(folder, n), 'utf8');
  const output = resolve(here, '../core/physics/stopping/nist-star-tables.ts');
  writeFileSync(output, renderStoppingModule({ pstar: read('pstar.csv'), astar: read('astar.csv'), materials: read('materials.csv') }));
  process.stdout.write(`wrote ${NIST_MATERIAL_IDS.length} materials to ${output}\n`);
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) main();
