import type { DetectorConfig, SeriesConfig, TargetConfig } from '../config/series-schema.js';
import { nuclide, parseNuclideName } from '../physics/nuclides.js';
import type { UserStoppingTables } from '../physics/stopping/user-stopping-table.js';
import { resolveTarget } from '../model/resolve-target.js';
import { kinematicsForReaction } from './kinematics-for-reaction.js';
import { prepareTargetPeaks, type TargetPeakPlan } from './plan-target-peaks.js';
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
  // Prepared per (kind, target, detector): reactions, kinematics, layers; then memoized per beam energy.
  const prepared = new Map<string, { plan: (e: number) => TargetPeakPlan; byEnergy: Map<number, TargetPeakPlan> }>();
  const planFor = (key: string, specs: () => readonly PeakReactionSpec[], target: TargetConfig, detector: DetectorConfig, e: number): TargetPeakPlan => {
    let p = prepared.get(key);
    if (p === undefined) prepared.set(key, (p = { plan: prepareTargetPeaks(ctx, target, detector, specs()), byEnergy: new Map() }));
    let plan = p.byEnergy.get(e);
    if (plan === undefined) p.byEnergy.set(e, (plan = p.plan(e)));
    return plan;
  };
  return {
    kinematicsFor,
    samplePeaks: (target, detector, e) => planFor(`s\t${target.id}\t${detector.id}`, () => sampleSpecs, target, detector, e),
    elasticPeaks: (target, detector, e) =>
      planFor(`e\t${target.id}\t${detector.id}`, () => [...new Set(resolveTarget(target).map((r) => r.nuclide))].map((n) => ({ label: `${n} elastic`, target_nuclide: n, excitation_keV: 0, detect: 'ejectile' as const })), target, detector, e),
    referencePeaks: (target, element, detector, e) =>
      planFor(`r\t${target.id}\t${element}\t${detector.id}`, () => {
        // The element's isotopes as the target holds them (natural ones, and any named nuclide, e.g. an enriched 13C layer).
        const names = [...new Set(resolveTarget(target).map((r) => r.nuclide))].filter((n) => parseNuclideName(n)?.symbol === element);
        return names.map((n) => ({ label: referencePeakLabel(element, n), target_nuclide: n, excitation_keV: 0, detect: 'ejectile' as const }));
      }, target, detector, e),
  };
}
