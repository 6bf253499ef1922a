import { describe, expect, it } from 'vitest';
import { targetNuclides } from '../../pipeline/simulate/target-nuclides.js';

describe('targetNuclides', () => {
  it('splits natural carbon by the IUPAC 2013 abundances (12C 0.9893, 13C 0.0107) and a trace of O by atom ratio', () => {
    const found = targetNuclides({ layers: [{ composition: { C: 1, O: 0.02 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0 }] });
    const byName = new Map(found.map((n) => [n.nuclide.name, n.atomsPerCm2]));
    expect(byName.get('12C')! / ((150e15 / 1.02) * 0.9893)).toBeCloseTo(1, 12);
    expect(byName.get('13C')! / ((150e15 / 1.02) * 0.0107)).toBeCloseTo(1, 12);
    // Meija et al. 2016: 16O 0.99757.
    expect(byName.get('16O')! / ((150e15 * 0.02) / 1.02 * 0.99757)).toBeCloseTo(1, 12);
    expect(found.map((n) => n.nuclide.name)).toEqual(['12C', '13C', '16O', '17O', '18O']);
  });

  it('converts µg/cm² with the mean molar mass per atom: 100 µg/cm² of Au = 3.0574e17 atoms/cm² (A_r(Au) = 196.966570, N_A CODATA 2018)', () => {
    const [au] = targetNuclides({ layers: [{ composition: { Au: 1 }, areal_density_ug_per_cm2: 100, areal_density_unc_rel: 0 }] });
    expect(au!.nuclide.name).toBe('197Au');
    expect(au!.atomsPerCm2 / ((100e-6 * 6.02214076e23) / 196.96657)).toBeCloseTo(1, 6);
  });

  it('sums a nuclide over layers and takes a nuclide key at abundance 1', () => {
    const found = targetNuclides({ layers: [
      { composition: { '13C': 1 }, areal_density_1e15_per_cm2: 10, areal_density_unc_rel: 0 },
      { composition: { C: 1 }, areal_density_1e15_per_cm2: 100, areal_density_unc_rel: 0 },
    ] });
    const c13 = found.find((n) => n.nuclide.name === '13C')!;
    expect(c13.atomsPerCm2 / (10e15 + 100e15 * 0.0107)).toBeCloseTo(1, 12);
  });
});
