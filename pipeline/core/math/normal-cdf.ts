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
