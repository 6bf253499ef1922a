// Runs test: A. Wald, J. Wolfowitz, "On a test whether two samples are from the same population", Ann. Math. Statist. 11, 147-162 (1940).
import { normalCdf } from '../math/normal-cdf.js';

/**
 * Wald–Wolfowitz runs test on the signs of residuals r_i = n_i − μ_i (zeros skipped). With n₊
 * positive and n₋ negative signs, N = n₊ + n₋, and R runs (maximal blocks of equal sign),
 *   E[R] = 1 + 2n₊n₋/N,   Var R = 2n₊n₋(2n₊n₋ − N) / (N²(N − 1)),
 * z = (R − E[R])/√Var R, and the one-sided p-value for too few runs (the sign of a model that
 * misses structure) is Φ(z) in the normal approximation.
 */
export interface RunsTestResult {
  runs: number;
  positive: number;
  negative: number;
  expectedRuns: number;
  z: number;
  /** P(R <= observed) in the normal approximation; NaN when fewer than 2 signs of each kind. */
  pTooFew: number;
}

export function runsTest(data: ArrayLike<number>, model: ArrayLike<number>, count = data.length): RunsTestResult {
  let runs = 0;
  let positive = 0;
  let negative = 0;
  let last = 0;
  for (let i = 0; i < count; i++) {
    const r = data[i]! - model[i]!;
    const sign = r > 0 ? 1 : r < 0 ? -1 : 0;
    if (sign === 0) continue;
    if (sign > 0) positive++;
    else negative++;
    if (sign !== last) runs++;
    last = sign;
  }
  const total = positive + negative;
  const pn = 2 * positive * negative;
  const expectedRuns = total > 0 ? 1 + pn / total : 0;
  if (positive < 2 || negative < 2) return { runs, positive, negative, expectedRuns, z: Number.NaN, pTooFew: Number.NaN };
  const variance = (pn * (pn - total)) / (total * total * (total - 1));
  const z = (runs - expectedRuns) / Math.sqrt(variance);
  return { runs, positive, negative, expectedRuns, z, pTooFew: normalCdf(z) };
}
