import type { DetectorConfig } from '../../pipeline/core/config/series-schema.js';
import { elasticKinematicFactor } from '../../pipeline/core/physics/elastic-kinematic-factor.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';
import type { PeakRequest } from '../../pipeline/core/counting/peak-window.js';
import type { ReferenceComposition } from './reference-nuclides.js';

/**
 * Where the reference element's elastic peak lies: the abundance-weighted mean of K·E over
 * its isotopes; their spread widens the window (added in quadrature to the detector FWHM).
 */
export function planReferenceWindow(projectile: Nuclide, ref: ReferenceComposition, detector: DetectorConfig, beamEnergyKeV: number): PeakRequest {
  let mean = 0;
  let lo = Infinity;
  let hi = -Infinity;
  for (const n of ref.nuclides) {
    const e = elasticKinematicFactor(projectile.massU, n.nuclide.massU, detector.angle_deg) * beamEnergyKeV;
    mean += (e * n.atomsPerCm2) / ref.atomsPerCm2;
    lo = Math.min(lo, e);
    hi = Math.max(hi, e);
  }
  const spread = hi - lo;
  return { key: `reference ${ref.element}`, detector: detector.id, expectedEnergyKeV: mean, fwhmKeV: Math.hypot(detector.resolution_fwhm_keV, spread) };
}
