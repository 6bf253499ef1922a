import { gaussianBinContent } from '../../../pipeline/core/fitting/gaussian-peak.js';
import { samplePoisson } from '../../../pipeline/core/random/sample-poisson.js';
import type { UniformSource } from '../../../pipeline/core/random/xoshiro128-star-star.js';

/** Expected counts per channel 0 … n−1: Gaussian peaks (area, centroid, σ in channels) on a + b·ch. */
export function expectedSpectrum(n: number, peaks: readonly { area: number; centroid: number; sigma: number }[], level: number, slope = 0): Float64Array {
  const mu = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    mu[i] = level + slope * i;
    for (const p of peaks) mu[i] += gaussianBinContent(p.area, p.centroid, p.sigma, i - 0.5, i + 0.5);
  }
  return mu;
}

export function poissonSpectrum(rng: UniformSource, mu: Float64Array): Float64Array {
  return mu.map((m) => samplePoisson(rng, m));
}

export const mean = (a: readonly number[]) => a.reduce((x, y) => x + y, 0) / a.length;
export const sd = (a: readonly number[]) => {
  const m = mean(a);
  return Math.sqrt(a.reduce((s, x) => s + (x - m) ** 2, 0) / (a.length - 1));
};
export function correlation(a: readonly number[], b: readonly number[]): number {
  const ma = mean(a);
  const mb = mean(b);
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < a.length; i++) {
    sab += (a[i]! - ma) * (b[i]! - mb);
    saa += (a[i]! - ma) ** 2;
    sbb += (b[i]! - mb) ** 2;
  }
  return sab / Math.sqrt(saa * sbb);
}
