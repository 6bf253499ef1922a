// Normal distribution function: M. Abramowitz, I.A. Stegun, Handbook of Mathematical Functions (NBS, 1964), eqs. 26.2.1-26.2.2, 7.1.1.
import { erfc } from '../math/erfc.js';

/**
 * Gaussian peak of area A (counts), centroid c and standard deviation σ (channels):
 *   f(x) = A/(σ√(2π)) · exp(−(x − c)²/(2σ²)),   x in channels.
 * Its content in a bin [u₀, u₁] is A·[Φ(z₁) − Φ(z₀)], z = (u − c)/σ, Φ the normal distribution
 * function; for z₀ >= 0 it is computed as A·[Q(z₀) − Q(z₁)] with Q = 1 − Φ so far upper tails keep
 * their digits. With φ the standard normal density, the derivatives of Φ(z) at a bin edge are
 *   ∂Φ/∂c = −φ(z)/σ,   ∂Φ/∂σ = −z·φ(z)/σ,
 * and a bin's derivatives are the differences of these across its edges (times A).
 */
export interface GaussianEdge {
  /** (u − c)/σ, dimensionless. */
  z: number;
  /** φ(z). */
  density: number;
  /** Φ(z). */
  lower: number;
  /** Q(z) = 1 − Φ(z). */
  upper: number;
}

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

export function newGaussianEdge(): GaussianEdge {
  return { z: 0, density: 0, lower: 0, upper: 0 };
}

/** Fills `out` for a bin edge at u (channels) of a Gaussian with centroid c and width σ (channels). */
export function gaussianEdge(u: number, centroid: number, sigma: number, out: GaussianEdge): void {
  const z = (u - centroid) / sigma;
  out.z = z;
  out.density = INV_SQRT_2PI * Math.exp(-0.5 * z * z);
  if (z >= 0) {
    out.upper = 0.5 * erfc(z * Math.SQRT1_2);
    out.lower = 1 - out.upper;
  } else {
    out.lower = 0.5 * erfc(-z * Math.SQRT1_2);
    out.upper = 1 - out.lower;
  }
}

/** Φ(z₁) − Φ(z₀) between two edges, z₀ <= z₁, without cancellation in either tail. */
export function gaussianEdgeDifference(lo: GaussianEdge, hi: GaussianEdge): number {
  return lo.z >= 0 ? lo.upper - hi.upper : hi.lower - lo.lower;
}

/** Content of the bin [loChannel, hiChannel] (channel units) of a Gaussian of area `area` counts. */
export function gaussianBinContent(area: number, centroid: number, sigma: number, loChannel: number, hiChannel: number): number {
  const a = newGaussianEdge();
  const b = newGaussianEdge();
  gaussianEdge(loChannel, centroid, sigma, a);
  gaussianEdge(hiChannel, centroid, sigma, b);
  return area * gaussianEdgeDifference(a, b);
}

/** Density f(x) of a Gaussian of area `area` counts at x (channels): counts per channel. */
export function gaussianDensity(area: number, centroid: number, sigma: number, x: number): number {
  const z = (x - centroid) / sigma;
  return (area * INV_SQRT_2PI * Math.exp(-0.5 * z * z)) / sigma;
}
