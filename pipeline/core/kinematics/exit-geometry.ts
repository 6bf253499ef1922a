import { degToRad } from '../physics/units.js';

/** Below this |cos| of a path angle (≈ 87°) a path through a layer is taken as grazing and refused. */
export const GRAZING_COSINE = 0.05;

export type PathCosines = { ok: true; cosIn: number; cosOut: number; exitAngleDeg: number } | { ok: false; reason: string };

/**
 * Path angles through a tilted target, beam, target normal and detector in one plane with the
 * normal turned towards the detector by the tilt α (IBM geometry, common practice):
 *
 *   incidence: from the normal, α;  path factor 1/cos α
 *   reflection (detector on the beam side):  β = 180° − θ − α
 *   transmission (detector behind the target): β = θ + α
 *
 * @param thetaLabDeg lab angle of the detected particle, deg; @param tiltDeg α, deg
 */
export function pathCosines(thetaLabDeg: number, tiltDeg: number, mode: 'reflection' | 'transmission'): PathCosines {
  const cosIn = Math.cos(degToRad(tiltDeg));
  const exitAngleDeg = mode === 'reflection' ? 180 - thetaLabDeg - tiltDeg : thetaLabDeg + tiltDeg;
  const cosOut = Math.cos(degToRad(exitAngleDeg));
  if (cosOut < GRAZING_COSINE) {
    const side = mode === 'reflection' ? 'beam side' : 'back';
    return {
      ok: false,
      reason: `the detected particle leaves the target's ${side} at ${exitAngleDeg.toFixed(1)}° from the normal (θ = ${thetaLabDeg}°, tilt ${tiltDeg}°, ${mode}): grazing or through the other face`,
    };
  }
  return { ok: true, cosIn, cosOut, exitAngleDeg };
}
