import { csvField, fixed, scientific } from './format-number.js';

/**
 * One row of truth.csv: the true values behind one sample run × detector × declared peak, for
 * end-to-end tests to compare a reduction with (pulls) and for planning an experiment.
 */
export interface TruthRow {
  run: string;
  detector: string;
  peak: string;
  target: string;
  targetNuclide: string;
  excitationKeV: number;
  beamEnergyKeV: number;
  /** Beam energy where the truth is taken: the beam energy, or mid-depth of the layer with energy loss, keV. */
  reactionEnergyKeV: number;
  thetaLabDeg: number;
  thetaCmDeg: number;
  /** Lab energy of the detected particle where it is made (at mid-depth), keV. */
  peakEnergyKeV: number;
  /** Energy it deposits after the exit path, foils and dead layer, keV, and its (fractional) channel in the run's calibration. */
  detectedEnergyKeV: number;
  peakChannel: number;
  dsigmaLabMbPerSr: number;
  dsigmaCmMbPerSr: number;
  /** σ_lab / (σ_R,lab · F_screening), F = 1 when the series' screening is `none`; NaN (empty in the file) for non-elastic peaks. */
  sigmaOverRutherford: number;
  rutherfordLabMbPerSr: number;
  screeningFactor: number;
  /** Atoms of the peak's nuclide per cm² in the run's target. */
  nuclideAtomsPerCm2: number;
  trueChargeUC: number;
  liveFraction: number;
  trueSolidAngleMsr: number;
  /** Mean of the peak's counts before Poisson sampling (all of the Gaussian, inside the spectrum or not). */
  expectedCounts: number;
  calibrationVersion: string;
  /** Defect kinds applied to the run, `;`-separated; empty when none. */
  defects: string;
}

export const TRUTH_COLUMNS = [
  'run', 'detector', 'peak', 'target', 'target_nuclide', 'excitation_keV', 'beam_energy_keV', 'reaction_energy_keV', 'theta_lab_deg', 'theta_cm_deg',
  'peak_energy_keV', 'detected_energy_keV', 'peak_channel', 'dsigma_domega_lab_mb_per_sr', 'dsigma_domega_cm_mb_per_sr', 'sigma_over_rutherford',
  'rutherford_lab_mb_per_sr', 'screening_factor', 'nuclide_areal_density_atoms_per_cm2', 'true_charge_uC', 'live_fraction',
  'true_solid_angle_msr', 'expected_counts', 'calibration_version', 'defects',
] as const;

/** Empty where a quantity is not defined (σ/σ_R and the Rutherford columns of a non-elastic peak). */
const orEmpty = (x: number, f: (x: number) => string) => (Number.isNaN(x) ? '' : f(x));

/** truth.csv text: a header, then one line per row, numbers in fixed formats (10 significant digits for cross sections). */
export function truthCsvText(rows: readonly TruthRow[]): string {
  const out: string[] = [TRUTH_COLUMNS.join(',')];
  for (const r of rows) {
    out.push([
      csvField(r.run), csvField(r.detector), csvField(r.peak), csvField(r.target), r.targetNuclide, fixed(r.excitationKeV, 3),
      fixed(r.beamEnergyKeV, 3), fixed(r.reactionEnergyKeV, 4), fixed(r.thetaLabDeg, 6), fixed(r.thetaCmDeg, 6), fixed(r.peakEnergyKeV, 4), fixed(r.detectedEnergyKeV, 4), fixed(r.peakChannel, 4),
      scientific(r.dsigmaLabMbPerSr, 9), scientific(r.dsigmaCmMbPerSr, 9), orEmpty(r.sigmaOverRutherford, (x) => scientific(x, 9)),
      orEmpty(r.rutherfordLabMbPerSr, (x) => scientific(x, 9)), orEmpty(r.screeningFactor, (x) => fixed(x, 9)), scientific(r.nuclideAtomsPerCm2, 9), fixed(r.trueChargeUC, 6),
      fixed(r.liveFraction, 9), fixed(r.trueSolidAngleMsr, 6), fixed(r.expectedCounts, 4), csvField(r.calibrationVersion), csvField(r.defects),
    ].join(','));
  }
  return `${out.join('\n')}\n`;
}
