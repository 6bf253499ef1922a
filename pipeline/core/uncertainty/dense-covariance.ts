import type { LongCovariance } from './series-covariance.js';

/** The full symmetric n × n matrix from the long form (for small series and checks; O(n²) memory). */
export function denseCovariance(long: LongCovariance): Float64Array[] {
  const n = long.rowCount;
  const m: Float64Array[] = [];
  for (let r = 0; r < n; r++) m.push(new Float64Array(n));
  for (let k = 0; k < long.i.length; k++) {
    const i = long.i[k]!;
    const j = long.j[k]!;
    m[i]![j] = long.covariance[k]!;
    m[j]![i] = long.covariance[k]!;
  }
  return m;
}
