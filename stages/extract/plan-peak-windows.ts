import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { PeakRequest } from '../../pipeline/core/counting/peak-window.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';

export interface PlannedPeak {
  request: PeakRequest;
  /** The configured peak label (the request key adds a branch suffix where there are two). */
  peakLabel: string;
  /** Why the peak cannot be looked for in this run and detector (kinematically forbidden, …). */
  problem?: string;
}

/**
 * For a sample run: every configured peak whose target nuclide is in the run's target, in every
 * detector, where the series peak planner puts it (kinematics, and energy loss when enabled), with
 * its predicted width (resolution ⊕ straggling ⊕ kinematic broadening ⊕ layer).
 */
export function planPeakWindows(config: SeriesConfig, planner: SeriesPeakPlanner, run: RunRecord): PlannedPeak[] {
  const target = config.targets.find((t) => t.id === run.target)!;
  const out: PlannedPeak[] = [];
  for (const det of config.detectors) {
    const plan = planner.samplePeaks(target, det, run.beamEnergyKeV);
    for (const p of plan.peaks) out.push({ request: { key: p.key, detector: det.id, expectedEnergyKeV: p.detectedEnergyKeV, fwhmKeV: p.fwhmKeV }, peakLabel: p.label });
    for (const [label, problem] of plan.problems) {
      out.push({ request: { key: label, detector: det.id, expectedEnergyKeV: Number.NaN, fwhmKeV: det.resolution_fwhm_keV }, peakLabel: label, problem });
    }
  }
  return out;
}
