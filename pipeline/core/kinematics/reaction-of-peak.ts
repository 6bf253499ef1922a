import { elementSymbol, nuclide, type Nuclide } from '../physics/nuclides.js';
import { qValueKeV } from '../physics/two-body-kinematics.js';

/** A configured peak as a two-body reaction A(a,b)B, with the particle the detector sees. */
export interface Reaction {
  projectile: Nuclide;
  target: Nuclide;
  /** b: the light outgoing particle as configured (default: the projectile). */
  ejectile: Nuclide;
  /** B = a + A − b. */
  residual: Nuclide;
  /** The particle that reaches the detector: b, or B for `detect: recoil`. */
  detected: Nuclide;
  detectsRecoil: boolean;
  /** Q to the final state, keV: the override, or (M_a + M_A − M_b − M_B)c² − Ex from AME2020. */
  qValueKeV: number;
  /** Elastic scattering: the outgoing pair is the incoming pair and Q = 0. */
  elastic: boolean;
}

export interface PeakReactionSpec {
  label: string;
  target_nuclide: string;
  excitation_keV: number;
  q_value_keV?: number | undefined;
  ejectile?: string | undefined;
  detect: 'ejectile' | 'recoil';
}

export type ReactionResult = { ok: true; value: Reaction } | { ok: false; reason: string };

/**
 * The reaction of a peak: b defaults to the projectile; B follows from conservation of charge
 * and mass number; Q from the AME2020 atomic masses minus the excitation energy of B unless
 * `q_value_keV` overrides it. Elastic when {b, B} = {a, A} with Q = 0 (b = A, B = a is the same
 * reaction with the labels exchanged).
 */
export function reactionOfPeak(projectile: Nuclide, peak: PeakReactionSpec): ReactionResult {
  const target = nuclide(peak.target_nuclide);
  const ejectile = peak.ejectile === undefined ? projectile : nuclide(peak.ejectile);
  const z = projectile.z + target.z - ejectile.z;
  const a = projectile.a + target.a - ejectile.a;
  const symbol = z >= 0 ? elementSymbol(z) : undefined;
  if (a < 1 || z < 0 || symbol === undefined) {
    return { ok: false, reason: `${target.name}(${projectile.name},${ejectile.name}) leaves no residual nucleus (Z = ${z}, A = ${a})` };
  }
  let residual: Nuclide;
  try {
    residual = nuclide(`${a}${symbol}`);
  } catch {
    return { ok: false, reason: `residual nucleus of ${target.name}(${projectile.name},${ejectile.name}) (Z = ${z}, A = ${a}) is not in the AME2020 table` };
  }
  const sameNuclei = (x: Nuclide, y: Nuclide) => x.z === y.z && x.a === y.a;
  const pairUnchanged = (sameNuclei(ejectile, projectile) && sameNuclei(residual, target)) || (sameNuclei(ejectile, target) && sameNuclei(residual, projectile));
  const q = peak.q_value_keV ?? (pairUnchanged ? -peak.excitation_keV : qValueKeV(projectile, target, ejectile, residual, peak.excitation_keV));
  const detectsRecoil = peak.detect === 'recoil';
  return {
    ok: true,
    value: { projectile, target, ejectile, residual, detected: detectsRecoil ? residual : ejectile, detectsRecoil, qValueKeV: q, elastic: pairUnchanged && q === 0 },
  };
}
