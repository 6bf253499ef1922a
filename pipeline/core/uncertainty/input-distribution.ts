// Sampling from the probability distributions of JCGM 101:2008 (Propagation of distributions using a Monte Carlo method) §6.4.2 (rectangular), §6.4.5 (triangular), §6.4.6 (arc sine), §6.4.7 (Gaussian).
import { samplePoisson } from '../random/sample-poisson.js';
import type { UniformSource } from '../random/xoshiro128-star-star.js';
import type { NormalSampler } from './normal-sampler.js';

/**
 * The distribution assigned to one input quantity (values in the quantity's unit):
 *   normal      N(mean, sd²):                       mean + sd·z
 *   rectangular R(lower, upper):                    lower + (upper − lower)·U         (u = (upper − lower)/√12)
 *   triangular  symmetric on [lower, upper]:        lower + (upper − lower)(U₁ + U₂)/2 (u = (upper − lower)/√24)
 *   arcsine     U-shaped on [lower, upper]:          (lower + upper)/2 + (upper − lower)/2 · sin(2πU)  (u = (upper − lower)/√8)
 *   poisson     counts with expectation `mean`      (a number of events, e.g. peak counts)
 *   constant    a fixed value (no uncertainty)
 */
export type InputDistribution =
  | { kind: 'normal'; mean: number; standardDeviation: number }
  | { kind: 'rectangular'; lower: number; upper: number }
  | { kind: 'triangular'; lower: number; upper: number }
  | { kind: 'arcsine'; lower: number; upper: number }
  | { kind: 'poisson'; mean: number }
  | { kind: 'constant'; value: number };

/** A function drawing one value of the input per call, checked once up front. */
export function inputSampler(d: InputDistribution, rng: UniformSource, normal: NormalSampler): () => number {
  switch (d.kind) {
    case 'normal': {
      const { mean, standardDeviation: sd } = d;
      if (!Number.isFinite(mean) || !(sd >= 0) || !Number.isFinite(sd)) throw new RangeError(`normal input needs a finite mean and sd >= 0, got mean ${mean}, sd ${sd}`);
      return () => mean + sd * normal.next();
    }
    case 'rectangular':
    case 'triangular':
    case 'arcsine': {
      const { lower, upper } = d;
      if (!Number.isFinite(lower) || !Number.isFinite(upper) || !(upper >= lower)) throw new RangeError(`${d.kind} input needs finite lower <= upper, got [${lower}, ${upper}]`);
      const w = upper - lower;
      if (d.kind === 'rectangular') return () => lower + w * rng.nextFloat64();
      if (d.kind === 'triangular') return () => lower + (w * (rng.nextFloat64() + rng.nextFloat64())) / 2;
      const mid = (lower + upper) / 2;
      return () => mid + (w / 2) * Math.sin(2 * Math.PI * rng.nextFloat64());
    }
    case 'poisson': {
      const mean = d.mean;
      if (!(mean >= 0) || !Number.isFinite(mean)) throw new RangeError(`poisson input needs a finite mean >= 0, got ${mean}`);
      return () => samplePoisson(rng, mean);
    }
    case 'constant': {
      const v = d.value;
      if (!Number.isFinite(v)) throw new RangeError(`constant input must be finite, got ${v}`);
      return () => v;
    }
  }
}
