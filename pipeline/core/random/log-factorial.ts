// Stirling series for ln Γ: M. Abramowitz, I.A. Stegun, Handbook of Mathematical Functions (NBS, 1964), eq. 6.1.41.
/**
 * ln k! for integer k >= 0.
 *
 * k < 256: a table of running sums ln 1 + ln 2 + … + ln k (exact to rounding, ~1e-13 relative).
 * k >= 256: ln k! = k ln k − k + ½ ln(2πk) + 1/(12k) − 1/(360k³) + 1/(1260k⁵),
 * whose truncation error is below 1/(1680 k⁷) < 1e-19.
 */
const TABLE_SIZE = 256;
const TABLE = new Float64Array(TABLE_SIZE);
for (let k = 2; k < TABLE_SIZE; k++) TABLE[k] = TABLE[k - 1]! + Math.log(k);

const HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);

export function logFactorial(k: number): number {
  if (!(k >= 0) || !Number.isInteger(k)) throw new RangeError(`logFactorial needs an integer k >= 0, got ${k}`);
  if (k < TABLE_SIZE) return TABLE[k]!;
  const inv = 1 / k;
  const inv2 = inv * inv;
  return k * Math.log(k) - k + HALF_LOG_TWO_PI + 0.5 * Math.log(k) + inv * (1 / 12 - inv2 * (1 / 360 - inv2 / 1260));
}
