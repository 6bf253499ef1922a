import type { ColumnSpec } from './arrow-table.js';

/** One combined value (combined.arrow), as the extract stage's combineRows gives it. */
export interface CombinedTableRow {
  peak: string;
  angleLabDeg: number;
  /** Mean beam energy of the members, keV. */
  beamEnergyKeV: number;
  /** Spread of the members' beam energies (max − min), keV. */
  beamEnergySpreadKeV: number;
  value: number;
  /** δx̄ from the independent parts, times S when S > 1. */
  uncertaintyIndependent: number;
  /** The components every member shares, combined with the weights. */
  uncertaintyCommon: number;
  uncertaintyTotal: number;
  chi2: number;
  ndf: number;
  chi2PerNdf: number;
  scaleFactor: number;
  count: number;
  /** Member rows (indices) and runs, in row order. */
  rows: readonly number[];
  runs: readonly string[];
}

/** combined.arrow: rows of the same peak, lab angle and beam energy (within the tolerance) combined by the weighted mean. */
export const COMBINED_COLUMNS: readonly ColumnSpec<CombinedTableRow>[] = [
  { name: 'peak', type: 'utf8', description: 'peak label from series.yaml', value: (r) => r.peak },
  { name: 'angle_lab_deg', type: 'float64', unit: 'deg', description: 'lab angle shared by the members', value: (r) => r.angleLabDeg },
  { name: 'beam_energy_keV', type: 'float64', unit: 'keV', description: 'mean beam energy of the members', value: (r) => r.beamEnergyKeV },
  { name: 'beam_energy_spread_keV', type: 'float64', unit: 'keV', description: 'highest minus lowest member beam energy (at most extract.combine_energy_tolerance_keV)', value: (r) => r.beamEnergySpreadKeV },
  { name: 'dsigma_domega_lab_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'weighted mean of the members\' dσ/dΩ_lab, weights 1/u_independent²', value: (r) => r.value },
  { name: 'unc_independent_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'uncertainty of the mean from the parts not shared by all members, times the scale factor when it exceeds 1', value: (r) => r.uncertaintyIndependent },
  { name: 'unc_common_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'the components every member shares (same name, class, key), combined linearly with the weights: averaging does not reduce them', value: (r) => r.uncertaintyCommon },
  { name: 'unc_total_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'independent ⊕ common', value: (r) => r.uncertaintyTotal },
  { name: 'chi2', type: 'float64', description: 'χ² of the members about the mean (independent parts)', value: (r) => r.chi2 },
  { name: 'ndf', type: 'int32', description: 'degrees of freedom, members − 1', value: (r) => r.ndf },
  { name: 'chi2_per_ndf', type: 'float64', description: 'χ²/ν (null for a single member)', value: (r) => r.chi2PerNdf },
  { name: 'scale_factor', type: 'float64', description: 'S applied to the independent uncertainty (Particle Data Group rule; 1 when χ²/ν <= 1)', value: (r) => r.scaleFactor },
  { name: 'member_count', type: 'int32', description: 'number of rows combined', value: (r) => r.count },
  { name: 'member_rows', type: 'utf8', description: '0-based rows of cross_sections.arrow combined, joined by "+"', value: (r) => r.rows.join('+') },
  { name: 'member_runs', type: 'utf8', description: 'runs of the combined rows, joined by "+"', value: (r) => r.runs.join('+') },
];
