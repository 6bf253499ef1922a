// Continued fraction for erfc: M. Abramowitz, I.A. Stegun, Handbook of Mathematical Functions (NBS, 1964), eq. 7.1.14.
import { erfc } from '../math/erfc.js';

/**
 * Scaled complementary error function erfcx(x) = e^{x²} erfc(x), finite for all x >= −26
 * (dimensionless argument). For x >= 2 the continued fraction of A&S 7.1.14 without its
 * e^{−x²} prefactor:
 *   erfcx(x) = (1/√π) · 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + …))))),
 * evaluated bottom-up from depth ⌈10 + 190/x²⌉ as pipeline/core/math/erfc.ts does; below 2,
 * e^{x²}·erfc(x) directly (e^{x²} <= e⁴ there, no loss). Used where e^{g}·erfc(w) would
 * overflow in the exponentially tailed peak shape.
 */
const ONE_OVER_SQRT_PI = 1 / Math.sqrt(Math.PI);

export function erfcx(x: number): number {
  if (x < 2) return Math.exp(x * x) * erfc(x);
  let f = x;
  for (let k = Math.ceil(10 + 190 / (x * x)); k >= 1; k--) f = x + k / 2 / f;
  return ONE_OVER_SQRT_PI / f;
}
