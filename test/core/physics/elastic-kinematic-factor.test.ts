import { describe, expect, it } from 'vitest';
import { elasticKinematicFactor } from '../../../pipeline/core/physics/elastic-kinematic-factor.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';

// Atomic masses (AME2020) are used throughout, as is usual for kinematic-factor tables.
const he4 = nuclide('4He').massU;

describe('elastic kinematic factor (Chu, Mayer & Nicolet, Backscattering Spectrometry, 1978, eq. 2.5)', () => {
  it.each(['197Au', '28Si', '12C', '16O'])('4He on %s at 180 deg equals ((M2-M1)/(M2+M1))^2 (ibid., 180 deg limit)', (target) => {
    const m2 = nuclide(target).massU;
    expect(elasticKinematicFactor(he4, m2, 180)).toBeCloseTo(((m2 - he4) / (m2 + he4)) ** 2, 14);
  });

  it('at 90 deg K = (M2-M1)/(M2+M1) (follows from eq. 2.5, common practice)', () => {
    const m2 = nuclide('28Si').massU;
    expect(elasticKinematicFactor(he4, m2, 90)).toBeCloseTo((m2 - he4) / (m2 + he4), 14);
  });

  it('4He on Au at 170 deg: K = 0.9225 (kinematic-factor tables, from memory; tolerance 3e-4 covers mass-number vs atomic-mass tables)', () => {
    expect(elasticKinematicFactor(he4, nuclide('197Au').massU, 170)).toBeCloseTo(0.9225, 3);
    expect(Math.abs(elasticKinematicFactor(4, 197, 170) - 0.9225)).toBeLessThan(3e-4);
  });

  it('equal masses: K = cos^2 theta up to 90 deg (common practice)', () => {
    expect(elasticKinematicFactor(1, 1, 30)).toBeCloseTo(Math.cos(Math.PI / 6) ** 2, 14);
    expect(elasticKinematicFactor(1, 1, 90)).toBeCloseTo(0, 14);
    expect(() => elasticKinematicFactor(1, 1, 91)).toThrow(RangeError);
  });

  it('M1 > M2: + branch, K = (M1-M2)/(M1+M2) at the maximum angle asin(M2/M1), RangeError beyond (common practice)', () => {
    const maxDeg = (Math.asin(1 / 4) * 180) / Math.PI; // 14.4775 deg for 4He on 1H (mass numbers)
    expect(elasticKinematicFactor(4, 1, maxDeg)).toBeCloseTo(0.6, 10);
    // the + branch lies above the value at the maximum angle
    expect(elasticKinematicFactor(4, 1, 10)).toBeGreaterThan(0.6);
    expect(elasticKinematicFactor(4, 1, 0)).toBeCloseTo(1, 14);
    expect(() => elasticKinematicFactor(4, 1, 15)).toThrow(/at most 14\.4775 deg/);
  });

  it('K -> 1 at 0 deg, and rejects invalid arguments', () => {
    expect(elasticKinematicFactor(he4, 12, 0)).toBeCloseTo(1, 14);
    expect(() => elasticKinematicFactor(0, 12, 10)).toThrow(RangeError);
    expect(() => elasticKinematicFactor(4, -1, 10)).toThrow(RangeError);
    expect(() => elasticKinematicFactor(4, 12, 181)).toThrow(RangeError);
    expect(() => elasticKinematicFactor(4, 12, Number.NaN)).toThrow(RangeError);
  });
});
