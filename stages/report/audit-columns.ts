import type { ColumnSpec } from '../../pipeline/core/tables/arrow-table.js';
import { detectorColumn, flagsColumn, kindColumn, runColumn } from './common-columns.js';
import type { QcRow, ReferencePoint, YieldRow } from '../../pipeline/core/model/result-rows.js';

/** normalization.arrow: one row per reference run × detector. */
export const NORMALIZATION_COLUMNS: readonly ColumnSpec<ReferencePoint & { referenceElement: string; nominalMsr: number }>[] = [
  runColumn(),
  detectorColumn(),
  { name: 'beam_energy_keV', type: 'float64', unit: 'keV', description: 'beam energy of the reference run', value: (r) => r.beamEnergyKeV },
  { name: 'reference_element', type: 'utf8', description: 'element whose elastic peak normalizes', value: (r) => r.referenceElement },
  { name: 'net_counts', type: 'float64', unit: 'counts', description: 'net counts of the reference peak', value: (r) => r.netCounts },
  { name: 'net_counts_unc', type: 'float64', unit: 'counts', description: 'Poisson uncertainty of the net counts', value: (r) => r.netCountsUnc },
  { name: 'charge_uC', type: 'float64', unit: 'uC', description: 'integrated charge', value: (r) => r.chargeUC },
  { name: 'live_fraction', type: 'float64', unit: '1', description: 'live fraction', value: (r) => r.liveFraction },
  { name: 'live_fraction_unc', type: 'float64', unit: '1', description: 'uncertainty of the live fraction', value: (r) => r.liveFractionUnc },
  { name: 'rutherford_lab_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'isotope-averaged screened Rutherford cross section of the reference element (lab, with recoil)', value: (r) => r.rutherfordMbPerSr },
  { name: 'screening_factor', type: 'float64', unit: '1', description: 'screening factor applied', value: (r) => r.screeningFactor },
  { name: 'effective_solid_angle_msr', type: 'float64', unit: 'msr', description: 'effective solid angle this run implies', value: (r) => r.solidAngleMsr },
  { name: 'effective_solid_angle_run_unc_msr', type: 'float64', unit: 'msr', description: 'uncertainty independent between reference runs (counting, live time, beam energy)', value: (r) => (r.solidAngleMsr === null ? null : r.solidAngleMsr * Math.hypot(r.relCounting, r.relLive, r.relEnergy)) },
  { name: 'effective_solid_angle_common_rel_unc', type: 'float64', unit: '1', description: 'relative uncertainty shared by all reference runs (reference areal density)', value: (r) => r.relAreal },
  { name: 'nominal_solid_angle_msr', type: 'float64', unit: 'msr', description: 'nominal solid angle from series.yaml', value: (r) => r.nominalMsr },
  flagsColumn(),
];

/** yields.arrow: one row per measured peak window. */
export const YIELD_COLUMNS: readonly ColumnSpec<YieldRow>[] = [
  runColumn(),
  kindColumn(),
  detectorColumn(),
  { name: 'peak', type: 'utf8', description: 'peak label, or "reference <element>"', value: (r) => r.peak },
  { name: 'expected_energy_keV', type: 'float64', unit: 'keV', description: 'expected peak energy from kinematics', value: (r) => r.expectedEnergyKeV },
  { name: 'expected_channel', type: 'float64', unit: 'channel', description: 'expected peak position through the calibration', value: (r) => r.expectedChannel },
  { name: 'calibration_energy_unc_keV', type: 'float64', unit: 'keV', description: 'standard uncertainty of the calibrated energy at the expected channel (from the calibration covariance)', value: (r) => r.calibrationEnergyUncKeV },
  { name: 'fwhm_keV', type: 'float64', unit: 'keV', description: 'expected peak width used for the windows', value: (r) => r.fwhmKeV },
  { name: 'peak_first_channel', type: 'int32', unit: 'channel', description: 'first channel of the peak window', value: (r) => r.peakLo },
  { name: 'peak_last_channel', type: 'int32', unit: 'channel', description: 'last channel of the peak window', value: (r) => r.peakHi },
  { name: 'left_first_channel', type: 'int32', unit: 'channel', description: 'first channel of the low-energy background window', value: (r) => r.leftLo },
  { name: 'left_last_channel', type: 'int32', unit: 'channel', description: 'last channel of the low-energy background window', value: (r) => r.leftHi },
  { name: 'right_first_channel', type: 'int32', unit: 'channel', description: 'first channel of the high-energy background window', value: (r) => r.rightLo },
  { name: 'right_last_channel', type: 'int32', unit: 'channel', description: 'last channel of the high-energy background window', value: (r) => r.rightHi },
  { name: 'gross_counts', type: 'float64', unit: 'counts', description: 'counts in the peak window', value: (r) => r.grossCounts },
  { name: 'background_counts', type: 'float64', unit: 'counts', description: 'background under the peak', value: (r) => r.backgroundCounts },
  { name: 'background_unc', type: 'float64', unit: 'counts', description: 'Poisson uncertainty of the background', value: (r) => r.backgroundUnc },
  { name: 'net_counts', type: 'float64', unit: 'counts', description: 'net counts', value: (r) => r.netCounts },
  { name: 'net_counts_unc', type: 'float64', unit: 'counts', description: 'uncertainty of the net counts', value: (r) => r.netCountsUnc },
  { name: 'centroid_shift_keV', type: 'float64', unit: 'keV', description: 'net-count centroid minus expected energy (gain-drift indicator)', value: (r) => r.centroidShiftKeV },
  flagsColumn(),
];

/** qc.arrow: one row per run × detector, with the reason for every run set aside. */
export const QC_COLUMNS: readonly ColumnSpec<QcRow>[] = [
  runColumn(),
  kindColumn(),
  detectorColumn(),
  { name: 'status', type: 'utf8', description: 'reduced | set-aside | not-reduced (calibration and background runs)', value: (r) => r.status },
  { name: 'reason', type: 'utf8', description: 'why the run was set aside or not reduced (first diagnostic, with its file position)', value: (r) => r.reason },
  { name: 'rule', type: 'utf8', description: 'rule id of that diagnostic', value: (r) => r.rule },
  { name: 'calibration_version', type: 'utf8', description: 'calibration version used', value: (r) => r.calibrationVersion },
  { name: 'live_fraction', type: 'float64', unit: '1', description: 'live fraction', value: (r) => r.liveFraction },
  { name: 'live_fraction_unc', type: 'float64', unit: '1', description: 'uncertainty of the live fraction', value: (r) => r.liveFractionUnc },
  { name: 'dead_time_source', type: 'utf8', description: 'live-time | pulser | none', value: (r) => r.liveSource },
  { name: 'total_counts', type: 'float64', unit: 'counts', description: 'all counts in the detector spectrum', value: (r) => r.totalCounts },
  { name: 'channel_count', type: 'int32', unit: 'channel', description: 'number of channels', value: (r) => r.channelCount },
  { name: 'peak_shift_keV', type: 'float64', unit: 'keV', description: 'centroid shift of the strongest measured peak from its expected energy', value: (r) => r.peakShiftKeV },
  flagsColumn(),
];
