import { describe, expect, it } from 'vitest';
import { formatPercent, formatStatSys, formatToUncertainty, pdgPlace } from '../../../stages/report/format/format-stat-sys.js';

// PDG rounding rule: R.L. Workman et al. (Particle Data Group), Prog. Theor. Exp. Phys. 2022, 083C01,
// Introduction §5.3: the three highest digits of the uncertainty decide — 100–354 two significant
// digits, 355–949 one, 950–999 rounded up to 1000 with two; the value is rounded to the same place.
describe('summary-page number formatting (PDG rule, Introduction §5.3)', () => {
  it('PDG worked example 1234.5 ± 23.1 → 1235 ± 23 (place 10^0), and the three-digit thresholds', () => {
    expect(pdgPlace(23.1)).toBe(0);
    expect(formatToUncertainty(1234.5, 23.1)).toBe('1235');
    expect(pdgPlace(0.354)).toBe(-2); // 354: two digits → 0.35
    expect(pdgPlace(0.355)).toBe(-1); // 355: one digit → 0.4
    expect(pdgPlace(0.949)).toBe(-1); // 949: one digit → 0.9
    expect(pdgPlace(0.950)).toBe(-1); // 950: rounds up to 1.0, two digits at place 10^-1
  });

  it('stat and sys: the rule applied to the smaller uncertainty sets the place of all three (project convention)', () => {
    // smaller = 3.12 → 312 → two digits → place 10^-1
    expect(formatStatSys(207.14, 3.12, 12.23)).toBe('207.1 ± 3.1 ± 12.2');
    // smaller = 23.1 (as in the PDG example) → place 10^0
    expect(formatStatSys(1234.5, 23.1, 61.7)).toBe('1235 ± 23 ± 62');
    // smaller = 0.0449 → 449 → one digit → place 10^-2
    expect(formatStatSys(0.8271, 0.0449, 0.061)).toBe('0.83 ± 0.04 ± 0.06');
    // 950–999: 0.0962 → 0.10, two digits at place 10^-2
    expect(formatStatSys(1.2345, 0.0962, 0.2)).toBe('1.23 ± 0.10 ± 0.20');
  });

  it('one missing uncertainty is named; none gives four significant digits; no value gives a dash', () => {
    expect(formatStatSys(207.14, 3.12, Number.NaN)).toBe('207.1 ± 3.1 (stat)');
    expect(formatStatSys(207.14, 0, 12.23)).toBe('207 ± 12 (sys)');
    expect(formatStatSys(207.14, Number.NaN, Number.NaN)).toBe('207.1');
    expect(formatStatSys(Number.NaN, 1, 1)).toBe('—');
  });

  it('an energy or angle rounded to its own uncertainty (beam 2000 ± 2 keV → 2000.0; 165° ± 0.25° → 165.0)', () => {
    expect(formatToUncertainty(2000, 2)).toBe('2000.0');
    expect(formatToUncertainty(165, 0.25)).toBe('165.00');
    expect(formatToUncertainty(159.61234, 0)).toBe('159.6');
  });

  it('relative uncertainties in percent with two significant digits (project convention)', () => {
    expect(formatPercent(0.05123)).toBe('5.1');
    expect(formatPercent(0.0041)).toBe('0.41');
    expect(formatPercent(Number.NaN)).toBe('—');
  });
});
