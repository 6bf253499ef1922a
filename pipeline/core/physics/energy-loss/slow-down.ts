/**
 * Energy of a light ion after a layer: the path is the layer's areal density divided by the cosine
 * of the angle between the path and the layer normal; the mean energy and the energy variance are
 * integrated together (slow-down-with.ts), the variance with Bohr's straggling (bohr-straggling.ts).
 */
import type { Nuclide } from '../nuclides.js';
import { prepareStopping, type StoppingOptions } from '../stopping/stopping-power.js';
import { stoppingFailure, type StoppingFailure, type StoppingMethod } from '../stopping/stopping-result.js';
import { bohrStragglingRateKeV2Per1e15, meanAtomicNumber } from './bohr-straggling.js';
import { slowDownWith } from './slow-down-with.js';

export interface SlowDownOptions extends StoppingOptions {
  /** Energy variance of the particles entering the layer, keV² (default 0). */
  energyVarianceInKeV2?: number;
}

export interface SlowDownResult {
  ok: true;
  energyOutKeV: number;
  energyLossKeV: number;
  /** Energy variance after the layer, keV²: the incoming variance carried through plus straggling. */
  stragglingKeV2: number;
  /** Atoms along the path, 1e15 atoms/cm². */
  pathAreal1e15: number;
  /** Stopping method at the entrance energy. */
  method: StoppingMethod;
  tables: string[];
  steps: number;
}

/**
 * @param projectile the ion (1H, 2H, 3H, 3He, 4He, or one a user table covers)
 * @param layerComposition atom ratios of the layer (element symbols or nuclides)
 * @param arealDensity1e15 the layer's areal density along its normal, 1e15 atoms/cm²
 * @param energyInKeV kinetic energy entering the layer, keV
 * @param cosine cos of the angle between the path and the layer normal, in (0, 1]
 */
export function slowDown(projectile: Nuclide, layerComposition: Readonly<Record<string, number>>, arealDensity1e15: number, energyInKeV: number, cosine: number, options: SlowDownOptions = {}): SlowDownResult | StoppingFailure {
  if (!(cosine > 0 && cosine <= 1)) return stoppingFailure('stopping-bad-input', `path cosine ${cosine} is outside (0, 1]: the path must cross the layer`);
  const variance = options.energyVarianceInKeV2 ?? 0;
  if (!(variance >= 0 && Number.isFinite(variance))) return stoppingFailure('stopping-bad-input', `incoming energy variance ${variance} keV² is not a non-negative number`);
  const prepared = prepareStopping(projectile, layerComposition, options);
  if (!prepared.ok) return prepared;
  const z2 = meanAtomicNumber(layerComposition);
  if (typeof z2 !== 'number') return z2;
  const path = arealDensity1e15 / cosine;
  const entry = prepared.stopping.at(energyInKeV);
  if (!entry.ok) return entry;
  const r = slowDownWith(prepared.stopping, bohrStragglingRateKeV2Per1e15(projectile.z, z2), path, energyInKeV, variance, projectile.name);
  if (!r.ok) return r;
  return { ok: true, energyOutKeV: r.energyOutKeV, energyLossKeV: energyInKeV - r.energyOutKeV, stragglingKeV2: r.stragglingKeV2, pathAreal1e15: path, method: entry.method, tables: prepared.stopping.tables, steps: r.steps };
}
