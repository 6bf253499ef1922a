import { describe, expect, it } from 'vitest';
import { coverageIntervals } from '../../../pipeline/core/uncertainty/coverage-intervals.js';
import { numericalTolerance, propagateMonteCarloAdaptive } from '../../../pipeline/core/uncertainty/propagate-monte-carlo-adaptive.js';
import type { InputDistribution } from '../../../pipeline/core/uncertainty/input-distribution.js';

describe('coverageIntervals (JCGM 101:2008 §7.7)', () => {
  const y = Float64Array.from({ length: 10 }, (_, k) => (k + 1) ** 2); // 1, 4, 9, …, 100: skewed to the right

  it('§7.7.1: pM = 8 an integer → q = 8, (M − q)/2 = 1 → [y_(1), y_(9)]', () => {
    expect(coverageIntervals(y, 0.8).symmetric).toEqual([1, 81]);
  });

  it('§7.7.1: pM = 6.5 → q = ⌊7⌋ = 7, (M − q)/2 = 1.5 → r = ⌊(M − q + 1)/2⌋ = 2 → [y_(2), y_(9)]', () => {
    expect(coverageIntervals(y, 0.65).symmetric).toEqual([4, 81]);
  });

  it('§7.7.2: the shortest interval of skewed values starts at the dense end: q = 7 → [y_(1), y_(8)]', () => {
    expect(coverageIntervals(y, 0.65).shortest).toEqual([1, 64]);
  });

  it('rejects p outside (0, 1) and too few values', () => {
    expect(() => coverageIntervals(y, 1)).toThrow(RangeError);
    expect(() => coverageIntervals(y, 0)).toThrow(RangeError);
    expect(() => coverageIntervals(y, 0.99)).toThrow(/too few/);
  });
});

describe('propagateMonteCarloAdaptive (JCGM 101:2008 §7.9)', () => {
  it('§7.9.2 numerical tolerance: u = 0.0754, n_dig = 2 → δ = 0.0005; u = 2.0, n_dig = 1 → δ = 0.5; u = 2.0, n_dig = 2 → 0.05', () => {
    expect(numericalTolerance(0.0754, 2)).toBeCloseTo(0.0005, 15);
    expect(numericalTolerance(2.0, 1)).toBeCloseTo(0.5, 15);
    expect(numericalTolerance(2.0, 2)).toBeCloseTo(0.05, 15);
    expect(numericalTolerance(0, 2)).toBe(0);
  });

  it('stabilizes on the §9.2.2 additive model (u = 2) with n_dig = 2, in batches of 10⁴, and reports u within δ of 2', () => {
    const normal: InputDistribution = { kind: 'normal', mean: 0, standardDeviation: 1 };
    const sum = (x: Float64Array): number => x[0]! + x[1]! + x[2]! + x[3]!;
    const r = propagateMonteCarloAdaptive(sum, [normal, normal, normal, normal], { seed: 79, significantDigits: 2 });
    expect(r.converged).toBe(true);
    expect(r.numericalTolerance).toBeCloseTo(0.05, 12);
    expect(r.batches).toBeGreaterThanOrEqual(2);
    expect(r.trials).toBe(r.batches * 10_000);
    expect(Math.abs(r.standardUncertainty - 2)).toBeLessThan(r.numericalTolerance);
    expect(Math.abs(r.symmetricInterval[1] - 3.92)).toBeLessThan(2 * r.numericalTolerance);
  });

  it('reports converged: false when maxTrials stops it first', () => {
    const r = propagateMonteCarloAdaptive((x) => x[0]!, [{ kind: 'normal', mean: 0, standardDeviation: 1 }], { seed: 1, significantDigits: 4, maxTrials: 30_000 });
    expect(r.converged).toBe(false);
    expect(r.trials).toBe(30_000);
  });
});
