// Smooth step under a peak, as in the Hypermet function: G.W. Phillips, K.W. Marlow, Nucl. Instrum. Methods 137, 525-536 (1976).
/**
 * Background step of height H (counts per channel on the low side) under a peak of centroid c and
 * width σ (channels):
 *   s(x) = H·½erfc((x − c)/(σ√2)) = H·Q(z),   z = (x − c)/σ.
 * Its content in a bin [u₀, u₁] is H·σ·[S(z₁) − S(z₀)] with the antiderivative S(z) = z·Q(z) − φ(z)
 * (dS/dz = Q). Bin derivatives: ∂/∂H = σ·ΔS, ∂/∂c = −H·ΔQ, ∂/∂σ = −H·Δφ.
 * z, φ(z) and Q(z) at an edge come from gaussianEdge (gaussian-peak.ts).
 */
export function stepAntiderivative(z: number, density: number, upper: number): number {
  return z * upper - density;
}
