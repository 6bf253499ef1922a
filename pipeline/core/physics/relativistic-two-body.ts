// Relativistic two-body kinematics: R. Hagedorn, Relativistic Kinematics (W.A. Benjamin, 1963); Particle Data Group, R.L. Workman et al., Prog. Theor. Exp. Phys. 2022, 083C01, review "Kinematics" (two-body final state).
import { ATOMIC_MASS_UNIT_KEV } from './codata2018.js';
import { radToDeg } from './units.js';
import type { TwoBodyParams } from './two-body-kinematics.js';

/**
 * The centre-of-mass frame of a + A → b + B with A at rest in the lab, exact (special relativity,
 * c = 1: energies and momenta in keV). Mass energies are m c² = massU × 931 494.102 42 keV
 * (CODATA 2018) from atomic (neutral-atom) masses; the electrons ride along with the nuclei, which
 * shifts mass ratios by ~ m_e/m_u ≈ 5e-4 × (difference in Z/A), below 1e-4 of any kinematic energy.
 *
 * The residual B is left with the mass energy that energy conservation gives for the stated Q:
 *   m_B* = m_a + m_A − m_b − Q      (= m_B + Ex when Q = Q_0 − Ex),
 * so `residualMassU` (the ground state) only enters through Q; Q and the masses need not agree.
 *
 *   √s = sqrt((m_a + m_A)² + 2 m_A T_a),  T_in = √s − m_a − m_A = 2 m_A T_a / (√s + m_a + m_A)
 *   T_out = T_in + Q = √s − m_b − m_B*   (kinetic energy shared by b and B in the CM frame)
 *   p* = sqrt(T_out (T_out + 2m_b)(T_out + 2m_B*)(T_out + 2m_b + 2m_B*)) / (2√s)
 *   T_b* = T_out (T_out + 2m_B*) / (2√s),  E_b* = m_b + T_b*
 *   γ_cm = (T_a + m_a + m_A)/√s,  β_cm γ_cm = p_a/√s,  p_a = sqrt(T_a (T_a + 2 m_a))
 *   g = β_cm / β_b* = β_cm E_b* / p*   (g > 1: two lab energies per lab angle)
 *   sin θ_max = p* / (m_b β_cm γ_cm)   (for g > 1; θ_max = 90° for g = 1)
 * All differences are formed from kinetic quantities, so nothing cancels at low energy.
 */
export interface RelativisticCmFrame {
  projectileMassKeV: number;
  targetMassKeV: number;
  ejectileMassKeV: number;
  /** m_B* c², keV: the residual as left by the stated Q (ground state plus excitation). */
  residualMassKeV: number;
  beamEnergyKeV: number;
  qValueKeV: number;
  /** √s, total energy in the CM frame, keV. */
  invariantMassKeV: number;
  /** Kinetic energy in the CM frame before the reaction, keV. */
  cmEnergyInKeV: number;
  /** Kinetic energy in the CM frame after the reaction, T_in + Q, keV. */
  cmEnergyOutKeV: number;
  /** p*, momentum of b (and B) in the CM frame, keV/c. */
  cmMomentumKeV: number;
  /** E_b*, total energy of b in the CM frame, keV. */
  ejectileCmTotalEnergyKeV: number;
  /** p_a, beam momentum in the lab, keV/c. */
  beamMomentumKeV: number;
  gammaCm: number;
  betaGammaCm: number;
  /** g = β_cm / β_b*: speed of the CM over the speed of b in the CM frame. */
  velocityRatio: number;
  /** Largest lab angle b reaches, degrees, or null when every angle 0..180 is reached (g < 1). */
  maxLabAngleDeg: number | null;
}

export type RelativisticCmFrameResult = { ok: true; frame: RelativisticCmFrame } | { ok: false; reason: string };

/**
 * |g − 1| below this counts as g = 1 exactly: elastic recoil (b = A, B = a, Q = 0) has g = 1 analytically, and a Q
 * rounded from masses (~1e-9 keV) must not split off a spurious low branch of zero energy.
 */
const UNIT_VELOCITY_RATIO_TOLERANCE = 1e-9;

/**
 * Threshold beam energy in keV (0 for Q >= 0):  T_th = ((m_b + m_B*)² − (m_a + m_A)²) / (2 m_A)
 *   = −Q (m_a + m_A)/m_A + Q²/(2 m_A).  Masses in u, Q in keV (beamEnergyKeV is not used).
 */
