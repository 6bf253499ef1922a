// Weighted average with the scale factor S: R.L. Workman et al. (Particle Data Group), Prog. Theor. Exp. Phys. 2022, 083C01, Introduction §5.2; shared errors combined linearly (ρ = 1), JCGM 100:2008 §5.2.2.
import { weightedMean } from '../../pipeline/core/uncertainty/weighted-mean.js';
import type { UncertaintyComponent } from '../../pipeline/core/uncertainty/uncertainty-component.js';
import type { CombinedTableRow } from '../../pipeline/core/tables/combined-columns.js';

export interface CombinableRow {
  /** Position of the row in cross_sections.arrow. */
  index: number;
  run: string;
  peak: string;
  angleLabDeg: number;
  beamEnergyKeV: number;
  /** The value and its budget (one unit for all rows, e.g. mb/sr). */
  value: number;
  components: readonly UncertaintyComponent[];
}

/** A combined value (the fields of combined.arrow, pipeline/core/tables/combined-columns.ts), built here. */
export interface CombinedRow extends CombinedTableRow {
  rows: number[];
  runs: string[];
}

const identity = (c: UncertaintyComponent) => `${c.class}\u0000${c.name}\u0000${c.key}`;

/**
 * Rows of the same peak and lab angle whose beam energies lie within `toleranceKeV` of the
 * lowest one of their cluster (energies sorted; a row further away starts a new cluster) are
 * combined:
 * - a component (same name, class, key) carried by every member is common: it moves all
 *   members together, so it does not reduce by averaging; it is combined linearly with the
 *   normalized weights, u_common = |Σ_i w_i c_i| (JCGM 100:2008 §5.2.2 with r = 1);
 * - the rest is independent between members: x̄ = Σ w_i x_i / Σ w_i with w_i = 1/u_i²,
 *   δx̄ = (Σ w_i)^{−1/2}, χ²/ν and the scale factor S (PDG rule, weightedMean); S > 1 inflates δx̄;
 * - total = √(u_indep² + u_common²).
 * Rows with a non-finite value or no independent uncertainty are left out. Groups of one row are
 * listed too (ν = 0, S = 1). Output sorted by peak, angle, energy.
 */
export function combineRows(rows: readonly CombinableRow[], toleranceKeV: number): CombinedRow[] {
  if (!(toleranceKeV >= 0)) throw new RangeError(`energy tolerance must be >= 0 keV, got ${toleranceKeV}`);
  const usable = rows.filter((r) => Number.isFinite(r.value) && r.components.some((c) => c.class === 'uncorrelated' && c.value !== 0));
  const byKey = new Map<string, CombinableRow[]>();
  for (const r of usable) {
    const key = `${r.peak}\u0000${r.angleLabDeg.toFixed(6)}`;
    let list = byKey.get(key);
    if (list === undefined) byKey.set(key, (list = []));
    list.push(r);
  }
  const out: CombinedRow[] = [];
  for (const list of byKey.values()) {
    list.sort((a, b) => a.beamEnergyKeV - b.beamEnergyKeV || a.index - b.index);
    let start = 0;
    for (let i = 1; i <= list.length; i++) {
      if (i < list.length && list[i]!.beamEnergyKeV - list[start]!.beamEnergyKeV <= toleranceKeV) continue;
      out.push(combineGroup(list.slice(start, i)));
      start = i;
    }
  }
  return out.sort((a, b) => (a.peak < b.peak ? -1 : a.peak > b.peak ? 1 : 0) || a.angleLabDeg - b.angleLabDeg || a.beamEnergyKeV - b.beamEnergyKeV);
}

function combineGroup(group: CombinableRow[]): CombinedRow {
  if (group.length === 1) return single(group[0]!);
  group.sort((a, b) => a.index - b.index);
  const counts = new Map<string, number>();
  for (const r of group) for (const id of new Set(r.components.filter((c) => c.class !== 'uncorrelated').map(identity))) counts.set(id, (counts.get(id) ?? 0) + 1);
  const common = new Set([...counts].filter(([, n]) => n === group.length).map(([id]) => id));
  const independent = group.map((r) => Math.sqrt(r.components.reduce((s, c) => (c.class !== 'uncorrelated' && common.has(identity(c)) ? s : s + c.value * c.value), 0)));
  const wm = weightedMean(group.map((r) => r.value), independent);
  const w = independent.map((u) => 1 / (u * u));
  const sw = w.reduce((a, b) => a + b, 0);
  const commonSum = new Map<string, number>();
  group.forEach((r, i) => {
    for (const c of r.components) if (c.class !== 'uncorrelated' && common.has(identity(c))) commonSum.set(identity(c), (commonSum.get(identity(c)) ?? 0) + (w[i]! / sw) * c.value);
  });
  const uCommon = Math.sqrt([...commonSum.values()].reduce((s, v) => s + v * v, 0));
  const uIndep = wm.scaledUncertainty;
  const energies = group.map((r) => r.beamEnergyKeV);
  return {
    peak: group[0]!.peak,
    angleLabDeg: group[0]!.angleLabDeg,
    beamEnergyKeV: energies.reduce((a, b) => a + b, 0) / group.length,
    beamEnergySpreadKeV: Math.max(...energies) - Math.min(...energies),
    value: wm.mean,
    uncertaintyIndependent: uIndep,
    uncertaintyCommon: uCommon,
    uncertaintyTotal: Math.hypot(uIndep, uCommon),
    chi2: wm.chi2,
    ndf: wm.ndf,
    chi2PerNdf: wm.chi2PerNdf,
    scaleFactor: wm.scaleFactor,
    count: group.length,
    rows: group.map((r) => r.index),
    runs: group.map((r) => r.run),
  };
}

/** A group of one row: every shared component is common, the uncorrelated ones independent (ν = 0, S = 1). */
function single(r: CombinableRow): CombinedRow {
  let indep2 = 0;
  // Shared components summed per (name, class, key) in first-seen order; a row has few, so a
  // scan of the ones seen replaces a Map keyed by identity strings (one group per row is the usual case).
  const seen: UncertaintyComponent[] = [];
  const sums: number[] = [];
  for (const c of r.components) {
    if (c.class === 'uncorrelated') indep2 += c.value * c.value;
    else {
      let k = 0;
      while (k < seen.length && !(seen[k]!.class === c.class && seen[k]!.name === c.name && seen[k]!.key === c.key)) k++;
      if (k === seen.length) {
        seen.push(c);
        sums.push(0 + c.value);
      } else sums[k]! += c.value;
    }
  }
  let common2 = 0;
  for (const v of sums) common2 += v * v;
  const uIndep = Math.sqrt(indep2);
  const uCommon = Math.sqrt(common2);
  return {
    peak: r.peak,
    angleLabDeg: r.angleLabDeg,
    beamEnergyKeV: r.beamEnergyKeV,
    beamEnergySpreadKeV: 0,
    value: r.value,
    uncertaintyIndependent: uIndep,
    uncertaintyCommon: uCommon,
    uncertaintyTotal: Math.hypot(uIndep, uCommon),
    chi2: 0,
    ndf: 0,
    chi2PerNdf: Number.NaN,
    scaleFactor: 1,
    count: 1,
    rows: [r.index],
    runs: [r.run],
  };
}
