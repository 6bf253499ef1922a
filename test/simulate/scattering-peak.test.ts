import { describe, expect, it } from 'vitest';
import {
  ejectileEnergiesNonRelKeV, elasticKinematicFactor, lecuyerScreeningFactor, nuclide, rutherfordLabMbPerSr,
} from '../../pipeline/core/physics/index.js';
import { scatteringPeak } from '../../pipeline/simulate/scattering-peak.js';

const he4 = nuclide('4He');
const c12 = nuclide('12C');
const au = nuclide('197Au');

describe('scatteringPeak', () => {
  it('elastic with a ratio model: σ_lab = r · σ_R,lab · F_L\'Ecuyer and σ/σ_R = r', () => {
    const truth = { ratio_to_rutherford: { base: 1.3, resonances: [] } };
    const p = scatteringPeak(he4, c12, 0, 2500, 165, truth, 'lecuyer')!;
    const sigmaR = rutherfordLabMbPerSr(2, 6, he4.massU, c12.massU, 2500, 165);
    const f = lecuyerScreeningFactor(2, 6, (2500 * c12.massU) / (he4.massU + c12.massU));
    expect(p.dsigmaLabMbPerSr).toBeCloseTo(1.3 * sigmaR * f, 10);
    expect(p.sigmaOverRutherford).toBeCloseTo(1.3, 12);
    expect(p.peakEnergyKeV).toBeCloseTo(elasticKinematicFactor(he4.massU, c12.massU, 165) * 2500, 9);
    expect(p.dsigmaCmMbPerSr / p.dsigmaLabMbPerSr).toBeCloseTo(p.jacobianLabPerCm, 12);
  });

  it('defaults to Rutherford (σ/σ_R = 1) and leaves screening out when the series says `none`', () => {
    const p = scatteringPeak(he4, au, 0, 2000, 150, undefined, 'none')!;
    expect(p.screeningFactor).toBe(1);
    expect(p.dsigmaLabMbPerSr).toBeCloseTo(rutherfordLabMbPerSr(2, 79, he4.massU, au.massU, 2000, 150), 9);
  });

  it('inelastic, isotropic in the CM: σ_lab · dΩlab/dΩcm is the declared σ_cm at every angle', () => {
    const truth = { cm_mb_per_sr: { base: 12.5, resonances: [] } };
    for (const theta of [100, 135, 170]) {
      const p = scatteringPeak(he4, c12, -4438.9, 9000, theta, truth, 'lecuyer')!;
      expect(p.dsigmaLabMbPerSr * p.jacobianLabPerCm).toBeCloseTo(12.5, 10);
      expect(p.peakEnergyKeV).toBeCloseTo(ejectileEnergiesNonRelKeV({
        projectileMassU: he4.massU, targetMassU: c12.massU, ejectileMassU: he4.massU, residualMassU: c12.massU,
        beamEnergyKeV: 9000, qValueKeV: -4438.9, thetaLabDeg: theta,
      })[0]!, 9);
    }
  });

  it('generates nothing below the 12C(α,α′)4.439 threshold E = −Q (M1 + M2)/M2 ≈ 5.92 MeV, nor on a target lighter than the beam', () => {
    const truth = { cm_mb_per_sr: { base: 10, resonances: [] } };
    expect(scatteringPeak(he4, c12, -4438.9, 3600, 150, truth, 'lecuyer')).toBeNull();
    expect(scatteringPeak(he4, c12, -4438.9, 5900, 150, truth, 'lecuyer')).toBeNull();
    expect(scatteringPeak(he4, nuclide('1H'), 0, 2000, 30, undefined, 'lecuyer')).toBeNull();
  });
});
