import { describe, expect, it } from 'vitest';
import { searchPeaks, secondDifferenceKernel } from '../../../pipeline/core/spectrum/peak-search.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { expectedSpectrum, poissonSpectrum } from '../fitting/simulated-peaks.js';

describe('Mariscotti (1967) smoothed second-difference peak search', () => {
  it('uses a kernel with zero sum and zero first moment, so a linear background gives S = 0 (Mariscotti 1967, the property the method rests on)', () => {
    const c = secondDifferenceKernel(5, 5);
    expect(c.length).toBe(3 + 5 * 4);
    let sum = 0;
    let moment = 0;
    c.forEach((v, j) => {
      sum += v;
      moment += v * (j - (c.length - 1) / 2);
    });
    expect(sum).toBe(0);
    expect(moment).toBe(0);
    const line = Float64Array.from({ length: 300 }, (_, i) => 50 + 0.2 * i);
    expect(searchPeaks(line, { fwhmChannels: 8 })).toEqual([]);
  });

  it('finds three simulated peaks on a sloping background at their centroids (within 0.3 channel) and estimates their areas (within 15 %)', () => {
    const sigma = 8 / (2 * Math.sqrt(2 * Math.LN2));
    const truth = [{ area: 20000, centroid: 150.3, sigma }, { area: 8000, centroid: 260.7, sigma }, { area: 3000, centroid: 400, sigma }];
    const counts = poissonSpectrum(Xoshiro128StarStar.fromSeed(99), expectedSpectrum(512, truth, 40, -0.05));
    const found = searchPeaks(counts, { fwhmChannels: 8 });
    expect(found.length).toBe(3);
    found.forEach((f, i) => {
      expect(Math.abs(f.centroidChannel - truth[i]!.centroid)).toBeLessThan(0.3);
      expect(Math.abs(f.areaEstimate / truth[i]!.area - 1)).toBeLessThan(0.15);
    });
    expect(found[0]!.significance).toBeGreaterThan(found[2]!.significance);
  });

  it('finds nothing in pure Poisson noise on a flat background at the default 5-sigma threshold, and rejects a non-positive FWHM', () => {
    const counts = poissonSpectrum(Xoshiro128StarStar.fromSeed(3), expectedSpectrum(2048, [], 25));
    expect(searchPeaks(counts, { fwhmChannels: 10 })).toEqual([]);
    expect(() => searchPeaks(counts, { fwhmChannels: 0 })).toThrow(RangeError);
    expect(searchPeaks(new Float64Array(10), { fwhmChannels: 10 })).toEqual([]);
  });
});
