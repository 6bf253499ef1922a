import { describe, expect, it } from 'vitest';
import { seriesSchema } from '../../../pipeline/core/config/series-schema.js';
import { seriesPeakPlanner } from '../../../pipeline/core/kinematics/series-peak-planner.js';
import { samplePoisson } from '../../../pipeline/core/random/sample-poisson.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { addGaussianOverChannels } from '../../../pipeline/simulate/add-gaussian-over-channels.js';
import { fitDetectorCalibration } from '../../../stages/calibrate/fit-detector-calibration.js';
import { sourceLines } from '../../../stages/calibrate/source-lines.js';

const config = seriesSchema.parse({
  series: 'cal-unit',
  beam: { projectile: '4He', charge_state: 1 },
  detectors: [{ id: 'd01', angle_deg: 150, resolution_fwhm_keV: 16, solid_angle_msr: 2 }],
  targets: [{ id: 'tri', layers: [{ composition: { Au: 1, Ag: 1, Si: 1 }, areal_density_1e15_per_cm2: 50 }] }],
  peaks: [{ label: 'Si elastic', target_nuclide: '28Si' }],
  normalization: { reference_target: 'tri' },
  calibration_sources: [{ id: 'mixed-alpha', lines_from: ['239Pu', '241Am', '244Cm'] }, { id: 'tri-elastic', target: 'tri' }],
});
const det = config.detectors[0]!;
const planner = seriesPeakPlanner(config);
const prior = { version: 'prior', offsetKeV: 0, gainKeVPerChannel: 3.3, quadraticKeVPerChannel2: 0, covariance: [] };

/** A seeded Poisson spectrum of Gaussian lines (E keV, expected counts) through E = a + b·ch, on a flat floor. */
function spectrum(lines: readonly [number, number][], a: number, b: number, seed: number): Float64Array {
  const mu = new Float64Array(2048).fill(0.5);
  for (const [e, n] of lines) addGaussianOverChannels(mu, n, e, det.resolution_fwhm_keV, a, b);
  const rng = Xoshiro128StarStar.fromSeed(seed, 1, 1);
  return mu.map((m) => samplePoisson(rng, m));
}

describe('calibration source lines', () => {
  it('merges the 239Pu 5156.59/5144.3 keV pair at 16 keV FWHM to their DDEP intensity-weighted mean (70.77 %, 17.11 %: 5154.20 keV) and drops 241Am 5388.23 keV (1.66 %, under 5 % of the 84.45 % line)', () => {
    const lines = sourceLines(config, config.calibration_sources[0]!, det, planner, Number.NaN, 0);
    const pu = lines.find((l) => l.label.startsWith('239Pu 5144.3+5156.6'))!;
    expect(pu.energyKeV).toBeCloseTo((70.77 * 5156.59 + 17.11 * 5144.3) / (70.77 + 17.11), 6);
    expect(lines.some((l) => l.members.some((m) => m.energyKeV === 5388.23))).toBe(false);
    expect(lines.length).toBe(6);
  });

  it('a target source gives each nuclide\'s elastic peak at the planner\'s detected energy, u(E) = u(E_beam)·E/E_beam, isotopes of one element within the FWHM merged, weak ones dropped; it needs a beam energy', () => {
    const lines = sourceLines(config, config.calibration_sources[1]!, det, planner, 2000, 2);
    const elastic = planner.elasticPeaks(config.targets[0]!, det, 2000).peaks;
    const members = lines.flatMap((l) => l.members);
    // Every member is a planned elastic peak; a weak minor isotope (under 5 % of its element's strongest line) is dropped.
    expect(members.length).toBeGreaterThanOrEqual(4);
    expect(members.length).toBeLessThanOrEqual(elastic.length);
    for (const m of members) {
      const p = elastic.find((x) => x.detectedEnergyKeV === m.energyKeV)!;
      expect(m.energyUncKeV).toBeCloseTo((2 * p.detectedEnergyKeV) / 2000, 12);
    }
    // 107Ag and 109Ag lie < 16 keV apart at 150°: one line of two members; Au has one isotope.
    expect(lines.filter((l) => l.nuclide === 'Ag').map((l) => l.members.length)).toEqual([2]);
    expect(lines.filter((l) => l.nuclide === 'Au').map((l) => l.members.length)).toEqual([1]);
    expect(() => sourceLines(config, config.calibration_sources[1]!, det, planner, Number.NaN, 0)).toThrow(/beam_energy_keV/);
  });
});

describe('fitDetectorCalibration on seeded simulated spectra (truth: the generating calibration)', () => {
  it('recovers offset and gain from a mixed-alpha spectrum within its covariance (χ² of 2 dof < 13.8, P = 0.001) over 10 seeds', () => {
    const lines = sourceLines(config, config.calibration_sources[0]!, det, planner, Number.NaN, 0);
    const truth = { a: 12.5, b: 3.41 };
    const emitted = lines.flatMap((l) => l.members.map((m) => [m.energyKeV, 300 * m.intensityPercent] as [number, number]));
    let sum = 0;
    for (let seed = 1; seed <= 10; seed++) {
      const r = fitDetectorCalibration(spectrum(emitted, truth.a, truth.b, seed), lines, { fwhmKeV: 16, prior, degree: 1, searchThreshold: 5, matchToleranceKeV: 25, gainRangeRel: 0.2 });
      expect(r.ok, r.diagnostics.map((d) => d.message).join('; ')).toBe(true);
      const f = r.fit!;
      const [[c00, c01], [, c11]] = f.covariance as [[number, number], [number, number]];
      const x = f.offsetKeV - truth.a;
      const y = f.gainKeVPerChannel - truth.b;
      const chi2 = (c11 * x * x - 2 * c01 * x * y + c00 * y * y) / (c00 * c11 - c01 * c01);
      expect(chi2).toBeLessThan(13.8);
      sum += chi2;
    }
    // Σχ² over 10 seeds follows χ²(20): mean 20; P(> 45) ≈ 0.001.
    expect(sum).toBeLessThan(45);
  });

  it('refuses an assignment from two lines (two points fix a line and test nothing) with calibration-assignment-ambiguous', () => {
    const lines = sourceLines(config, { id: 'two', lines_from: ['148Gd', '210Po'] }, det, planner, Number.NaN, 0);
    const r = fitDetectorCalibration(spectrum([[3182.69, 2e4], [5304.33, 2e4]], 12.5, 3.41, 3), lines, { fwhmKeV: 16, prior, degree: 1, searchThreshold: 5, matchToleranceKeV: 25, gainRangeRel: 0.2 });
    expect(r.ok).toBe(false);
    expect(r.diagnostics.map((d) => d.rule)).toEqual(['calibration-assignment-ambiguous']);
  });

  it('with elastic peaks of Au, Ag and Si at a known beam energy recovers the gain within 3σ', () => {
    const lines = sourceLines(config, config.calibration_sources[1]!, det, planner, 2500, 1);
    const truth = { a: 8, b: 3.35 };
    const r = fitDetectorCalibration(spectrum(lines.flatMap((l) => l.members.map((m) => [m.energyKeV, 500 * m.intensityPercent] as [number, number])), truth.a, truth.b, 11), lines, { fwhmKeV: 16, prior, degree: 1, searchThreshold: 5, matchToleranceKeV: 25, gainRangeRel: 0.2 });
    expect(r.ok, r.diagnostics.map((d) => d.message).join('; ')).toBe(true);
    expect(Math.abs(r.fit!.gainKeVPerChannel - truth.b)).toBeLessThan(3 * Math.sqrt(r.fit!.covariance[1]![1]!));
  });
});
