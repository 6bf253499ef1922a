import { describe, expect, it } from 'vitest';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { ejectileEnergiesNonRelKeV } from '../../../pipeline/core/physics/two-body-kinematics.js';
import { cmVelocityRatio, labToCmAngleDeg, solidAngleJacobianLabPerCm } from '../../../pipeline/core/physics/lab-cm.js';
import { relativisticCmToLab, relativisticLabSolutions } from '../../../pipeline/core/physics/relativistic-two-body-lab.js';
import { twoBodyParamsFromNuclides } from '../../../pipeline/core/physics/two-body-params-from-nuclides.js';
import type { TwoBodyParams } from '../../../pipeline/core/physics/two-body-kinematics.js';

const n = nuclide;
const U_KEV = 931494.10242;
const solve = (p: TwoBodyParams, thetaLabDeg: number) => {
  const r = relativisticLabSolutions({ ...p, thetaLabDeg });
  if (!r.ok) throw new Error(r.reason);
  return r.solutions;
};
const momentum = (tKeV: number, mKeV: number) => Math.sqrt(tKeV * (tKeV + 2 * mKeV));

describe('relativistic lab solutions: reactions with Q != 0', () => {
  it('3H(d,n)4He: D-T neutrons at 90 deg from 100 keV deuterons: 14.1 MeV (common practice, from memory) within 0.05 MeV', () => {
    const [s] = solve(twoBodyParamsFromNuclides(n('2H'), n('3H'), n('1n'), 100), 90);
    expect(Math.abs(s.ejectileEnergyKeV - 14_100)).toBeLessThan(50); // 14 068.8 keV here
  });

  it('2H(d,n)3He neutrons from deuterons at rest: 2.45 MeV (common practice, from memory) within 0.01 MeV', () => {
    const [s] = solve(twoBodyParamsFromNuclides(n('2H'), n('2H'), n('1n'), 1), 90);
    expect(Math.abs(s.ejectileEnergyKeV - 2450)).toBeLessThan(10);
  });

  it('14N(d,p0)15N, Q = 8608.7 keV (AME2020), 1.4 MeV deuterons at 150 deg: energy and momentum are conserved', () => {
    const p = twoBodyParamsFromNuclides(n('2H'), n('14N'), n('1H'), 1400);
    expect(p.qValueKeV).toBeCloseTo(8608.73, 1); // AME2020: S_n(15N) − B(2H) = 10 833.30 − 2 224.57 keV (from memory)
    const r = relativisticLabSolutions({ ...p, thetaLabDeg: 150 });
    if (!r.ok) throw new Error(r.reason);
    expect(r.solutions).toHaveLength(1);
    const s = r.solutions[0]!;
    expect(s.ejectileEnergyKeV + s.residualEnergyKeV).toBeCloseTo(1400 + p.qValueKeV, 6);
    const pb = momentum(s.ejectileEnergyKeV, r.frame.ejectileMassKeV);
    const pB = momentum(s.residualEnergyKeV, r.frame.residualMassKeV);
    const rad = Math.PI / 180;
    expect(pb * Math.sin(150 * rad) / (pB * Math.sin(s.residualThetaLabDeg * rad))).toBeCloseTo(1, 9);
    expect((pb * Math.cos(150 * rad) + pB * Math.cos(s.residualThetaLabDeg * rad)) / r.frame.beamMomentumKeV).toBeCloseTo(1, 9);
    // non-relativistic Q-equation (Marion & Young 1968) gives 8665.5 keV; relativity lowers it by ~T_b/(2 m_p c²) order
    const [nonRel] = ejectileEnergiesNonRelKeV({ ...p, thetaLabDeg: 150 });
    expect(s.ejectileEnergyKeV / nonRel - 1).toBeLessThan(0);
    expect(Math.abs(s.ejectileEnergyKeV / nonRel - 1)).toBeLessThan(8665 / (2 * 938_272));
  });

  it('7Li(p,a)4He: the partner of a detected alpha is itself a solution at its own angle (identical particles)', () => {
    const p = twoBodyParamsFromNuclides(n('1H'), n('7Li'), n('4He'), 1000);
    const [s] = solve(p, 60);
    const partner = solve(p, s.residualThetaLabDeg).find((x) => Math.abs(x.ejectileEnergyKeV - s.residualEnergyKeV) < 1e-6);
    expect(partner).toBeDefined();
    expect(partner!.thetaCmDeg).toBeCloseTo(180 - s.thetaCmDeg, 8);
  });

  it('7Li(p,n)7Be 10 keV above threshold: both neutron branches, forbidden beyond the maximum angle', () => {
    const p = twoBodyParamsFromNuclides(n('1H'), n('7Li'), n('1n'), 1890.6);
    const r = relativisticLabSolutions({ ...p, thetaLabDeg: 10 });
    expect(r.ok && r.solutions.map((x) => x.branch)).toEqual(['high', 'low']);
    const beyond = relativisticLabSolutions({ ...p, thetaLabDeg: 89 });
    expect(beyond.ok === false && beyond.reason).toMatch(/beyond the maximum lab angle/);
  });
});

