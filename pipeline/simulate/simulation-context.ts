import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { addBackgroundOverChannels } from './add-background-over-channels.js';
import { nuclide, type Nuclide } from '../core/physics/index.js';
import type { SimulatedPeakSpec, SimulationSpec } from './simulation-spec.js';
import { targetNuclides, type TargetNuclide } from './target-nuclides.js';
import type { PeakTruth } from './truth-model.js';

/** One physical peak of a nuclide: elastic or one final state, with the declared peaks that name it. */
export interface PeakSource {
  qValueKeV: number;
  excitationKeV: number;
  truth: PeakTruth | undefined;
  declared: SimulatedPeakSpec[];
}

/** What every run of a series shares, resolved once. */
export interface SimulationContext {
  spec: SimulationSpec;
  projectile: Nuclide;
  targets: Map<string, TargetNuclide[]>;
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
  const byNuclide = new Map<string, PeakSource[]>();
  for (const p of spec.peaks) {
    const qValueKeV = p.q_value_keV ?? -p.excitation_keV;
    const list = byNuclide.get(p.target_nuclide) ?? [];
    let source = list.find((s) => s.qValueKeV === qValueKeV);
    if (source === undefined) {
      source = { qValueKeV, excitationKeV: p.excitation_keV, truth: p.truth, declared: [] };
      list.push(source);
    }
    source.declared.push(p);
    byNuclide.set(p.target_nuclide, list);
  }
  for (const list of byNuclide.values()) {
    if (!list.some((s) => s.qValueKeV === 0)) list.unshift({ qValueKeV: 0, excitationKeV: 0, truth: undefined, declared: [] });
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
  const elasticOnly: PeakSource[] = [{ qValueKeV: 0, excitationKeV: 0, truth: undefined, declared: [] }];
  return {
    spec,
    projectile: nuclide(spec.beam.projectile),
    targets,
    peakSources: (name) => byNuclide.get(name) ?? elasticOnly,
    backgroundPerUC,
    diagnostics: [],
    warned: new Set(),
  };
}
