import { describe, expect, it } from 'vitest';
import { splitMix64Sequence } from '../../../pipeline/core/random/splitmix64.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';

describe('splitMix64', () => {
  it('matches the published first outputs of Vigna\'s splitmix64.c for seed 0', () => {
    // Reference values of the SplitMix64 reference code (Steele, Lea & Flood 2014; prng.di.unimi.it/splitmix64.c).
    expect(splitMix64Sequence(0n, 3)).toEqual([0xe220a8397b1dcdafn, 0x6e789e6aa1b965f4n, 0x06c45d188009454fn]);
  });
});

describe('Xoshiro128StarStar', () => {
  it('reproduces the output of the xoshiro128** reference C code (Blackman & Vigna 2021)', () => {
    // Seed state and outputs generated with the authors' xoshiro128starstar.c, as published in the test
    // data of the public xoshiro-6502 project (test-rom/testdata.asm, VerifyValuesXoshiro128, starstar column).
    const rng = new Xoshiro128StarStar([0x964d4a0c, 0xd40ab895, 0xad7fdecb, 0x3006f0f0]);
    expect([rng.nextUint32(), rng.nextUint32(), rng.nextUint32(), rng.nextUint32()]).toEqual([0xf1391922, 0x6fe53806, 0xa5be2840, 0xf510ee70]);
  });

  it('follows the published recurrence by hand from state {1, 2, 3, 4}', () => {
    // rotl(2·5, 7)·9 = 1280·9 = 11520; after one step s1 = 0, so the second output is 0 (worked from the definition).
    const rng = new Xoshiro128StarStar([1, 2, 3, 4]);
    expect(rng.nextUint32()).toBe(11520);
    expect(rng.nextUint32()).toBe(0);
  });

  it('gives the same stream for the same seed and keys, and a different one for another key', () => {
    const draw = (rng: Xoshiro128StarStar) => Array.from({ length: 1000 }, () => rng.nextUint32());
    const a = draw(Xoshiro128StarStar.fromSeed(20260302, 7, 1));
    const b = draw(Xoshiro128StarStar.fromSeed(20260302, 7, 1));
    const c = draw(Xoshiro128StarStar.fromSeed(20260302, 7, 2));
    const d = draw(Xoshiro128StarStar.fromSeed(20260303, 7, 1));
    expect(b).toEqual(a);
    expect(c).not.toEqual(a);
    expect(d).not.toEqual(a);
    // Pure regression numbers: they pin the seeding, so simulated series never change silently.
    expect(a.slice(0, 2)).toEqual([957227354, 1215000936]);
  });

  it('draws uniform doubles in [0, 1) with mean 1/2 and variance 1/12 (exact moments of U(0,1))', () => {
    const rng = Xoshiro128StarStar.fromSeed(11);
    const n = 200_000;
    let sum = 0;
    let sumSq = 0;
    let min = 1;
    let max = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.nextFloat64();
      sum += u;
      sumSq += u * u;
      min = Math.min(min, u);
      max = Math.max(max, u);
    }
    const mean = sum / n;
    const variance = sumSq / n - mean * mean;
    expect(min).toBeGreaterThanOrEqual(0);
    expect(max).toBeLessThan(1);
    // Tolerance: 5 standard errors. SE(mean) = sqrt(1/12 / n); SE(var) = sqrt((1/80 − 1/144) / n) (μ4 of U(0,1) is 1/80).
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(5 * Math.sqrt((1 / 80 - 1 / 144) / n));
  });

  it('rejects the all-zero state and a negative or fractional seed', () => {
    expect(() => new Xoshiro128StarStar([0, 0, 0, 0])).toThrow(RangeError);
    expect(() => Xoshiro128StarStar.fromSeed(-1)).toThrow(RangeError);
    expect(() => Xoshiro128StarStar.fromSeed(1.5)).toThrow(RangeError);
    expect(() => Xoshiro128StarStar.fromSeed(1, -2)).toThrow(RangeError);
  });
});
