import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { PeakRequest } from '../../pipeline/core/counting/peak-window.js';
import { peakKinematics } from '../../pipeline/core/kinematics/peak-kinematics.js';
import type { ResolvedNuclide, RunRecord } from '../../pipeline/core/model/series-model.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';

export interface PlannedPeak {
  request: PeakRequest | null;
  peakLabel: string;
  /** Why the peak cannot be looked for in this run and detector (kinematically forbidden, …). */
  problem?: string;
}

/**
 * For a sample run: every configured peak whose target nuclide is in the run's target, in
 * every detector, at the energy two-body kinematics puts it (thin target: no energy loss).
 */
export function planPeakWindows(config: SeriesConfig, projectile: Nuclide, run: RunRecord, resolved: readonly ResolvedNuclide[]): PlannedPeak[] {
  const present = new Set(resolved.map((r) => r.nuclide));
  const out: PlannedPeak[] = [];
  for (const peak of config.peaks) {
    if (!present.has(peak.target_nuclide)) continue;
    for (const det of config.detectors) {
      const k = peakKinematics(projectile, peak.target_nuclide, peak.excitation_keV, peak.q_value_keV, run.beamEnergyKeV, det.angle_deg);
      if (!k.ok) {
        out.push({ request: { key: peak.label, detector: det.id, expectedEnergyKeV: Number.NaN, fwhmKeV: det.resolution_fwhm_keV }, peakLabel: peak.label, problem: k.reason });
        continue;
      }
      out.push({ request: { key: peak.label, detector: det.id, expectedEnergyKeV: k.value.energyKeV, fwhmKeV: det.resolution_fwhm_keV }, peakLabel: peak.label });
    }
  }
  return out;
}
