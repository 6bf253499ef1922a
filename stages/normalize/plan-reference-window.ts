import type { DetectorConfig, TargetConfig } from '../../pipeline/core/config/series-schema.js';
import type { PeakRequest } from '../../pipeline/core/counting/peak-window.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { ReferenceComposition } from './reference-nuclides.js';

export interface ReferenceWindowPlan {
  request: PeakRequest;
  /** Why the reference peak cannot be placed (e.g. the beam stops before the reference layer). */
  problem?: string;
}

/** Measured-peak key of the normalizing peak. */
export const referenceKey = (element: string) => `reference ${element}`;

/**
 * Where the reference element's elastic peak lies: the atom-weighted mean of its isotopes'
 * detected energies (series-peak-planner: kinematics, and energy loss when enabled); the spread
 * of the isotopes widens the window (added in quadrature to the widest predicted FWHM).
 */
export function planReferenceWindow(planner: SeriesPeakPlanner, target: TargetConfig, ref: ReferenceComposition, detector: DetectorConfig, beamEnergyKeV: number): ReferenceWindowPlan {
  const plan = planner.referencePeaks(target, ref.element, detector, beamEnergyKeV);
  const key = referenceKey(ref.element);
  if (plan.problems.size > 0 || plan.peaks.length === 0) {
    const problem = [...plan.problems.values()][0] ?? `no elastic peak of ${ref.element} reaches detector ${detector.id}`;
    return { request: { key, detector: detector.id, expectedEnergyKeV: Number.NaN, fwhmKeV: detector.resolution_fwhm_keV }, problem };
  }
  let atoms = 0;
  let mean = 0;
  let lo = Infinity;
  let hi = -Infinity;
  let widest = 0;
  for (const p of plan.peaks) {
    atoms += p.atomsPerCm2;
    mean += p.atomsPerCm2 * p.detectedEnergyKeV;
    lo = Math.min(lo, p.detectedEnergyKeV);
    hi = Math.max(hi, p.detectedEnergyKeV);
    widest = Math.max(widest, p.fwhmKeV);
  }
  return { request: { key, detector: detector.id, expectedEnergyKeV: mean / atoms, fwhmKeV: Math.hypot(widest, hi - lo) } };
}
