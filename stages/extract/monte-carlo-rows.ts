// Propagation of distributions by a Monte Carlo method: JCGM 101:2008 §7 (estimate §7.6, probabilistically symmetric coverage interval §7.7.1).
import { flattenModel, type MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import { propagateMonteCarlo } from '../../pipeline/core/uncertainty/propagate-monte-carlo.js';

export interface MonteCarloRow {
  /** ỹ, the mean of the M model values, in the row's unit. */
  mean: number;
  /** u(ỹ), their standard deviation. */
  standardUncertainty: number;
  /** Probabilistically symmetric 95 % coverage interval. */
  lower95: number;
  upper95: number;
  /** Why the row has no Monte Carlo values (a trial gave a non-finite value), else ''. */
  problem: string;
}

/**
 * M trials per row through the same model that gives the first-order value: every leaf input
 * drawn from its distribution (counts Poisson, others Gaussian, JCGM 101 §6.4.7), a shared
 * input once per trial for all its paths. Row i draws the stream (seed, i), so a row's result
 * does not depend on the other rows. Cost: M × (number of leaf inputs) per row.
 */
export function monteCarloRows(models: readonly MeasurementModel[], trials: number, seed: number, streamKeys: readonly number[] = models.map((_, i) => i)): MonteCarloRow[] {
  if (!Number.isSafeInteger(trials) || trials < 40) throw new RangeError(`--mc needs a whole number of trials >= 40 (a 95 % interval needs M > 1/(1 − p) = 20), got ${trials}`);
  return models.map((model, i) => {
    const flat = flattenModel(model);
    try {
      const r = propagateMonteCarlo(flat.evaluate, flat.distributions, { trials, seed, streamKeys: [streamKeys[i]!], coverageProbability: 0.95 });
      return { mean: r.mean, standardUncertainty: r.standardUncertainty, lower95: r.symmetricInterval[0], upper95: r.symmetricInterval[1], problem: '' };
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      return { mean: Number.NaN, standardUncertainty: Number.NaN, lower95: Number.NaN, upper95: Number.NaN, problem: e.message };
    }
  });
}
