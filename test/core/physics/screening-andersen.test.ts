import { describe, expect, it } from 'vitest';
import {
  andersenScreeningFactor, andersenScreeningLogDerivativePerKeV, andersenScreeningPotentialKeV,
} from '../../../pipeline/core/physics/screening-andersen.js';
import { lecuyerScreeningFactor } from '../../../pipeline/core/physics/screening-lecuyer.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';

// Andersen, Besenbacher, Loftager & Möller, Phys. Rev. A 21, 1891 (1980), formula and V1 as usually quoted (from memory):
// F = (1 + V1/2E)² / [1 + V1/E + (V1/(2E sin(θ/2)))²]², V1 = 48.73 Z1 Z2 sqrt(Z1^(2/3) + Z2^(2/3)) eV, E and θ in the CM.
const ecm = (elabKeV: number) => (elabKeV * nuclide('197Au').massU) / (nuclide('197Au').massU + nuclide('4He').massU);

describe('Andersen et al., Phys. Rev. A 21, 1891 (1980): angle-dependent screening', () => {
  it('V1 for 4He on Au: 48.73 eV x 2 x 79 x sqrt(1.587401 + 18.411312) = 7699.34 eV x 4.471992 = 34.4314 keV (hand evaluation)', () => {
    expect(andersenScreeningPotentialKeV(2, 79)).toBeCloseTo(34.4314, 4);
  });

  it('2 MeV 4He on Au at θcm = 170 deg: F = 0.982662 (hand evaluation of the paper formula, see comment)', () => {
    // Ecm = 2000 x 196.96657/(196.96657 + 4.00260) = 1960.1670 keV; x = V1/Ecm = 0.0175655; sin 85° = 0.9961947;
    // x/(2 sin 85°) = 0.0088163; numerator (1 + x/2)² = 1.0176427; bracket 1 + x + 0.0088163² = 1.0176433;
    // F = 1.0176427 / 1.0176433² = 0.982662
    expect(ecm(2000)).toBeCloseTo(1960.167, 3);
    expect(andersenScreeningFactor(2, 79, ecm(2000), 170)).toBeCloseTo(0.982662, 6);
  });

  it("reduces to L'Ecuyer-like size at backward angles (L'Ecuyer et al., NIM 160, 337 (1979)): 1 − F within 5 % of each other", () => {
    // at 180°: 1 − F ≈ V1/Ecm = 34.43/Ecm keV against 0.049 Z1 Z2^(4/3) = 33.22/Ecm keV for 4He on Au
    for (const eKeV of [1000, 2000, 3000]) {
      const andersen = 1 - andersenScreeningFactor(2, 79, ecm(eKeV), 180);
      const lecuyer = 1 - lecuyerScreeningFactor(2, 79, ecm(eKeV));
      expect(Math.abs(andersen / lecuyer - 1)).toBeLessThan(0.05);
    }
    // exact back-angle form of the formula: F(180°) = 1/(1 + V1/(2 Ecm))²
    const x = andersenScreeningPotentialKeV(2, 79) / ecm(2000);
    expect(andersenScreeningFactor(2, 79, ecm(2000), 180)).toBeCloseTo(1 / (1 + x / 2) ** 2, 14);
  });

  it('screening grows towards small angles (the angle dependence the paper adds)', () => {
    const f = [170, 90, 30, 10].map((t) => andersenScreeningFactor(2, 79, ecm(2000), t));
    for (let i = 1; i < f.length; i++) expect(f[i]!).toBeLessThan(f[i - 1]!);
    expect(f[3]!).toBeCloseTo(0.963486, 5); // hand evaluation as above with sin 5° = 0.0871557
  });

  it('log derivative agrees with a central finite difference', () => {
    for (const theta of [30, 170]) {
      const e = 600;
      const h = 1e-3;
      const numeric = (Math.log(andersenScreeningFactor(2, 79, e + h, theta)) - Math.log(andersenScreeningFactor(2, 79, e - h, theta))) / (2 * h);
      expect(andersenScreeningLogDerivativePerKeV(2, 79, e, theta) / numeric).toBeCloseTo(1, 7);
    }
  });

  it('refuses bad arguments and V1/Ecm >= 0.5, quoting the minimum energy', () => {
    expect(() => andersenScreeningFactor(2, 79, 68, 170)).toThrow(/Ecm > 68\.9 keV/);
    expect(andersenScreeningFactor(2, 79, 69, 170)).toBeGreaterThan(0.5);
    expect(() => andersenScreeningFactor(2, 79, 0, 170)).toThrow(RangeError);
    expect(() => andersenScreeningFactor(2, 79, 1000, 0)).toThrow(RangeError);
    expect(() => andersenScreeningFactor(2, 79, 1000, 181)).toThrow(RangeError);
    expect(() => andersenScreeningPotentialKeV(0, 79)).toThrow(RangeError);
  });
});
