/**
 * Spread of the beam energy at which reactions happen across one layer (for
 * `reaction_energy_spread_keV`): the beam enters at E_in and leaves at E_out, and reactions are spread
 * evenly in depth, so for a layer thin enough that E falls linearly with depth the reaction energies
 * are uniform on [E_out, E_in], with standard deviation ΔE/√12 (common practice). Straggling at
 * mid-depth (Bohr, plus any incoming variance) widens this: rms = sqrt(ΔE²/12 + Ω²_mid).
 */
import type { Nuclide } from '../nuclides.js';
import type { StoppingFailure, StoppingMethod } from '../stopping/stopping-result.js';
import { slowDown, type SlowDownOptions } from './slow-down.js';

export interface LayerEnergySpread {
  ok: true;
  energyInKeV: number;
  /** Mean energy at mid-depth, keV (energy-at-mid-depth.ts). */
  energyMidKeV: number;
  energyOutKeV: number;
  /** ΔE = E_in - E_out, keV. */
  energyLossKeV: number;
  /** ΔE/√12, keV: rms of a uniform spread over the layer. */
  uniformRmsKeV: number;
  /** Energy variance at mid-depth (straggling plus incoming variance), keV². */
  stragglingMidKeV2: number;
  /** sqrt(ΔE²/12 + Ω²_mid), keV. */
  spreadRmsKeV: number;
  method: StoppingMethod;
}

/**
 * @param arealDensity1e15 the layer's areal density along its normal, 1e15 atoms/cm²
 * @param energyInKeV energy entering the layer, keV
 * @param cosine cos of the angle between the beam and the layer normal
 */
export function layerEnergySpread(projectile: Nuclide, layerComposition: Readonly<Record<string, number>>, arealDensity1e15: number, energyInKeV: number, cosine: number, options: SlowDownOptions = {}): LayerEnergySpread | StoppingFailure {
  const mid = slowDown(projectile, layerComposition, arealDensity1e15 / 2, energyInKeV, cosine, options);
  if (!mid.ok) return mid;
  const out = slowDown(projectile, layerComposition, arealDensity1e15, energyInKeV, cosine, options);
  if (!out.ok) return out;
  const loss = energyInKeV - out.energyOutKeV;
  const uniformRmsKeV = loss / Math.sqrt(12);
  return {
    ok: true,
    energyInKeV,
    energyMidKeV: mid.energyOutKeV,
    energyOutKeV: out.energyOutKeV,
    energyLossKeV: loss,
    uniformRmsKeV,
    stragglingMidKeV2: mid.stragglingKeV2,
    spreadRmsKeV: Math.sqrt(uniformRmsKeV * uniformRmsKeV + mid.stragglingKeV2),
    method: mid.method,
  };
}
