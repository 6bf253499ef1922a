import type { DetectorConfig, SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { NetCounts } from '../../pipeline/core/counting/net-counts.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';
import { normalizingNuclides } from './normalizing-nuclides.js';
import type { ReferenceMeasurement } from './reference-solid-angle-model.js';

/**
 * What a reference run × detector contributes to the yield equation: the normalizing element
 * of the reference target (every isotope, per layer) with its screened Rutherford cross section
 * at `energyKeV` (default: the run's beam energy, thin film), the net counts and the live
 * fraction. null when the peak was not measured, its net counts are not positive, or the
 * Rutherford form does not hold (referencePoint flags those cases).
 */
export function referenceMeasurement(config: SeriesConfig, projectile: Nuclide, element: string, run: RunRecord, det: DetectorConfig, net: NetCounts | null, live: LiveFraction, energyKeV = run.beamEnergyKeV): ReferenceMeasurement | null {
  if (net === null || !(net.net > 0)) return null;
  const target = config.targets.find((t) => t.id === config.normalization.reference_target);
  if (target === undefined) return null;
  const nuclides = normalizingNuclides(projectile, target, element, energyKeV, det.angle_deg, config.normalization.screening, { referenceTarget: target.id });
  if (nuclides === null) return null;
  return {
    run: run.run,
    detector: det.id,
    startedAtMs: run.startedAtMs,
    chargeUC: run.chargeUC,
    chargeState: config.beam.charge_state,
    netCounts: net.net,
    netCountsUnc: Math.sqrt(net.netVariance),
    live,
    beamEnergyUncKeV: run.beamEnergyUncKeV,
    angleUncDeg: det.angle_unc_deg,
    nuclides,
  };
}
