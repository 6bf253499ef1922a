// Box-Muller transform: G.E.P. Box, M.E. Muller, "A note on the generation of random normal deviates", Ann. Math. Statist. 29, 610-611 (1958); recommended in JCGM 101:2008 §C.4.
import type { UniformSource } from '../random/xoshiro128-star-star.js';

/**
 * Standard normal deviates from a uniform source, two per pair of uniforms:
 *   z₁ = √(−2 ln U₁) cos(2π U₂),  z₂ = √(−2 ln U₁) sin(2π U₂),  U₁ ∈ (0, 1], U₂ ∈ [0, 1).
 * The second deviate of a pair is kept for the next call (dimensionless, mean 0, sd 1).
 */
export class NormalSampler {
  private spare = 0;
  private hasSpare = false;

  constructor(private readonly rng: UniformSource) {}

  next(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    const u1 = 1 - this.rng.nextFloat64();
    const u2 = this.rng.nextFloat64();
    const radius = Math.sqrt(-2 * Math.log(u1));
    const angle = 2 * Math.PI * u2;
    this.spare = radius * Math.sin(angle);
    this.hasSpare = true;
    return radius * Math.cos(angle);
  }
}