describe('relativistic vs non-relativistic kinematics', () => {
  it('non-relativistic limit: matches ejectileEnergiesNonRelKeV (Marion & Young 1968) to 1e-6 relative at 1-2 keV', () => {
    const cases: [string, string, string, number, number, number][] = [
      ['1H', '12C', '1H', 1, 0, 150], ['4He', '197Au', '4He', 2, -0.5, 170], ['12C', '1H', '12C', 1, 0, 3],
      ['4He', '1H', '1H', 2, 0, 30],
    ];
    for (const [a, A, b, e, q, theta] of cases) {
      const base = twoBodyParamsFromNuclides(n(a), n(A), n(b), e);
      const p = q === 0 ? base : { ...base, qValueKeV: q };
      const rel = solve(p, theta).map((s) => s.ejectileEnergyKeV);
      const nonRel = ejectileEnergiesNonRelKeV({ ...p, thetaLabDeg: theta });
      expect(rel).toHaveLength(nonRel.length);
      rel.forEach((x, i) => expect(Math.abs(x / nonRel[i]! - 1), `${a}+${A} -> ${b} at ${theta} deg`).toBeLessThan(1e-6));
    }
  });

  it('10 MeV protons backscattered (180 deg) from 12C and 4He: relative change −2 M T/(M+m)² to 2 % (first order, derived here)', () => {
    // At 180° elastic, exactly p_b = p_a (M² − m²)/s with s = (m+M)² + 2 M T, so K_rel/K_nr = (1 + 2MT/(M+m)²)^-2 (2m+T)/(2m+T_b)
    // = 1 − 2 M T/(M+m)² + O(T²). Its size is at most T/(2 m c²) = 0.53 % (reached for M = m). Second order is
    // ~ (T/mc²) of the first, 1 %: hence the 2 % tolerance. 12C: −1.52e-3; 4He: −3.42e-3.
    for (const target of ['12C', '4He']) {
      const p = twoBodyParamsFromNuclides(n('1H'), n(target), n('1H'), 10_000);
      const [rel] = solve(p, 180);
      const [nonRel] = ejectileEnergiesNonRelKeV({ ...p, thetaLabDeg: 180 });
      const m = p.projectileMassU * U_KEV;
      const M = p.targetMassU * U_KEV;
      const firstOrder = (-2 * M * 10_000) / (M + m) ** 2;
      expect((rel.ejectileEnergyKeV / nonRel - 1) / firstOrder).toBeCloseTo(1, 1);
      expect(Math.abs(rel.ejectileEnergyKeV / nonRel - 1)).toBeLessThan(10_000 / (2 * m));
    }
  });

  it('elastic recoil: E_recoil = 4 m1 m2/(m1+m2)² E cos²φ in the non-relativistic limit (to 1e-6 relative at 1 keV)', () => {
    // Chu, Mayer & Nicolet, Backscattering Spectrometry (1978) ch. 2, recoil kinematic factor
    for (const [a, A] of [['4He', '1H'], ['4He', '2H'], ['1H', '1H']]) {
      const beamKeV = 1;
      const p = twoBodyParamsFromNuclides(n(a), n(A), n(A), beamKeV);
      for (const phi of [0, 20, 45, 80]) {
        const m1 = p.projectileMassU;
        const m2 = p.targetMassU;
        const expected = ((4 * m1 * m2) / (m1 + m2) ** 2) * beamKeV * Math.cos((phi * Math.PI) / 180) ** 2;
        const s = solve(p, phi);
        expect(s).toHaveLength(1);
        expect(Math.abs(s[0]!.ejectileEnergyKeV / expected - 1)).toBeLessThan(1e-6); // correction ~ T/(2 m c²) ≈ 5e-7
      }
      expect(relativisticLabSolutions({ ...p, thetaLabDeg: 90 }).ok).toBe(false);
      expect(relativisticLabSolutions({ ...p, thetaLabDeg: 120 }).ok).toBe(false);
    }
  });
});

