import { describe, expect, it } from 'vitest';
import { ATOMIC_MASS_UNIT_KEV, CODATA2018, COULOMB_CONSTANT_KEV_FM } from '../../../pipeline/core/physics/codata2018.js';

describe('CODATA 2018 constants (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021))', () => {
  it('matches CODATA 2018 e^2/(4 pi eps0) = alpha hbar c', () => {
    // alpha = 7.2973525693e-3 and hbar c = 197.3269804 MeV fm (CODATA 2018): product 1.4399645474 MeV fm.
    const product = CODATA2018.fineStructureConstant * CODATA2018.hbarCMeVFm;
    expect(Math.abs(product / CODATA2018.coulombConstantMeVFm - 1)).toBeLessThan(1e-9);
    expect(COULOMB_CONSTANT_KEV_FM).toBeCloseTo(1439.964547, 6);
  });

  it('matches CODATA 2018 u c^2 = m_u c^2 / e (931.49410242 MeV)', () => {
    const c = CODATA2018.speedOfLightMPerS;
    const mev = (CODATA2018.atomicMassUnitKg * c * c) / CODATA2018.elementaryChargeC / 1e6;
    expect(Math.abs(mev / CODATA2018.atomicMassUnitMeV - 1)).toBeLessThan(1e-9);
    expect(ATOMIC_MASS_UNIT_KEV).toBeCloseTo(931494.10242, 5);
  });

  it('matches CODATA 2018 electron mass in u and in MeV (m_e = 5.48579909065e-4 u)', () => {
    const mev = CODATA2018.electronMassU * CODATA2018.atomicMassUnitMeV;
    expect(Math.abs(mev / CODATA2018.electronMassMeV - 1)).toBeLessThan(1e-9);
  });

  it('matches CODATA 2018 molar mass constant M_u = N_A m_u (0.99999999965 g/mol)', () => {
    const gPerMol = CODATA2018.avogadro * CODATA2018.atomicMassUnitKg * 1000;
    expect(Math.abs(gPerMol - CODATA2018.molarMassConstantGPerMol)).toBeLessThan(1e-9);
  });

  it('records its edition', () => {
    expect(CODATA2018.edition).toBe('CODATA 2018');
  });
});

describe('the value quoted in the design notes', () => {
  it('e^2/(4 pi eps0) = 1.43996448 MeV fm (DESIGN.md) agrees with CODATA 2018 alpha*hbar*c = 1.439964547 to 5e-8 relative', async () => {
    const { CODATA2018 } = await import('../../../pipeline/core/physics/codata2018.js');
    expect(Math.abs(CODATA2018.coulombConstantMeVFm / 1.43996448 - 1)).toBeLessThan(5e-8);
  });
});
