import { describe, expect, it } from 'vitest';
import { detectorSchema, targetSchema } from '../../pipeline/core/config/series-schema.js';
import { kinematicsForReaction } from '../../pipeline/core/kinematics/kinematics-for-reaction.js';
import { reactionOfPeak } from '../../pipeline/core/kinematics/reaction-of-peak.js';
import { stoppingSlowingModel } from '../../pipeline/core/kinematics/stopping-slowing-model.js';
import { elasticKinematicFactor, lecuyerScreeningFactor, nuclide, rutherfordLabMbPerSr } from '../../pipeline/core/physics/index.js';
import { layerPeakLines, type LayerPeakInput } from '../../pipeline/simulate/layer-peak-lines.js';

const he4 = nuclide('4He');
const c12 = nuclide('12C');
const det = (angle: number, extra: object = {}) => detectorSchema.parse({ id: 'd01', angle_deg: angle, resolution_fwhm_keV: 15, solid_angle_msr: 2, ...extra });
const thin = targetSchema.parse({ id: 't', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 100 }] });
const input = (label: string, exKeV: number, o: Partial<LayerPeakInput>): LayerPeakInput => {
  const r = reactionOfPeak(he4, { label, target_nuclide: '12C', excitation_keV: exKeV, detect: 'ejectile' });
  if (!r.ok) throw new Error(r.reason);
  return {
    reaction: r.value, kinematics: kinematicsForReaction(r.value), truth: undefined, screening: 'lecuyer', target: thin, layerIndex: 0,
    atomsPerCm2: 100e15, detector: det(165), beamEnergyKeV: 2500, energyLoss: false, slowing: null, slices: 24, ...o,
  };
};
const ok = (r: ReturnType<typeof layerPeakLines>) => {
  if ('reason' in r) throw new Error(r.reason);
  return r;
};

describe('layerPeakLines (the simulator\'s own forward model)', () => {
  it('thin target, elastic with a ratio model: σ_lab = r · σ_R,lab · F (Darwin lab form, L\'Ecuyer 1979), at K·E (Chu, Mayer & Nicolet 1978, eq. 2.5; relativistic to 5e-4)', () => {
    const p = ok(layerPeakLines(input('12C elastic', 0, { truth: { ratio_to_rutherford: { base: 1.3, resonances: [] } } })));
    const sigmaR = rutherfordLabMbPerSr(2, 6, he4.massU, c12.massU, 2500, 165);
    const f = lecuyerScreeningFactor(2, 6, (2500 * c12.massU) / (he4.massU + c12.massU));
    expect(p.truth.dsigmaLabMbPerSr / (1.3 * sigmaR * f)).toBeCloseTo(1, 10);
    expect(p.truth.sigmaOverRutherford).toBeCloseTo(1.3, 12);
    expect(Math.abs(p.truth.emittedEnergyKeV / (elasticKinematicFactor(he4.massU, c12.massU, 165) * 2500) - 1)).toBeLessThan(2500 / 3727e3);
    expect(p.lines).toHaveLength(1);
    expect(p.lines[0]!.atomsTimesSigma).toBeCloseTo(p.truth.dsigmaLabMbPerSr * 100e15, -5);
  });

  it('inelastic, isotropic in the CM: σ_lab · dΩlab/dΩcm is the declared σ_cm at every angle', () => {
    for (const theta of [100, 135, 170]) {
      const p = ok(layerPeakLines(input('12C 4.44', 4438.9, { beamEnergyKeV: 9000, detector: det(theta), truth: { cm_mb_per_sr: { base: 12.5, resonances: [] } } })));
      expect(p.truth.dsigmaLabMbPerSr * p.truth.jacobianLabPerCm).toBeCloseTo(12.5, 10);
    }
  });

  it('nothing below the 12C(α,α′)4.439 threshold E = −Q (M1 + M2)/M2 ≈ 5.92 MeV', () => {
    const r = layerPeakLines(input('12C 4.44', 4438.9, { beamEnergyKeV: 5900, truth: { cm_mb_per_sr: { base: 10, resonances: [] } } }));
    expect('reason' in r).toBe(true);
  });

  it('thick layer: the lines span the layer, the truth sits at mid-depth, and a foil lowers every line by its energy loss', () => {
    const thick = targetSchema.parse({ id: 't', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 2000 }] });
    const slowing = stoppingSlowingModel();
    const p = ok(layerPeakLines(input('12C elastic', 0, { target: thick, energyLoss: true, slowing, atomsPerCm2: 2000e15 })));
    expect(p.lines).toHaveLength(24);
    const energies = p.lines.map((l) => l.energyKeV);
    // The deepest slice comes out lowest (energy lost both ways).
    expect(energies[23]!).toBeLessThan(energies[0]!);
    expect(p.truth.reactionEnergyKeV).toBeLessThan(2500);
    expect(p.truth.reactionEnergyKeV).toBeGreaterThan(2500 - 300);
    const foiled = ok(layerPeakLines(input('12C elastic', 0, { target: thick, energyLoss: true, slowing, atomsPerCm2: 2000e15, detector: det(165, { absorber: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 500 }] }) })));
    for (let j = 0; j < 24; j++) expect(foiled.lines[j]!.energyKeV).toBeLessThan(p.lines[j]!.energyKeV);
  });
});
