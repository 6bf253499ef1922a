import type { ScreeningModel } from '../../pipeline/core/kinematics/screened-rutherford.js';
import { screenedRutherfordLabIfValid } from '../../pipeline/core/kinematics/screened-rutherford.js';
import type { TargetConfig } from '../../pipeline/core/config/series-schema.js';
import { resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import { layerThickness } from '../../pipeline/core/normalization/shared-inputs.js';
import { nuclide, type Nuclide } from '../../pipeline/core/physics/nuclides.js';
import type { NormalizingNuclide } from './reference-solid-angle-model.js';

export interface NormalizingNuclidesOptions {
  /** Only layers for which this holds (default: every layer). */
  layer?: (layer: TargetConfig['layers'][number], index: number) => boolean;
  /** Layers of this target count as reference film (reference_areal_density) whatever their role. */
  referenceTarget?: string;
}

/**
 * Every isotope of `element` in a target, per layer (atoms/cm²: layer areal density × atom
 * fraction × abundance, as resolveTarget gives them) with each layer's thickness input, and
 * its screened lab Rutherford cross section at `beamEnergyKeV` and `thetaLabDeg`.
 * null when the element is absent or the Rutherford form is not valid for one of its isotopes.
 */
export function normalizingNuclides(projectile: Nuclide, target: TargetConfig, element: string, beamEnergyKeV: number, thetaLabDeg: number, screening: ScreeningModel, options: NormalizingNuclidesOptions = {}): NormalizingNuclide[] | null {
  const byNuclide = new Map<string, NormalizingNuclide>();
  for (const r of resolveTarget(target)) {
    const layer = target.layers[r.layer]!;
    if (r.element !== element || (options.layer && !options.layer(layer, r.layer))) continue;
    let n = byNuclide.get(r.nuclide);
    if (n === undefined) {
      const rutherford = screenedRutherfordLabIfValid(projectile, nuclide(r.nuclide), beamEnergyKeV, thetaLabDeg, screening);
      if (rutherford === null) return null;
      byNuclide.set(r.nuclide, (n = { layers: [], rutherford }));
    }
    n.layers.push({ atomsPerCm2: r.atomsPerCm2, thickness: layerThickness(target.id, r.layer, r.relUnc, layer.role === 'reference' || target.id === options.referenceTarget) });
  }
  return byNuclide.size === 0 ? null : [...byNuclide.values()];
}