describe('inverse kinematics, 12C beam on 1H', () => {
  const p = twoBodyParamsFromNuclides(n('12C'), n('1H'), n('12C'), 24_000);
  const r = relativisticLabSolutions({ ...p, thetaLabDeg: 2 });
  const thetaMax = r.ok ? r.frame.maxLabAngleDeg! : Number.NaN;

  it('two branches below θmax, converging at θmax (sin θmax = m_p/m_C), none beyond', () => {
    expect(r.ok && r.solutions.map((s) => s.branch)).toEqual(['high', 'low']);
    const near = solve(p, thetaMax * (1 - 1e-10));
    expect(near).toHaveLength(2);
    expect(near[1]!.ejectileEnergyKeV / near[0]!.ejectileEnergyKeV).toBeCloseTo(1, 4);
    const at = solve(p, thetaMax);
    expect(at[1]!.ejectileEnergyKeV / at[0]!.ejectileEnergyKeV).toBeCloseTo(1, 5);
    // both CM angles meet where cos θcm = −1/g
    expect(near[0]!.thetaCmDeg).toBeCloseTo(near[1]!.thetaCmDeg, 2);
    const g = r.ok ? r.frame.velocityRatio : Number.NaN;
    expect(near[0]!.thetaCmDeg).toBeCloseTo((Math.acos(-1 / g) * 180) / Math.PI, 2);
    const beyond = relativisticLabSolutions({ ...p, thetaLabDeg: thetaMax + 1e-3 });
    expect(beyond.ok === false && beyond.reason).toMatch(/beyond the maximum lab angle 4\.8177/);
  });

  it('CM angle -> lab and lab -> CM agree on both branches', () => {
    for (const thetaCmDeg of [10, 60, 95, 120, 170]) {
      const c = relativisticCmToLab({ ...p, thetaCmDeg });
      if (!c.ok) throw new Error(c.reason);
      const back = solve(p, c.solution.thetaLabDeg).find((s) => s.branch === c.solution.branch)!;
      expect(back.thetaCmDeg).toBeCloseTo(thetaCmDeg, 7);
      expect(back.ejectileEnergyKeV / c.solution.ejectileEnergyKeV).toBeCloseTo(1, 9);
      expect(back.jacobianLabPerCm / c.solution.jacobianLabPerCm).toBeCloseTo(1, 7);
    }
  });
});

