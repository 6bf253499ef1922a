import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { addBackgroundOverChannels } from './add-background-over-channels.js';
import { nuclide, type Nuclide } from '../core/physics/index.js';
import type { SimulatedPeakSpec, SimulationSpec } from './simulation-spec.js';
import { targetNuclides, type TargetNuclide } from './target-nuclides.js';
import type { PeakTruth } from './truth-model.js';
import type { KinematicsAt } from '../core/kinematics/peak-path.js';
import { kinematicsForReaction } from '../core/kinematics/kinematics-for-reaction.js';
import { reactionOfPeak, type PeakReactionSpec, type Reaction } from '../core/kinematics/reaction-of-peak.js';
import type { SlowingModel } from '../core/kinematics/slowing-model.js';
import { stoppingSlowingModel } from '../core/kinematics/stopping-slowing-model.js';
import { resolveTarget } from '../core/model/resolve-target.js';

/** One physical peak of a nuclide: elastic or one reaction/final state, with the declared peaks that name it. */
export interface PeakSource {
  reaction: Reaction;
  kinematics: KinematicsAt;
  excitationKeV: number;
  truth: PeakTruth | undefined;
  declared: SimulatedPeakSpec[];
}

/** A nuclide in one layer of a target. */
export interface LayerNuclide {
  layerIndex: number;
  nuclide: Nuclide;
  atomsPerCm2: number;
}

/** What every run of a series shares, resolved once. */
export interface SimulationContext {
  spec: SimulationSpec;
  projectile: Nuclide;
  targets: Map<string, TargetNuclide[]>;
  /** Target id → its nuclides layer by layer (beam side first). */
  layerNuclides: Map<string, LayerNuclide[]>;
  /** Stopping and straggling (NIST tables), when energy loss or foils need them. */
  slowing: SlowingModel | null;
  /** Nuclide name → its peaks: always the elastic one, plus every declared inelastic state. */
  peakSources: (nuclideName: string) => PeakSource[];
  /** Expected background counts per µC of true charge, per channel, for (calibration version index, detector index); cached. */
  backgroundPerUC: (calibration: number, detector: number) => Float64Array;
  diagnostics: Diagnostic[];
  /** Keys of warnings already given (each case is reported once, not once per run). */
  warned: Set<string>;
}

export function simulationContext(spec: SimulationSpec): SimulationContext {
  const targets = new Map(spec.targets.map((t) => [t.id, targetNuclides(t)] as const));
  const projectile = nuclide(spec.beam.projectile);
  const byNuclide = new Map<string, PeakSource[]>();
  const sourceOf = (p: PeakReactionSpec): PeakSource | null => {
    const r = reactionOfPeak(projectile, p);
    return r.ok ? { reaction: r.value, kinematics: kinematicsForReaction(r.value), excitationKeV: p.excitation_keV, truth: undefined, declared: [] } : null;
  };
  const sameReaction = (a: Reaction, b: Reaction) => a.detected.name === b.detected.name && a.ejectile.name === b.ejectile.name && a.detectsRecoil === b.detectsRecoil && a.qValueKeV === b.qValueKeV;
  for (const p of spec.peaks) {
    const fresh = sourceOf(p);
    if (fresh === null) continue;
    const list = byNuclide.get(p.target_nuclide) ?? [];
    let source = list.find((s) => sameReaction(s.reaction, fresh.reaction));
    if (source === undefined) {
      source = { ...fresh, truth: p.truth };
      list.push(source);
    }
    source.declared.push(p);
    byNuclide.set(p.target_nuclide, list);
  }
  const elasticOf = (name: string) => sourceOf({ label: `${name} elastic`, target_nuclide: name, excitation_keV: 0, detect: 'ejectile' })!;
  for (const [name, list] of byNuclide) {
    if (!list.some((s) => s.reaction.elastic && !s.reaction.detectsRecoil)) list.unshift(elasticOf(name));
  }
  const backgrounds = new Map<string, Float64Array>();
  const backgroundPerUC = (calibration: number, detector: number): Float64Array => {
    const key = `${calibration}:${detector}`;
    let shape = backgrounds.get(key);
    if (shape === undefined) {
      const id = spec.detectors[detector]!.id;
      const cal = spec.calibrations[calibration]!.detectors.find((c) => c.id === id)!;
      shape = new Float64Array(spec.channels);
      addBackgroundOverChannels(shape, {
        flatPerKeVPerUC: spec.background.flat_per_keV_per_uC,
        exponentialPerKeVPerUC: spec.background.exponential_per_keV_per_uC,
        exponentialDecayKeV: spec.background.exponential_decay_keV,
      }, 1, cal.offset_keV, cal.gain_keV_per_channel);
      backgrounds.set(key, shape);
    }
    return shape;
  };
  const elasticOnly = new Map<string, PeakSource[]>();
  const needsSlowing = spec.physics.energy_loss === 'layers' || spec.detectors.some((d) => d.absorber.length > 0 || d.dead_layer !== undefined);
  return {
    spec,
    projectile,
    targets,
    layerNuclides: new Map(spec.targets.map((t) => [t.id, resolveTarget(t).map((r) => ({ layerIndex: r.layer, nuclide: nuclide(r.nuclide), atomsPerCm2: r.atomsPerCm2 }))] as const)),
    slowing: needsSlowing ? stoppingSlowingModel() : null,
    peakSources: (name) => {
      const declared = byNuclide.get(name);
      if (declared) return declared;
      let only = elasticOnly.get(name);
      if (only === undefined) elasticOnly.set(name, (only = [elasticOf(name)]));
      return only;
    },
    backgroundPerUC,
    diagnostics: [],
    warned: new Set(),
  };
}
