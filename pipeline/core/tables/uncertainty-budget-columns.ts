import type { UncertaintyComponent } from '../uncertainty/uncertainty-component.js';
import type { ColumnSpec } from './arrow-table.js';

/** One component of one row's budget, long form (uncertainty_budget.arrow). */
export interface BudgetTableRow {
  /** Position of the row in cross_sections.arrow (0-based), the i and j of covariance.arrow. */
  row: number;
  run: string;
  detector: string;
  peak: string;
  /** Which result the component belongs to: `dsigma_domega_lab` (mb/sr) or `sigma_over_rutherford` (1). */
  quantity: 'dsigma_domega_lab' | 'sigma_over_rutherford';
  component: UncertaintyComponent;
  /** The result's value (same unit as the component). */
  resultValue: number;
}

/** uncertainty_budget.arrow: one row per result row × quantity × component (the names are a contract). */
export const UNCERTAINTY_BUDGET_COLUMNS: readonly ColumnSpec<BudgetTableRow>[] = [
  { name: 'row', type: 'int32', description: '0-based position of the result row in cross_sections.arrow (the i, j of covariance.arrow)', value: (r) => r.row },
  { name: 'run', type: 'utf8', description: 'run id from runlog.csv', value: (r) => r.run },
  { name: 'detector', type: 'utf8', description: 'detector id from series.yaml', value: (r) => r.detector },
  { name: 'peak', type: 'utf8', description: 'peak label from series.yaml', value: (r) => r.peak },
  { name: 'quantity', type: 'utf8', description: 'the result the component belongs to: dsigma_domega_lab (value in mb/sr) or sigma_over_rutherford (dimensionless)', value: (r) => r.quantity },
  { name: 'component', type: 'utf8', description: 'component name: counting, background, reference_counting, reference_areal_density, sample_areal_density, areal_density_ratio, charge, live_time, screening, beam_energy, angle, calibration', value: (r) => r.component.name },
  { name: 'correlation_class', type: 'utf8', description: 'who shares it: uncorrelated (this row alone), run, detector or series (fully correlated among the rows with the same key)', value: (r) => r.component.class },
  { name: 'key', type: 'utf8', description: 'the run, detector, layer or series that shares the component (empty for uncorrelated)', value: (r) => (r.component.class === 'uncorrelated' ? '' : r.component.key) },
  { name: 'value', type: 'float64', description: 'signed contribution c·u(x) to the result, in the result\'s unit (mb/sr or 1); the sign matters only between rows that share the component', value: (r) => r.component.value },
  { name: 'relative_value', type: 'float64', description: 'value divided by the result', value: (r) => r.component.value / r.resultValue },
];
