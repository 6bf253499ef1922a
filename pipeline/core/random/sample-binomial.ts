// BTRS: W. Hörmann, "The generation of binomial random variates", J. Statist. Comput. Simul. 46, 101-110 (1993).
import { logFactorial } from './log-factorial.js';
import type { UniformSource } from './xoshiro128-star-star.js';

/**
 * One Binomial(n, p) variate: the number of successes in n trials of probability p.
 *
 * By symmetry p > ½ is drawn as n − Binomial(n, 1 − p). With p <= ½:
 * n·p < 10: inversion by sequential search, f(0) = (1 − p)^n, f(k) = f(k−1) · (n − k + 1)/k · p/(1 − p).
 * n·p >= 10: Hörmann's BTRS (transformed rejection with squeeze): with σ = √(n p q),
 *   b = 1.15 + 2.53 σ, a = −0.0873 + 0.0248 b + 0.01 p, c = n p + ½, α = (2.83 + 5.1/b) σ,
 *   v_r = 0.92 − 4.2/b, m = ⌊(n + 1) p⌋;
 *   U ~ U(−½, ½), V ~ U(0, 1), u_s = ½ − |U|, k = ⌊(2a/u_s + b) U + c⌋; reject k outside [0, n];
 *   accept at once if u_s >= 0.07 and V <= v_r; else accept if
 *   ln(V α / (a/u_s² + b)) <= ln f(k) − ln f(m) (exact log-probability ratio via ln k!).
 * @param n number of trials (non-negative integer)
 * @param p success probability in [0, 1]
 */
export function sampleBinomial(rng: UniformSource, n: number, p: number): number {
  if (!Number.isSafeInteger(n) || n < 0) throw new RangeError(`Binomial n must be a non-negative integer, got ${n}`);
  if (!(p >= 0 && p <= 1)) throw new RangeError(`Binomial p must be within [0, 1], got ${p}`);
  if (p > 0.5) return n - sampleBinomial(rng, n, 1 - p);
  if (n === 0 || p === 0) return 0;
  if (n * p < 10) return binomialInversion(rng, n, p);
  return binomialBtrs(rng, n, p);
}

function binomialInversion(rng: UniformSource, n: number, p: number): number {
  const q = 1 - p;
  const odds = p / q;
  let u = rng.nextFloat64();
  let k = 0;
  let f = Math.exp(n * Math.log1p(-p));
  while (u > f) {
    u -= f;
    k += 1;
    if (k > n) return n; // u was within rounding of 1
    f *= ((n - k + 1) / k) * odds;
  }
  return k;
}

function binomialBtrs(rng: UniformSource, n: number, p: number): number {
  const q = 1 - p;
  const spq = Math.sqrt(n * p * q);
  const b = 1.15 + 2.53 * spq;
  const a = -0.0873 + 0.0248 * b + 0.01 * p;
  const c = n * p + 0.5;
  const alpha = (2.83 + 5.1 / b) * spq;
  const vr = 0.92 - 4.2 / b;
  const logOdds = Math.log(p / q);
  const m = Math.floor((n + 1) * p);
  const h = logFactorial(m) + logFactorial(n - m);
  for (;;) {
    const u = rng.nextFloat64() - 0.5;
    let v = rng.nextFloat64();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + c);
    if (k < 0 || k > n) continue;
    if (us >= 0.07 && v <= vr) return k;
    v = Math.log((v * alpha) / (a / (us * us) + b));
    if (v <= h - logFactorial(k) - logFactorial(n - k) + (k - m) * logOdds) return k;
  }
}
