/**
 * One table read at one energy: log-log interpolation inside the table; above the top energy of a
 * NIST table, the Bethe formula (bethe-stopping.ts) multiplied by table/Bethe at the top point so
 * the two join continuously (nuclear stopping is dropped there: at the top points it is < 5e-4 of
 * the total); anything else outside the table fails.
 */
import { betheElectronicEvPer1e15 } from './bethe-stopping.js';
import { interpolateLogLog } from './interpolate-log-log.js';
import type { TableReadFactors } from './same-velocity-scaling.js';
import { stoppingFailure, type StoppingFailure } from './stopping-result.js';
import type { StoppingTable } from './stopping-table.js';

export interface TableReading {
  ok: true;
  electronic: number;
  nuclear: number;
  usedBethe: boolean;
  /** Bethe / table - 1 at the top energy, when Bethe was used. */
  betheMismatchAtTop: number;
}

/** The Bethe projectile of a NIST table: charge number and M c² in MeV. */
export interface BetheProjectile {
  z: number;
  massMeV: number;
}

/**
 * @param table the table, in eV/(1e15 atoms/cm²) at keV
 * @param factors energy and value factors for an ion other than the table's (same-velocity-scaling.ts)
 * @param energyKeV kinetic energy of the ion, keV
 * @param betheProjectile the table's own projectile, for Bethe above the top (NIST tables)
 * @param ionLabel the ion's name, for messages
 */
export function readStoppingTable(table: StoppingTable, factors: TableReadFactors, energyKeV: number, betheProjectile: BetheProjectile | null, ionLabel: string): TableReading | StoppingFailure {
  const e = table.energiesKeV;
  const n = e.length;
  // Clamped at the lowest grid point only to absorb rounding of E x factor (E itself is checked below).
  const eRef = Math.max(energyKeV * factors.electronicEnergyFactor, e[0]!);
  const hasNuclear = table.nuclearEvPer1e15 !== null;
  const lowestKeV = Math.max(e[0]! / factors.electronicEnergyFactor, hasNuclear ? e[0]! / factors.nuclearEnergyFactor : 0);
  const highestKeV = e[n - 1]! / factors.electronicEnergyFactor;
  if (!(energyKeV >= lowestKeV)) {
    return stoppingFailure('stopping-below-table', `${ionLabel} at ${energyKeV} keV is below the ${table.label} table: its lowest energy is ${lowestKeV} keV for ${ionLabel}; the particle is (nearly) stopped`);
  }
  // Above the top energy the nuclear part is dropped (see above), also when only the nuclear column's reading energy is past it.
  const nuclear = (eN: number) => (table.nuclearEvPer1e15 === null || eN > e[n - 1]! ? 0 : interpolateLogLog(e, table.nuclearEvPer1e15, Math.max(eN, e[0]!)) * factors.nuclearValueFactor);
  if (eRef <= e[n - 1]!) {
    return { ok: true, electronic: interpolateLogLog(e, table.electronicEvPer1e15, eRef), nuclear: nuclear(energyKeV * factors.nuclearEnergyFactor), usedBethe: false, betheMismatchAtTop: 0 };
  }
  if (table.bethe === null || betheProjectile === null) {
    return stoppingFailure('stopping-above-table', `${ionLabel} at ${energyKeV} keV is above the ${table.label} table: its highest energy is ${highestKeV} keV for ${ionLabel}; extend the table`);
  }
  const { meanZ, meanExcitationEV } = table.bethe;
  const atTop = betheElectronicEvPer1e15(betheProjectile.z, betheProjectile.massMeV, meanZ, meanExcitationEV, e[n - 1]!);
  const tableTop = table.electronicEvPer1e15[n - 1]!;
  const bethe = betheElectronicEvPer1e15(betheProjectile.z, betheProjectile.massMeV, meanZ, meanExcitationEV, eRef);
  return { ok: true, electronic: (bethe * tableTop) / atTop, nuclear: 0, usedBethe: true, betheMismatchAtTop: atTop / tableTop - 1 };
}
