import type { DetectorConfig, FoilConfig, PhysicsSettings, TargetConfig } from '../config/series-schema.js';
import { layerAtomsPerCm2, resolveTarget } from '../model/resolve-target.js';
import type { Nuclide } from '../physics/nuclides.js';
import { peakPath, type KinematicsAt, type PeakPathBranch } from './peak-path.js';
import { reactionOfPeak, type PeakReactionSpec, type Reaction, type ReactionResult } from './reaction-of-peak.js';
import type { Slab, SlowingModel } from './slowing-model.js';

/** A peak as expected in one detector for one target and beam energy (one per kinematic branch). */
export interface PlannedPeakGeometry {
  /** The peak label, with ` [high]` / ` [low]` added where the lab energy is double-valued. */
  key: string;
  label: string;
  reaction: Reaction;
  branch: PeakPathBranch['branch'];
  /** Atoms/cm² of the target nuclide over the layers that hold it, and their relative uncertainty. */
  atomsPerCm2: number;
  relUnc: number;
  /** Atom-weighted over those layers (see planTargetPeaks). */
  reactionEnergyKeV: number;
  reactionEnergySpreadKeV: number;
  emittedEnergyKeV: number;
  detectedEnergyKeV: number;
  fwhmKeV: number;
  thetaCmDeg: number;
  jacobianLabPerCm: number;
}

export interface PeakPlanContext {
  projectile: Nuclide;
  physics: Pick<PhysicsSettings, 'energy_loss'>;
  slowing: SlowingModel | null;
  kinematicsFor: (reaction: Reaction) => KinematicsAt;
}

export interface TargetPeakPlan {
  peaks: PlannedPeakGeometry[];
  /** Peaks that cannot be seen in this detector: label → reason (kinematically forbidden, particle stopped, …). */
  problems: Map<string, string>;
}

const slab = (l: FoilConfig): Slab => ({ composition: l.composition, atomsPerCm2: layerAtomsPerCm2(l), material: l.stopping_material });

interface PreparedSpec {
  label: string;
  reaction: ReactionResult;
  kinematics: KinematicsAt | null;
  layers: { layer: number; atomsPerCm2: number; relUnc: number }[];
}

/**
 * Where every peak of `specs` whose nuclide the target holds appears in `detector`, as a function
 * of the beam energy: the forward model of peak-path.ts, per layer holding the nuclide. What does
 * not depend on the energy (the reactions, their kinematics, the layers and foils) is prepared
 * once. A nuclide in several layers gives one window over all of them: centre and FWHM span every
 * layer's signal, and the reaction energy is the atom-weighted mean of the layers' mid-depth
 * energies (spread: the weighted spread of those means ⊕ the mean in-layer spread).
 */
