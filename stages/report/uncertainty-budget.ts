import type { CrossSectionRow } from '../../pipeline/core/model/result-rows.js';
import type { BudgetBar } from './charts/budget-chart.js';

/** One component of a row's uncertainty budget: a relative standard uncertainty of dσ/dΩ. */
export interface UncertaintyComponent {
  name: string;
  kind: 'statistical' | 'systematic';
  relUnc: number;
}

/** The budget of one cross-section row (as the uncertainty propagation supplies it, component by component). */
export interface RowBudget {
  run: string;
  detector: string;
  peak: string;
  components: readonly UncertaintyComponent[];
}

/**
 * The components today's cross_sections.arrow columns give: the statistical part, and the
 * systematic part split into the reference-run normalization counting (its own column) and the
 * rest (areal densities, angle, reference film), which add in quadrature to the total systematic.
 */
export function budgetFromColumns(r: CrossSectionRow): RowBudget {
  const v = r.crossSectionLabMbPerSr;
  const stat = r.crossSectionLabStatMbPerSr / v;
  const sys = r.crossSectionLabSysMbPerSr / v;
  const norm = Number.isFinite(r.normalizationCountingRelUnc) ? Math.min(r.normalizationCountingRelUnc, Number.isFinite(sys) ? sys : Infinity) : Number.NaN;
  const components: UncertaintyComponent[] = [{ name: 'statistical', kind: 'statistical', relUnc: stat }];
  if (Number.isFinite(norm)) {
    components.push({ name: 'normalization counting', kind: 'systematic', relUnc: norm });
    components.push({ name: 'other systematic', kind: 'systematic', relUnc: Math.sqrt(Math.max(0, sys * sys - norm * norm)) });
  } else components.push({ name: 'systematic', kind: 'systematic', relUnc: sys });
  return { run: r.run, detector: r.detector, peak: r.peak, components };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

const summaries = new WeakMap<readonly RowBudget[], BudgetBar[]>();

/**
 * Median of each component's relative uncertainty (percent) per peak × detector, over the rows
 * that have it. Kept per budgets array (the page's chart and table both ask for it).
 */
export function summarizeBudget(budgets: readonly RowBudget[]): BudgetBar[] {
  let bars = summaries.get(budgets);
  if (bars === undefined) summaries.set(budgets, (bars = summarize(budgets)));
  return bars;
}

function summarize(budgets: readonly RowBudget[]): BudgetBar[] {
  const groups = new Map<string, { peak: string; detector: string; component: string; values: number[] }>();
  for (const b of budgets) {
    for (const c of b.components) {
      if (!Number.isFinite(c.relUnc)) continue;
      const key = `${b.peak}\u0000${b.detector}\u0000${c.name}`;
      let g = groups.get(key);
      if (g === undefined) groups.set(key, (g = { peak: b.peak, detector: b.detector, component: c.name, values: [] }));
      g.values.push(c.relUnc);
    }
  }
  return [...groups.values()].map((g) => ({ peak: g.peak, detector: g.detector, component: g.component, percent: 100 * median(g.values) }));
}
