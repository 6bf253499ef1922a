import { describe, expect, it } from 'vitest';
import { seriesSchema, type SeriesConfig } from '../../../pipeline/core/config/series-schema.js';
import { seriesPeakPlanner } from '../../../pipeline/core/kinematics/series-peak-planner.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';

const config = (beam: string, targets: object[], peaks: object[], detectors?: object[], physics?: object): SeriesConfig =>
  seriesSchema.parse({
    series: 'planner-test',
    beam: { projectile: beam, charge_state: 1 },
    detectors: detectors ?? [{ id: 'd01', angle_deg: 30, resolution_fwhm_keV: 20, solid_angle_msr: 1 }],
    targets: [{ id: 'ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 50 }] }, ...targets],
    peaks,
    normalization: { reference_target: 'ref' },
    ...(physics ? { physics } : {}),
  });

describe('series peak planner: the particle a detector sees', () => {
  it('elastic recoil detection (4He on 1H at 30°): E = 4 m1 m2/(m1 + m2)² · E0 · cos²φ (Chu, Mayer & Nicolet 1978), relativistic to O(T/mc²)', () => {
    const cfg = config('4He', [{ id: 'ch', layers: [{ composition: { C: 1, H: 1 }, areal_density_1e15_per_cm2: 100 }] }], [{ label: 'recoil 1H', target_nuclide: '1H', detect: 'recoil' }]);
    const plan = seriesPeakPlanner(cfg).samplePeaks(cfg.targets[1]!, cfg.detectors[0]!, 2000);
    expect(plan.problems.size).toBe(0);
    const p = plan.peaks[0]!;
    const m1 = nuclide('4He').massU;
    const m2 = nuclide('1H').massU;
    const expected = ((4 * m1 * m2) / (m1 + m2) ** 2) * 2000 * Math.cos((30 * Math.PI) / 180) ** 2;
    expect(p.reaction.detected.name).toBe('1H');
    expect(Math.abs(p.detectedEnergyKeV / expected - 1)).toBeLessThan(2000 / 3727e3);
    expect(p.reaction.elastic).toBe(true);
  });

  it('inverse kinematics (12C beam on 1H): two branches below θmax = asin(m_p/m_C) ≈ 4.79°, keyed [high]/[low]; beyond it a problem, no peak', () => {
    const target = { id: 'ch2', layers: [{ composition: { C: 1, H: 2 }, areal_density_1e15_per_cm2: 100 }] };
    const peaks = [{ label: '12C on 1H', target_nuclide: '1H' }];
    const cfg = config('12C', [target], peaks, [
      { id: 'd01', angle_deg: 3, resolution_fwhm_keV: 50, solid_angle_msr: 0.1 },
      { id: 'd02', angle_deg: 6, resolution_fwhm_keV: 50, solid_angle_msr: 0.1 },
    ]);
    const planner = seriesPeakPlanner(cfg);
    const inside = planner.samplePeaks(cfg.targets[1]!, cfg.detectors[0]!, 24000);
    expect(inside.peaks.map((p) => p.key)).toEqual(['12C on 1H [high]', '12C on 1H [low]']);
    expect(inside.peaks[0]!.detectedEnergyKeV).toBeGreaterThan(inside.peaks[1]!.detectedEnergyKeV);
    const beyond = planner.samplePeaks(cfg.targets[1]!, cfg.detectors[1]!, 24000);
    expect(beyond.peaks).toEqual([]);
    expect(beyond.problems.get('12C on 1H')).toMatch(/maximum|angle/i);
  });

  it('a reaction below threshold is a problem with the reason: 12C(α,α′)4.44 at 5 MeV (threshold ≈ 5.92 MeV)', () => {
    const cfg = config('4He', [{ id: 'c', layers: [{ composition: { '12C': 1 }, areal_density_1e15_per_cm2: 100 }] }], [{ label: '12C 4.44', target_nuclide: '12C', excitation_keV: 4439.8 }], [{ id: 'd01', angle_deg: 150, resolution_fwhm_keV: 20, solid_angle_msr: 1 }]);
    const plan = seriesPeakPlanner(cfg).samplePeaks(cfg.targets[1]!, cfg.detectors[0]!, 5000);
    expect(plan.peaks).toEqual([]);
    expect(plan.problems.get('12C 4.44')).toMatch(/threshold/i);
  });

  it('a nuclide in two layers: one window spanning both signals, reaction energy the atom-weighted mean of the mid-depth energies', () => {
    const cfg = config(
      '4He',
      [{ id: 'sandwich', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 300 }, { composition: { Au: 1 }, areal_density_1e15_per_cm2: 400 }, { composition: { C: 1 }, areal_density_1e15_per_cm2: 100 }] }],
      [{ label: '12C elastic', target_nuclide: '12C' }],
      [{ id: 'd01', angle_deg: 165, resolution_fwhm_keV: 15, solid_angle_msr: 1 }],
      { energy_loss: 'layers' },
    );
    const p = seriesPeakPlanner(cfg).samplePeaks(cfg.targets[1]!, cfg.detectors[0]!, 2000).peaks[0]!;
    // The back carbon layer sits behind 400e15 Au (≈ 40 keV of loss each way for 2 MeV 4He, NIST ASTAR):
    // the combined window is much wider than the resolution and its reaction energy below the front layer's.
    expect(p.fwhmKeV).toBeGreaterThan(60);
    expect(p.reactionEnergyKeV).toBeLessThan(2000 - 10);
    expect(p.atomsPerCm2).toBeCloseTo(400e15 * 0.9893, -10);
  });

  it('reference peaks: every isotope the reference layer holds (natural Cu: 63Cu and 65Cu, IUPAC 2013)', () => {
    const cfg = config('4He', [{ id: 'cu', layers: [{ composition: { Cu: 1 }, areal_density_1e15_per_cm2: 80 }] }], [{ label: '63Cu elastic', target_nuclide: '63Cu' }]);
    const plan = seriesPeakPlanner(cfg).referencePeaks(cfg.targets[1]!, 'Cu', cfg.detectors[0]!, 2000);
    expect(plan.peaks.map((p) => p.reaction.target.name).sort()).toEqual(['63Cu', '65Cu']);
  });
});
