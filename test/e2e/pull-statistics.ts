/**
 * Mean and sample standard deviation (n − 1) of pulls (value − truth)/u. For a correct value
 * with a correct standard uncertainty the pulls scatter as a unit normal: mean ≈ 0, sd ≈ 1
 * (common practice for checking an estimator against a simulation's truth).
 */
export function pullStatistics(pulls: readonly number[]): { n: number; mean: number; sd: number } {
  const n = pulls.length;
  const mean = pulls.reduce((s, x) => s + x, 0) / n;
  const sd = Math.sqrt(pulls.reduce((s, x) => s + (x - mean) ** 2, 0) / (n - 1));
  return { n, mean, sd };
}
