/**
 * The benchmark run series: 1,000 runs (799 sample + 201 reference) × 16 detectors ×
 * 4,096 channels, the size DESIGN.md sets as the design target (≈ 180 MB of CSV). The
 * scenario is invented (a TiN film on carbon with a gold reference, 4He at 1.5-3.5 MeV,
 * detectors from 100° to 175°); only its size matters, but its spectra look like real ones.
 */
import type { SimulationSpecInput } from '../simulate/simulation-spec.js';

const detectors = Array.from({ length: 16 }, (_, i) => {
  const angle = 100 + 5 * i;
  const nominal = 1.5 + 0.1 * (i % 4);
  return {
    id: `d${String(i + 1).padStart(2, '0')}`, angle_deg: angle, angle_unc_deg: 0.2, resolution_fwhm_keV: 13 + (i % 5),
    solid_angle_msr: nominal, true_solid_angle_msr: Number((nominal * (1 + 0.01 * ((i % 7) - 3))).toFixed(4)),
  };
});
const calibration = (version: string, fromRunIndex: number, shift: number) => ({
  version, from_run_index: fromRunIndex,
  detectors: detectors.map((d, i) => ({ id: d.id, offset_keV: 15 + (i % 6) + shift, gain_keV_per_channel: Number((0.94 + 0.002 * (i % 8) + 0.001 * shift).toFixed(5)) })),
});

// 799 sample runs with a reference after every 4th, and first and last: 1 + 799 + 199 + 1 = 1,000 runs.
const energies = Array.from({ length: 799 }, (_, i) => 1500 + 2.5 * i);
export const BENCH_SPEC: SimulationSpecInput = {
  seed: 4096,
  series: 'bench-1000x16x4096',
  title: 'Benchmark series: 1,000 runs x 16 detectors x 4,096 channels (simulated)',
  beam: { projectile: '4He', charge_state: 1 },
  channels: 4096,
  detectors,
  targets: [
    { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 50, areal_density_unc_rel: 0.03 }, { composition: { C: 1 }, areal_density_1e15_per_cm2: 50, areal_density_unc_rel: 0.1 }] },
    { id: 'tin-on-c', layers: [{ composition: { Ti: 1, N: 1 }, areal_density_1e15_per_cm2: 300, areal_density_unc_rel: 0.04 }, { composition: { C: 1, O: 0.03 }, areal_density_1e15_per_cm2: 400, areal_density_unc_rel: 0.05 }] },
  ],
  peaks: [
    { label: '14N elastic', target_nuclide: '14N', excitation_keV: 0, truth: { ratio_to_rutherford: { base: 1.1, resonances: [{ energy_keV: 2350, fwhm_keV: 60, height: 0.8 }] } } },
    { label: '48Ti elastic', target_nuclide: '48Ti', excitation_keV: 0 },
    { label: '12C elastic', target_nuclide: '12C', excitation_keV: 0, truth: { ratio_to_rutherford: { base: 1.15, resonances: [{ energy_keV: 3050, fwhm_keV: 140, height: 1.6 }] } } },
    { label: '16O elastic', target_nuclide: '16O', excitation_keV: 0 },
  ],
  normalization: { method: 'reference-run', reference_target: 'au-ref', screening: 'lecuyer' },
  energies_keV: energies,
  beam_energy_unc_keV: 1.5,
  schedule: { sample_target: 'tin-on-c', samples_per_energy: 1, reference_every: 4, start_at: '2026-05-04T07:00:00Z', changeover_s: 120 },
  charge: { sample_uC: 10, reference_uC: 2, charge_reading_factor: 1.02, beam_current_nA: { sample: 20, reference: 10 } },
  dead_time: { model: 'non-paralyzable', dead_time_us: 300 },
  scalers: { pulser_rate_hz: 100, modes: [{ from_run_index: 1, mode: 'pulser' }, { from_run_index: 501, mode: 'live_time' }] },
  calibrations: [calibration('bench-cal-a', 1, 0), calibration('bench-cal-b', 401, 2), calibration('bench-cal-c', 801, -1)],
  background: { flat_per_keV_per_uC: 0.6, exponential_per_keV_per_uC: 8, exponential_decay_keV: 250 },
};

