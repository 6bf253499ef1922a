import { describe, expect, it } from 'vitest';
import { logFactorial } from '../../../pipeline/core/random/log-factorial.js';
import { sampleBinomial } from '../../../pipeline/core/random/sample-binomial.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { chiSquareUpper, sampleMoments } from './sampling-checks.js';

const N = 200_000;

describe('sampleBinomial', () => {
  // Exact moments of Binomial(n, p): mean np, variance npq, fourth central moment npq(1 + 3(n − 2)pq).
  // Tolerances: 5 standard errors, SE(mean) = sqrt(npq/N), SE(variance) ≈ sqrt((μ4 − (npq)²)/N).
  const cases: [number, number][] = [[20, 0.3], [1000, 0.004], [100, 0.15], [500, 0.5], [60000, 0.9], [60000, 0.97], [40, 0.8]];
  for (const [n, p] of cases) {
    it(`has mean np and variance np(1−p) for n = ${n}, p = ${p} within 5 standard errors (exact binomial moments)`, () => {
      const rng = Xoshiro128StarStar.fromSeed(1993, n, Math.round(p * 1000));
      const { mean, variance, min, max } = sampleMoments(N, () => sampleBinomial(rng, n, p));
      const q = 1 - p;
      const mu4 = n * p * q * (1 + 3 * (n - 2) * p * q);
      expect(min).toBeGreaterThanOrEqual(0);
      expect(max).toBeLessThanOrEqual(n);
      expect(Math.abs(mean - n * p)).toBeLessThan(5 * Math.sqrt((n * p * q) / N));
      expect(Math.abs(variance - n * p * q)).toBeLessThan(5 * Math.sqrt((mu4 - (n * p * q) ** 2) / N));
    });
  }

  for (const [n, p] of [[20, 0.3], [100, 0.15], [60000, 0.9]] as const) {
    it(`matches the exact Binomial(${n}, ${p}) probabilities by a chi-square test (p = 1e-4 critical value)`, () => {
      const rng = Xoshiro128StarStar.fromSeed(78, n);
      const counts = new Map<number, number>();
      for (let i = 0; i < N; i++) {
        const k = sampleBinomial(rng, n, p);
        counts.set(k, (counts.get(k) ?? 0) + 1);
      }
      const pmf = (k: number) => Math.exp(logFactorial(n) - logFactorial(k) - logFactorial(n - k) + k * Math.log(p) + (n - k) * Math.log1p(-p));
      const { statistic, critical } = chiSquareUpper(counts, pmf, N, 1e-4);
      expect(statistic).toBeLessThan(critical);
    });
  }

  it('handles the edges: n = 0, p = 0, p = 1; rejects bad arguments', () => {
    const rng = Xoshiro128StarStar.fromSeed(2);
    expect(sampleBinomial(rng, 0, 0.4)).toBe(0);
    expect(sampleBinomial(rng, 50, 0)).toBe(0);
    expect(sampleBinomial(rng, 50, 1)).toBe(50);
    expect(() => sampleBinomial(rng, -1, 0.5)).toThrow(RangeError);
    expect(() => sampleBinomial(rng, 2.5, 0.5)).toThrow(RangeError);
    expect(() => sampleBinomial(rng, 10, 1.2)).toThrow(RangeError);
  });
});
