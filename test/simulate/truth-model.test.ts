import { describe, expect, it } from 'vitest';
import { energyCurveValue } from '../../pipeline/simulate/truth-model.js';

describe('energyCurveValue', () => {
  const curve = { base: 1.12, resonances: [{ energy_keV: 3050, fwhm_keV: 140, height: 1.6 }] };

  it('is base + height at the bump centre and base + height/2 at E_r ± Γ/2 (definition of the FWHM, common practice)', () => {
    expect(energyCurveValue(curve, 3050)).toBeCloseTo(2.72, 12);
    expect(energyCurveValue(curve, 3050 - 70)).toBeCloseTo(1.92, 12);
    expect(energyCurveValue(curve, 3050 + 70)).toBeCloseTo(1.92, 12);
  });

  it('falls back towards the base far from the bump (Lorentzian tail (Γ/2)²/ΔE²)', () => {
    expect(energyCurveValue(curve, 3050 + 7000)).toBeCloseTo(1.12 + (1.6 * 70 * 70) / (7000 * 7000 + 70 * 70), 12);
    expect(energyCurveValue({ base: 0.5, resonances: [] }, 1234)).toBe(0.5);
  });
});
