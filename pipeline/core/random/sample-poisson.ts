// PTRS: W. Hörmann, "The transformed rejection method for generating Poisson random variables", Insurance: Mathematics and Economics 12, 39-45 (1993).
import { logFactorial } from './log-factorial.js';
import type { UniformSource } from './xoshiro128-star-star.js';

/**
 * One Poisson(mean) variate (mean >= 0, counts).
 *
 * mean < 10: sequential-search inversion: the smallest k with U <= Σ_{j<=k} e^{−μ} μ^j / j!.
 * mean >= 10: Hörmann's PTRS (transformed rejection with squeeze): with s = √μ,
 *   b = 0.931 + 2.53 s, a = −0.059 + 0.02483 b, 1/α = 1.1239 + 1.1328/(b − 3.4), v_r = 0.9277 − 3.6224/(b − 2);
 *   U ~ U(−½, ½), V ~ U(0, 1), u_s = ½ − |U|, k = ⌊(2a/u_s + b) U + μ + 0.43⌋;
 *   accept at once if u_s >= 0.07 and V <= v_r; reject if k < 0 or (u_s < 0.013 and V > u_s);
 *   else accept if ln(V · (1/α) / (a/u_s² + b)) <= −μ + k ln μ − ln k!.
 */
export function samplePoisson(rng: UniformSource, mean: number): number {
  if (!(mean >= 0) || !Number.isFinite(mean)) throw new RangeError(`Poisson mean must be finite and >= 0, got ${mean}`);
  if (mean === 0) return 0;
  if (mean < 10) return poissonInversion(rng, mean);
  return poissonPtrs(rng, mean);
}

function poissonInversion(rng: UniformSource, mean: number): number {
  const u = rng.nextFloat64();
  let k = 0;
  let p = Math.exp(-mean);
  let cumulative = p;
  while (u > cumulative) {
    k += 1;
    p *= mean / k;
    if (p === 0) break; // cumulative has reached 1 to rounding: u lies in the far tail
    cumulative += p;
  }
  return k;
}

function poissonPtrs(rng: UniformSource, mean: number): number {
  const s = Math.sqrt(mean);
  const logMean = Math.log(mean);
  const b = 0.931 + 2.53 * s;
  const a = -0.059 + 0.02483 * b;
  const invAlpha = 1.1239 + 1.1328 / (b - 3.4);
  const vr = 0.9277 - 3.6224 / (b - 2);
  for (;;) {
    const u = rng.nextFloat64() - 0.5;
    const v = rng.nextFloat64();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + mean + 0.43);
    if (us >= 0.07 && v <= vr) return k;
    if (k < 0 || (us < 0.013 && v > us)) continue;
    if (Math.log(v) + Math.log(invAlpha) - Math.log(a / (us * us) + b) <= -mean + k * logMean - logFactorial(k)) return k;
  }
}
