import { describe, expect, it } from 'vitest';
import { CODATA2018 } from '../../../pipeline/core/physics/codata2018.js';
import { rutherfordCmMbPerSr } from '../../../pipeline/core/physics/rutherford-cm.js';
import {
  FM2_TO_MB, MB_TO_CM2, arealDensityAtomsPerCm2ToUgPerCm2, arealDensityUgPerCm2ToAtomsPerCm2,
  degToRad, microCoulombToParticles, radToDeg,
} from '../../../pipeline/core/physics/units.js';

describe('units: the same physical input in other units gives the same answer', () => {
  it('1 b = 100 fm^2 = 1e-24 cm^2 (SI brochure, common practice)', () => {
    expect(100 * FM2_TO_MB * MB_TO_CM2).toBeCloseTo(1e-24, 36);
    expect(1 / (1e-13 * 1e-13) * 1e-24).toBeCloseTo(100, 9); // 1 fm = 1e-13 cm
  });

  it('Rutherford in mb/sr equals the same cross section computed in CGS (esu, erg, cm)', () => {
    // e in esu = e[C] * c[m/s] * 10; 1 keV = 1.602176634e-9 erg (CODATA 2018 exact e). Tolerance 2e-9:
    // since 2019 mu0 is not exactly 4 pi 1e-7, so the esu charge differs from e/sqrt(4 pi eps0) by ~5e-10.
    const eEsu = CODATA2018.elementaryChargeC * CODATA2018.speedOfLightMPerS * 10;
    const eCmKeV = 1500;
    const eErg = eCmKeV * 1e3 * CODATA2018.elementaryChargeC * 1e7;
    const s = Math.sin(degToRad(150) / 2);
    const cgsCm2 = ((2 * 14 * eEsu * eEsu) / (4 * eErg)) ** 2 / s ** 4;
    const ours = rutherfordCmMbPerSr(2, 14, eCmKeV, 150) * MB_TO_CM2;
    expect(Math.abs(ours / cgsCm2 - 1)).toBeLessThan(2e-9);
  });

  it('degrees and radians: 180 deg = pi rad, round trip', () => {
    expect(degToRad(180)).toBe(Math.PI);
    expect(radToDeg(Math.PI / 2)).toBeCloseTo(90, 12);
    expect(radToDeg(degToRad(37.25))).toBeCloseTo(37.25, 12);
  });

  it('1 uC of singly charged ions is 6.241509074e12 particles (1 C = 1/e elementary charges, CODATA 2018 exact e)', () => {
    expect(microCoulombToParticles(1, 1)).toBeCloseTo(6.241509074e12, -3);
    // same charge of 4He2+: half as many particles; 1000 uC = 1 mC scales linearly
    expect(microCoulombToParticles(1, 2)).toBeCloseTo(microCoulombToParticles(1, 1) / 2, -3);
    expect(microCoulombToParticles(1000, 1) / microCoulombToParticles(1, 1)).toBeCloseTo(1000, 9);
    expect(() => microCoulombToParticles(1, 0)).toThrow(RangeError);
  });

  it('ug/cm^2 to atoms/cm^2 agrees with dividing by the mass of one atom (m_u in kg, CODATA 2018)', () => {
    const massU = 196.966570103; // 197Au, AME2020
    const gramsPerAtom = massU * CODATA2018.atomicMassUnitKg * 1000;
    const viaAtomMass = 100e-6 / gramsPerAtom;
    const viaAvogadro = arealDensityUgPerCm2ToAtomsPerCm2(100, massU);
    expect(Math.abs(viaAvogadro / viaAtomMass - 1)).toBeLessThan(1e-9);
  });

  it('1 ug/cm^2 of carbon-12 is 5.0185e16 atoms/cm^2 (N_A/12 * 1e-6, common practice), and the inverse round-trips', () => {
    expect(arealDensityUgPerCm2ToAtomsPerCm2(1, 12) / 1e16).toBeCloseTo(5.01845, 4);
    expect(arealDensityAtomsPerCm2ToUgPerCm2(arealDensityUgPerCm2ToAtomsPerCm2(20, 28.085), 28.085)).toBeCloseTo(20, 10);
    expect(() => arealDensityUgPerCm2ToAtomsPerCm2(1, 0)).toThrow(RangeError);
    expect(() => arealDensityAtomsPerCm2ToUgPerCm2(1, -1)).toThrow(RangeError);
  });
});
