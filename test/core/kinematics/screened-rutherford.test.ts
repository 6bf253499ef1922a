import { describe, expect, it } from 'vitest';
import { screenedRutherfordLab, screenedRutherfordLabIfValid } from '../../../pipeline/core/kinematics/screened-rutherford.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { rutherfordLabMbPerSr } from '../../../pipeline/core/physics/rutherford-lab.js';

const he = nuclide('4He');
const au = nuclide('197Au');

describe('screened lab Rutherford cross section', () => {
  it("is σ_R,lab × (1 − 0.049 Z1 Z2^(4/3)/E_cm[keV]) (L'Ecuyer, Davies & Matsunami, NIM 160 (1979) 337)", () => {
    const r = screenedRutherfordLab(he, au, 2000, 150, 'lecuyer');
    const eCm = (2000 * au.massU) / (he.massU + au.massU);
    const f = 1 - (0.049 * 2 * 79 ** (4 / 3)) / eCm;
    expect(r.screeningFactor).toBeCloseTo(f, 12);
    expect(r.sigmaMbPerSr).toBeCloseTo(rutherfordLabMbPerSr(2, 79, he.massU, au.massU, 2000, 150) * f, 9);
  });
  it('its energy log-derivative matches a central finite difference (common practice: derivative checks)', () => {
    const h = 0.01;
    const num = (Math.log(screenedRutherfordLab(he, au, 2000 + h, 150, 'lecuyer').sigmaMbPerSr) - Math.log(screenedRutherfordLab(he, au, 2000 - h, 150, 'lecuyer').sigmaMbPerSr)) / (2 * h);
    expect(screenedRutherfordLab(he, au, 2000, 150, 'lecuyer').dLnSigmaDEnergyPerKeV).toBeCloseTo(num, 9);
  });
  it('IfValid: null where the screening formula fails (F ≤ 0.5 at 50 keV on Au) or the projectile is heavier; the value otherwise', () => {
    expect(screenedRutherfordLabIfValid(he, au, 50, 150, 'lecuyer')).toBeNull();
    expect(screenedRutherfordLabIfValid(au, he, 2000, 30, 'none')).toBeNull();
    expect(screenedRutherfordLabIfValid(he, au, 2000, 150, 'none')?.screeningFactor).toBe(1);
  });
});
