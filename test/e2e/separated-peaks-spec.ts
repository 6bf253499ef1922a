import type { SimulationSpecInput } from '../../pipeline/simulate/simulation-spec.js';

/**
 * A simulation spec (invented scenario: the "Brackwater tandem" 4He beam on an enriched 12C
 * foil with an oxide layer) built so that every expected peak of a spectrum is well separated
 * from every other: the sample holds only 12C and 16O (isotopically pure), the reference only
 * 197Au (monoisotopic) on a 12C backing. At 4He energies 1.5–3.5 MeV and 112°–165° the 12C and
 * 16O elastic peaks are ≥ 160 keV apart (kinematic factor, Chu, Mayer & Nicolet 1978), more than
 * the 4.5 FWHM a peak window plus its background windows and a neighbour's ±1 FWHM take, so no
 * `overlap-*` flag is expected.
 *
 * What the reduction must undo: true solid angles ≠ nominal (d04 more than 10 % off nominal on
 * purpose, so its rows must carry `uses-solid-angle-off-nominal`), a charge integrator reading
 * 4 % high, live-time clocks for the first 12 runs and a pulser after, a calibration version
 * change at run 10, and a falling background continuum. 21 sample energies × 5 detectors ×
 * 2 peaks = 210 sample rows; 28 runs of 1024 channels.
 */
export function separatedPeaksSpec(extra: Partial<SimulationSpecInput> = {}): SimulationSpecInput {
  return {
    seed: 7301,
    series: 'bkw-2026-c12-o16',
    title: 'Brackwater tandem: 4He on enriched 12C with oxide, 1.5-3.5 MeV (simulated for end-to-end tests)',
    beam: { projectile: '4He', charge_state: 1 },
    channels: 1024,
    detectors: [
      { id: 'd01', angle_deg: 165, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5, true_solid_angle_msr: 2.61 },
      { id: 'd02', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 16, solid_angle_msr: 2.5, true_solid_angle_msr: 2.44 },
      { id: 'd03', angle_deg: 140, angle_unc_deg: 0.25, resolution_fwhm_keV: 17, solid_angle_msr: 3.0, true_solid_angle_msr: 3.12 },
      { id: 'd04', angle_deg: 126, angle_unc_deg: 0.25, resolution_fwhm_keV: 18, solid_angle_msr: 3.0, true_solid_angle_msr: 3.55 },
      { id: 'd05', angle_deg: 112, angle_unc_deg: 0.3, resolution_fwhm_keV: 16, solid_angle_msr: 2.0, true_solid_angle_msr: 2.06 },
    ],
    targets: [
      {
        id: 'au-on-c',
        layers: [
          { composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 55, areal_density_unc_rel: 0.03 },
          { composition: { '12C': 1 }, areal_density_1e15_per_cm2: 30, areal_density_unc_rel: 0.1 },
        ],
      },
      {
        id: 'c12-oxide',
        layers: [
          { composition: { '16O': 1 }, areal_density_1e15_per_cm2: 25, areal_density_unc_rel: 0.06 },
          { composition: { '12C': 1 }, areal_density_1e15_per_cm2: 140, areal_density_unc_rel: 0.05 },
        ],
      },
    ],
    peaks: [
      {
        label: 'C-12 elastic',
        target_nuclide: '12C',
        excitation_keV: 0,
        truth: { ratio_to_rutherford: { base: 1.1, resonances: [{ energy_keV: 2600, fwhm_keV: 180, height: 1.3 }] } },
      },
      {
        label: 'O-16 elastic',
        target_nuclide: '16O',
        excitation_keV: 0,
        truth: { ratio_to_rutherford: { base: 0.97, resonances: [{ energy_keV: 3050, fwhm_keV: 120, height: 2.1 }] } },
      },
    ],
    normalization: { method: 'reference-run', reference_target: 'au-on-c', screening: 'lecuyer' },
    energies_keV: { from: 1500, to: 3500, step: 100 },
    beam_energy_unc_keV: 2.5,
    schedule: { sample_target: 'c12-oxide', samples_per_energy: 1, reference_every: 4, start_at: '2026-05-11T07:45:00Z', changeover_s: 180 },
    charge: { sample_uC: 30, reference_uC: 3, charge_reading_factor: 1.04, beam_current_nA: { sample: 40, reference: 10 } },
    dead_time: { model: 'uniform', live_fraction_min: 0.82, live_fraction_max: 0.98 },
    scalers: { pulser_rate_hz: 60, modes: [{ from_run_index: 1, mode: 'live_time' }, { from_run_index: 13, mode: 'pulser' }] },
    calibrations: [
      {
        version: 'cal-bkw-05a',
        from_run_index: 1,
        detectors: [
          { id: 'd01', offset_keV: 21.3, gain_keV_per_channel: 3.412 },
          { id: 'd02', offset_keV: 18.7, gain_keV_per_channel: 3.398 },
          { id: 'd03', offset_keV: 24.0, gain_keV_per_channel: 3.425 },
          { id: 'd04', offset_keV: 19.5, gain_keV_per_channel: 3.407 },
          { id: 'd05', offset_keV: 22.8, gain_keV_per_channel: 3.418 },
        ],
      },
      {
        version: 'cal-bkw-05b',
        from_run_index: 10,
        detectors: [
          { id: 'd01', offset_keV: 16.2, gain_keV_per_channel: 3.437 },
          { id: 'd02', offset_keV: 23.9, gain_keV_per_channel: 3.381 },
          { id: 'd03', offset_keV: 19.4, gain_keV_per_channel: 3.446 },
          { id: 'd04', offset_keV: 25.1, gain_keV_per_channel: 3.392 },
          { id: 'd05', offset_keV: 20.3, gain_keV_per_channel: 3.429 },
        ],
      },
    ],
    background: { flat_per_keV_per_uC: 0.003, exponential_per_keV_per_uC: 0.8, exponential_decay_keV: 220 },
    ...extra,
  };
}
