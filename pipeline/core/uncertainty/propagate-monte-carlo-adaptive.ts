// Adaptive Monte Carlo procedure: JCGM 101:2008 §7.9 (numerical tolerance §7.9.2, procedure §7.9.4).
import { Xoshiro128StarStar } from '../random/xoshiro128-star-star.js';
import { inputSampler, type InputDistribution } from './input-distribution.js';
import { NormalSampler } from './normal-sampler.js';
import { summarizeMonteCarlo, type MonteCarloResult } from './propagate-monte-carlo.js';

export interface AdaptiveMonteCarloOptions {
  seed: number;
  streamKeys?: readonly number[];
  coverageProbability?: number;
  /** n_dig: significant decimal digits of u(y) regarded as meaningful (1 or 2 usually); default 2. */
  significantDigits?: number;
  /** Upper bound on h·M; reached without stabilizing → `converged: false`. Default 10⁷. */
  maxTrials?: number;
}

export interface AdaptiveMonteCarloResult extends MonteCarloResult {
  converged: boolean;
  /** Number of batches h. */
  batches: number;
  /** Numerical tolerance δ of u(y) (§7.9.2), in the output's unit. */
  numericalTolerance: number;
}

/**
 * Numerical tolerance of z for n_dig significant digits: write z = c × 10^ℓ with c an n_dig-digit
 * integer; δ = ½ × 10^ℓ (§7.9.2). E.g. u = 0.0754, n_dig = 2 → c = 75, ℓ = −3, δ = 0.0005.
 */
export function numericalTolerance(z: number, significantDigits: number): number {
  if (!(z > 0) || !Number.isFinite(z)) return 0;
  const l = Math.floor(Math.log10(z)) - significantDigits + 1;
  return 0.5 * 10 ** l;
}

/**
 * §7.9.4: batches of M = max(⌈100/(1 − p)⌉, 10⁴) trials. After each batch h >= 2, the standard
 * deviations of the batch averages, s_z = √(Σ_r (z^(r) − z̄)² / (h(h − 1))), are formed for the
 * estimate, the standard uncertainty and the two endpoints of the probabilistically symmetric
 * interval; the computation has stabilized when 2 s_z <= δ (of u(y) from all h·M values) for all
 * four. The results come from all h·M values.
 */
export function propagateMonteCarloAdaptive(model: (x: Float64Array) => number, inputs: readonly InputDistribution[], options: AdaptiveMonteCarloOptions): AdaptiveMonteCarloResult {
  const p = options.coverageProbability ?? 0.95;
  const nDig = options.significantDigits ?? 2;
  const maxTrials = options.maxTrials ?? 10_000_000;
  const batch = Math.max(Math.ceil(100 / (1 - p)), 10_000);
  const rng = Xoshiro128StarStar.fromSeed(options.seed, ...(options.streamKeys ?? []));
  const normal = new NormalSampler(rng);
  const samplers = inputs.map((d) => inputSampler(d, rng, normal));
  const x = new Float64Array(inputs.length);
  const chunks: Float64Array[] = [];
  const stats: number[][] = [[], [], [], []];
  let total = 0;
  let pooledMean = 0;
  let pooledM2 = 0;
  for (;;) {
    const y = new Float64Array(batch);
    for (let r = 0; r < batch; r++) {
      for (let i = 0; i < samplers.length; i++) x[i] = samplers[i]!();
      const v = model(x);
      if (!Number.isFinite(v)) throw new RangeError(`model value ${v} at trial ${chunks.length * batch + r + 1}; the model must be finite over the inputs' distributions`);
      y[r] = v;
    }
    chunks.push(y);
    const s = summarizeMonteCarlo(y, p);
    [s.mean, s.standardUncertainty, s.symmetricInterval[0], s.symmetricInterval[1]].forEach((v, k) => stats[k]!.push(v));
    // pooled mean and sum of squared deviations of all h·M values (Chan, Golub & LeVeque 1983, Am. Stat. 37, 242, eq. 2.1)
    const m2Batch = s.standardUncertainty ** 2 * (batch - 1);
    const nOld = total;
    total += batch;
    const d = s.mean - pooledMean;
    pooledMean += (d * batch) / total;
    pooledM2 += m2Batch + (d * d * nOld * batch) / total;
    const h = chunks.length;
    if (h < 2) continue;
    const delta = numericalTolerance(Math.sqrt(pooledM2 / (total - 1)), nDig);
    const stable = stats.every((z) => 2 * sdOfMean(z) <= delta);
    if (stable || total + batch > maxTrials) return { ...summarizeMonteCarlo(concat(chunks), p), converged: stable, batches: h, numericalTolerance: delta };
  }
}

function sdOfMean(z: readonly number[]): number {
  const h = z.length;
  const mean = z.reduce((a, b) => a + b, 0) / h;
  let ss = 0;
  for (const v of z) ss += (v - mean) ** 2;
  return Math.sqrt(ss / (h * (h - 1)));
}

function concat(chunks: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(chunks.reduce((n, c) => n + c.length, 0));
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.length;
  }
  return out;
}