export function relativisticThresholdKeV(p: Omit<TwoBodyParams, 'beamEnergyKeV'>): number {
  const { ma, mA } = massesKeV(p);
  const q = p.qValueKeV;
  return q >= 0 ? 0 : (-q * (ma + mA)) / mA + (q * q) / (2 * mA);
}

/**
 * The CM frame of the reaction (formulas above). Masses in u, beamEnergyKeV (lab kinetic energy of
 * a) and qValueKeV in keV. A reaction at or below threshold is `{ ok: false, reason }`; bad
 * arguments (non-positive masses or beam energy, non-finite Q, Q so large that m_B* <= 0) throw RangeError.
 */
export function relativisticCmFrame(p: TwoBodyParams): RelativisticCmFrameResult {
  const { ma, mA, mb, mB } = massesKeV(p);
  const ta = p.beamEnergyKeV;
  if (!(ta > 0) || !Number.isFinite(ta)) throw new RangeError(`beam energy must be positive and finite, got ${ta} keV`);
  const q = p.qValueKeV;
  const w = Math.sqrt((ma + mA) * (ma + mA) + 2 * mA * ta);
  const tIn = (2 * mA * ta) / (w + ma + mA);
  const tOut = tIn + q;
  if (!(tOut > 0)) {
    const threshold = relativisticThresholdKeV(p);
    return { ok: false, reason: `beam energy ${ta} keV is at or below the threshold ${threshold.toFixed(3)} keV of a reaction with Q = ${q} keV` };
  }
  const pStar = Math.sqrt(tOut * (tOut + 2 * mb) * (tOut + 2 * mB) * (tOut + 2 * mb + 2 * mB)) / (2 * w);
  const eStar = mb + (tOut * (tOut + 2 * mB)) / (2 * w);
  const pa = Math.sqrt(ta * (ta + 2 * ma));
  const gammaCm = (ta + ma + mA) / w;
  const betaGammaCm = pa / w;
  const velocityRatio = (betaGammaCm * eStar) / (gammaCm * pStar);
  let maxLabAngleDeg: number | null = null;
  if (Math.abs(velocityRatio - 1) <= UNIT_VELOCITY_RATIO_TOLERANCE) maxLabAngleDeg = 90;
  else if (velocityRatio > 1) maxLabAngleDeg = radToDeg(Math.asin(Math.min(1, pStar / (mb * betaGammaCm))));
  return {
    ok: true,
    frame: {
      projectileMassKeV: ma, targetMassKeV: mA, ejectileMassKeV: mb, residualMassKeV: mB, beamEnergyKeV: ta, qValueKeV: q,
      invariantMassKeV: w, cmEnergyInKeV: tIn, cmEnergyOutKeV: tOut, cmMomentumKeV: pStar, ejectileCmTotalEnergyKeV: eStar,
      beamMomentumKeV: pa, gammaCm, betaGammaCm, velocityRatio, maxLabAngleDeg,
    },
  };
}

/** True when the frame counts as g = 1 (see UNIT_VELOCITY_RATIO_TOLERANCE). */
export function hasUnitVelocityRatio(frame: RelativisticCmFrame): boolean {
  return Math.abs(frame.velocityRatio - 1) <= UNIT_VELOCITY_RATIO_TOLERANCE;
}

function massesKeV(p: Omit<TwoBodyParams, 'beamEnergyKeV'>): { ma: number; mA: number; mb: number; mB: number } {
  const { projectileMassU, targetMassU, ejectileMassU, residualMassU, qValueKeV } = p;
  if (!(projectileMassU > 0) || !(targetMassU > 0) || !(ejectileMassU > 0) || !(residualMassU > 0)) {
    throw new RangeError(`all four masses must be positive (u), got ${projectileMassU}, ${targetMassU}, ${ejectileMassU}, ${residualMassU}`);
  }
  if (!Number.isFinite(qValueKeV)) throw new RangeError(`Q-value must be finite, got ${qValueKeV} keV`);
  const ma = projectileMassU * ATOMIC_MASS_UNIT_KEV;
  const mA = targetMassU * ATOMIC_MASS_UNIT_KEV;
  const mb = ejectileMassU * ATOMIC_MASS_UNIT_KEV;
  const mB = ma + mA - mb - qValueKeV;
  if (!(mB > 0)) throw new RangeError(`Q = ${qValueKeV} keV leaves the residual no mass (m_a + m_A − m_b − Q = ${mB} keV)`);
  return { ma, mA, mb, mB };
}
