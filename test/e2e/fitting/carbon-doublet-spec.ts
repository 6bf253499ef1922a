import type { SimulationSpecInput } from '../../../pipeline/simulate/simulation-spec.js';
import { separatedPeaksSpec } from '../separated-peaks-spec.js';

/**
 * The separated-peaks scenario with the sample replaced by a carbon foil enriched to 40 % 13C and
 * detectors of 30–34 keV FWHM, so the 12C and 13C elastic peaks form a doublet 1.9–4.4 FWHM apart
 * (4He at 1.5–3.5 MeV; kinematic factors of Chu, Mayer & Nicolet 1978 give ΔK ≈ 0.038 at
 * 165°), fitted together as one multiplet (fit_group carbon). Truth: the simulator's truth.csv.
 */
export function carbonDoubletSpec(extra: Partial<SimulationSpecInput> = {}): SimulationSpecInput {
  const base = separatedPeaksSpec();
  return {
    ...base,
    seed: 7417,
    series: 'bkw-2026-c-doublet',
    title: 'Brackwater tandem: 4He on 12C/13C, doublet fitted (simulated for end-to-end tests)',
    detectors: base.detectors.filter((d) => d.angle_deg >= 140).map((d, i) => ({ ...d, resolution_fwhm_keV: 30 + 2 * i })),
    targets: [
      base.targets[0]!,
      {
        id: 'c-enriched',
        layers: [{ composition: { '12C': 0.6, '13C': 0.4 }, areal_density_1e15_per_cm2: 180, areal_density_unc_rel: 0.05 }],
      },
    ],
    peaks: [
      { label: 'C-12 elastic', target_nuclide: '12C', excitation_keV: 0, method: 'fit', fit_group: 'carbon', truth: { ratio_to_rutherford: { base: 1.1, resonances: [] } } },
      { label: 'C-13 elastic', target_nuclide: '13C', excitation_keV: 0, method: 'fit', fit_group: 'carbon', truth: { ratio_to_rutherford: { base: 0.95, resonances: [] } } },
    ],
    schedule: { ...base.schedule, sample_target: 'c-enriched' },
    calibrations: base.calibrations.map((c) => ({ ...c, detectors: c.detectors.filter((d) => ['d01', 'd02', 'd03'].includes(d.id)) })),
    ...extra,
  };
}
