import { describe, expect, it } from 'vitest';
import { nuclide } from '../../../../pipeline/core/physics/nuclides.js';
import { bohrStragglingKeV2, meanAtomicNumber } from '../../../../pipeline/core/physics/energy-loss/bohr-straggling.js';
import { slowDown } from '../../../../pipeline/core/physics/energy-loss/slow-down.js';

describe('Bohr energy-loss straggling (Bohr 1948, Mat. Fys. Medd. Dan. Vid. Selsk. 18, no. 8)', () => {
  // Hand calculation: e²/4πε₀ = 1.43996448 MeV fm = 1.43996448e-10 keV cm (CODATA 2018);
  // 4π e⁴ = 4π (1.43996448e-10)² = 2.60563e-19 keV² cm²; 4He in Si: z1² Z2 = 4 x 14 = 56;
  // N Δx = 1e18 atoms/cm²  ->  Ω²_B = 2.60563e-19 x 56 x 1e18 = 14.5916 keV² (Ω_B = 3.820 keV).
  it('4He through 1e18 Si atoms/cm²: Ω²_B = 14.59 keV² (hand calculation above)', () => {
    const r = bohrStragglingKeV2(2, { Si: 1 }, 1000);
    expect(r.ok && r.value).toBeCloseTo(14.5916, 3);
  });

  it('adds over the atoms of a compound: SiO2 has Z2 = (14 + 2 x 8)/3 = 10 per atom', () => {
    expect(meanAtomicNumber({ Si: 1, O: 2 })).toBeCloseTo(10, 12);
    const r = bohrStragglingKeV2(1, { Si: 1, O: 2 }, 500);
    expect(r.ok && r.value).toBeCloseTo(2.60563e-4 * 10 * 500, 5);
    expect(bohrStragglingKeV2(1, { Zz: 1 }, 500)).toMatchObject({ ok: false, rule: 'stopping-unknown-element' });
  });

  it('slowDown through a thin layer gives Bohr straggling to within 1% (the dS/dE transport term is small)', () => {
    const r = slowDown(nuclide('4He'), { Si: 1 }, 200, 2000, 1);
    const b = bohrStragglingKeV2(2, { Si: 1 }, 200);
    expect(r.ok && b.ok && Math.abs(r.stragglingKeV2 / b.value - 1)).toBeLessThan(0.01);
  });
});
