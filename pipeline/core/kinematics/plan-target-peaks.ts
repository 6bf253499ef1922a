import type { DetectorConfig, FoilConfig, PhysicsSettings, TargetConfig } from '../config/series-schema.js';
import { layerAtomsPerCm2, resolveTarget } from '../model/resolve-target.js';
import type { Nuclide } from '../physics/nuclides.js';
import { peakPath, type KinematicsAt, type PeakPathBranch } from './peak-path.js';
import { reactionOfPeak, type PeakReactionSpec, type Reaction } from './reaction-of-peak.js';
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

const slab = (l: FoilConfig): Slab => ({ composition: l.composition, atomsPerCm2: layerAtomsPerCm2(l) });

/**
 * Where every peak of `specs` whose nuclide the target holds appears in `detector` at a beam
 * energy: the forward model of peak-path.ts, per layer holding the nuclide. A nuclide in several
 * layers gives one window over all of them: centre and FWHM span every layer's signal, and the
 * reaction energy is the atom-weighted mean of the layers' mid-depth energies (spread: the
 * weighted spread of those means ⊕ the mean in-layer spread).
 */
export function planTargetPeaks(ctx: PeakPlanContext, target: TargetConfig, detector: DetectorConfig, specs: readonly PeakReactionSpec[], beamEnergyKeV: number): TargetPeakPlan {
  const resolved = resolveTarget(target);
  const layers = target.layers.map(slab);
  const foils = [...detector.absorber, ...(detector.dead_layer ? [detector.dead_layer] : [])].map(slab);
  const peaks: PlannedPeakGeometry[] = [];
  const problems = new Map<string, string>();
  for (const spec of specs) {
    const inLayers = resolved.filter((r) => r.nuclide === spec.target_nuclide);
    if (inLayers.length === 0) continue;
    const reaction = reactionOfPeak(ctx.projectile, spec);
    if (!reaction.ok) {
      problems.set(spec.label, reaction.reason);
      continue;
    }
    const kinematics = ctx.kinematicsFor(reaction.value);
    const perLayer: { atoms: number; relUnc: number; branches: PeakPathBranch[] }[] = [];
    let failure: string | null = null;
    for (const r of inLayers) {
      const path = peakPath({
        detected: reaction.value.detected,
        projectile: ctx.projectile,
        kinematics,
        layers,
        layerIndex: r.layer,
        tiltDeg: target.tilt_deg,
        exitMode: target.exit_angle_mode,
        targetEnergyLoss: ctx.physics.energy_loss === 'layers',
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
    if (failure !== null || perLayer.length === 0) {
      problems.set(spec.label, failure ?? 'no layer holds the nuclide');
      continue;
    }
    const branchNames = perLayer[0]!.branches.map((b) => b.branch);
    if (branchNames.length === 0) {
      problems.set(spec.label, `no kinematic solution at ${beamEnergyKeV} keV and ${detector.angle_deg}°`);
      continue;
    }
    for (const name of branchNames) {
      const parts = perLayer.map((l) => ({ atoms: l.atoms, relUnc: l.relUnc, b: l.branches.find((b) => b.branch === name) })).filter((p) => p.b !== undefined) as { atoms: number; relUnc: number; b: PeakPathBranch }[];
      const atoms = parts.reduce((s, p) => s + p.atoms, 0);
      const mean = (f: (b: PeakPathBranch) => number) => parts.reduce((s, p) => s + p.atoms * f(p.b), 0) / atoms;
      const eReaction = mean((b) => b.reactionEnergyKeV);
      const spreadVar = mean((b) => (b.reactionEnergyKeV - eReaction) ** 2 + b.reactionEnergySpreadKeV ** 2);
      const lo = Math.min(...parts.map((p) => p.b.detectedEnergyKeV));
      const hi = Math.max(...parts.map((p) => p.b.detectedEnergyKeV));
      const first = parts[0]!.b;
      peaks.push({
        key: name === 'single' ? spec.label : `${spec.label} [${name}]`,
        label: spec.label,
        reaction: reaction.value,
        branch: name,
        atomsPerCm2: atoms,
        relUnc: parts.reduce((s, p) => s + p.atoms * p.relUnc, 0) / atoms,
        reactionEnergyKeV: eReaction,
        reactionEnergySpreadKeV: Math.sqrt(spreadVar),
        emittedEnergyKeV: parts.length === 1 ? first.emittedEnergyKeV : mean((b) => b.emittedEnergyKeV),
        detectedEnergyKeV: (lo + hi) / 2,
        fwhmKeV: Math.hypot(Math.max(...parts.map((p) => p.b.fwhmKeV)), hi - lo),
        thetaCmDeg: parts.length === 1 ? first.thetaCmDeg : mean((b) => b.thetaCmDeg),
        jacobianLabPerCm: parts.length === 1 ? first.jacobianLabPerCm : mean((b) => b.jacobianLabPerCm),
      });
    }
  }
  return { peaks, problems };
}
