import { describe, expect, it } from 'vitest';
import { budgetFromGradient } from '../../../pipeline/core/uncertainty/budget-from-gradient.js';
import { div, dualVariables, mul, type Dual } from '../../../pipeline/core/uncertainty/dual.js';
import { splitStatSys } from '../../../pipeline/core/uncertainty/split-stat-sys.js';
import { COMPONENT_NAMES, CORRELATION_CLASSES, type UncertaintyComponent } from '../../../pipeline/core/uncertainty/uncertainty-component.js';

describe('uncertainty budget', () => {
  it('has the twelve component names and four correlation classes fixed by issue 5', () => {
    expect(COMPONENT_NAMES).toEqual(['counting', 'background', 'reference_counting', 'reference_spread', 'reference_areal_density', 'sample_areal_density', 'areal_density_ratio', 'charge', 'live_time', 'screening', 'beam_energy', 'angle', 'solid_angle', 'calibration']);
    expect(CORRELATION_CLASSES).toEqual(['uncorrelated', 'run', 'detector', 'series']);
  });

  it('splitStatSys: stat from uncorrelated components, sys from shared ones, each in quadrature (3-4-5 and 5-12-13 triangles)', () => {
    const c: UncertaintyComponent[] = [
      { name: 'counting', value: 3, class: 'uncorrelated', key: '' },
      { name: 'background', value: -4, class: 'uncorrelated', key: '' },
      { name: 'charge', value: 5, class: 'run', key: 'r1' },
      { name: 'angle', value: -12, class: 'detector', key: 'd1' },
    ];
    const s = splitStatSys(c);
    expect(s.stat).toBe(5);
    expect(s.sys).toBe(13);
    expect(s.total).toBeCloseTo(Math.hypot(5, 13), 14);
    expect(splitStatSys([])).toEqual({ stat: 0, sys: 0, total: 0 });
    expect(() => splitStatSys([{ name: 'counting', value: Number.NaN, class: 'uncorrelated', key: '' }])).toThrow(RangeError);
  });

  it('budgetFromGradient on the thin-target yield relation σ = N/(N_b n ΔΩ f) (Chu, Mayer & Nicolet 1978, eq. 3.4): each value = −σ u(x)/x for a denominator, σ u(N)/N for the counts', () => {
    const x0 = [10_000, 6.2e12, 1.2e18, 2.4e-3, 0.95]; // counts, ions, atoms/cm², sr, live fraction
    const u0 = [100, 0, 6e16, 0, 0.005];
    const sigma = ((x: readonly Dual[]): Dual => div(x[0]!, mul(mul(mul(x[1]!, x[2]!), x[3]!), x[4]!)))(dualVariables(x0));
    const budget = budgetFromGradient(sigma, [
      { name: 'counting', class: 'uncorrelated', key: '', standardUncertainty: u0[0]! },
      { name: 'charge', class: 'run', key: 'r7', standardUncertainty: u0[1]! },
      { name: 'sample_areal_density', class: 'series', key: 'foil', standardUncertainty: u0[2]! },
      { name: 'calibration', class: 'detector', key: 'd1', standardUncertainty: u0[3]! },
      { name: 'live_time', class: 'uncorrelated', key: '', standardUncertainty: u0[4]! },
    ]);
    expect(budget.map((c) => c.name)).toEqual(['counting', 'sample_areal_density', 'live_time']); // zero-u inputs left out
    const s = sigma.value;
    expect(budget[0]!.value / s).toBeCloseTo(0.01, 14);
    expect(budget[1]!.value / s).toBeCloseTo(-0.05, 14);
    expect(budget[2]!.value / s).toBeCloseTo(-0.005 / 0.95, 14);
    expect(budget[1]!.key).toBe('foil');
    const split = splitStatSys(budget);
    expect(split.stat / s).toBeCloseTo(Math.hypot(0.01, 0.005 / 0.95), 14);
    expect(split.sys / s).toBeCloseTo(0.05, 14);
  });

  it('budgetFromGradient rejects a slot count that does not match the inputs', () => {
    const [a] = dualVariables([1, 2]) as [Dual, Dual];
    expect(() => budgetFromGradient(a, [{ name: 'counting', class: 'uncorrelated', key: '', standardUncertainty: 1 }])).toThrow(/2 tangent slots/);
  });
});
