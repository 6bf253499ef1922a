import { describe, expect, it } from 'vitest';
import { formatWithUncertainty, roundToUncertainty } from '../../../pipeline/core/text/round-to-uncertainty.js';

// PDG rounding rule: Workman et al. (Particle Data Group), PTEP 2022, 083C01, Introduction §5.3.
describe('roundToUncertainty (PDG rule)', () => {
  it('PDG worked cases: 0.827 → 0.8, 0.992 → 1.0, 0.123 → 0.12 (two digits below 355)', () => {
    expect(roundToUncertainty(10, 0.827).unc).toBe('0.8');
    expect(roundToUncertainty(10, 0.992).unc).toBe('1.0');
    expect(roundToUncertainty(10, 0.123).unc).toBe('0.12');
  });
  it('1234.5 ± 23.1 is shown as 1235 ± 23', () => {
    expect(formatWithUncertainty(1234.5, 23.1)).toBe('1235 ± 23');
  });
  it('rounds the value to the decimal place of the uncertainty', () => {
    expect(formatWithUncertainty(0.8271, 0.0449)).toBe('0.83 ± 0.04');
    expect(formatWithUncertainty(98765, 3540)).toBe('98800 ± 3500');
  });
  it('no uncertainty: four significant digits; non-finite value: a dash', () => {
    expect(formatWithUncertainty(3.14159, 0)).toBe('3.142');
    expect(formatWithUncertainty(Number.NaN, 1)).toBe('—');
  });
});
