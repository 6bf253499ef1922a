// Relativistic two-body kinematics, lab angles: R. Hagedorn, Relativistic Kinematics (W.A. Benjamin, 1963); Particle Data Group, R.L. Workman et al., Prog. Theor. Exp. Phys. 2022, 083C01, review "Kinematics".
import { degToRad, radToDeg } from './units.js';
import type { TwoBodyParams } from './two-body-kinematics.js';
import { hasUnitVelocityRatio, relativisticCmFrame, type RelativisticCmFrame } from './relativistic-two-body.js';

/**
 * One kinematic solution for the detected particle b of a + A → b + B (frame: relativistic-two-body.ts).
 * `high` is the larger lab momentum of b at that lab angle; where only one solution exists it is `high`.
 */
export interface RelativisticLabSolution {
  branch: 'high' | 'low';
  /** Lab angle of b, degrees. */
  thetaLabDeg: number;
  /** Lab kinetic energy of b, keV. */
  ejectileEnergyKeV: number;
  /** CM angle of b (from the beam direction), degrees; B goes to 180° − θcm in the CM frame. */
  thetaCmDeg: number;
  /** dΩ_lab/dΩ_cm of b on this branch: dσ/dΩ_cm = dσ/dΩ_lab × jacobianLabPerCm. */
  jacobianLabPerCm: number;
  /** Lab angle of the partner B, degrees, on the other side of the beam. */
  residualThetaLabDeg: number;
  /** Lab kinetic energy of the partner B, keV. */
  residualEnergyKeV: number;
}

export type RelativisticLabResult =
  | { ok: true; frame: RelativisticCmFrame; solutions: RelativisticLabSolution[] }
  | { ok: false; reason: string };

/** Relative size under which a discriminant or a root counts as zero (rounding, not physics). */
const ROUNDING = 1e-12;

/**
 * All solutions for b at lab angle θ (A at rest, c = 1, keV). With Γ = γ_cm, B = β_cm γ_cm and the
 * invariant Γ E_b − B p cos θ = E_b*, the lab momentum of b solves
 *
 *   (1 + B² sin²θ) p² − 2 E_b* B cos θ p + (B² m_b² − p*²) = 0
 *   p = [E_b* B cos θ ± Γ sqrt(p*² − B² m_b² sin²θ)] / (1 + B² sin²θ)
 *
 * (the smaller root from the product of the roots, so nothing cancels). Then T_b = p²/(E_b + m_b),
 * θcm = atan2(p sin θ, Γ p cos θ − B E_b), and, exactly,
 *
 *   dΩ_lab/dΩ_cm = p* |Γ p − B E_b cos θ| / p²
 *
 * B carries p_B = p_a − p_b: θ_B = atan2(p sin θ, p_a − p cos θ), T_B = p_B²/(E_B + m_B*).
 * Masses in u, energies in keV, thetaLabDeg in degrees (0..180). Forbidden cases (below threshold,
 * beyond the maximum lab angle) are `{ ok: false, reason }`; bad arguments throw RangeError.
 */
export function relativisticLabSolutions(p: TwoBodyParams & { thetaLabDeg: number }): RelativisticLabResult {
  if (!(p.thetaLabDeg >= 0 && p.thetaLabDeg <= 180)) throw new RangeError(`lab angle must be within 0..180 deg, got ${p.thetaLabDeg}`);
  const framed = relativisticCmFrame(p);
  if (!framed.ok) return framed;
  const f = framed.frame;
  const unit = hasUnitVelocityRatio(f);
  if (f.maxLabAngleDeg !== null && (p.thetaLabDeg > f.maxLabAngleDeg || (unit && p.thetaLabDeg >= 90))) {
    return { ok: false, reason: `lab angle ${p.thetaLabDeg}° is beyond the maximum lab angle ${f.maxLabAngleDeg.toFixed(4)}° of the detected particle at ${f.beamEnergyKeV} keV` };
  }
  const theta = degToRad(p.thetaLabDeg);
  const sin = Math.sin(theta);
  const cos = Math.cos(theta);
  const { cmMomentumKeV: ps, ejectileCmTotalEnergyKeV: es, ejectileMassKeV: mb, gammaCm: g, betaGammaCm: b } = f;
  let sq = ps * ps - b * b * mb * mb * sin * sin;
  if (sq < 0 && sq > -ROUNDING * ps * ps) sq = 0;
  if (sq < 0) return { ok: false, reason: `lab angle ${p.thetaLabDeg}° is beyond the maximum lab angle of the detected particle at ${f.beamEnergyKeV} keV` };
  const r = g * Math.sqrt(sq);
  const c = es * b * cos;
  const d = 1 + b * b * sin * sin;
  const product = unit ? 0 : (b * mb - ps) * (b * mb + ps);
  const momenta: number[] = [];
  if (c >= 0) {
    const high = (c + r) / d;
    if (high > 0) {
      momenta.push(high);
      const low = product / (d * high);
      if (low > ROUNDING * high) momenta.push(low);
    }
  } else if (product < 0) {
    momenta.push(product / (c - r));
  }
  if (momenta.length === 0) return { ok: false, reason: `no kinematic solution for the detected particle at ${p.thetaLabDeg}° and ${f.beamEnergyKeV} keV` };
  return { ok: true, frame: f, solutions: momenta.map((pb, i) => solutionAt(f, pb, p.thetaLabDeg, i === 0 ? 'high' : 'low')) };
}

