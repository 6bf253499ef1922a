import type { DetectorConfig, SeriesConfig, TargetConfig } from '../../pipeline/core/config/series-schema.js';
import type { TargetPeakPlan } from '../../pipeline/core/kinematics/plan-target-peaks.js';
import { rutherfordForPeak } from '../../pipeline/core/kinematics/rutherford-for-peak.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import { resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import { layerThickness } from '../../pipeline/core/normalization/shared-inputs.js';
import type { NormalizingNuclide } from './reference-solid-angle-model.js';

export type PlannedNuclides = { ok: true; nuclides: NormalizingNuclide[] } | { ok: false; reason: string };

/**
 * The normalizing element's isotopes as the series peak planner placed them (plan from
 * planner.referencePeaks): for each planned isotope its atoms/cm² per layer with the layer's
 * thickness input, and its screened lab Rutherford cross section at the planned reaction energy
 * (the beam energy for a thin target, mid-depth of its layers with energy loss) — the same
 * σ_R(E_i, θ) that referencePoint uses, so a model built from these gives the same ΔΩ.
 * Layers of `target` count as reference layers (reference_areal_density) when `referenceTarget`
 * is set or they carry role: reference.
 */
export function plannedNormalizingNuclides(config: SeriesConfig, planner: SeriesPeakPlanner, target: TargetConfig, plan: TargetPeakPlan, det: DetectorConfig, referenceTarget: boolean): PlannedNuclides {
  if (plan.problems.size > 0) return { ok: false, reason: [...plan.problems.values()][0]! };
  if (plan.peaks.length === 0) return { ok: false, reason: `the normalizing element has no elastic peak in detector ${det.id}` };
  const resolved = resolveTarget(target);
  const nuclides: NormalizingNuclide[] = [];
  for (const p of plan.peaks) {
    const rr = rutherfordForPeak(p.reaction, planner.kinematicsFor(p.reaction), p.branch, p.reactionEnergyKeV, det.angle_deg, config.normalization.screening);
    if (!rr.ok) return { ok: false, reason: rr.flag };
    const layers = resolved
      .filter((r) => r.nuclide === p.reaction.target.name)
      .map((r) => ({ atomsPerCm2: r.atomsPerCm2, thickness: layerThickness(target.id, r.layer, r.relUnc, referenceTarget || target.layers[r.layer]!.role === 'reference') }));
    nuclides.push({ layers, rutherford: rr.value });
  }
  return { ok: true, nuclides };
}
