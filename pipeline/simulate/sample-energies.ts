import type { SimulationSpec } from './simulation-spec.js';

/**
 * The sample beam energies of a spec, keV, in run order: the list as given, or
 * from, from + step, … up to `to` (inclusive when it falls on the grid within 1e-9 of a step).
 * Grid energies are rounded to 1e-3 keV, the precision runlog.csv is written with.
 */
export function sampleEnergiesKeV(energies: SimulationSpec['energies_keV']): number[] {
  if (Array.isArray(energies)) return energies.map(roundToMilliKeV);
  const { from, to, step } = energies;
  if (to < from) return [];
  const count = Math.floor((to - from) / step + 1e-9) + 1;
  return Array.from({ length: count }, (_, i) => roundToMilliKeV(from + i * step));
}

function roundToMilliKeV(energyKeV: number): number {
  return Math.round(energyKeV * 1000) / 1000;
}
