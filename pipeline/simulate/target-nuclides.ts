import type { TargetConfig } from '../core/config/series-schema.js';
import {
  ATOMS_PER_CM2_PER_1E15, arealDensityUgPerCm2ToAtomsPerCm2, molarMassGPerMol, naturalIsotopes, nuclide, parseNuclideName,
  type Nuclide,
} from '../core/physics/index.js';

export interface TargetNuclide {
  nuclide: Nuclide;
  /** Atoms of this nuclide per cm², summed over the target's layers. */
  atomsPerCm2: number;
}

/**
 * Nuclides of a target and their areal densities. Per layer: total atoms/cm² N from
 * `areal_density_1e15_per_cm2`, or from `areal_density_ug_per_cm2` via the mean molar mass per
 * atom M̄ = Σ x_i M_i / Σ x_i (N = m N_A / M̄); component i holds N · x_i/Σx atoms; an element
 * splits into its natural isotopes by amount fraction (IUPAC 2013), a nuclide key is itself.
 * Order: first appearance (beam-side layer first, composition order, isotopes by mass number).
 */
export function targetNuclides(target: TargetConfig): TargetNuclide[] {
  const byName = new Map<string, TargetNuclide>();
  for (const layer of target.layers) {
    const entries = Object.entries(layer.composition);
    const ratioSum = entries.reduce((s, [, x]) => s + x, 0);
    let layerAtomsPerCm2: number;
    if (layer.areal_density_1e15_per_cm2 !== undefined) {
      layerAtomsPerCm2 = layer.areal_density_1e15_per_cm2 * ATOMS_PER_CM2_PER_1E15;
    } else {
      const meanMolarMass = entries.reduce((s, [key, x]) => s + x * molarMassGPerMol(key), 0) / ratioSum;
      layerAtomsPerCm2 = arealDensityUgPerCm2ToAtomsPerCm2(layer.areal_density_ug_per_cm2 as number, meanMolarMass);
    }
    for (const [key, ratio] of entries) {
      const componentAtoms = (layerAtomsPerCm2 * ratio) / ratioSum;
      const isotopes = parseNuclideName(key) !== null ? [{ nuclide: nuclide(key), abundance: 1 }] : naturalIsotopes(key);
      for (const iso of isotopes) {
        const entry = byName.get(iso.nuclide.name) ?? { nuclide: iso.nuclide, atomsPerCm2: 0 };
        entry.atomsPerCm2 += componentAtoms * iso.abundance;
        byName.set(iso.nuclide.name, entry);
      }
    }
  }
  return [...byName.values()];
}
