import { describe, expect, it } from 'vitest';
import { runsTest } from '../../../pipeline/core/fitting/runs-test.js';
import { chiSquareUpperTail } from '../../../pipeline/core/fitting/chi-square-upper-tail.js';
import { poissonDeviance } from '../../../pipeline/core/fitting/poisson-deviance.js';
import { multipletSpec } from '../../../pipeline/core/fitting/multiplet-spec.js';
import { fitPeaks } from '../../../pipeline/core/fitting/fit-peaks.js';
import { spectrumModel } from '../../../pipeline/core/fitting/spectrum-model.js';
import { parameterTie } from '../../../pipeline/core/fitting/linear-tie.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { poissonSpectrum } from './simulated-peaks.js';

describe('Wald–Wolfowitz (1940) runs test', () => {
  it('has the exact permutation mean and variance of the number of runs (checked by enumerating all C(9,4) = 126 sign orders)', () => {
    let sum = 0;
    let sum2 = 0;
    let count = 0;
    for (let mask = 0; mask < 512; mask++) {
      let neg = 0;
      for (let b = 0; b < 9; b++) if (mask & (1 << b)) neg++;
      if (neg !== 4) continue;
      let runs = 1;
      for (let b = 1; b < 9; b++) if (((mask >> b) & 1) !== ((mask >> (b - 1)) & 1)) runs++;
      sum += runs;
      sum2 += runs * runs;
      count++;
    }
    const m = sum / count;
    const v = sum2 / count - m * m;
    const r = runsTest([1, 1, 1, 1, 1, 0, 0, 0, 0], [0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5]);
    expect(count).toBe(126);
    expect(r.runs).toBe(2);
    expect(r.expectedRuns).toBeCloseTo(m, 12);
    expect(((r.runs - r.expectedRuns) / r.z) ** 2).toBeCloseTo(v, 12);
    expect(r.pTooFew).toBeLessThan(0.05);
    expect(Number.isNaN(runsTest([1, 1], [0, 0]).pTooFew)).toBe(true);
  });
});

describe('chiSquareUpperTail (Wilson & Hilferty 1931)', () => {
  it('gives the tabulated upper-tail probabilities within 5 % (A&S 1964 Table 26.8 percentage points, from memory)', () => {
    for (const [x, nu, p] of [[18.307, 10, 0.05], [50.892, 30, 0.01], [124.342, 100, 0.05], [149.449, 100, 0.001]] as const) {
      expect(Math.abs(chiSquareUpperTail(x, nu) / p - 1)).toBeLessThan(0.05);
    }
    expect(chiSquareUpperTail(0, 5)).toBe(1);
  });
});

describe('poissonDeviance (Baker & Cousins 1984, eq. 8)', () => {
  it('is 2Σ[μ − n + n ln(n/μ)], 2μ where n = 0, and +∞ for an impossible model', () => {
    expect(poissonDeviance([0, 2], [1, 1])).toBeCloseTo(2 * (1 + (1 - 2 + 2 * Math.log(2))), 14);
    expect(poissonDeviance([3, 5], [3, 5])).toBe(0);
    expect(poissonDeviance([1], [0])).toBe(Number.POSITIVE_INFINITY);
    expect(poissonDeviance([0], [-1])).toBe(Number.POSITIVE_INFINITY);
  });
});

describe('fitPeaks goodness of fit and extreme inputs', () => {
  // A strongly tailed peak (Bortels & Collaers form, η = 0.5, τ = 8 channels) with 1e5 counts.
  const n = 200;
  const truth = new Float64Array(n);
  spectrumModel({
    firstChannel: 0, channelCount: n, parameters: ['A', 'c', 's', 'eta', 'tau'].map((name) => ({ name, start: 0 })),
    peaks: [{ label: 'p', area: 0, centroid: parameterTie(1), sigma: parameterTie(2), tail: { fraction: parameterTie(3), length: parameterTie(4) } }],
  }).evaluate(Float64Array.from([1e5, 120, 3, 0.5, 8]), truth, new Float64Array(n * 5));
  for (let i = 0; i < n; i++) truth[i] += 5;
  const counts = poissonSpectrum(Xoshiro128StarStar.fromSeed(11), truth);
  const base = { firstChannel: 40, channelCount: 120, lines: [{ label: 'p', expectedChannel: 119 }], sigmaChannels: 3.3, background: 'constant' as const };

  it('flags a pure Gaussian fitted to a tailed peak (deviance and residual-runs warnings)', () => {
    const fit = fitPeaks(counts, multipletSpec(counts, base));
    const rules = fit.diagnostics.map((d) => d.rule);
    expect(rules).toContain('fit-poor-deviance');
    expect(rules).toContain('fit-residual-runs');
    expect(fit.deviancePerDof).toBeGreaterThan(3);
  });

  it('fits the same peak with a free tail without warnings and recovers the area (within 3 sigma) and tail length', () => {
    const fit = fitPeaks(counts, multipletSpec(counts, { ...base, tail: { mode: 'shared', fraction: 0.3, lengthChannels: 5 } }));
    expect(fit.converged).toBe(true);
    expect(fit.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
    const p = fit.peaks[0]!;
    expect(Math.abs(p.area - 1e5)).toBeLessThan(3 * p.areaUnc);
    const tau = fit.parameters.find((q) => q.name === 'tail_length')!;
    expect(Math.abs(tau.value - 8)).toBeLessThan(3 * tau.unc);
  });

  it('handles an empty region (area at its bound 0, reported) and rejects a region outside the spectrum', () => {
    const zeros = new Float64Array(100);
    const fit = fitPeaks(zeros, multipletSpec(zeros, { firstChannel: 10, channelCount: 60, lines: [{ label: 'p', expectedChannel: 40 }], sigmaChannels: 3, background: 'none' }));
    expect(fit.peaks[0]!.area).toBe(0);
    expect(fit.diagnostics.map((d) => d.rule)).toContain('fit-parameter-at-bound');
    expect(() => fitPeaks(zeros, multipletSpec(new Float64Array(200), { firstChannel: 90, channelCount: 60, lines: [{ label: 'p', expectedChannel: 120 }], sigmaChannels: 3 }))).toThrow(RangeError);
  });
});
