import { describe, expect, it } from 'vitest';
import { multipletSpec } from '../../../pipeline/core/fitting/multiplet-spec.js';
import { fitPeaks } from '../../../pipeline/core/fitting/fit-peaks.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { correlation, expectedSpectrum, mean, poissonSpectrum, sd } from './simulated-peaks.js';

// Seeded simulation of a doublet whose lines are 2 FWHM apart (FWHM = 2√(2 ln 2)·σ, common practice),
// positions tied through a known gain (two lines of known energy difference), shared width, linear
// background. Truth is known; the checks compare the fit's own uncertainties and correlation with
// the scatter across 500 trials.
const SIGMA = 4;
const FWHM = 2 * Math.sqrt(2 * Math.LN2) * SIGMA;
const CHANNELS_PER_KEV = 0.5;
const E1 = 5000;
const E2 = E1 + (2 * FWHM) / CHANNELS_PER_KEV;
const C1 = 60.4;
const C2 = C1 + 2 * FWHM;
const AREAS = [4000, 1500];

describe('doublet 2 FWHM apart, Poisson ML', () => {
  it('recovers both areas with correct uncertainties (pull mean within ±0.1, sd within 1 ± 0.1) and their correlation (fitted vs empirical within 3 standard errors)', () => {
    const truth = expectedSpectrum(140, [{ area: AREAS[0]!, centroid: C1, sigma: SIGMA }, { area: AREAS[1]!, centroid: C2, sigma: SIGMA }], 30, -0.05);
    const rng = Xoshiro128StarStar.fromSeed(4242);
    const a1: number[] = [];
    const a2: number[] = [];
    const pull1: number[] = [];
    const pull2: number[] = [];
    const fittedCorrelation: number[] = [];
    let converged = 0;
    let flagged = 0;
    const trials = 500;
    for (let t = 0; t < trials; t++) {
      const counts = poissonSpectrum(rng, truth);
      // Start values as the caller has them: expected centroids and predicted width, slightly off.
      const spec = multipletSpec(counts, {
        firstChannel: 20, channelCount: 100, sigmaChannels: SIGMA * 1.1, positions: 'tied-fixed-gain', channelsPerKeV: CHANNELS_PER_KEV, background: 'linear',
        lines: [{ label: 'a', expectedChannel: C1 + 1.5, energyKeV: E1 }, { label: 'b', expectedChannel: C2 + 1.5, energyKeV: E2 }],
      });
      const fit = fitPeaks(counts, spec);
      if (fit.converged) converged++;
      if (fit.diagnostics.some((d) => d.severity === 'warning')) flagged++;
      const [p, q] = fit.peaks as [typeof fit.peaks[0], typeof fit.peaks[0]];
      a1.push(p.area);
      a2.push(q.area);
      pull1.push((p.area - AREAS[0]!) / p.areaUnc);
      pull2.push((q.area - AREAS[1]!) / q.areaUnc);
      fittedCorrelation.push(fit.areaCorrelation[0]![1]!);
    }
    expect(converged).toBe(trials);
    // Goodness-of-fit warnings at P < 0.001 (two tests per fit): expect ~1 in 500, allow 5.
    expect(flagged).toBeLessThanOrEqual(5);
    for (const pulls of [pull1, pull2]) {
      expect(Math.abs(mean(pulls))).toBeLessThan(0.1);
      expect(Math.abs(sd(pulls) - 1)).toBeLessThan(0.1);
    }
    const empirical = correlation(a1, a2);
    const rho = mean(fittedCorrelation);
    // Standard error of a sample correlation: (1 − ρ²)/√(n − 1) (R.A. Fisher, Biometrika 10, 507 (1915), large-n form).
    const se = (1 - rho * rho) / Math.sqrt(trials - 1);
    // Overlap anticorrelates the areas; the shared width and background correlate them: ρ is small (≈ +0.05 here).
    expect(Math.abs(rho)).toBeLessThan(0.3);
    expect(Math.abs(empirical - rho)).toBeLessThan(3 * se);
  });
});
