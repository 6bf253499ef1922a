import type { SimulationSpecInput } from '../../pipeline/simulate/simulation-spec.js';

/** A small simulation spec for tests: 2 detectors, 256 channels, 3 energies, 4He on single-nuclide targets. */
export function smallSpec(extra: Partial<SimulationSpecInput> = {}): SimulationSpecInput {
  return {
    seed: 42,
    series: 'test-small',
    title: 'small test series',
    beam: { projectile: '4He', charge_state: 1 },
    channels: 256,
    detectors: [
      { id: 'd01', angle_deg: 165, angle_unc_deg: 0.2, resolution_fwhm_keV: 40, solid_angle_msr: 2.5, true_solid_angle_msr: 2.6 },
      { id: 'd02', angle_deg: 135, angle_unc_deg: 0.2, resolution_fwhm_keV: 40, solid_angle_msr: 3, true_solid_angle_msr: 2.9 },
    ],
    targets: [
      { id: 'au-ref', layers: [{ composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
      { id: 'c12-foil', layers: [{ composition: { '12C': 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
    ],
    peaks: [
      { label: '12C elastic', target_nuclide: '12C', excitation_keV: 0, truth: { ratio_to_rutherford: { base: 1.2, resonances: [{ energy_keV: 2500, fwhm_keV: 150, height: 0.8 }] } } },
    ],
    normalization: { method: 'reference-run', reference_target: 'au-ref', screening: 'lecuyer' },
    energies_keV: { from: 2000, to: 3000, step: 500 },
    beam_energy_unc_keV: 2,
    schedule: { sample_target: 'c12-foil', samples_per_energy: 2, reference_every: 3, start_at: '2026-03-02T08:30:00Z', changeover_s: 60 },
    charge: { sample_uC: 20, reference_uC: 4, charge_reading_factor: 1.03, beam_current_nA: { sample: 20, reference: 8 } },
    dead_time: { model: 'uniform', live_fraction_min: 0.85, live_fraction_max: 0.99 },
    scalers: { pulser_rate_hz: 50, modes: [{ from_run_index: 1, mode: 'live_time' }, { from_run_index: 5, mode: 'pulser' }] },
    calibrations: [
      { version: 'cal-a', from_run_index: 1, detectors: [{ id: 'd01', offset_keV: 20, gain_keV_per_channel: 14 }, { id: 'd02', offset_keV: 25, gain_keV_per_channel: 14.2 }] },
      { version: 'cal-b', from_run_index: 6, detectors: [{ id: 'd01', offset_keV: 18, gain_keV_per_channel: 14.1 }, { id: 'd02', offset_keV: 27, gain_keV_per_channel: 14.05 }] },
    ],
    ...extra,
  };
}
