import { describe, expect, it } from 'vitest';
import { erfc } from '../../../pipeline/core/math/erfc.js';
import { normalCdf, normalUpperTail } from '../../../pipeline/core/math/normal-cdf.js';

describe('erfc', () => {
  it('matches Abramowitz & Stegun (1964) Table 7.1 values of erf to the 10 printed decimals', () => {
    // erf(x) from A&S Table 7.1.
    const table: [number, number][] = [[0.1, 0.1124629160], [0.5, 0.5204998778], [1.0, 0.8427007929], [1.5, 0.9661051465], [2.0, 0.9953222650]];
    for (const [x, erf] of table) expect(Math.abs(1 - erfc(x) - erf)).toBeLessThan(6e-11);
  });

  it('keeps relative precision in the far tail: erfc(3), erfc(5), erfc(10) (from memory, 16 digits)', () => {
    const tail: [number, number][] = [[3, 2.209049699858544e-5], [5, 1.537459794428035e-12], [10, 2.088487583762545e-45]];
    for (const [x, v] of tail) expect(Math.abs(erfc(x) - v) / v).toBeLessThan(1e-14);
  });

  it('is continuous where the series hands over to the continued fraction (x = 2) and obeys erfc(−x) = 2 − erfc(x)', () => {
    // Across the hand-over the step must match the slope d erfc/dx = −(2/√π) e^{−x²}: no jump.
    const h = 1e-7;
    const step = erfc(2 - h) - erfc(2);
    const slopeStep = (2 / Math.sqrt(Math.PI)) * Math.exp(-4) * h;
    expect(Math.abs(step - slopeStep) / erfc(2)).toBeLessThan(1e-12);
    for (const x of [0.3, 1.7, 2.5, 4]) expect(erfc(-x)).toBeCloseTo(2 - erfc(x), 15);
    expect(erfc(0)).toBe(1);
    expect(erfc(30)).toBe(0);
    expect(Number.isNaN(erfc(Number.NaN))).toBe(true);
  });
});

describe('normalCdf and normalUpperTail', () => {
  it('match Abramowitz & Stegun (1964) Table 26.1: P(1) = 0.8413447461, P(2) = 0.9772498681, P(3) = 0.9986501020', () => {
    expect(normalCdf(1)).toBeCloseTo(0.8413447461, 10);
    expect(normalCdf(2)).toBeCloseTo(0.9772498681, 10);
    expect(normalCdf(3)).toBeCloseTo(0.998650102, 10);
    expect(normalCdf(0)).toBe(0.5);
  });

  it('gives the 5σ one-sided tail 2.8665157e-7 (from memory) with full relative precision', () => {
    expect(Math.abs(normalUpperTail(5) - 2.866515718791939e-7) / 2.866515718791939e-7).toBeLessThan(1e-13);
    expect(normalUpperTail(-1)).toBeCloseTo(normalCdf(1), 15);
  });
});
