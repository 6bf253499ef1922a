import { describe, expect, it } from 'vitest';
import { lecuyerScreeningFactor, lecuyerScreeningLogDerivativePerKeV } from '../../../pipeline/core/physics/screening-lecuyer.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';

describe("L'Ecuyer, Davies & Matsunami, Nucl. Instrum. Methods 160, 337 (1979): F = 1 - 0.049 Z1 Z2^(4/3) / Ecm[keV]", () => {
  const ecm = (elabKeV: number) => (elabKeV * nuclide('197Au').massU) / (nuclide('197Au').massU + nuclide('4He').massU);

  it('2 MeV 4He on Au: F = 0.9831 (hand evaluation of the paper formula: 0.049*2*79^(4/3) = 33.22 keV over Ecm = 1960.2 keV)', () => {
    expect(lecuyerScreeningFactor(2, 79, ecm(2000))).toBeCloseTo(1 - 33.2188 / 1960.16, 5);
    expect(lecuyerScreeningFactor(2, 79, ecm(2000))).toBeCloseTo(0.9831, 4);
  });

  it('1 MeV 4He on Au: screening about 3.4 % (F = 0.966, same hand evaluation)', () => {
    expect(lecuyerScreeningFactor(2, 79, ecm(1000))).toBeCloseTo(0.9661, 4);
  });

  it('log derivative agrees with a central finite difference', () => {
    const e = 800;
    const h = 1e-3;
    const numeric = (Math.log(lecuyerScreeningFactor(2, 79, e + h)) - Math.log(lecuyerScreeningFactor(2, 79, e - h))) / (2 * h);
    expect(lecuyerScreeningLogDerivativePerKeV(2, 79, e) / numeric).toBeCloseTo(1, 7);
  });

  it('refuses energies where F <= 0.5 (formula not valid), quoting the minimum energy', () => {
    // 0.049*2*79^(4/3) = 33.2 keV, so F = 0.5 at Ecm = 66.4 keV
    expect(lecuyerScreeningFactor(2, 79, 67)).toBeGreaterThan(0.5);
    expect(() => lecuyerScreeningFactor(2, 79, 66)).toThrow(/Ecm > 66\.4 keV/);
    expect(() => lecuyerScreeningLogDerivativePerKeV(2, 79, 50)).toThrow(RangeError);
    expect(() => lecuyerScreeningFactor(2, 79, 0)).toThrow(RangeError);
  });
});
