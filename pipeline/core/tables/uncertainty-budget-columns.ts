import type { ComponentName, CorrelationClass } from '../uncertainty/uncertainty-component.js';
import type { ColumnSpec } from './arrow-table.js';

/**
 * One component of one result row's budget, long form (uncertainty_budget.arrow): its signed
 * contribution to dσ/dΩ_lab and to σ/σ_R (NaN where the component does not enter that result,
 * or the row has no σ/σ_R). One entry per (row, component, class, key), so a reader groups the
 * file by those four columns; run, detector and peak are those of the row in cross_sections.arrow.
 */
export interface BudgetTableRow {
  /** Position of the row in cross_sections.arrow (0-based), the i and j of covariance.arrow. */
  row: number;
  name: ComponentName;
  class: CorrelationClass;
  key: string;
  /** c·u(x) for dσ/dΩ_lab, mb/sr. */
  labValue: number;
  /** c·u(x) for σ/σ_R, dimensionless. */
  ratioValue: number;
}

/** uncertainty_budget.arrow: one entry per result row × component (the names are a contract). */
export const UNCERTAINTY_BUDGET_COLUMNS: readonly ColumnSpec<BudgetTableRow>[] = [
  { name: 'row', type: 'int32', description: '0-based position of the result row in cross_sections.arrow (the i, j of covariance.arrow; its run, detector and peak are there)', value: (r) => r.row },
  { name: 'component', type: 'utf8', description: 'component name: counting, background, reference_counting, reference_spread, reference_areal_density, sample_areal_density, areal_density_ratio, charge, live_time, screening, beam_energy, angle, solid_angle, calibration', value: (r) => r.name },
  { name: 'correlation_class', type: 'utf8', description: 'who shares it: uncorrelated (this row alone), run, detector or series (fully correlated among the rows with the same component, class and key)', value: (r) => r.class },
  { name: 'key', type: 'utf8', description: 'the run, run/detector, detector, target layer or series that shares the component (empty for uncorrelated)', value: (r) => (r.class === 'uncorrelated' ? '' : r.key) },
  { name: 'dsigma_domega_lab_mb_per_sr', type: 'float64', unit: 'mb/sr', description: 'signed contribution c·u(x) to dσ/dΩ_lab (null where the component does not enter it); the sign matters only between rows that share the component', value: (r) => r.labValue },
  { name: 'sigma_over_rutherford', type: 'float64', description: 'signed contribution c·u(x) to σ/σ_R (null where the row has no σ/σ_R or the component does not enter it)', value: (r) => r.ratioValue },
];
