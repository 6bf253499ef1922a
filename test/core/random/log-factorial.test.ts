import { describe, expect, it } from 'vitest';
import { logFactorial } from '../../../pipeline/core/random/log-factorial.js';

describe('logFactorial', () => {
  it('gives ln 10! = ln 3 628 800 and ln 0! = ln 1! = 0 (exact factorials)', () => {
    expect(logFactorial(0)).toBe(0);
    expect(logFactorial(1)).toBe(0);
    expect(logFactorial(10)).toBeCloseTo(Math.log(3628800), 12);
  });

  it('agrees on the Stirling branch (k >= 256) with a direct sum of logarithms to 1e-13 relative', () => {
    for (const k of [256, 300, 1000, 60000]) {
      let direct = 0;
      for (let j = 2; j <= k; j++) direct += Math.log(j);
      expect(Math.abs(logFactorial(k) - direct) / direct).toBeLessThan(1e-13);
    }
  });

  it('rejects negative and fractional arguments', () => {
    expect(() => logFactorial(-1)).toThrow(RangeError);
    expect(() => logFactorial(2.5)).toThrow(RangeError);
  });
});
