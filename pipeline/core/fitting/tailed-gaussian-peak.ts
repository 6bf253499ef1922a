// Gaussian convolved with a low-energy exponential: G. Bortels, P. Collaers, Appl. Radiat. Isot. 38, 831-837 (1987); the same tail term as the Hypermet function of G.W. Phillips, K.W. Marlow, Nucl. Instrum. Methods 137, 525-536 (1976).
import { erfc } from '../math/erfc.js';
import { erfcx } from './erfcx.js';

/**
 * Peak with a low-energy tail, area A (counts), centroid c, width σ, tail fraction η (0..1) and
 * tail length τ (channels):
 *   f(x) = A·[(1 − η)·G(x) + η·T(x)],
 *   G(x) = exp(−(x − c)²/(2σ²)) / (σ√(2π)),
 *   T(x) = (1/(2τ))·exp((x − c)/τ + σ²/(2τ²))·erfc[((x − c)/σ + σ/τ)/√2],
 * T being the unit-area convolution of G with (1/τ)e^{t/τ} for t < 0 (Bortels & Collaers use a
 * weighted sum of such terms with η = 1; Phillips & Marlow add one to a Gaussian). Both parts have
 * unit area, so the area of the component is A.
 *
 * Bin contents come from the distribution function of T, which with z = (u − c)/σ, k = σ/τ is
 *   F_T(u) = Φ(z) + E(z),   E(z) = exp(zk + k²/2)·½erfc((z + k)/√2)
 * (differentiate: dF_T/du = E/τ = T). A bin [u₀, u₁] holds A·[ΔΦ + η·ΔE]. E is computed as
 * ½e^{−z²/2}·erfcx(w), w = (z + k)/√2, when w > 0 (no overflow far above c). Edge derivatives:
 *   ∂E/∂c = −E/τ + φ/σ,
 *   ∂E/∂σ = σE/τ² − φ/τ + zφ/σ,
 *   ∂E/∂τ = −E·(zσ/τ² + σ²/τ³) + φσ/τ²,
 * with φ = φ(z) the standard normal density; ∂/∂η of a bin is A·ΔE.
 */
export interface TailEdge {
  e: number;
  dCentroid: number;
  dSigma: number;
  dLength: number;
}

export function newTailEdge(): TailEdge {
  return { e: 0, dCentroid: 0, dSigma: 0, dLength: 0 };
}

/**
 * Fills `out` for a bin edge with z = (u − c)/σ and φ(z) = `density` (from gaussianEdge),
 * width σ and tail length τ (channels).
 */
export function tailEdge(z: number, density: number, sigma: number, tau: number, out: TailEdge): void {
  const k = sigma / tau;
  const w = (z + k) * Math.SQRT1_2;
  const e = w > 0 ? 0.5 * Math.exp(-0.5 * z * z) * erfcx(w) : 0.5 * Math.exp(z * k + 0.5 * k * k) * erfc(w);
  const tau2 = tau * tau;
  out.e = e;
  out.dCentroid = -e / tau + density / sigma;
  out.dSigma = (sigma * e) / tau2 - density / tau + (z * density) / sigma;
  out.dLength = -e * ((z * sigma) / tau2 + (sigma * sigma) / (tau2 * tau)) + (density * sigma) / tau2;
}

/** Density T(x) of the unit-area tail term at x (channels), per channel. */
export function exponentialTailDensity(centroid: number, sigma: number, tau: number, x: number): number {
  const z = (x - centroid) / sigma;
  const k = sigma / tau;
  const w = (z + k) * Math.SQRT1_2;
  const e = w > 0 ? 0.5 * Math.exp(-0.5 * z * z) * erfcx(w) : 0.5 * Math.exp(z * k + 0.5 * k * k) * erfc(w);
  return e / tau;
}
