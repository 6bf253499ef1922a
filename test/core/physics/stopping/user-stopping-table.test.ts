import { describe, expect, it } from 'vitest';
import { nuclide } from '../../../../pipeline/core/physics/nuclides.js';
import { stoppingPowerEvPer1e15 } from '../../../../pipeline/core/physics/stopping/stopping-power.js';
import { parseUserStoppingTables } from '../../../../pipeline/core/physics/stopping/user-stopping-table.js';

const p = nuclide('1H');
const d = nuclide('2H');
const he4 = nuclide('4He');

// Values are a power law S = 60 (E/1000 keV)^-0.7 eV/(1e15 atoms/cm²), made up for the test (no source needed:
// log-log interpolation must return it exactly between any two rows, a mathematical identity).
const law = (e: number) => 60 * (e / 1000) ** -0.7;
const GOOD = [
  '# stopping of 4He in TiN and of protons in Ni',
  'material,projectile,energy_keV,stopping_eV_per_1e15_atoms_per_cm2',
  ...[500, 1000, 2000, 4000].map((e) => `TiN,4He,${e},${law(e)}`),
  'Ni,1H,3000,10.0',
  'Ni,1H,500,30.0',
  'Ni,1H,1000,20.0',
].join('\n');

describe('user stopping tables (CSV)', () => {
  it('parses tables per material and projectile, in any row order', () => {
    const { tables, diagnostics } = parseUserStoppingTables(GOOD, 'stopping.csv');
    expect(diagnostics).toEqual([]);
    expect([...tables.keys()]).toEqual(['TiN', 'Ni']);
    expect(Array.from(tables.get('Ni')![0]!.energiesKeV)).toEqual([500, 1000, 3000]);
  });

  it('a named material overrides NIST for the whole layer and is read log-log (exact for a power law)', () => {
    const { tables } = parseUserStoppingTables(GOOD, 'stopping.csv');
    const r = stoppingPowerEvPer1e15(he4, { Ti: 1, N: 1 }, 1500, { userTables: tables, material: 'TiN' });
    expect(r.ok && r.method).toBe('user-table');
    expect(r.ok && r.value).toBeCloseTo(law(1500), 10);
    expect(r.ok && r.nuclear).toBe(0);
  });

  it('an element table supplies an element NIST lacks (Ni) and joins Bragg sums with NIST tables', () => {
    const { tables } = parseUserStoppingTables(GOOD, 'stopping.csv');
    const ni = stoppingPowerEvPer1e15(p, { Ni: 1 }, 1000, { userTables: tables });
    expect(ni.ok && ni.value).toBe(20);
    expect(ni.ok && ni.method).toBe('user-table');
    const mix = stoppingPowerEvPer1e15(p, { Ni: 1, Si: 1 }, 1000, { userTables: tables });
    const si = stoppingPowerEvPer1e15(p, { Si: 1 }, 1000);
    expect(mix.ok && mix.method).toBe('bragg');
    expect(mix.ok && si.ok && mix.value).toBeCloseTo(si.ok ? (20 + si.value) / 2 : Number.NaN, 12);
  });

  it('serves 2H from a 1H table at the same velocity, and fails outside its range (no Bethe for user tables)', () => {
    const { tables } = parseUserStoppingTables(GOOD, 'stopping.csv');
    const md = 2.013553212745; // deuteron mass, u (CODATA 2018)
    const mp = 1.007276466621; // proton mass, u (CODATA 2018)
    const r = stoppingPowerEvPer1e15(d, { Ni: 1 }, (1000 * md) / mp, { userTables: tables });
    expect(r.ok && r.value).toBeCloseTo(20, 6);
    expect(r.ok && r.scaledFrom).toBe('1H');
    expect(stoppingPowerEvPer1e15(p, { Ni: 1 }, 3500, { userTables: tables })).toMatchObject({ ok: false, rule: 'stopping-above-table' });
    expect(stoppingPowerEvPer1e15(p, { Ni: 1 }, 400, { userTables: tables })).toMatchObject({ ok: false, rule: 'stopping-below-table' });
    expect(stoppingPowerEvPer1e15(he4, { Ni: 1 }, 1000, { userTables: tables })).toMatchObject({ ok: false, rule: 'stopping-no-table' });
  });

  it('reports bad rows with their line and column, and keeps the good ones', () => {
    const text = [
      'material,projectile,energy_keV,stopping_eV_per_1e15_atoms_per_cm2',
      'TiN,4He,500,50', // line 2
      'TiN,4He,abc,40', // line 3: energy not a number
      'TiN,4He,2000,-1', // line 4: negative stopping
      'TiN,He4,1000,45', // line 5: projectile misspelt
      ',4He,1000,45', // line 6: no material
      'TiN,4He,500,51', // line 7: duplicate energy
      'TiN,4He,1000,45', // line 8
      'Cr,1H,1000,12', // line 9: a single energy
    ].join('\n');
    const { tables, diagnostics } = parseUserStoppingTables(text, 'tables/stop.csv');
    const at = diagnostics.map((x) => [x.line, x.column, x.rule]);
    expect(at).toEqual([
      [3, 9, 'stopping-table-bad-row'],
      [4, 14, 'stopping-table-bad-row'],
      [5, 5, 'stopping-table-bad-row'],
      [6, 1, 'stopping-table-bad-row'],
      [7, 9, 'stopping-table-duplicate-energy'],
      [9, 7, 'stopping-table-too-short'],
    ]);
    expect(diagnostics.every((x) => x.file === 'tables/stop.csv' && x.severity === 'error')).toBe(true);
    expect(Array.from(tables.get('TiN')![0]!.energiesKeV)).toEqual([500, 1000]);
    expect(tables.has('Cr')).toBe(false);
  });

  it('names a missing column', () => {
    const { tables, diagnostics } = parseUserStoppingTables('material,energy_keV,stopping\nTiN,500,50\n', 's.csv');
    expect(tables.size).toBe(0);
    expect(diagnostics.map((x) => x.rule)).toEqual(['stopping-table-missing-column', 'stopping-table-missing-column']);
    expect(diagnostics[0]!.message).toContain('"projectile"');
  });
});
