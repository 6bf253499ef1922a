import type { ColumnSpec } from './arrow-table.js';

/** One entry of the series covariance of dσ/dΩ_lab (covariance.arrow, long form, i <= j). */
export interface CovarianceTableRow {
  i: number;
  j: number;
  covariance: number;
  /** cov(i, j)/(u_i u_j). */
  correlation: number;
}

/** covariance.arrow: the upper triangle (i <= j) of the covariance matrix of every row's dσ/dΩ_lab; absent pairs are 0. */
export const COVARIANCE_COLUMNS: readonly ColumnSpec<CovarianceTableRow>[] = [
  { name: 'i', type: 'int32', description: '0-based row of cross_sections.arrow', value: (r) => r.i },
  { name: 'j', type: 'int32', description: '0-based row of cross_sections.arrow, j >= i (the matrix is symmetric: cov(j, i) = cov(i, j)); pairs not listed have covariance 0', value: (r) => r.j },
  { name: 'covariance_mb2_per_sr2', type: 'float64', unit: '(mb/sr)^2', description: 'covariance of dσ/dΩ_lab of rows i and j from the components they share; for i = j the squared total uncertainty (stat² + sys²)', value: (r) => r.covariance },
  { name: 'correlation', type: 'float64', description: 'cov(i, j) / (u_i u_j), within [−1, 1]', value: (r) => r.correlation },
];

/** Table rows from the long-form covariance (seriesCovariance), with correlations from its diagonal. */
export function covarianceTableRows(long: { rowCount: number; i: Int32Array; j: Int32Array; covariance: Float64Array }): CovarianceTableRow[] {
  const variance = new Float64Array(long.rowCount);
  for (let k = 0; k < long.i.length; k++) if (long.i[k] === long.j[k]) variance[long.i[k]!] = long.covariance[k]!;
  const out: CovarianceTableRow[] = [];
  for (let k = 0; k < long.i.length; k++) {
    const i = long.i[k]!;
    const j = long.j[k]!;
    const c = long.covariance[k]!;
    const d = Math.sqrt(variance[i]! * variance[j]!);
    out.push({ i, j, covariance: c, correlation: d > 0 ? c / d : Number.NaN });
  }
  return out;
}
