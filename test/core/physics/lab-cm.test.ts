import { describe, expect, it } from 'vitest';
import {
  cmToLabAngleDeg, cmVelocityRatio, labToCmAngleDeg, maxLabAngleDeg, solidAngleJacobianLabPerCm,
} from '../../../pipeline/core/physics/lab-cm.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { ejectileEnergiesNonRelKeV, qValueKeV } from '../../../pipeline/core/physics/two-body-kinematics.js';

const m = (name: string) => nuclide(name).massU;
const rad = (deg: number) => (deg * Math.PI) / 180;

describe('lab <-> CM (Marion & Young, Nuclear Reaction Analysis, 1968)', () => {
  it('elastic scattering: gamma = M1/M2', () => {
    const p = { projectileMassU: m('4He'), targetMassU: m('28Si'), ejectileMassU: m('4He'), residualMassU: m('28Si'), beamEnergyKeV: 2000, qValueKeV: 0 };
    expect(cmVelocityRatio(p)).toBeCloseTo(m('4He') / m('28Si'), 14);
  });

  it.each([0.05, 0.3, 0.99])('round trip lab -> CM -> lab, gamma = %f', (gamma) => {
    for (const lab of [1, 30, 90, 135, 170, 179.5]) {
      expect(cmToLabAngleDeg(labToCmAngleDeg(lab, gamma), gamma)).toBeCloseTo(lab, 10);
    }
  });

  it('round trip on the forward branch for gamma > 1, RangeError beyond the maximum lab angle', () => {
    const gamma = 1.6;
    const maxDeg = maxLabAngleDeg(gamma);
    expect(maxDeg).toBeCloseTo((Math.asin(1 / 1.6) * 180) / Math.PI, 12);
    for (const lab of [5, 20, maxDeg - 0.01]) {
      expect(cmToLabAngleDeg(labToCmAngleDeg(lab, gamma), gamma)).toBeCloseTo(lab, 9);
    }
    expect(() => labToCmAngleDeg(maxDeg + 0.01, gamma)).toThrow(RangeError);
  });

  it('gamma -> 0 (infinitely heavy target): angles equal, Jacobian 1', () => {
    expect(labToCmAngleDeg(123.4, 0)).toBeCloseTo(123.4, 12);
    expect(solidAngleJacobianLabPerCm(77, 0)).toBe(1);
    expect(solidAngleJacobianLabPerCm(77, 1e-9)).toBeCloseTo(1, 8);
  });

  it('equal masses (gamma = 1): theta_cm = 2 theta_lab and dOmega_lab/dOmega_cm = 1/(4 cos theta_lab) (common practice)', () => {
    expect(labToCmAngleDeg(30, 1)).toBeCloseTo(60, 12);
    expect(solidAngleJacobianLabPerCm(60, 1)).toBeCloseTo(1 / (4 * Math.cos(rad(30))), 12);
  });

  it.each([0.1, 0.5, 0.9, 1.6, 3])('Jacobian equals |d cos(theta_lab) / d cos(theta_cm)| by central differences, gamma = %f', (gamma) => {
    const cosLab = (cosCm: number) => Math.cos(rad(cmToLabAngleDeg((Math.acos(cosCm) * 180) / Math.PI, gamma)));
    for (const cm of [10, 45, 100, 160]) {
      const x = Math.cos(rad(cm));
      const h = 1e-6;
      const numeric = Math.abs((cosLab(x + h) - cosLab(x - h)) / (2 * h));
      expect(solidAngleJacobianLabPerCm(cm, gamma) / numeric).toBeCloseTo(1, 7);
    }
  });

  it('lab energy from gamma and theta_cm, E_b = E_b,cm (1 + gamma^2 + 2 gamma cos theta_cm), agrees with the Q-equation: 12C(d,p)13C', () => {
    const q = qValueKeV(nuclide('2H'), nuclide('12C'), nuclide('1H'), nuclide('13C'));
    const p = { projectileMassU: m('2H'), targetMassU: m('12C'), ejectileMassU: m('1H'), residualMassU: m('13C'), beamEnergyKeV: 2000, qValueKeV: q };
    const gamma = cmVelocityRatio(p);
    // final-state CM energy, consistent with the Q-equation's momentum balance (total mass m_b + m_B)
    const finalCmKeV = p.beamEnergyKeV + q - (p.projectileMassU * p.beamEnergyKeV) / (p.ejectileMassU + p.residualMassU);
    const protonCmKeV = (finalCmKeV * p.residualMassU) / (p.ejectileMassU + p.residualMassU);
    for (const lab of [15, 90, 165]) {
      const cm = labToCmAngleDeg(lab, gamma);
      const [eb] = ejectileEnergiesNonRelKeV({ ...p, thetaLabDeg: lab });
      expect(protonCmKeV * (1 + gamma ** 2 + 2 * gamma * Math.cos(rad(cm))) / eb).toBeCloseTo(1, 12);
    }
  });

  it('gamma > 1 (13C(p,n)13N just above threshold): the two Q-equation roots are the forward and backward CM branches', () => {
    const q = qValueKeV(nuclide('1H'), nuclide('13C'), nuclide('1n'), nuclide('13N'));
    const p = { projectileMassU: m('1H'), targetMassU: m('13C'), ejectileMassU: m('1n'), residualMassU: m('13N'), beamEnergyKeV: 3240, qValueKeV: q };
    const gamma = cmVelocityRatio(p);
    expect(gamma).toBeGreaterThan(1);
    const finalCmKeV = p.beamEnergyKeV + q - (p.projectileMassU * p.beamEnergyKeV) / (p.ejectileMassU + p.residualMassU);
    const neutronCmKeV = (finalCmKeV * p.residualMassU) / (p.ejectileMassU + p.residualMassU);
    const lab = 10;
    const [high, low] = ejectileEnergiesNonRelKeV({ ...p, thetaLabDeg: lab });
    const forward = labToCmAngleDeg(lab, gamma);
    const backward = 180 + lab - (Math.asin(gamma * Math.sin(rad(lab))) * 180) / Math.PI;
    expect(neutronCmKeV * (1 + gamma ** 2 + 2 * gamma * Math.cos(rad(forward))) / high).toBeCloseTo(1, 10);
    expect(neutronCmKeV * (1 + gamma ** 2 + 2 * gamma * Math.cos(rad(backward))) / low).toBeCloseTo(1, 10);
    expect(cmToLabAngleDeg(backward, gamma)).toBeCloseTo(lab, 10);
  });

  it('rejects energies below threshold and invalid arguments', () => {
    const q = qValueKeV(nuclide('1H'), nuclide('13C'), nuclide('1n'), nuclide('13N'));
    const p = { projectileMassU: m('1H'), targetMassU: m('13C'), ejectileMassU: m('1n'), residualMassU: m('13N'), beamEnergyKeV: 3000, qValueKeV: q };
    expect(() => cmVelocityRatio(p)).toThrow(/below the threshold/);
    expect(() => cmVelocityRatio({ ...p, beamEnergyKeV: -1 })).toThrow(RangeError);
    expect(() => labToCmAngleDeg(30, -0.1)).toThrow(RangeError);
    expect(() => labToCmAngleDeg(190, 0.1)).toThrow(RangeError);
  });
});
