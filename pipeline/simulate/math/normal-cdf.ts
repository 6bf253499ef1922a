import { erfc } from './erfc.js';

/**
 * Standard normal distribution function Φ(x) = ½ erfc(−x/√2) and its upper tail
 * Q(x) = 1 − Φ(x) = ½ erfc(x/√2), each computed directly so neither loses relative precision
 * in its own tail (common practice). x is in standard deviations.
 */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

export function normalUpperTail(x: number): number {
  return 0.5 * erfc(x / Math.SQRT2);
}

/** P(a < X <= b) for a standard normal X, a <= b, accurate in both tails. */
export function normalIntervalProbability(a: number, b: number): number {
  if (a >= 0) return normalUpperTail(a) - normalUpperTail(b);
  if (b <= 0) return normalCdf(b) - normalCdf(a);
  return 1 - normalCdf(a) - normalUpperTail(b);
}