describe('solid-angle Jacobian dΩ_lab/dΩ_cm (exact relativistic form)', () => {
  /** Σ over branches of ∫ dΩ_lab / J must be the full CM sphere, 4π. */
  const cmSolidAngle = (p: TwoBodyParams, maxDeg: number | null): number => {
    const steps = 20_000;
    const top = maxDeg === null ? Math.PI : (maxDeg * Math.PI) / 180;
    let sum = 0;
    for (let i = 0; i < steps; i++) {
      const u = (i + 0.5) / steps;
      // θ = top (1 − u²) for a double-valued ejectile removes the 1/sqrt(θmax − θ) end point; plain midpoint otherwise
      const theta = maxDeg === null ? u * top : top * (1 - u * u);
      const dTheta = maxDeg === null ? top / steps : (2 * top * u) / steps;
      const r = relativisticLabSolutions({ ...p, thetaLabDeg: (theta * 180) / Math.PI });
      if (!r.ok) throw new Error(r.reason);
      for (const s of r.solutions) sum += (2 * Math.PI * Math.sin(theta) * dTheta) / s.jacobianLabPerCm;
    }
    return sum;
  };

  it('integrates to 4π: 14N(d,p) at 1.4 MeV, 12C on 1H at 100 MeV/u (γ_cm = 1.09), 7Li(p,n) 10 keV above threshold', () => {
    const cases = [
      twoBodyParamsFromNuclides(n('2H'), n('14N'), n('1H'), 1400),
      twoBodyParamsFromNuclides(n('12C'), n('1H'), n('12C'), 1_200_000),
      twoBodyParamsFromNuclides(n('1H'), n('7Li'), n('1n'), 1890.6),
    ];
    for (const p of cases) {
      const r = relativisticLabSolutions({ ...p, thetaLabDeg: 0 });
      if (!r.ok) throw new Error(r.reason);
      expect(cmSolidAngle(p, r.frame.maxLabAngleDeg) / (4 * Math.PI)).toBeCloseTo(1, 4);
    }
  });

  it('equals sin θ dθ / (sin θcm dθcm) from a finite difference of the CM -> lab map', () => {
    const p = twoBodyParamsFromNuclides(n('12C'), n('1H'), n('12C'), 1_200_000);
    const h = 1e-4;
    for (const thetaCmDeg of [30, 90, 150]) {
      const lab = (t: number) => { const c = relativisticCmToLab({ ...p, thetaCmDeg: t }); if (!c.ok) throw new Error(c.reason); return c.solution; };
      const rad = Math.PI / 180;
      const dLab = (Math.cos(lab(thetaCmDeg - h).thetaLabDeg * rad) - Math.cos(lab(thetaCmDeg + h).thetaLabDeg * rad));
      const dCm = Math.cos((thetaCmDeg - h) * rad) - Math.cos((thetaCmDeg + h) * rad);
      expect(lab(thetaCmDeg).jacobianLabPerCm / Math.abs(dLab / dCm)).toBeCloseTo(1, 6);
    }
  });

  it('non-relativistic limit: equals solidAngleJacobianLabPerCm of lab-cm.ts (Marion & Young 1968) to 1e-6', () => {
    for (const [a, A, theta] of [['4He', '12C', 150], ['1H', '197Au', 90], ['12C', '1H', 4]] as const) {
      const p = twoBodyParamsFromNuclides(n(a), n(A), n(a), 1);
      const [s] = solve(p, theta);
      const gamma = cmVelocityRatio(p);
      expect(s.thetaCmDeg / labToCmAngleDeg(theta, gamma)).toBeCloseTo(1, 6);
      expect(s.jacobianLabPerCm / solidAngleJacobianLabPerCm(s.thetaCmDeg, gamma)).toBeCloseTo(1, 6);
    }
  });
});

describe('arguments', () => {
  it('throws RangeError for bad angles, never for forbidden physics', () => {
    const p = twoBodyParamsFromNuclides(n('1H'), n('12C'), n('1H'), 1000);
    expect(() => relativisticLabSolutions({ ...p, thetaLabDeg: -1 })).toThrow(RangeError);
    expect(() => relativisticLabSolutions({ ...p, thetaLabDeg: 181 })).toThrow(RangeError);
    expect(() => relativisticCmToLab({ ...p, thetaCmDeg: Number.NaN })).toThrow(RangeError);
    const inelastic = twoBodyParamsFromNuclides(n('1H'), n('12C'), n('1H'), 1000, 4438.9);
    const below = relativisticLabSolutions({ ...inelastic, thetaLabDeg: 150 });
    expect(below.ok === false && below.reason).toMatch(/below the threshold/);
  });

  it('elastic recoil at θcm = 180 deg leaves the target at rest: no lab angle', () => {
    const p = twoBodyParamsFromNuclides(n('4He'), n('1H'), n('1H'), 2000);
    const r = relativisticCmToLab({ ...p, thetaCmDeg: 180 });
    expect(r.ok === false && r.reason).toMatch(/at rest/);
  });
});
