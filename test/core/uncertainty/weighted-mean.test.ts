import { describe, expect, it } from 'vitest';
import { weightedMean } from '../../../pipeline/core/uncertainty/weighted-mean.js';

// The averaging rule of the Review of Particle Physics (R.L. Workman et al., PTEP 2022, 083C01, Introduction,
// "Averages and fits"), checked on analytic cases worked by hand beside each check.
describe('weightedMean with the PDG scale factor', () => {
  it('two values 1 ± 1 and 3 ± 1: x̄ = 2, δx̄ = 1/√2, χ² = 2, ν = 1, S = √2, scaled δx̄ = 1', () => {
    const r = weightedMean([1, 3], [1, 1]);
    expect(r.mean).toBeCloseTo(2, 15);
    expect(r.uncertainty).toBeCloseTo(Math.SQRT1_2, 15);
    expect(r.chi2).toBeCloseTo(2, 14);
    expect(r.ndf).toBe(1);
    expect(r.chi2PerNdf).toBeCloseTo(2, 14);
    expect(r.scaleFactor).toBeCloseTo(Math.SQRT2, 14);
    expect(r.scaledUncertainty).toBeCloseTo(1, 14);
  });

  it('weights by 1/δx²: 10 ± 1 and 20 ± 2 → x̄ = (10 + 20/4)/(1 + 1/4) = 12, δx̄ = 1/√1.25', () => {
    const r = weightedMean([10, 20], [1, 2]);
    expect(r.mean).toBeCloseTo(12, 14);
    expect(r.uncertainty).toBeCloseTo(1 / Math.sqrt(1.25), 14);
    // χ² = (2/1)² + (8/2)² = 20 → S = √20.
    expect(r.scaleFactor).toBeCloseTo(Math.sqrt(20), 13);
  });

  it('leaves δx̄ unscaled when χ²/ν <= 1 (S < 1 is not applied)', () => {
    const r = weightedMean([5.0, 5.1, 4.9], [1, 1, 1]);
    expect(r.scaleFactorRaw).toBeCloseTo(0.1, 14); // χ² = 0.02, ν = 2
    expect(r.scaleFactor).toBe(1);
    expect(r.scaledUncertainty).toBe(r.uncertainty);
  });

  it('computes S without values whose δx_i > 3√N δx̄ (PDG rule), while they still enter the mean', () => {
    // 10 ± 1, 12 ± 1, 30 ± 20: Σw = 2.0025, x̄ = 22.075/2.0025 = 11.02372, δx̄ = 0.706665;
    // cut-off 3√3 · 0.706665 = 3.672 → the third value (δ = 20) is left out of S.
    const r = weightedMean([10, 12, 30], [1, 1, 20]);
    expect(r.mean).toBeCloseTo(22.075 / 2.0025, 12);
    expect(r.usedForScaleFactor).toEqual([true, true, false]);
    const xbar = 22.075 / 2.0025;
    const chi2Used = (10 - xbar) ** 2 + (12 - xbar) ** 2; // = 2.00125
    expect(r.scaleFactorRaw).toBeCloseTo(Math.sqrt(chi2Used / 1), 12);
    // With all three values, S would be √((2.00125 + 0.90013)/2) = 1.2044: the rule changes the answer.
    const chi2All = chi2Used + ((30 - xbar) / 20) ** 2;
    expect(r.chi2).toBeCloseTo(chi2All, 12);
    expect(Math.abs(r.scaleFactor - Math.sqrt(chi2All / 2))).toBeGreaterThan(0.2);
  });

  it('one value: itself, ν = 0, χ²/ν undefined, S = 1', () => {
    const r = weightedMean([7], [0.5]);
    expect(r.mean).toBe(7);
    expect(r.uncertainty).toBe(0.5);
    expect(r.ndf).toBe(0);
    expect(Number.isNaN(r.chi2PerNdf)).toBe(true);
    expect(r.scaleFactor).toBe(1);
  });

  it('rejects no values, a zero or negative uncertainty, NaN values and mismatched lengths', () => {
    expect(() => weightedMean([], [])).toThrow(RangeError);
    expect(() => weightedMean([1, 2], [1, 0])).toThrow(/uncertainty 1 is 0/);
    expect(() => weightedMean([1, 2], [1, -1])).toThrow(RangeError);
    expect(() => weightedMean([Number.NaN], [1])).toThrow(RangeError);
    expect(() => weightedMean([1, 2], [1])).toThrow(RangeError);
  });
});
