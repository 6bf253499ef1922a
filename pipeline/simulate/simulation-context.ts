import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
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
  const elasticOnly: PeakSource[] = [{ qValueKeV: 0, excitationKeV: 0, truth: undefined, declared: [] }];
  return {
    spec,
    projectile: nuclide(spec.beam.projectile),
    targets,
    peakSources: (name) => byNuclide.get(name) ?? elasticOnly,
    diagnostics: [],
    warned: new Set(),
  };
}
