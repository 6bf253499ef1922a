import { covarianceFactors } from './covariance-factors.js';
import { forEachCovarianceEntry } from './for-each-covariance-entry.js';
import type { UncertaintyComponent } from './uncertainty-component.js';

/**
 * The covariance matrix of a series in long form (the layout of covariance.arrow): one entry
 * per (row i, row j) with i ≤ j, ordered by i then j; the diagonal always present; off-diagonal
 * entries only where the rows share a component; the lower triangle is implied by symmetry.
 * Units: the product of the two rows' units.
 */
export interface LongCovariance {
  rowCount: number;
  i: Int32Array;
  j: Int32Array;
  covariance: Float64Array;
}

/**
 * cov(i, j) from each row's budget (see forEachCovarianceEntry for the formula). A series-class
 * component makes the matrix dense (n(n+1)/2 entries); for ~10⁴ rows stream with
 * forEachCovarianceEntry instead of collecting.
 */
export function seriesCovariance(rows: readonly (readonly UncertaintyComponent[])[]): LongCovariance {
  const factors = covarianceFactors(rows);
  let capacity = Math.max(16, 2 * rows.length);
  let ii = new Int32Array(capacity);
  let jj = new Int32Array(capacity);
  let cc = new Float64Array(capacity);
  let size = 0;
  forEachCovarianceEntry(factors, (i, j, c) => {
    if (size === capacity) {
      capacity *= 2;
      ii = grow(ii, new Int32Array(capacity));
      jj = grow(jj, new Int32Array(capacity));
      cc = grow(cc, new Float64Array(capacity));
    }
    ii[size] = i;
    jj[size] = j;
    cc[size] = c;
    size += 1;
  });
  return { rowCount: rows.length, i: ii.slice(0, size), j: jj.slice(0, size), covariance: cc.slice(0, size) };
}

function grow<T extends Int32Array | Float64Array>(from: T, to: T): T {
  to.set(from);
  return to;
}
