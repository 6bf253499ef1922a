import type { ColumnSpec } from '../../pipeline/core/tables/arrow-table.js';
import type { QcRow } from '../../pipeline/core/model/result-rows.js';
import { detectorColumn, flagsColumn, runColumn } from './common-columns.js';

/** One fitted peak of one run × detector (fits.arrow). */
export interface FitRow {
  run: string;
  detector: string;
  group: string;
  peak: string;
  groupSize: number;
  firstChannel: number;
  lastChannel: number;
  expectedEnergyKeV: number;
  expectedChannel: number;
  areaCounts: number;
  areaUncCounts: number;
  centroidChannel: number;
  centroidUncChannel: number;
  centroidEnergyKeV: number;
  sigmaChannel: number;
  sigmaUncChannel: number;
  /** `peak=rho` pairs for the group's other peaks, ";"-joined. */
  areaCorrelations: string;
  converged: number;
  stopReason: string;
  iterations: number;
  deviance: number;
  dof: number;
  deviancePerDof: number;
  devianceP: number;
  residualRuns: number;
  expectedRuns: number;
  runsP: number;
  /** `name=value±unc` per fitted parameter, ";"-joined. */
  parameters: string;
  problem: string;
  flags: string[];
}

/** One channel of one fit region (fit_residuals.arrow, long form). */
export interface FitResidualRow {
  run: string;
  detector: string;
  group: string;
  channel: number;
  energyKeV: number;
  observed: number;
  model: number;
  residual: number;
  /** The fitted background in the channel, counts (drawn on the summary page; not a column of fit_residuals.arrow). */
  background?: number;
}

/** Gain-drift columns added to qc.arrow when drift.mode is track or correct. */
export interface DriftQcFields {
  driftTrackingPeak: string;
  driftShiftKeV: number;
  driftShiftUncKeV: number;
  gainCorrection: number;
}

export type QcRowWithDrift = QcRow & Partial<DriftQcFields>;

const f64 = <R>(name: string, unit: string, description: string, value: (r: R) => number): ColumnSpec<R> => ({ name, type: 'float64', unit, description, value });

/** fits.arrow: one row per run × detector × fitted peak. */
export const FIT_COLUMNS: readonly ColumnSpec<FitRow>[] = [
  runColumn(),
  detectorColumn(),
  { name: 'fit_group', type: 'utf8', description: 'the multiplet fitted together (fit_group, or the peak label when fitted alone)', value: (r) => r.group },
  { name: 'peak', type: 'utf8', description: 'peak label (key in cross_sections.arrow)', value: (r) => r.peak },
  { name: 'group_size', type: 'int32', unit: '1', description: 'peaks in the multiplet', value: (r) => r.groupSize },
  { name: 'fit_first_channel', type: 'int32', unit: 'channel', description: 'first channel of the fit region', value: (r) => r.firstChannel },
  { name: 'fit_last_channel', type: 'int32', unit: 'channel', description: 'last channel of the fit region', value: (r) => r.lastChannel },
  f64('expected_energy_keV', 'keV', 'expected peak energy from kinematics (start value)', (r) => r.expectedEnergyKeV),
  f64('expected_channel', 'channel', 'expected centroid through the calibration (start value)', (r) => r.expectedChannel),
  f64('area_counts', 'counts', 'fitted peak area (integral of the line shape)', (r) => r.areaCounts),
  f64('area_unc_counts', 'counts', 'standard uncertainty of the area (inverse Fisher information)', (r) => r.areaUncCounts),
  f64('centroid_channel', 'channel', 'fitted centroid', (r) => r.centroidChannel),
  f64('centroid_unc_channel', 'channel', 'standard uncertainty of the centroid', (r) => r.centroidUncChannel),
  f64('centroid_energy_keV', 'keV', 'fitted centroid through the calibration', (r) => r.centroidEnergyKeV),
  f64('sigma_channel', 'channel', 'fitted Gaussian width σ', (r) => r.sigmaChannel),
  f64('sigma_unc_channel', 'channel', 'standard uncertainty of σ', (r) => r.sigmaUncChannel),
  { name: 'area_correlations', type: 'utf8', description: 'correlation coefficients of this area with the other areas of the group, "peak=rho" joined by ";"', value: (r) => r.areaCorrelations },
  { name: 'converged', type: 'int32', unit: '1', description: '1 when the optimiser met its convergence test, else 0', value: (r) => r.converged },
  { name: 'stop_reason', type: 'utf8', description: 'converged | iteration-limit | no-decrease | invalid-start | not-run', value: (r) => r.stopReason },
  { name: 'iterations', type: 'int32', unit: '1', description: 'optimiser iterations', value: (r) => r.iterations },
  f64('deviance', '1', 'Poisson deviance 2Σ[μ − n + n ln(n/μ)] at the optimum', (r) => r.deviance),
  f64('dof', '1', 'degrees of freedom (channels − free parameters)', (r) => r.dof),
  f64('deviance_per_dof', '1', 'deviance per degree of freedom', (r) => r.deviancePerDof),
  f64('deviance_p', '1', 'upper-tail χ² probability of the deviance', (r) => r.devianceP),
  f64('residual_runs', '1', 'runs of equal residual sign', (r) => r.residualRuns),
  f64('expected_runs', '1', 'runs expected for random signs (Wald–Wolfowitz)', (r) => r.expectedRuns),
  f64('runs_p', '1', 'probability of so few runs (normal approximation)', (r) => r.runsP),
  { name: 'parameters', type: 'utf8', description: 'every fit parameter as "name=value±unc", joined by ";" (channels, counts)', value: (r) => r.parameters },
  { name: 'problem', type: 'utf8', description: 'why the fit was not done (empty when it ran)', value: (r) => r.problem },
  flagsColumn(),
];

/** fit_residuals.arrow: one row per channel of each fit region. */
export const FIT_RESIDUAL_COLUMNS: readonly ColumnSpec<FitResidualRow>[] = [
  runColumn(),
  detectorColumn(),
  { name: 'fit_group', type: 'utf8', description: 'the multiplet (as in fits.arrow)', value: (r) => r.group },
  { name: 'channel', type: 'int32', unit: 'channel', description: 'channel of the fit region', value: (r) => r.channel },
  f64('energy_keV', 'keV', 'energy at the channel centre through the run\'s calibration', (r) => r.energyKeV),
  f64('observed_counts', 'counts', 'counts in the channel', (r) => r.observed),
  f64('model_counts', 'counts', 'fitted model μ in the channel', (r) => r.model),
  f64('pearson_residual', '1', '(n − μ)/√μ', (r) => r.residual),
];

/** qc.arrow columns of gain-drift tracking (present only when drift.mode is not off). */
export const DRIFT_QC_COLUMNS: readonly ColumnSpec<QcRowWithDrift>[] = [
  { name: 'drift_tracking_peak', type: 'utf8', description: 'the peak tracked for gain drift (empty: none found)', value: (r) => r.driftTrackingPeak ?? '' },
  f64('drift_shift_keV', 'keV', 'tracking peak centroid (fitted) minus the energy the calibration predicts', (r) => r.driftShiftKeV ?? Number.NaN),
  f64('drift_shift_unc_keV', 'keV', 'standard uncertainty of the drift shift', (r) => r.driftShiftUncKeV ?? Number.NaN),
  f64('gain_correction', '1', 'factor applied to the gain for this run (1: none; drift.mode correct)', (r) => r.gainCorrection ?? Number.NaN),
];
