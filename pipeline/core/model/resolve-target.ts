import type { FoilConfig, TargetConfig } from '../config/series-schema.js';
import { molarMassGPerMol, naturalIsotopes, nuclide, parseNuclideName } from '../physics/nuclides.js';
import { arealDensityUgPerCm2ToAtomsPerCm2 } from '../physics/units.js';
import type { ResolvedNuclide } from './series-model.js';

/**
 * The number of atoms per cm² of every nuclide in a target: layer areal density × atom
 * fraction of the composition key × isotopic abundance (1 for a key that names a nuclide).
 * A layer given in µg/cm² is converted with the composition's mean molar mass.
 * Throws (UnknownElementError / UnknownNuclideError) for keys the tables do not hold; ingest
 * checks keys first and reports them as diagnostics.
 */
export function resolveTarget(target: Pick<TargetConfig, 'layers'>): ResolvedNuclide[] {
  const out: ResolvedNuclide[] = [];
  target.layers.forEach((layer, li) => {
    const entries = Object.entries(layer.composition);
    const totalParts = entries.reduce((s, [, x]) => s + x, 0);
    const atomsPerCm2 = layerAtomsPerCm2(layer);
    for (const [key, parts] of entries) {
      const fraction = parts / totalParts;
      const isNuclide = parseNuclideName(key) !== null;
      const isotopes = isNuclide ? [{ nuclide: nuclide(key), abundance: 1 }] : naturalIsotopes(key);
      for (const iso of isotopes) {
        const prev = out.find((r) => r.nuclide === iso.nuclide.name && r.layer === li);
        const n = atomsPerCm2 * fraction * iso.abundance;
        if (prev) prev.atomsPerCm2 += n;
        else out.push({ nuclide: iso.nuclide.name, element: iso.nuclide.symbol, layer: li, atomsPerCm2: n, relUnc: layer.areal_density_unc_rel });
      }
    }
  });
  return out;
}

/** Atoms per cm² of a layer or foil, all its constituents (µg/cm² converted with the composition's mean molar mass). */
export function layerAtomsPerCm2(layer: Pick<FoilConfig, 'composition' | 'areal_density_1e15_per_cm2' | 'areal_density_ug_per_cm2'>): number {
  if (layer.areal_density_1e15_per_cm2 !== undefined) return layer.areal_density_1e15_per_cm2 * 1e15;
  const entries = Object.entries(layer.composition);
  const totalParts = entries.reduce((s, [, x]) => s + x, 0);
  const meanMolar = entries.reduce((s, [k, x]) => s + x * molarMassGPerMol(k), 0) / totalParts;
  return arealDensityUgPerCm2ToAtomsPerCm2(layer.areal_density_ug_per_cm2!, meanMolar);
}

export interface NuclideTotal {
  element: string;
  atomsPerCm2: number;
  /** Relative uncertainty, layers taken as fully correlated (conservative). */
  relUnc: number;
}

/** Every nuclide's atoms per cm² summed over the layers, in order of first appearance (beam side first). */
export function nuclideTotals(resolved: readonly ResolvedNuclide[]): Map<string, NuclideTotal> {
  const totals = new Map<string, NuclideTotal & { weightedUnc: number }>();
  for (const r of resolved) {
    const t = totals.get(r.nuclide) ?? { element: r.element, atomsPerCm2: 0, relUnc: 0, weightedUnc: 0 };
    t.atomsPerCm2 += r.atomsPerCm2;
    t.weightedUnc += r.atomsPerCm2 * r.relUnc;
    t.relUnc = t.weightedUnc / t.atomsPerCm2;
    totals.set(r.nuclide, t);
  }
  return new Map([...totals].map(([n, { element, atomsPerCm2, relUnc }]) => [n, { element, atomsPerCm2, relUnc }]));
}
