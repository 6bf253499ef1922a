import { slowDown } from '../physics/energy-loss/slow-down.js';
import type { UserStoppingTables } from '../physics/stopping/user-stopping-table.js';
import type { SlowingModel } from './slowing-model.js';

/**
 * The slowing model of the reduction: NIST PSTAR/ASTAR stopping (Bragg additivity, velocity
 * scaling, Bethe above the tables, user tables first) integrated along the path with Bohr
 * straggling — pipeline/core/physics/energy-loss/slow-down.ts. A failure (below a table, an
 * unsupported particle, a particle that stops) comes back as its reason, never an extrapolation.
 */
export function stoppingSlowingModel(userTables?: UserStoppingTables): SlowingModel {
  const base = userTables === undefined ? {} : { userTables };
  return {
    slowDown(particle, composition, pathAtomsPerCm2, energyInKeV, material) {
      const r = slowDown(particle, composition, pathAtomsPerCm2 / 1e15, energyInKeV, 1, material === undefined ? base : { ...base, material });
      if (!r.ok) return { ok: false, reason: r.reason };
      return { ok: true, energyOutKeV: r.energyOutKeV, stragglingKeV2: r.stragglingKeV2 };
    },
  };
}
