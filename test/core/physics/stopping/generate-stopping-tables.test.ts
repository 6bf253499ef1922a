import { describe, expect, it } from 'vitest';
import { NIST_STAR_MATERIALS } from '../../../../pipeline/core/physics/stopping/nist-star-tables.js';
import { parseStarCsv, renderStoppingModule } from '../../../../pipeline/tools/generate-stopping-tables.js';

// Lines in the layout of pstar.csv (NIST PSTAR values for graphite and gold, MeV and MeV cm²/g).
const HEADER = 'material,kinetic_energy_MeV,electronic_MeV_cm2_per_g,nuclear_MeV_cm2_per_g';
const LINES = [HEADER, '"CARBON (Graphite, density 1.7 g/cm3)",1.000E+00,2.295E+02,1.594E-01', '"CARBON (Graphite, density 1.7 g/cm3)",2.000E+00,1.408E+02,8.541E-02', 'GOLD,1.000E+00,6.291E+01,6.030E-02', 'GOLD,2.000E+00,4.558E+01,3.467E-02'];

describe('generate-stopping-tables: reading the NIST CSV copies', () => {
  it('keeps NIST strings verbatim per material on one shared grid', () => {
    const t = parseStarCsv(LINES.join('\n'), 'pstar.csv');
    expect(t.energiesMeV).toEqual(['1.000E+00', '2.000E+00']);
    expect(t.byMaterial.get('GOLD')).toEqual({ electronic: ['6.291E+01', '4.558E+01'], nuclear: ['6.030E-02', '3.467E-02'] });
  });

  it('rejects a value not printed like NIST (4 significant figures) and grids that differ', () => {
    expect(() => parseStarCsv([HEADER, 'GOLD,1.000E+00,62.91,6.030E-02'].join('\n'), 'pstar.csv')).toThrow(/pstar.csv:2/);
    expect(() => parseStarCsv([...LINES.slice(0, 4), 'GOLD,3.000E+00,3.692E+01,2.486E-02'].join('\n'), 'pstar.csv')).toThrow(/grid/);
  });

  it('refuses to write a module when a material is missing', () => {
    expect(() => renderStoppingModule({ pstar: LINES.join('\n'), astar: LINES.join('\n'), materials: 'material,density_g_cm3,mean_excitation_eV\nGOLD,19.32,790\n' })).toThrow(/missing/);
  });

  it('the committed table holds those NIST strings at the matching grid positions', () => {
    const graphite = NIST_STAR_MATERIALS.find((m) => m.id === 'C-graphite')!;
    const gold = NIST_STAR_MATERIALS.find((m) => m.id === 'Au')!;
    // 1 MeV is the 56th PSTAR energy (index 55), 2 MeV index 59.
    expect(graphite.pstarElectronic.split(' ')[55]).toBe('2.295E+02');
    expect(graphite.pstarElectronic.split(' ')[59]).toBe('1.408E+02');
    expect(gold.pstarNuclear.split(' ')[59]).toBe('3.467E-02');
  });
});
