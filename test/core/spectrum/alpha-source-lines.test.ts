import { describe, expect, it } from 'vitest';
import { ALPHA_SOURCE_LINES, alphaSourceLines } from '../../../pipeline/core/spectrum/alpha-source-lines.js';
import { mergeUnresolvedLines } from '../../../pipeline/core/spectrum/merge-unresolved-lines.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { ATOMIC_MASS_UNIT_KEV } from '../../../pipeline/core/physics/codata2018.js';

// The shipped table is typed from memory of the DDEP evaluation (see its header). Retyping the same
// numbers here would check nothing, so each line is checked against a source independent of it:
// the decay Q-value from AME2020 atomic masses (Wang et al., Chinese Physics C 45, 030003 (2021)),
// with two-body kinematics for decay to the daughter level fed:
//   T_α = (M² + m_α² − m_d²)/(2M) − m_α,   m_d = M(daughter) + E_level.
// Tolerance: 3 combined standard uncertainties (line energy, masses) plus 0.15 keV for using atomic
// instead of nuclear masses (the electron binding differences; from memory, order 0.1 keV).
const DAUGHTER: Record<string, string> = { '148Gd': '144Sm', '210Po': '206Pb', '238Pu': '234U', '239Pu': '235U', '241Am': '237Np', '244Cm': '240Pu' };

describe('alpha source lines (DDEP values typed from memory)', () => {
  for (const [parent, lines] of Object.entries(ALPHA_SOURCE_LINES)) {
    it(`${parent}: every line energy agrees with the AME2020 Q-value to the daughter level`, () => {
      const p = nuclide(parent);
      const d = nuclide(DAUGHTER[parent]!);
      const he = nuclide('4He');
      for (const l of lines) {
        const M = p.massU * ATOMIC_MASS_UNIT_KEV;
        const ma = he.massU * ATOMIC_MASS_UNIT_KEV;
        const md = d.massU * ATOMIC_MASS_UNIT_KEV + l.daughterLevelKeV;
        const t = (M * M + ma * ma - md * md) / (2 * M) - ma;
        const uQ = Math.hypot(p.massUncU, d.massUncU, he.massUncU) * ATOMIC_MASS_UNIT_KEV;
        expect(Math.abs(l.energyKeV - t)).toBeLessThan(3 * Math.hypot(l.energyUncKeV, uQ) + 0.15);
      }
      // Emission probabilities per decay: the main lines carry nearly all decays and cannot exceed 100 %.
      const total = lines.reduce((s, l) => s + l.intensityPercent, 0);
      expect(total).toBeGreaterThan(98);
      expect(total).toBeLessThanOrEqual(100.2);
    });
  }

  it('returns the lines of a mixed source sorted by energy and rejects an unknown nuclide', () => {
    const mixed = alphaSourceLines(['244Cm', '239Pu', '241Am']);
    expect(mixed.length).toBe(8);
    for (let i = 1; i < mixed.length; i++) expect(mixed[i]!.energyKeV).toBeGreaterThan(mixed[i - 1]!.energyKeV);
    expect(() => alphaSourceLines(['226Ra'])).toThrow(/no alpha lines for 226Ra/);
  });

  it('merges lines closer than the FWHM at their intensity-weighted energy and drops weak groups (common practice)', () => {
    const merged = mergeUnresolvedLines(alphaSourceLines(['239Pu', '241Am']), 20);
    // 239Pu 5156.59 and 5144.3 are 12.3 keV apart (< 20): one peak; 5105.5 stays apart; 241Am 5388.23 (2 % of 84 %) is dropped.
    const pu = merged.find((m) => m.members.length === 2)!;
    expect(pu.energyKeV).toBeCloseTo((70.77 * 5156.59 + 17.11 * 5144.3) / (70.77 + 17.11), 9);
    expect(merged.map((m) => m.nuclide)).toEqual(['239Pu', '239Pu', '241Am', '241Am']);
  });
});