/**
 * b at CM angle θcm (degrees, 0..180) to the lab: p_∥ = Γ p* cos θcm + B E_b*, p_⊥ = p* sin θcm,
 * θ_lab = atan2(p_⊥, p_∥); the branch is `low` where Γ p − B E_b cos θ < 0 (the far side of the
 * maximum lab angle). Same units and results as relativisticLabSolutions; `{ ok: false }` below
 * threshold or where b is left at rest in the lab (no lab angle).
 */
export function relativisticCmToLab(p: TwoBodyParams & { thetaCmDeg: number }):
  { ok: true; frame: RelativisticCmFrame; solution: RelativisticLabSolution } | { ok: false; reason: string } {
  if (!(p.thetaCmDeg >= 0 && p.thetaCmDeg <= 180)) throw new RangeError(`CM angle must be within 0..180 deg, got ${p.thetaCmDeg}`);
  const framed = relativisticCmFrame(p);
  if (!framed.ok) return framed;
  const f = framed.frame;
  const thetaCm = degToRad(p.thetaCmDeg);
  const parallel = f.gammaCm * f.cmMomentumKeV * Math.cos(thetaCm) + f.betaGammaCm * f.ejectileCmTotalEnergyKeV;
  const perpendicular = f.cmMomentumKeV * Math.sin(thetaCm);
  const pb = Math.hypot(parallel, perpendicular);
  if (!(pb > ROUNDING * f.cmMomentumKeV)) {
    return { ok: false, reason: `at θcm = ${p.thetaCmDeg}° the detected particle is left at rest in the lab; it has no lab angle` };
  }
  const thetaLabDeg = radToDeg(Math.atan2(perpendicular, parallel));
  const eb = Math.hypot(pb, f.ejectileMassKeV);
  const slope = f.gammaCm * pb - f.betaGammaCm * eb * Math.cos(degToRad(thetaLabDeg));
  return { ok: true, frame: f, solution: solutionAt(f, pb, thetaLabDeg, slope < 0 ? 'low' : 'high') };
}

function solutionAt(f: RelativisticCmFrame, pb: number, thetaLabDeg: number, branch: 'high' | 'low'): RelativisticLabSolution {
  const theta = degToRad(thetaLabDeg);
  const sin = Math.sin(theta);
  const cos = Math.cos(theta);
  const mb = f.ejectileMassKeV;
  const eb = Math.hypot(pb, mb);
  const thetaCmDeg = radToDeg(Math.atan2(pb * sin, f.gammaCm * pb * cos - f.betaGammaCm * eb));
  const jacobianLabPerCm = (f.cmMomentumKeV * Math.abs(f.gammaCm * pb - f.betaGammaCm * eb * cos)) / (pb * pb);
  const along = f.beamMomentumKeV - pb * cos;
  const across = pb * sin;
  const pB2 = along * along + across * across;
  const mB = f.residualMassKeV;
  return {
    branch,
    thetaLabDeg,
    ejectileEnergyKeV: (pb * pb) / (eb + mb),
    thetaCmDeg,
    jacobianLabPerCm,
    residualThetaLabDeg: radToDeg(Math.atan2(across, along)),
    residualEnergyKeV: pB2 / (Math.sqrt(pB2 + mB * mB) + mB),
  };
}
