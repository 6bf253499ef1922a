// Propagation of distributions by a Monte Carlo method: JCGM 101:2008 §7.2-7.7 (M trials, estimate §7.6, coverage intervals §7.7).
import { Xoshiro128StarStar } from '../random/xoshiro128-star-star.js';
import { coverageIntervals } from './coverage-intervals.js';
import { inputSampler, type InputDistribution } from './input-distribution.js';
import { NormalSampler } from './normal-sampler.js';

export interface MonteCarloOptions {
  /** Number of trials M (JCGM 101 §7.2.2 suggests M >= 10⁴/(1 − p) ... 10⁶). */
  trials: number;
  /** Seed of the xoshiro128** stream; the same seed and keys give identical results. */
  seed: number;
  /** Extra stream keys (e.g. row index) so independent rows draw independent streams. */
  streamKeys?: readonly number[];
  /** Coverage probability p, default 0.95. */
  coverageProbability?: number;
}

export interface MonteCarloResult {
  trials: number;
  /** ỹ = (1/M) Σ y_r (§7.6), in the output's unit. */
  mean: number;
  /** u(ỹ) = √(Σ (y_r − ỹ)² / (M − 1)) (§7.6). */
  standardUncertainty: number;
  coverageProbability: number;
  /** Probabilistically symmetric 100p % coverage interval (§7.7.1). */
  symmetricInterval: [number, number];
  /** Shortest 100p % coverage interval (§7.7.2). */
  shortestInterval: [number, number];
}

/**
 * Draws M values of the inputs from their distributions (independently), evaluates
 * y_r = f(x_r) for each, and summarises the distribution of Y. `model` gets the inputs in the
 * order given, in one reused Float64Array; it must not keep it. A non-finite model value is a
 * contract error (e.g. a ratio whose denominator reached zero) and throws with the trial number.
 */
export function propagateMonteCarlo(model: (x: Float64Array) => number, inputs: readonly InputDistribution[], options: MonteCarloOptions): MonteCarloResult {
  const values = monteCarloValues(model, inputs, options.trials, options.seed, options.streamKeys ?? []);
  return summarizeMonteCarlo(values, options.coverageProbability ?? 0.95);
}

/** The M model values, in trial order. */
export function monteCarloValues(model: (x: Float64Array) => number, inputs: readonly InputDistribution[], trials: number, seed: number, streamKeys: readonly number[]): Float64Array {
  if (!Number.isSafeInteger(trials) || trials < 2) throw new RangeError(`Monte Carlo needs an integer number of trials >= 2, got ${trials}`);
  const rng = Xoshiro128StarStar.fromSeed(seed, ...streamKeys);
  const normal = new NormalSampler(rng);
  const samplers = inputs.map((d) => inputSampler(d, rng, normal));
  const x = new Float64Array(inputs.length);
  const y = new Float64Array(trials);
  for (let r = 0; r < trials; r++) {
    for (let i = 0; i < samplers.length; i++) x[i] = samplers[i]!();
    const v = model(x);
    if (!Number.isFinite(v)) throw new RangeError(`model value ${v} at trial ${r + 1} (inputs ${Array.from(x).join(', ')}); the model must be finite over the inputs' distributions`);
    y[r] = v;
  }
  return y;
}

/** Estimate, standard uncertainty and both coverage intervals from model values (not modified). */
export function summarizeMonteCarlo(values: Float64Array, coverageProbability: number): MonteCarloResult {
  const m = values.length;
  let sum = 0;
  for (let r = 0; r < m; r++) sum += values[r]!;
  const mean = sum / m;
  let ss = 0;
  for (let r = 0; r < m; r++) ss += (values[r]! - mean) ** 2;
  const sorted = values.slice().sort();
  const ci = coverageIntervals(sorted, coverageProbability);
  return {
    trials: m,
    mean,
    standardUncertainty: Math.sqrt(ss / (m - 1)),
    coverageProbability,
    symmetricInterval: ci.symmetric,
    shortestInterval: ci.shortest,
  };
}
