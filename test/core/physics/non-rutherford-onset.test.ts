import { describe, expect, it } from 'vitest';
import { onsetEnergyKeV } from '../../../pipeline/core/physics/non-rutherford-onset.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';

const onset = (projectile: string, target: string) => {
  const r = onsetEnergyKeV(nuclide(projectile), nuclide(target));
  if (!r.ok) throw new Error(r.reason);
  return r;
};

describe('Bozoian (NIM B 51, 311 (1990); NIM B 58, 127 (1991)): onset of non-Rutherford backscattering, from memory', () => {
  it('4He on C, O, Si: 1.9, 2.4 and 3.9 MeV (E_NR = 0.25 Z2 + 0.4 MeV, from memory)', () => {
    expect(onset('4He', '12C').energyKeV).toBeCloseTo(1900, 6);
    expect(onset('4He', '16O').energyKeV).toBeCloseTo(2400, 6);
    expect(onset('4He', '28Si').energyKeV).toBeCloseTo(3900, 6);
    expect(onset('4He', '197Au').energyKeV).toBeCloseTo(20_150, 6);
  });

  it('1H on C, Si, Au: 0.22, 1.18 and 8.98 MeV (E_NR = 0.12 Z2 − 0.5 MeV, from memory)', () => {
    expect(onset('1H', '12C').energyKeV).toBeCloseTo(220, 6);
    expect(onset('1H', '28Si').energyKeV).toBeCloseTo(1180, 6);
    expect(onset('1H', '197Au').energyKeV).toBeCloseTo(8980, 6);
  });

  it('resonances used for enhanced-cross-section analysis lie above the onset (from memory, common practice)', () => {
    // 16O(α,α) at 3.04 MeV and 12C(α,α) at 4.26 MeV are strongly non-Rutherford; 2 MeV 4He RBS on Si is Rutherford
    expect(onset('4He', '16O').energyKeV).toBeLessThan(3040);
    expect(onset('4He', '12C').energyKeV).toBeLessThan(4260);
    expect(onset('4He', '28Si').energyKeV).toBeGreaterThan(2000);
  });

  it('states the angle range and the source', () => {
    const r = onset('4He', '28Si');
    expect(r.thetaLabRangeDeg).toEqual([160, 180]);
    expect(r.source).toMatch(/Bozoian/);
    expect(r.formula).toBe('0.25 Z2 + 0.4 MeV');
  });

  it('protons on Z2 <= 4: the formula gives <= 0, reported as 0 keV (non-Rutherford at every energy)', () => {
    expect(onset('1H', '9Be').energyKeV).toBe(0);
    expect(onset('1H', '11B').energyKeV).toBeCloseTo(100, 6);
  });

  it('no formula for other beams, nor for targets the projectile cannot backscatter from', () => {
    for (const [p, t] of [['2H', '12C'], ['3He', '28Si'], ['7Li', '197Au'], ['4He', '1H'], ['4He', '4He'], ['1H', '1H']]) {
      const r = onsetEnergyKeV(nuclide(p!), nuclide(t!));
      expect(r.ok, `${p} on ${t}`).toBe(false);
      expect(r.ok === false && r.reason.length).toBeGreaterThan(20);
    }
  });
});
