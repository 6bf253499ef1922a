import type { ColumnSpec } from '../../pipeline/core/tables/arrow-table.js';
import { detectorColumn, flagsColumn, runColumn } from './common-columns.js';
import type { CrossSectionRow } from '../../pipeline/core/model/result-rows.js';

type C = ColumnSpec<CrossSectionRow>;

/** cross_sections.arrow: one row per sample run × detector × peak (the names are a contract). */
export const CROSS_SECTION_COLUMNS: readonly C[] = [
  runColumn(),
  detectorColumn(),
  { name: 'peak', type: 'utf8', description: 'peak label from series.yaml', value: (r) => r.peak },
  { name: 'target', type: 'utf8', description: 'target id of the run', value: (r) => r.target },
  { name: 'target_nuclide', type: 'utf8', description: 'nuclide the peak comes from', value: (r) => r.targetNuclide },
  { name: 'beam_energy_keV', type: 'float64', unit: 'keV', description: 'beam energy on target (lab), from runlog.csv', value: (r) => r.beamEnergyKeV },
  { name: 'beam_energy_unc_keV', type: 'float64', unit: 'keV', description: 'standard uncertainty of the beam energy (a coordinate uncertainty, not in the cross-section uncertainty)', value: (r) => r.beamEnergyUncKeV },
  { name: 'angle_lab_deg', type: 'float64', unit: 'deg', description: 'lab scattering angle of the detector', value: (r) => r.angleLabDeg },
  { name: 'angle_lab_unc_deg', type: 'float64', unit: 'deg', description: 'standard uncertainty of the lab angle', value: (r) => r.angleLabUncDeg },
  { name: 'angle_cm_deg', type: 'float64', unit: 'deg', description: 'centre-of-mass scattering angle (non-relativistic two-body kinematics)', value: (r) => r.angleCmDeg },
  { name: 'peak_energy_keV', type: 'float64', unit: 'keV', description: 'expected lab energy of the detected particle (thin target)', value: (r) => r.peakEnergyKeV },
  { name: 'q_value_keV', type: 'float64', unit: 'keV', description: 'Q-value of the peak (0 elastic, −excitation inelastic, from AME2020 masses)', value: (r) => r.qValueKeV },
  { name: 'gross_counts', type: 'float64', unit: 'counts', description: 'counts in the peak window', value: (r) => r.grossCounts },
  { name: 'background_counts', type: 'float64', unit: 'counts', description: 'linear background under the peak window, from the side windows', value: (r) => r.backgroundCounts },
  { name: 'net_counts', type: 'float64', unit: 'counts', description: 'gross − background', value: (r) => r.netCounts },
  { name: 'net_counts_unc', type: 'float64', unit: 'counts', description: 'Poisson standard uncertainty of the net counts (gross and background)', value: (r) => r.netCountsUnc },
  { name: 'live_fraction', type: 'float64', unit: '1', description: 'live time / real time of this detector in this run', value: (r) => r.liveFraction },
  { name: 'live_fraction_unc', type: 'float64', unit: '1', description: 'standard uncertainty of the live fraction (binomial, pulser; 0 for a live-time clock)', value: (r) => r.liveFractionUnc },
  { name: 'charge_uC', type: 'float64', unit: 'uC', description: 'integrated beam charge from runlog.csv', value: (r) => r.chargeUC },
  { name: 'nuclide_areal_density_1e15_per_cm2', type: 'float64', unit: '1e15/cm^2', description: 'atoms of the target nuclide per area (layer density × atom fraction × abundance)', value: (r) => r.nuclideArealDensity1e15PerCm2 },
  { name: 'effective_solid_angle_msr', type: 'float64', unit: 'msr', description: 'normalization used: effective solid angle from the reference runs (absorbs the charge-integrator scale)', value: (r) => r.solidAngleMsr },
  { name: 'normalization_counting_rel_unc', type: 'float64', unit: '1', description: 'relative uncertainty of the normalization from reference-run counting and live time (included in the systematic uncertainty; shared by the rows that use the same reference runs)', value: (r) => r.normalizationCountingRelUnc },
  { name: 'reference_runs', type: 'utf8', description: 'reference runs the normalization came from, joined by +', value: (r) => r.referenceRuns },
  { name: 'cross_section_lab_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'differential cross section dσ/dΩ, lab frame', value: (r) => r.crossSectionLabMbPerSr },
  { name: 'cross_section_lab_stat_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'statistical standard uncertainty (counting, background, live fraction): independent between rows', value: (r) => r.crossSectionLabStatMbPerSr },
  { name: 'cross_section_lab_sys_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'systematic standard uncertainty (areal densities, normalization, angle): shared between rows of a target, detector or reference', value: (r) => r.crossSectionLabSysMbPerSr },
  { name: 'jacobian_lab_per_cm', type: 'float64', unit: '1', description: 'dΩ_lab/dΩ_cm at this angle', value: (r) => r.jacobianLabPerCm },
  { name: 'cross_section_cm_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'differential cross section dσ/dΩ, centre-of-mass frame', value: (r) => r.crossSectionCmMbPerSr },
  { name: 'cross_section_cm_stat_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'statistical standard uncertainty, CM frame', value: (r) => r.crossSectionCmStatMbPerSr },
  { name: 'cross_section_cm_sys_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'systematic standard uncertainty, CM frame', value: (r) => r.crossSectionCmSysMbPerSr },
  { name: 'rutherford_lab_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'screened Rutherford cross section (lab, exact with recoil) on the target nuclide; elastic peaks only', value: (r) => r.rutherfordLabMbPerSr },
  { name: 'screening_factor', type: 'float64', unit: '1', description: 'electron-screening factor applied to the Rutherford cross section (1 for screening: none)', value: (r) => r.screeningFactor },
  { name: 'ratio_to_rutherford', type: 'float64', unit: '1', description: 'σ/σ_Rutherford (screened), elastic peaks only; null for others', value: (r) => r.ratioToRutherford },
  { name: 'ratio_to_rutherford_stat', type: 'float64', unit: '1', description: 'statistical standard uncertainty of σ/σ_R', value: (r) => r.ratioToRutherfordStat },
  { name: 'ratio_to_rutherford_sys', type: 'float64', unit: '1', description: 'systematic standard uncertainty of σ/σ_R (adds the beam energy through ∂lnσ_R/∂E)', value: (r) => r.ratioToRutherfordSys },
  { name: 'calibration_version', type: 'utf8', description: 'energy-calibration version used for this run', value: (r) => r.calibrationVersion },
  flagsColumn(),
];
