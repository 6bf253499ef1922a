import type { CovarianceFactors } from './covariance-factors.js';

/**
 * Streams the upper triangle of the series covariance, row by row (i ascending, then j
 * ascending, i ≤ j), without forming the matrix (common practice for shared systematic errors,
 * JCGM 100:2008 §F.1.2.3 eq. (F.2): the covariance of two results that depend on the same uncorrelated quantities):
 *
 *   cov(i, j) = δ_ij Σ_{c uncorrelated} u_{i,c}²  +  Σ_{g shared by i and j} v_{i,g} v_{j,g}
 *
 * with ρ = 1 inside a group (same component name, class and key). The diagonal is always
 * emitted (it is the squared total of the row); an off-diagonal pair is emitted when the two rows
 * share a group and the sum is not exactly zero. Cost: O(number of non-zero entries × groups per
 * pair) time and O(rows) scratch memory.
 */
export function forEachCovarianceEntry(f: CovarianceFactors, emit: (i: number, j: number, covariance: number) => void): void {
  const n = f.rowCount;
  const scratch = new Float64Array(n);
  const mark = new Int32Array(n);
  const touched = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const stamp = i + 1;
    let count = 0;
    mark[i] = stamp;
    touched[count++] = i;
    scratch[i] = f.uncorrelatedVariance[i]!;
    for (let e = f.rowStart[i]!; e < f.rowStart[i + 1]!; e++) {
      const g = f.groups[f.entryGroup[e]!]!;
      const pos = f.entryPosition[e]!;
      const vi = g.values[pos]!;
      const rows = g.rows;
      const values = g.values;
      for (let k = pos; k < rows.length; k++) {
        const j = rows[k]!;
        if (mark[j] !== stamp) {
          mark[j] = stamp;
          touched[count++] = j;
          scratch[j] = 0;
        }
        scratch[j] += vi * values[k]!;
      }
    }
    if (count * 8 > n - i) {
      // dense row: a scan in column order is cheaper than sorting
      for (let j = i; j < n; j++) if (mark[j] === stamp && (j === i || scratch[j] !== 0)) emit(i, j, scratch[j]!);
    } else {
      const cols = touched.subarray(0, count).sort();
      for (let k = 0; k < count; k++) {
        const j = cols[k]!;
        if (j === i || scratch[j] !== 0) emit(i, j, scratch[j]!);
      }
    }
  }
}
