import { nuclide, type Nuclide } from '../physics/nuclides.js';
import { twoBodyParamsFromNuclides } from '../physics/two-body-params-from-nuclides.js';

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
 * The reaction of a peak: b defaults to the projectile; B and Q as in twoBodyParamsFromNuclides
 * (conservation of charge and mass number; Q from AME2020 minus the excitation of B, exactly −Ex
 * when the outgoing pair is the incoming one) unless `q_value_keV` overrides Q.
 */
export function reactionOfPeak(projectile: Nuclide, peak: PeakReactionSpec): ReactionResult {
  const target = nuclide(peak.target_nuclide);
  const ejectile = peak.ejectile === undefined ? projectile : nuclide(peak.ejectile);
  let p: ReturnType<typeof twoBodyParamsFromNuclides>;
  try {
    p = twoBodyParamsFromNuclides(projectile, target, ejectile, 1, peak.excitation_keV, peak.q_value_keV);
  } catch (e) {
    if (e instanceof RangeError) return { ok: false, reason: e.message };
    throw e;
  }
  const residual = p.residual;
  const same = (x: Nuclide, y: Nuclide) => x.name === y.name;
  const pairUnchanged = (same(ejectile, projectile) && same(residual, target)) || (same(ejectile, target) && same(residual, projectile));
  const detectsRecoil = peak.detect === 'recoil';
  return {
    ok: true,
    value: { projectile, target, ejectile, residual, detected: detectsRecoil ? residual : ejectile, detectsRecoil, qValueKeV: p.qValueKeV, elastic: pairUnchanged && p.qValueKeV === 0 },
  };
}
