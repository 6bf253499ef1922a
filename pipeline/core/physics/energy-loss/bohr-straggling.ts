// Bohr energy-loss straggling: N. Bohr, "The penetration of atomic particles through matter", Mat. Fys. Medd. Dan. Vid. Selsk. 18, no. 8 (1948).
import { COULOMB_CONSTANT_KEV_FM } from '../codata2018.js';
import { compositionFractions } from '../stopping/composition-fractions.js';
import type { StoppingFailure } from '../stopping/stopping-result.js';

/** (e²/4πε₀) in keV cm. */
const E2_KEV_CM = COULOMB_CONSTANT_KEV_FM * 1e-13;

/**
 * Bohr straggling variance per unit areal density: dΩ²/dN = 4π z1² e⁴ Z2, with e² = e²/4πε₀ (CODATA 2018),
 * in keV² per 1e15 atoms/cm² (= 2.60563e-4 z1² Z2). Energy independent: the high-velocity limit, no
 * Chu or other low-energy correction (it overestimates straggling near and below the stopping maximum).
 * @param projectileZ z1, the projectile's charge number
 * @param meanZ2 mean atomic number per atom of the material (atom-fraction weighted: additivity of Ω²)
 */
export function bohrStragglingRateKeV2Per1e15(projectileZ: number, meanZ2: number): number {
  return 4 * Math.PI * projectileZ * projectileZ * E2_KEV_CM * E2_KEV_CM * meanZ2 * 1e15;
}

/** Mean atomic number per atom of a composition (atom ratios), or the failure for a bad key. */
export function meanAtomicNumber(composition: Readonly<Record<string, number>>): number | StoppingFailure {
  const fr = compositionFractions(composition);
  if (!fr.ok) return fr;
  return fr.parts.reduce((s, p) => s + p.atomFraction * p.z, 0);
}

/**
 * Bohr straggling Ω²_B = 4π z1² e⁴ Z2 N Δx of a layer, keV².
 * @param projectileZ z1, charge number of the projectile
 * @param composition atom ratios of the layer (element symbols or nuclides)
 * @param arealDensity1e15 N Δx, atoms along the path in 1e15 atoms/cm² (divide a layer's areal density by cos of the path angle)
 */
export function bohrStragglingKeV2(projectileZ: number, composition: Readonly<Record<string, number>>, arealDensity1e15: number): { ok: true; value: number } | StoppingFailure {
  const z2 = meanAtomicNumber(composition);
  if (typeof z2 !== 'number') return z2;
  return { ok: true, value: bohrStragglingRateKeV2Per1e15(projectileZ, z2) * arealDensity1e15 };
}
