import type { DetectorConfig, SeriesConfig, TargetConfig } from '../config/series-schema.js';
import { naturalIsotopes, nuclide, parseNuclideName } from '../physics/nuclides.js';
import type { UserStoppingTables } from '../physics/stopping/user-stopping-table.js';
import { resolveTarget } from '../model/resolve-target.js';
import { kinematicsForReaction } from './kinematics-for-reaction.js';
import { planTargetPeaks, type TargetPeakPlan } from './plan-target-peaks.js';
import type { KinematicsAt } from './peak-path.js';
import type { PeakReactionSpec, Reaction } from './reaction-of-peak.js';
import { stoppingSlowingModel } from './stopping-slowing-model.js';

/**
 * Where the peaks of a series lie, computed once per (target, detector, beam energy) and shared by
 * measuring, normalizing and extracting, so the three cannot disagree: the configured peaks of a
 * sample target, and the elastic peaks of the reference element's isotopes.
 */
export interface SeriesPeakPlanner {
  samplePeaks(target: TargetConfig, detector: DetectorConfig, beamEnergyKeV: number): TargetPeakPlan;
  referencePeaks(target: TargetConfig, element: string, detector: DetectorConfig, beamEnergyKeV: number): TargetPeakPlan;
  /** The elastic peak of every nuclide of the target (labels `<nuclide> elastic`), for interference checks. */
  elasticPeaks(target: TargetConfig, detector: DetectorConfig, beamEnergyKeV: number): TargetPeakPlan;
  kinematicsFor(reaction: Reaction): KinematicsAt;
}

/** Key of the reference element's isotope peaks: `reference Au` for one isotope, `reference Cu (63Cu)` per isotope. */
export const referencePeakLabel = (element: string, isotope: string) => `reference ${element} (${isotope})`;

export function seriesPeakPlanner(config: SeriesConfig, userTables?: UserStoppingTables): SeriesPeakPlanner {
  const projectile = nuclide(config.beam.projectile);
  const needsSlowing = config.physics.energy_loss === 'layers' || config.detectors.some((d) => d.absorber.length > 0 || d.dead_layer !== undefined);
  const kinematicsCache = new Map<Reaction, KinematicsAt>();
  const kinematicsFor = (r: Reaction) => {
    let k = kinematicsCache.get(r);
    if (k === undefined) kinematicsCache.set(r, (k = kinematicsForReaction(r)));
    return k;
  };
  const ctx = { projectile, physics: config.physics, slowing: needsSlowing ? stoppingSlowingModel(userTables) : null, kinematicsFor };
  const sampleSpecs: PeakReactionSpec[] = config.peaks;
  const memo = new Map<string, TargetPeakPlan>();
  const cached = (key: string, make: () => TargetPeakPlan) => {
    let plan = memo.get(key);
    if (plan === undefined) memo.set(key, (plan = make()));
    return plan;
  };
  const referenceSpecs = new Map<string, PeakReactionSpec[]>();
  const elasticSpecs = new Map<string, PeakReactionSpec[]>();
  return {
    kinematicsFor,
    samplePeaks: (target, detector, e) => cached(`s\t${target.id}\t${detector.id}\t${e}`, () => planTargetPeaks(ctx, target, detector, sampleSpecs, e)),
    elasticPeaks: (target, detector, e) =>
      cached(`e\t${target.id}\t${detector.id}\t${e}`, () => {
        let specs = elasticSpecs.get(target.id);
        if (specs === undefined) {
          const names = [...new Set(resolveTarget(target).map((r) => r.nuclide))];
          elasticSpecs.set(target.id, (specs = names.map((n) => ({ label: `${n} elastic`, target_nuclide: n, excitation_keV: 0, detect: 'ejectile' as const }))));
        }
        return planTargetPeaks(ctx, target, detector, specs, e);
      }),
    referencePeaks: (target, element, detector, e) =>
      cached(`r\t${target.id}\t${element}\t${detector.id}\t${e}`, () => {
        let specs = referenceSpecs.get(element);
        if (specs === undefined) {
          specs = naturalIsotopes(element).map((i) => ({ label: referencePeakLabel(element, i.nuclide.name), target_nuclide: i.nuclide.name, excitation_keV: 0, detect: 'ejectile' as const }));
          // An isotope named in the composition (e.g. an enriched 13C layer) is planned too.
          for (const l of target.layers) for (const k of Object.keys(l.composition)) {
            if (parseNuclideName(k)?.symbol === element && !specs.some((s) => s.target_nuclide === k)) specs.push({ label: referencePeakLabel(element, k), target_nuclide: k, excitation_keV: 0, detect: 'ejectile' });
          }
          referenceSpecs.set(element, specs);
        }
        return planTargetPeaks(ctx, target, detector, specs, e);
      }),
  };
}
