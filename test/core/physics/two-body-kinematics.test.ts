import { describe, expect, it } from 'vitest';
import { elasticKinematicFactor } from '../../../pipeline/core/physics/elastic-kinematic-factor.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { ejectileEnergiesNonRelKeV, qValueKeV } from '../../../pipeline/core/physics/two-body-kinematics.js';

const m = (name: string) => nuclide(name).massU;

describe('non-relativistic Q-equation (Marion & Young, Nuclear Reaction Analysis, 1968)', () => {
  it('elastic (Q = 0) gives K E with K from Chu, Mayer & Nicolet 1978 eq. 2.5', () => {
    for (const theta of [20, 90, 150, 180]) {
      const [e] = ejectileEnergiesNonRelKeV({
        projectileMassU: m('4He'), targetMassU: m('12C'), ejectileMassU: m('4He'), residualMassU: m('12C'),
        beamEnergyKeV: 2000, qValueKeV: 0, thetaLabDeg: theta,
      });
      expect(e / (2000 * elasticKinematicFactor(m('4He'), m('12C'), theta))).toBeCloseTo(1, 12);
    }
  });

  it('M1 > M2 elastic gives both branches, [(M1 cos θ ± sqrt(M2² − M1² sin² θ))/(M1+M2)]² E, descending', () => {
    const energies = ejectileEnergiesNonRelKeV({
      projectileMassU: 4, targetMassU: 1, ejectileMassU: 4, residualMassU: 1, beamEnergyKeV: 1000, qValueKeV: 0, thetaLabDeg: 10,
    });
    const c = Math.cos(Math.PI / 18);
    const root = Math.sqrt(1 - 16 * Math.sin(Math.PI / 18) ** 2);
    expect(energies).toHaveLength(2);
    expect(energies[0]).toBeCloseTo(1000 * ((4 * c + root) / 5) ** 2, 9);
    expect(energies[1]).toBeCloseTo(1000 * ((4 * c - root) / 5) ** 2, 9);
    expect(ejectileEnergiesNonRelKeV({
      projectileMassU: 4, targetMassU: 1, ejectileMassU: 4, residualMassU: 1, beamEnergyKeV: 1000, qValueKeV: 0, thetaLabDeg: 20,
    })).toEqual([]);
  });

  it('13C(p,n)13N: no neutrons below the threshold E_th = -Q (m_n + M_B)/(m_n + M_B - m_p) = 3236 keV (from memory)', () => {
    const q = qValueKeV(nuclide('1H'), nuclide('13C'), nuclide('1n'), nuclide('13N'));
    const threshold = (-q * (m('1n') + m('13N'))) / (m('1n') + m('13N') - m('1H'));
    expect(Math.abs(threshold - 3236)).toBeLessThan(2);
    const p = { projectileMassU: m('1H'), targetMassU: m('13C'), ejectileMassU: m('1n'), residualMassU: m('13N'), qValueKeV: q, thetaLabDeg: 0 };
    expect(ejectileEnergiesNonRelKeV({ ...p, beamEnergyKeV: threshold - 1 })).toEqual([]);
    const above = ejectileEnergiesNonRelKeV({ ...p, beamEnergyKeV: threshold + 1 });
    expect(above).toHaveLength(2); // just above threshold both neutron branches go forward
    expect(above[0]).toBeGreaterThan(above[1]);
  });

  it('rejects invalid arguments', () => {
    const p = { projectileMassU: 4, targetMassU: 12, ejectileMassU: 4, residualMassU: 12, beamEnergyKeV: 1000, qValueKeV: 0, thetaLabDeg: 90 };
    expect(() => ejectileEnergiesNonRelKeV({ ...p, beamEnergyKeV: 0 })).toThrow(RangeError);
    expect(() => ejectileEnergiesNonRelKeV({ ...p, residualMassU: 0 })).toThrow(RangeError);
    expect(() => ejectileEnergiesNonRelKeV({ ...p, thetaLabDeg: -1 })).toThrow(RangeError);
  });
});

describe('Q-values from AME2020 atomic masses', () => {
  // Independent path: sums of the mass excesses (keV column of mass.mas20, AME2020):
  // 1H 7288.971064, 2H 13135.722895, 4He 2424.91587, 12C 0, 13C 3125.00933, 14N 2863.41683,
  // 15N 101.43809, 24Mg -13933.578, 27Al -17196.864. Tolerance 0.01 keV (rounding of the file).
  // Published Q-values (from memory): 12C(d,p)13C 2.722 MeV, 14N(d,p)15N 8.609 MeV, 27Al(p,a)24Mg 1.601 MeV; tolerance 1 keV.
  it.each([
    ['2H', '12C', '1H', '13C', 13135.722895 + 0 - 7288.971064 - 3125.00933, 2722],
    ['2H', '14N', '1H', '15N', 13135.722895 + 2863.41683 - 7288.971064 - 101.43809, 8609],
    ['1H', '27Al', '4He', '24Mg', 7288.971064 - 17196.864 - 2424.91587 + 13933.578, 1601],
  ])('%s + %s -> %s + %s', (a, target, b, residual, fromMassExcessKeV, publishedKeV) => {
    const q = qValueKeV(nuclide(a), nuclide(target), nuclide(b), nuclide(residual));
    expect(Math.abs(q - fromMassExcessKeV)).toBeLessThan(0.01);
    expect(Math.abs(q - publishedKeV)).toBeLessThan(1);
  });

  it('a residual left excited lowers Q by its excitation energy', () => {
    const ground = qValueKeV(nuclide('4He'), nuclide('12C'), nuclide('4He'), nuclide('12C'));
    expect(ground).toBe(0);
    expect(qValueKeV(nuclide('4He'), nuclide('12C'), nuclide('4He'), nuclide('12C'), 4438.9)).toBe(-4438.9);
  });

  it('refuses a reaction that does not conserve charge or mass number', () => {
    expect(() => qValueKeV(nuclide('2H'), nuclide('12C'), nuclide('1H'), nuclide('13N'))).toThrow(/does not conserve/);
    expect(() => qValueKeV(nuclide('2H'), nuclide('12C'), nuclide('1H'), nuclide('12C'))).toThrow(RangeError);
  });
});
