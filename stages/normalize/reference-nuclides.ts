import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { elementZ, nuclide, type Nuclide } from '../../pipeline/core/physics/nuclides.js';
import { nuclideTotals, resolveTarget } from '../../pipeline/core/model/resolve-target.js';

export interface ReferenceNuclide {
  nuclide: Nuclide;
  atomsPerCm2: number;
  relUnc: number;
}

export interface ReferenceComposition {
  element: string;
  nuclides: ReferenceNuclide[];
  /** Atoms per cm² of the element, all isotopes. */
  atomsPerCm2: number;
  relUnc: number;
}

/**
 * The nuclides whose elastic peak normalizes: every isotope of the reference element
 * (`normalization.reference_element`, default the heaviest element of the reference target,
 * whose elastic peak lies highest and apart from the others).
 */
export function referenceComposition(config: SeriesConfig): ReferenceComposition {
  const target = config.targets.find((t) => t.id === config.normalization.reference_target)!;
  const resolved = resolveTarget(target);
  const element =
    config.normalization.reference_element ?? [...new Set(resolved.map((r) => r.element))].sort((a, b) => (elementZ(b) ?? 0) - (elementZ(a) ?? 0))[0]!;
  const nuclides: ReferenceNuclide[] = [...nuclideTotals(resolved)]
    .filter(([, t]) => t.element === element)
    .map(([name, t]) => ({ nuclide: nuclide(name), atomsPerCm2: t.atomsPerCm2, relUnc: t.relUnc }));
  const atomsPerCm2 = nuclides.reduce((s, n) => s + n.atomsPerCm2, 0);
  const relUnc = nuclides.reduce((s, n) => s + n.relUnc * n.atomsPerCm2, 0) / atomsPerCm2;
  return { element, nuclides, atomsPerCm2, relUnc };
}
