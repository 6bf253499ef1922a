import { describe, expect, it } from 'vitest';
import { logFactorial } from '../../../pipeline/core/random/log-factorial.js';
import { samplePoisson } from '../../../pipeline/core/random/sample-poisson.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { chiSquareUpper, sampleMoments } from './sampling-checks.js';

const N = 200_000;

describe('samplePoisson', () => {
  // Exact moments of the Poisson law: mean μ, variance μ, fourth central moment μ(1 + 3μ).
  // Tolerances are 5 standard errors of the sample statistic: SE(mean) = sqrt(μ/N),
  // SE(variance) ≈ sqrt((μ4 − σ⁴)/N) = sqrt((μ + 2μ²)/N). Seeded, so the outcome is fixed.
  for (const mu of [0.3, 3, 9.99, 10, 25, 150, 5000]) {
    it(`has mean and variance μ = ${mu} within 5 standard errors (exact Poisson moments)`, () => {
      const rng = Xoshiro128StarStar.fromSeed(1993, Math.round(mu * 100));
      const { mean, variance, min } = sampleMoments(N, () => samplePoisson(rng, mu));
      expect(min).toBeGreaterThanOrEqual(0);
      expect(Math.abs(mean - mu)).toBeLessThan(5 * Math.sqrt(mu / N));
      expect(Math.abs(variance - mu)).toBeLessThan(5 * Math.sqrt((mu + 2 * mu * mu) / N));
    });
  }

  for (const mu of [3, 25, 400]) {
    it(`matches the exact Poisson(${mu}) probabilities by a chi-square test (p = 1e-4 critical value)`, () => {
      const rng = Xoshiro128StarStar.fromSeed(77, mu);
      const counts = new Map<number, number>();
      for (let i = 0; i < N; i++) {
        const k = samplePoisson(rng, mu);
        counts.set(k, (counts.get(k) ?? 0) + 1);
      }
      const pmf = (k: number) => Math.exp(-mu + k * Math.log(mu) - logFactorial(k));
      const { statistic, critical } = chiSquareUpper(counts, pmf, N, 1e-4);
      expect(statistic).toBeLessThan(critical);
    });
  }

  it('returns 0 for mean 0 and throws for a negative or infinite mean', () => {
    const rng = Xoshiro128StarStar.fromSeed(1);
    expect(samplePoisson(rng, 0)).toBe(0);
    expect(() => samplePoisson(rng, -1)).toThrow(RangeError);
    expect(() => samplePoisson(rng, Number.POSITIVE_INFINITY)).toThrow(RangeError);
    expect(() => samplePoisson(rng, Number.NaN)).toThrow(RangeError);
  });
});
