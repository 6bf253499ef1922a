import type { SimulationSpecInput } from '../../pipeline/simulate/simulation-spec.js';

/**
 * A simulation spec (invented scenario: the "Harlow Fen" deuteron beam on a thick carbon foil)
 * where energy loss matters and the peak of interest is a reaction product behind a foil:
 * 2H at 1.6–2.4 MeV on 8000e15 12C atoms/cm² (≈ 160 µg/cm²) tilted 20°; the beam loses ≈ 45 keV
 * across it (NIST PSTAR at the same velocity), so mid-depth is ≈ 22 keV below the beam energy.
 * The detectors sit behind a 2 µm polyimide-like foil (C22H10N2O5, 280 µg/cm²) that every
 * detected particle crosses. Peak of interest: 12C(d,p0)13C (Q = +2722 keV from AME2020) with an
 * invented CM cross section; the reference is a thin gold film (its elastic deuterons cross the
 * foil too), measured after every sample run. 9 energies × 3 detectors = 27 sample rows.
 */
export function thickTargetReactionSpec(): SimulationSpecInput {
  const foil = [{ composition: { C: 22, H: 10, N: 2, O: 5 }, areal_density_ug_per_cm2: 280 }];
  return {
    seed: 9917,
    series: 'hfn-2026-c12-dp',
    title: 'Harlow Fen: 12C(d,p0) on a thick carbon foil behind a detector foil (simulated for end-to-end tests)',
    beam: { projectile: '2H', charge_state: 1 },
    channels: 1024,
    detectors: [
      { id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 18, solid_angle_msr: 3, true_solid_angle_msr: 3.08, half_aperture_deg: 1, absorber: foil },
      { id: 'd02', angle_deg: 135, angle_unc_deg: 0.2, resolution_fwhm_keV: 18, solid_angle_msr: 3, true_solid_angle_msr: 2.95, half_aperture_deg: 1, absorber: foil },
      { id: 'd03', angle_deg: 120, angle_unc_deg: 0.2, resolution_fwhm_keV: 20, solid_angle_msr: 3, true_solid_angle_msr: 3.02, half_aperture_deg: 1, absorber: foil },
    ],
    targets: [
      { id: 'au-ref', layers: [{ composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 40, areal_density_unc_rel: 0.03 }] },
      { id: 'c-thick', tilt_deg: 20, layers: [{ composition: { '12C': 1 }, areal_density_1e15_per_cm2: 8000, areal_density_unc_rel: 0.04 }] },
    ],
    peaks: [
      {
        label: '12C(d,p0)',
        target_nuclide: '12C',
        ejectile: '1H',
        excitation_keV: 0,
        truth: { cm_mb_per_sr: { base: 18, resonances: [{ energy_keV: 2100, fwhm_keV: 900, height: 9 }] } },
      },
    ],
    normalization: { method: 'reference-run', reference_target: 'au-ref', screening: 'lecuyer' },
    physics: { energy_loss: 'layers' },
    energies_keV: { from: 1600, to: 2400, step: 100 },
    beam_energy_unc_keV: 2,
    schedule: { sample_target: 'c-thick', samples_per_energy: 1, reference_every: 1, start_at: '2026-06-02T08:00:00Z', changeover_s: 180 },
    charge: { sample_uC: 150, reference_uC: 80, charge_reading_factor: 1, beam_current_nA: { sample: 100, reference: 80 } },
    dead_time: { model: 'uniform', live_fraction_min: 0.9, live_fraction_max: 0.98 },
    calibrations: [
      {
        version: 'cal-hfn-06a',
        from_run_index: 1,
        detectors: [
          { id: 'd01', offset_keV: 15, gain_keV_per_channel: 5.2 },
          { id: 'd02', offset_keV: 12, gain_keV_per_channel: 5.15 },
          { id: 'd03', offset_keV: 18, gain_keV_per_channel: 5.25 },
        ],
      },
    ],
    background: { flat_per_keV_per_uC: 0.002, exponential_per_keV_per_uC: 0.05, exponential_decay_keV: 400 },
  };
}
