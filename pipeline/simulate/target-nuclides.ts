import type { TargetConfig } from '../core/config/series-schema.js';
import { nuclideTotals, resolveTarget } from '../core/model/resolve-target.js';
import { nuclide, type Nuclide } from '../core/physics/index.js';

export interface TargetNuclide {
  nuclide: Nuclide;
  /** Atoms of this nuclide per cm², summed over the target's layers. */
  atomsPerCm2: number;
}

/**
 * Nuclides of a target and their areal densities, summed over layers, in order of first
 * appearance — the same resolution the reduction uses (pipeline/core/model/resolve-target.ts),
 * so simulated and reduced areal densities cannot drift apart.
 */
export function targetNuclides(target: Pick<TargetConfig, 'layers'>): TargetNuclide[] {
  return [...nuclideTotals(resolveTarget(target))].map(([name, t]) => ({ nuclide: nuclide(name), atomsPerCm2: t.atomsPerCm2 }));
}
