import type { Nuclide } from '../nuclides.js';
import type { StoppingFailure } from '../stopping/stopping-result.js';
import { slowDown, type SlowDownOptions, type SlowDownResult } from './slow-down.js';

/**
 * Mean energy (and straggling) of the beam at the middle of a layer: slowDown over half of its areal
 * density. To second order in the layer's thickness this is also the depth-averaged energy, the usual
 * effective reaction energy of a thin layer (common practice).
 * @param arealDensity1e15 the whole layer's areal density along its normal, 1e15 atoms/cm²
 * @param energyInKeV energy entering the layer, keV
 * @param cosine cos of the angle between the beam and the layer normal
 */
export function energyAtMidDepth(projectile: Nuclide, layerComposition: Readonly<Record<string, number>>, arealDensity1e15: number, energyInKeV: number, cosine: number, options: SlowDownOptions = {}): SlowDownResult | StoppingFailure {
  return slowDown(projectile, layerComposition, arealDensity1e15 / 2, energyInKeV, cosine, options);
}
