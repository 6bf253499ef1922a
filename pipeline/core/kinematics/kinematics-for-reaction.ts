import { relativisticLabSolutions } from '../physics/relativistic-two-body-lab.js';
import type { KinematicsAt, KinematicSolution } from './peak-path.js';
import type { Reaction } from './reaction-of-peak.js';

/**
 * Exact relativistic two-body kinematics of the particle a peak's detector sees
 * (pipeline/core/physics/relativistic-two-body-lab.ts): for a recoil the two outgoing particles
 * swap roles (a + A → B + b with the same Q). One solution is labelled `single`; two (inverse
 * kinematics, or a reaction product below its maximum angle) `high` and `low` by lab energy.
 */
export function kinematicsForReaction(reaction: Reaction): KinematicsAt {
  const detected = reaction.detected;
  const other = reaction.detectsRecoil ? reaction.ejectile : reaction.residual;
  return (beamEnergyKeV, thetaLabDeg) => {
    if (!(beamEnergyKeV > 0)) return { ok: false, reason: `no beam energy left (${beamEnergyKeV.toFixed(1)} keV)` };
    const r = relativisticLabSolutions({
      projectileMassU: reaction.projectile.massU,
      targetMassU: reaction.target.massU,
      ejectileMassU: detected.massU,
      residualMassU: other.massU,
      beamEnergyKeV,
      qValueKeV: reaction.qValueKeV,
      thetaLabDeg,
    });
    if (!r.ok) return { ok: false, reason: `${detected.name} from ${reaction.target.name}(${reaction.projectile.name},${reaction.ejectile.name})${reaction.residual.name}: ${r.reason}` };
    const single = r.solutions.length === 1;
    const solutions: KinematicSolution[] = r.solutions.map((s) => ({
      branch: single ? 'single' : s.branch,
      energyKeV: s.ejectileEnergyKeV,
      thetaCmDeg: s.thetaCmDeg,
      jacobianLabPerCm: s.jacobianLabPerCm,
    }));
    return { ok: true, solutions };
  };
}
