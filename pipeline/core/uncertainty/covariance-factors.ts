import { checkComponent, type UncertaintyComponent } from './uncertainty-component.js';

/** The rows that share one component (same name, class and key), with each row's signed contribution. */
export interface SharedGroup {
  name: string;
  class: string;
  key: string;
  /** Member rows, ascending. */
  rows: Int32Array;
  /** values[k]: the contribution of this component to row rows[k], in that row's unit. */
  values: Float64Array;
}

/**
 * A series covariance in factored form, V = D + Σ_g v_g v_gᵀ:
 * D diagonal (uncorrelated components, Σ value²), one sparse vector v_g per shared group.
 * Memory is linear in the number of components, whatever the density of V.
 */
export interface CovarianceFactors {
  rowCount: number;
  uncorrelatedVariance: Float64Array;
  groups: SharedGroup[];
  /** CSR index of each row's shared entries: entries rowStart[i] … rowStart[i+1]−1. */
  rowStart: Int32Array;
  /** Group of each row entry. */
  entryGroup: Int32Array;
  /** Position of the row within its group's `rows`. */
  entryPosition: Int32Array;
}

/**
 * Groups each row's components for the series covariance. A row may carry one component per
 * (name, class, key) of a shared class: two would be ambiguous (same error or independent?),
 * so that throws instead of assuming either.
 */
export function covarianceFactors(rows: readonly (readonly UncertaintyComponent[])[]): CovarianceFactors {
  const n = rows.length;
  const uncorrelatedVariance = new Float64Array(n);
  const index = new Map<string, number>();
  const members: { rows: number[]; values: number[]; name: string; class: string; key: string }[] = [];
  const perRow: number[][] = [];
  let entries = 0;
  for (let i = 0; i < n; i++) {
    const own: number[] = [];
    for (const c of rows[i]!) {
      checkComponent(c);
      if (c.class === 'uncorrelated') {
        uncorrelatedVariance[i] += c.value * c.value;
        continue;
      }
      const id = `${c.class}\u0000${c.name}\u0000${c.key}`;
      let g = index.get(id);
      if (g === undefined) {
        g = members.length;
        index.set(id, g);
        members.push({ rows: [], values: [], name: c.name, class: c.class, key: c.key });
      }
      const m = members[g]!;
      if (m.rows.length > 0 && m.rows[m.rows.length - 1] === i) throw new RangeError(`row ${i} has component "${c.name}" (${c.class} "${c.key}") twice; give one combined value per shared component`);
      m.rows.push(i);
      m.values.push(c.value);
      own.push(g, m.rows.length - 1);
      entries += 1;
    }
    perRow.push(own);
  }
  const rowStart = new Int32Array(n + 1);
  const entryGroup = new Int32Array(entries);
  const entryPosition = new Int32Array(entries);
  let e = 0;
  for (let i = 0; i < n; i++) {
    rowStart[i] = e;
    const own = perRow[i]!;
    for (let k = 0; k < own.length; k += 2) {
      entryGroup[e] = own[k]!;
      entryPosition[e] = own[k + 1]!;
      e += 1;
    }
  }
  rowStart[n] = e;
  const groups = members.map((m) => ({ name: m.name, class: m.class, key: m.key, rows: Int32Array.from(m.rows), values: Float64Array.from(m.values) }));
  return { rowCount: n, uncorrelatedVariance, groups, rowStart, entryGroup, entryPosition };
}
