import { describe, expect, it } from 'vitest';
import { labToCmAngleDeg, solidAngleJacobianLabPerCm } from '../../../pipeline/core/physics/lab-cm.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { rutherfordCmMbPerSr } from '../../../pipeline/core/physics/rutherford-cm.js';
import { rutherfordLabLogDerivatives, rutherfordLabMbPerSr } from '../../../pipeline/core/physics/rutherford-lab.js';

const he4 = nuclide('4He').massU;
const au = nuclide('197Au').massU;

describe('Rutherford lab form with recoil (Darwin, Phil. Mag. 27, 499 (1914); Chu, Mayer & Nicolet 1978, ch. 2)', () => {
  it('tends to the CM form at the lab energy and angle as M1/M2 -> 0', () => {
    for (const theta of [20, 90, 150, 180]) {
      const lab = rutherfordLabMbPerSr(2, 79, 4, 4e9, 2000, theta);
      expect(lab / rutherfordCmMbPerSr(2, 79, 2000, theta)).toBeCloseTo(1, 8);
    }
  });

  it.each([
    ['4He', '197Au', 2, 79],
    ['4He', '12C', 2, 6],
    ['1H', '28Si', 1, 14],
    ['2H', '4He', 1, 2],
  ])('%s on %s: lab = CM(theta_cm, E M2/(M1+M2)) x dOmega_cm/dOmega_lab', (p, t, z1, z2) => {
    const m1 = nuclide(p).massU;
    const m2 = nuclide(t).massU;
    const gamma = m1 / m2;
    for (const theta of [10, 45, 89.9, 90, 90.1, 135, 170, 180]) {
      const cm = labToCmAngleDeg(theta, gamma);
      const expected = rutherfordCmMbPerSr(z1, z2, (1500 * m2) / (m1 + m2), cm) / solidAngleJacobianLabPerCm(cm, gamma);
      expect(rutherfordLabMbPerSr(z1, z2, m1, m2, 1500, theta) / expected).toBeCloseTo(1, 11);
    }
  });

  it('log derivatives agree with central finite differences', () => {
    for (const [m1, m2] of [[he4, au], [he4, 12], [1.0078, 4.0026]]) {
      for (const theta of [15, 60, 89, 91, 150, 175, 179.9]) {
        const e = 2500;
        const d = rutherfordLabLogDerivatives(2, 6, m1, m2, e, theta);
        const lnS = (ee: number, th: number) => Math.log(rutherfordLabMbPerSr(2, 6, m1, m2, ee, th));
        const hE = 1e-3;
        const hT = 1e-4;
        const dE = (lnS(e + hE, theta) - lnS(e - hE, theta)) / (2 * hE);
        const dT = (lnS(e, theta + hT) - lnS(e, theta - hT)) / (2 * hT);
        expect(d.dLnSigmaDEnergyPerKeV).toBeCloseTo(-2 / e, 15);
        expect(Math.abs(d.dLnSigmaDEnergyPerKeV - dE)).toBeLessThan(1e-9);
        expect(Math.abs(d.dLnSigmaDThetaPerDeg - dT)).toBeLessThan(1e-7 * Math.max(1, Math.abs(dT)));
      }
    }
    // at 180 deg the cross section is stationary in angle
    expect(rutherfordLabLogDerivatives(2, 79, he4, au, 2000, 180).dLnSigmaDThetaPerDeg).toBeCloseTo(0, 14);
  });

  it('M1 >= M2 (inverse kinematics) is refused with a RangeError', () => {
    expect(() => rutherfordLabMbPerSr(6, 2, 12, 4, 2000, 20)).toThrow(/lighter than target/);
    expect(() => rutherfordLabMbPerSr(2, 2, 4, 4, 2000, 20)).toThrow(RangeError);
    expect(() => rutherfordLabLogDerivatives(6, 2, 12, 4, 2000, 20)).toThrow(RangeError);
    expect(() => rutherfordLabMbPerSr(2, 79, 4, 197, 2000, 0)).toThrow(RangeError);
  });
});
