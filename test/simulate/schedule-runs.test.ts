import { describe, expect, it } from 'vitest';
import { scheduleRuns } from '../../pipeline/simulate/schedule-runs.js';
import { simulationSpecSchema } from '../../pipeline/simulate/simulation-spec.js';
import { smallSpec } from './small-spec.js';

describe('scheduleRuns', () => {
  it('puts a reference run first, after every k sample runs, and last (common practice of reference-run normalization)', () => {
    const runs = scheduleRuns(simulationSpecSchema.parse(smallSpec()));
    // 3 energies × 2 samples = 6 samples, k = 3: r s s s r s s s r (reference, sample).
    expect(runs.map((r) => r.kind[0]).join('')).toBe('rsssrsssr');
    expect(runs.map((r) => r.run)).toEqual(['r001', 'r002', 'r003', 'r004', 'r005', 'r006', 'r007', 'r008', 'r009']);
    expect(runs.map((r) => r.beamEnergyKeV)).toEqual([2000, 2000, 2000, 2500, 2500, 2500, 3000, 3000, 3000]);
    expect(runs.filter((r) => r.kind === 'reference').every((r) => r.target === 'au-ref')).toBe(true);
  });

  it('derives real time from charge and current (t = Q/I) and starts each run after the previous one plus changeover', () => {
    const runs = scheduleRuns(simulationSpecSchema.parse(smallSpec()));
    expect(runs[0]!.realTimeS).toBe(500); // 4 µC / 8 nA
    expect(runs[1]!.realTimeS).toBe(1000); // 20 µC / 20 nA
    expect(runs[0]!.startedAtMs).toBe(Date.parse('2026-03-02T08:30:00Z'));
    expect(runs[1]!.startedAtMs - runs[0]!.startedAtMs).toBe(560_000);
  });

  it('assigns calibration versions and scaler modes by from_run_index, and widens run ids past 999 runs', () => {
    const runs = scheduleRuns(simulationSpecSchema.parse(smallSpec()));
    expect(runs.map((r) => r.calibration)).toEqual([0, 0, 0, 0, 0, 1, 1, 1, 1]);
    expect(runs.map((r) => r.scalerMode[0]).join('')).toBe('llllppppp');
    const many = scheduleRuns(simulationSpecSchema.parse(smallSpec({ energies_keV: { from: 1000, to: 3000, step: 2 }, schedule: { sample_target: 'c12-foil', samples_per_energy: 1, reference_every: 10, start_at: '2026-03-02T08:30:00Z' } })));
    expect(many.length).toBeGreaterThan(999);
    expect(many[0]!.run).toBe('r0001');
    expect(many.filter((r) => r.kind === 'sample')).toHaveLength(1001);
  });
});
