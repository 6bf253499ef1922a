import type * as arrow from 'apache-arrow';

/** The values compared in units of their uncertainty: value, statistical and systematic parts (columns of cross_sections.arrow). */
export const DIFF_QUANTITIES = [
  { id: 'cross_section_lab', value: 'cross_section_lab_mb_per_sr', stat: 'cross_section_lab_stat_mb_per_sr', sys: 'cross_section_lab_sys_mb_per_sr', unit: 'mb/sr', suffix: '_mb_per_sr', label: 'dσ/dΩ lab' },
  { id: 'cross_section_cm', value: 'cross_section_cm_mb_per_sr', stat: 'cross_section_cm_stat_mb_per_sr', sys: 'cross_section_cm_sys_mb_per_sr', unit: 'mb/sr', suffix: '_mb_per_sr', label: 'dσ/dΩ cm' },
  { id: 'ratio_to_rutherford', value: 'ratio_to_rutherford', stat: 'ratio_to_rutherford_stat', sys: 'ratio_to_rutherford_sys', unit: '1', suffix: '', label: 'σ/σR' },
] as const;
export type QuantityId = (typeof DIFF_QUANTITIES)[number]['id'];

export interface QuantityChange {
  from: number | null;
  to: number | null;
  /** Total standard uncertainty (stat ⊕ sys) in each version. */
  uncFrom: number | null;
  uncTo: number | null;
  /** (to − from) / √(u_from² + u_to²); null when either value or both uncertainties are missing. */
  shiftSigma: number | null;
}

export interface DiffRow {
  run: string;
  detector: string;
  peak: string;
  /** moved: a numeric column differs; relabelled: only text columns (flags, calibration version) differ. */
  change: 'added' | 'removed' | 'moved' | 'relabelled';
  /** Columns whose value differs (matched rows only). */
  changedColumns: string[];
  quantities: Record<QuantityId, QuantityChange>;
  /** Largest |shift| over the quantities, σ; null when none could be computed. */
  maxAbsShiftSigma: number | null;
  maxQuantity: QuantityId | null;
  calibrationFrom: string | null;
  calibrationTo: string | null;
  flagsFrom: string | null;
  flagsTo: string | null;
}

export interface DiffResult {
  rowsFrom: number;
  rowsTo: number;
  /** Rows found in both versions. */
  matched: number;
  /** Every added, removed or changed row, in the order of the `to` table (removed ones last). Unchanged rows are left out. */
  rows: DiffRow[];
}

type Cell = string | number | null;
const KEY = ['run', 'detector', 'peak'] as const;

function columns(t: arrow.Table): { names: string[]; get: (name: string, i: number) => Cell } {
  const names = t.schema.fields.map((f) => f.name);
  const vectors = new Map(names.map((n) => [n, t.getChild(n)!]));
  return { names, get: (name, i) => (vectors.get(name)?.get(i) as Cell | undefined) ?? null };
}

const total = (stat: Cell, sys: Cell) => (typeof stat === 'number' && typeof sys === 'number' ? Math.hypot(stat, sys) : typeof stat === 'number' ? stat : null);

/**
 * Row-by-row comparison of two cross_sections tables, rows matched by (run, detector, peak).
 * Each value's shift is expressed in units of the combined uncertainty √(u_from² + u_to²), u
 * the total standard uncertainty (stat ⊕ sys) of each version: the two versions are treated
 * as independent, which overstates the uncertainty of a difference between reductions of the
 * same data (conservative: a shift beyond 1σ on this scale is a real change, not noise). A
 * matched row is listed when any column differs: `moved` when a number does, `relabelled` when
 * only text does (flags, e.g. a reference-outlier flag that the series' other reference runs
 * decide, or the calibration version name).
 */
export function diffCrossSections(from: arrow.Table, to: arrow.Table): DiffResult {
  const a = columns(from);
  const b = columns(to);
  const keyOf = (c: typeof a, i: number) => KEY.map((k) => String(c.get(k, i))).join('\u0000');
  const fromIndex = new Map<string, number>();
  for (let i = 0; i < from.numRows; i++) fromIndex.set(keyOf(a, i), i);
  const shared = b.names.filter((n) => a.names.includes(n));
  const rows: DiffRow[] = [];
  const seen = new Set<string>();
  const row = (change: DiffRow['change'], i: number | undefined, j: number | undefined, changedColumns: string[]): DiffRow => {
    const src = j !== undefined ? { c: b, i: j } : { c: a, i: i! };
    const quantities = {} as Record<QuantityId, QuantityChange>;
    let maxAbs: number | null = null;
    let maxQuantity: QuantityId | null = null;
    for (const q of DIFF_QUANTITIES) {
      const vf = i === undefined ? null : (a.get(q.value, i) as number | null);
      const vt = j === undefined ? null : (b.get(q.value, j) as number | null);
      const uf = i === undefined ? null : total(a.get(q.stat, i), a.get(q.sys, i));
      const ut = j === undefined ? null : total(b.get(q.stat, j), b.get(q.sys, j));
      const u = uf !== null && ut !== null ? Math.hypot(uf, ut) : null;
      const shiftSigma = vf !== null && vt !== null && u !== null && u > 0 ? (vt - vf) / u : vf !== null && vt !== null && vf === vt ? 0 : null;
      quantities[q.id] = { from: vf, to: vt, uncFrom: uf, uncTo: ut, shiftSigma };
      if (shiftSigma !== null && (maxAbs === null || Math.abs(shiftSigma) > maxAbs)) {
        maxAbs = Math.abs(shiftSigma);
        maxQuantity = q.id;
      }
    }
    return {
      run: String(src.c.get('run', src.i)),
      detector: String(src.c.get('detector', src.i)),
      peak: String(src.c.get('peak', src.i)),
      change,
      changedColumns,
      quantities,
      maxAbsShiftSigma: maxAbs,
      maxQuantity,
      calibrationFrom: i === undefined ? null : (a.get('calibration_version', i) as string | null),
      calibrationTo: j === undefined ? null : (b.get('calibration_version', j) as string | null),
      flagsFrom: i === undefined ? null : (a.get('flags', i) as string | null),
      flagsTo: j === undefined ? null : (b.get('flags', j) as string | null),
    };
  };
  let matched = 0;
  for (let j = 0; j < to.numRows; j++) {
    const key = keyOf(b, j);
    seen.add(key);
    const i = fromIndex.get(key);
    if (i === undefined) {
      rows.push(row('added', undefined, j, []));
      continue;
    }
    matched++;
    const changed = shared.filter((n) => a.get(n, i) !== b.get(n, j));
    if (changed.length > 0) rows.push(row(changed.some((n) => typeof b.get(n, j) === 'number' || typeof a.get(n, i) === 'number') ? 'moved' : 'relabelled', i, j, changed));
  }
  for (let i = 0; i < from.numRows; i++) if (!seen.has(keyOf(a, i))) rows.push(row('removed', i, undefined, []));
  return { rowsFrom: from.numRows, rowsTo: to.numRows, matched, rows };
}
