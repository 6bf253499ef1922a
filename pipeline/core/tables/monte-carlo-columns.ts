import type { ColumnSpec } from './arrow-table.js';

/** One result row propagated by Monte Carlo (monte_carlo.arrow, written with `--mc N`), beside its first-order values. */
export interface MonteCarloTableRow {
  row: number;
  run: string;
  detector: string;
  peak: string;
  quantity: 'dsigma_domega_lab' | 'sigma_over_rutherford';
  firstOrderValue: number;
  firstOrderUncertainty: number;
  mean: number;
  standardUncertainty: number;
  lower95: number;
  upper95: number;
  trials: number;
  seed: number;
  problem: string;
}

/** monte_carlo.arrow: JCGM 101:2008 propagation of every row's model (counts Poisson, the rest Gaussian). */
export const MONTE_CARLO_COLUMNS: readonly ColumnSpec<MonteCarloTableRow>[] = [
  { name: 'row', type: 'int32', description: '0-based row of cross_sections.arrow', value: (r) => r.row },
  { name: 'run', type: 'utf8', description: 'run id from runlog.csv', value: (r) => r.run },
  { name: 'detector', type: 'utf8', description: 'detector id from series.yaml', value: (r) => r.detector },
  { name: 'peak', type: 'utf8', description: 'peak label from series.yaml', value: (r) => r.peak },
  { name: 'quantity', type: 'utf8', description: 'dsigma_domega_lab (values in mb/sr) or sigma_over_rutherford (dimensionless)', value: (r) => r.quantity },
  { name: 'first_order_value', type: 'float64', description: 'the value of cross_sections.arrow (model at the input estimates)', value: (r) => r.firstOrderValue },
  { name: 'first_order_unc', type: 'float64', description: 'first-order combined standard uncertainty, √(stat² + sys²) (JCGM 100:2008 §5.1.2)', value: (r) => r.firstOrderUncertainty },
  { name: 'mc_mean', type: 'float64', description: 'mean of the Monte Carlo model values (JCGM 101:2008 §7.6)', value: (r) => r.mean },
  { name: 'mc_std', type: 'float64', description: 'standard deviation of the Monte Carlo model values: the standard uncertainty (JCGM 101:2008 §7.6)', value: (r) => r.standardUncertainty },
  { name: 'mc_lower_95', type: 'float64', description: 'lower end of the probabilistically symmetric 95 % coverage interval (JCGM 101:2008 §7.7.1)', value: (r) => r.lower95 },
  { name: 'mc_upper_95', type: 'float64', description: 'upper end of the probabilistically symmetric 95 % coverage interval', value: (r) => r.upper95 },
  { name: 'mc_trials', type: 'int32', description: 'number of Monte Carlo trials M (--mc)', value: (r) => r.trials },
  { name: 'mc_seed', type: 'float64', description: 'seed of the random streams (row i draws stream (seed, i))', value: (r) => r.seed },
  { name: 'mc_problem', type: 'utf8', description: 'why the row has no Monte Carlo values (empty when it has them)', value: (r) => r.problem },
];