export function prepareTargetPeaks(ctx: PeakPlanContext, target: TargetConfig, detector: DetectorConfig, specs: readonly PeakReactionSpec[]): (beamEnergyKeV: number) => TargetPeakPlan {
  const resolved = resolveTarget(target);
  const layers = target.layers.map(slab);
  const foils = [...detector.absorber, ...(detector.dead_layer ? [detector.dead_layer] : [])].map(slab);
  const prepared: PreparedSpec[] = [];
  for (const spec of specs) {
    const inLayers = resolved.filter((r) => r.nuclide === spec.target_nuclide).map((r) => ({ layer: r.layer, atomsPerCm2: r.atomsPerCm2, relUnc: r.relUnc }));
    if (inLayers.length === 0) continue;
    const reaction = reactionOfPeak(ctx.projectile, spec);
    prepared.push({ label: spec.label, reaction, kinematics: reaction.ok ? ctx.kinematicsFor(reaction.value) : null, layers: inLayers });
  }
  const energyLoss = ctx.physics.energy_loss === 'layers';
  return (beamEnergyKeV) => {
    const peaks: PlannedPeakGeometry[] = [];
    const problems = new Map<string, string>();
    for (const spec of prepared) {
      if (!spec.reaction.ok) {
        problems.set(spec.label, spec.reaction.reason);
        continue;
      }
      const reaction = spec.reaction.value;
      const perLayer: { atoms: number; relUnc: number; branches: PeakPathBranch[] }[] = [];
      let failure: string | null = null;
      for (const r of spec.layers) {
        const path = peakPath({
          detected: reaction.detected,
          projectile: ctx.projectile,
          kinematics: spec.kinematics!,
          layers,
          layerIndex: r.layer,
          tiltDeg: target.tilt_deg,
          exitMode: target.exit_angle_mode,
          targetEnergyLoss: energyLoss,
          thetaLabDeg: detector.angle_deg,
          halfApertureDeg: detector.half_aperture_deg,
          resolutionFwhmKeV: detector.resolution_fwhm_keV,
          foils,
          beamEnergyKeV,
          slowing: ctx.slowing,
        });
        if (!path.ok) {
          failure = path.reason;
          break;
        }
        perLayer.push({ atoms: r.atomsPerCm2, relUnc: r.relUnc, branches: path.branches });
      }
      if (failure !== null) {
        problems.set(spec.label, failure);
        continue;
      }
      const branchNames = perLayer[0]!.branches.map((b) => b.branch);
      if (branchNames.length === 0) {
        problems.set(spec.label, `no kinematic solution at ${beamEnergyKeV} keV and ${detector.angle_deg}°`);
        continue;
      }
      for (const name of branchNames) peaks.push(combineLayers(spec.label, reaction, name, perLayer));
    }
    return { peaks, problems };
  };
}

function combineLayers(label: string, reaction: Reaction, name: PeakPathBranch['branch'], perLayer: { atoms: number; relUnc: number; branches: PeakPathBranch[] }[]): PlannedPeakGeometry {
  const key = name === 'single' ? label : `${label} [${name}]`;
  if (perLayer.length === 1) {
    const l = perLayer[0]!;
    const b = l.branches.find((x) => x.branch === name)!;
    return {
      key, label, reaction, branch: name, atomsPerCm2: l.atoms, relUnc: l.relUnc, reactionEnergyKeV: b.reactionEnergyKeV, reactionEnergySpreadKeV: b.reactionEnergySpreadKeV,
      emittedEnergyKeV: b.emittedEnergyKeV, detectedEnergyKeV: b.detectedEnergyKeV, fwhmKeV: b.fwhmKeV, thetaCmDeg: b.thetaCmDeg, jacobianLabPerCm: b.jacobianLabPerCm,
    };
  }
  const parts = perLayer.map((l) => ({ atoms: l.atoms, relUnc: l.relUnc, b: l.branches.find((b) => b.branch === name) })).filter((p) => p.b !== undefined) as { atoms: number; relUnc: number; b: PeakPathBranch }[];
  const atoms = parts.reduce((s, p) => s + p.atoms, 0);
  const mean = (f: (b: PeakPathBranch) => number) => parts.reduce((s, p) => s + p.atoms * f(p.b), 0) / atoms;
  const eReaction = mean((b) => b.reactionEnergyKeV);
  const spreadVar = mean((b) => (b.reactionEnergyKeV - eReaction) ** 2 + b.reactionEnergySpreadKeV ** 2);
  const lo = Math.min(...parts.map((p) => p.b.detectedEnergyKeV));
  const hi = Math.max(...parts.map((p) => p.b.detectedEnergyKeV));
  return {
    key, label, reaction, branch: name,
    atomsPerCm2: atoms,
    relUnc: parts.reduce((s, p) => s + p.atoms * p.relUnc, 0) / atoms,
    reactionEnergyKeV: eReaction,
    reactionEnergySpreadKeV: Math.sqrt(spreadVar),
    emittedEnergyKeV: mean((b) => b.emittedEnergyKeV),
    detectedEnergyKeV: (lo + hi) / 2,
    fwhmKeV: Math.hypot(Math.max(...parts.map((p) => p.b.fwhmKeV)), hi - lo),
    thetaCmDeg: mean((b) => b.thetaCmDeg),
    jacobianLabPerCm: mean((b) => b.jacobianLabPerCm),
  };
}
