import type { Nuclide } from '../physics/nuclides.js';

/** A slab of matter a particle crosses: composition as atom ratios, atoms/cm² along the slab normal. */
export interface Slab {
  composition: Readonly<Record<string, number>>;
  atomsPerCm2: number;
  /** A named stopping table for the whole slab (user table or NIST material); default: from the composition. */
  material?: string | undefined;
}

export type SlowDownResult =
  | { ok: true; energyOutKeV: number; /** Bohr straggling variance accumulated on the path, keV². */ stragglingKeV2: number }
  | { ok: false; reason: string };

/**
 * How a particle slows down in matter — implemented over the stopping tables
 * (pipeline/core/physics/stopping), kept as an interface so the geometry can be tested with an
 * exactly solvable model.
 * @param pathAtomsPerCm2 atoms/cm² along the particle's path (slab areal density / |cos| of the path angle)
 */
export interface SlowingModel {
  slowDown(particle: Nuclide, composition: Readonly<Record<string, number>>, pathAtomsPerCm2: number, energyInKeV: number, material?: string): SlowDownResult;
}
