import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow } from '../../pipeline/core/model/result-rows.js';
import type { CombinedTableRow } from '../../pipeline/core/tables/combined-columns.js';
import { covarianceTableRows, type CovarianceTableRow } from '../../pipeline/core/tables/covariance-columns.js';
import type { MonteCarloTableRow } from '../../pipeline/core/tables/monte-carlo-columns.js';
import type { BudgetTableRow } from '../../pipeline/core/tables/uncertainty-budget-columns.js';
import { seriesCovariance } from '../../pipeline/core/uncertainty/series-covariance.js';
import type { UncertaintyComponent } from '../../pipeline/core/uncertainty/uncertainty-component.js';
import { componentOrder } from '../../pipeline/core/normalization/measurement-model.js';
import { combineRows } from './combine-rows.js';
import type { RowUncertainty } from './cross-section-row.js';
import { monteCarloRows } from './monte-carlo-rows.js';

export interface SeriesUncertaintyTables {
  budget: BudgetTableRow[];
  /** null when the series has more rows than extract.covariance_max_rows. */
  covariance: CovarianceTableRow[] | null;
  combined: CombinedTableRow[];
  /** null without --mc. */
  monteCarlo: MonteCarloTableRow[] | null;
  diagnostics: Diagnostic[];
}

/**
 * The entries of one row: the lab and ratio components merged by (name, class, key). Both lists
 * are in componentOrder (firstOrderEstimate sorts them), so one merge pass pairs them.
 */
function appendBudgetEntries(out: BudgetTableRow[], row: number, lab: readonly UncertaintyComponent[], ratio: readonly UncertaintyComponent[]): void {
  let a = 0;
  let b = 0;
  while (a < lab.length || b < ratio.length) {
    const x = lab[a];
    const y = ratio[b];
    const order = x === undefined ? 1 : y === undefined ? -1 : componentOrder(x, y);
    const c = (order <= 0 ? x : y)!;
    out.push({ row, name: c.name, class: c.class, key: c.key, labValue: order <= 0 ? x!.value : Number.NaN, ratioValue: order >= 0 ? y!.value : Number.NaN });
    if (order <= 0) a++;
    if (order >= 0) b++;
  }
}

/** One row's dσ/dΩ_lab budget by component name, relative (the summary page's budget chart). */
export interface PageBudget {
  run: string;
  detector: string;
  peak: string;
  components: { name: string; kind: 'statistical' | 'systematic'; relUnc: number }[];
}

/** The budgets of the rows with a non-zero dσ/dΩ_lab: each component name summed in quadrature over its keys, relative; uncorrelated ones statistical, the rest systematic. */
export function pageBudgets(rows: readonly CrossSectionRow[], uncertainties: readonly RowUncertainty[]): PageBudget[] {
  const out: PageBudget[] = [];
  rows.forEach((r, i) => {
    const lab = uncertainties[i]!.lab?.budget;
    if (lab === undefined || !Number.isFinite(lab.value) || lab.value === 0) return;
    const byName = new Map<string, { kind: 'statistical' | 'systematic'; sum2: number }>();
    for (const c of lab.components) {
      const e = byName.get(c.name) ?? { kind: c.class === 'uncorrelated' ? ('statistical' as const) : ('systematic' as const), sum2: 0 };
      e.sum2 += c.value * c.value;
      byName.set(c.name, e);
    }
    out.push({ run: r.run, detector: r.detector, peak: r.peak, components: [...byName].map(([name, e]) => ({ name, kind: e.kind, relUnc: Math.sqrt(e.sum2) / Math.abs(lab.value) })) });
  });
  return out;
}

export interface MonteCarloSettings {
  trials: number;
  seed: number;
}

/**
 * The series-level uncertainty outputs from each row's models and budgets (rows in
 * cross_sections.arrow order): the long-form budget of dσ/dΩ_lab and σ/σ_R (one entry per row × component), the covariance of
 * dσ/dΩ_lab between every two rows (JCGM 100:2008 §F.1.2.3, shared components at ρ = 1),
 * combined values (combineRows) and, when asked, Monte Carlo per row (JCGM 101:2008).
 */
export function seriesUncertaintyTables(config: SeriesConfig, rows: readonly CrossSectionRow[], uncertainties: readonly RowUncertainty[], mc?: MonteCarloSettings): SeriesUncertaintyTables {
  const diagnostics: Diagnostic[] = [];
  const budget: BudgetTableRow[] = [];
  const labComponents: (readonly UncertaintyComponent[])[] = [];
  rows.forEach((_r, i) => {
    const u = uncertainties[i]!;
    appendBudgetEntries(budget, i, u.lab?.budget.components ?? [], u.ratio?.budget.components ?? []);
    const lab = u.lab !== null && Number.isFinite(u.lab.budget.value) ? u.lab.budget : null;
    labComponents.push(lab?.components ?? []);
  });
  let covariance: CovarianceTableRow[] | null = null;
  const maxRows = config.extract.covariance_max_rows;
  if (rows.length <= maxRows) covariance = covarianceTableRows(seriesCovariance(labComponents));
  else diagnostics.push({ severity: 'info', rule: 'covariance-not-written', stage: 'extract', message: `covariance.arrow not written: ${rows.length} rows exceed extract.covariance_max_rows = ${maxRows} (a series-wide component makes the matrix dense, ${rows.length} × ${rows.length})`, hint: 'raise extract.covariance_max_rows, or build it from uncertainty_budget.arrow (README, "The covariance matrix")' });
  const combined = combineRows(
    rows.flatMap((r, i) => {
      const lab = uncertainties[i]!.lab;
      return lab === null ? [] : [{ index: i, run: r.run, peak: r.peak, angleLabDeg: r.angleLabDeg, beamEnergyKeV: r.beamEnergyKeV, value: lab.budget.value, components: lab.budget.components }];
    }),
    config.extract.combine_energy_tolerance_keV,
  );
  let monteCarlo: MonteCarloTableRow[] | null = null;
  if (mc !== undefined) {
    monteCarlo = [];
    for (const quantity of ['dsigma_domega_lab', 'sigma_over_rutherford'] as const) {
      const picked = uncertainties.flatMap((u, i) => {
        const part = quantity === 'dsigma_domega_lab' ? u.lab : u.ratio;
        if (part !== null && part.model === null) throw new RangeError('Monte Carlo needs the row models: extract with keepModels');
        return part === null || !Number.isFinite(part.budget.value) ? [] : [{ i, part }];
      });
      const results = monteCarloRows(picked.map((p) => p.part.model!), mc.trials, mc.seed, picked.map((p) => p.i));
      picked.forEach(({ i, part }, k) => {
        const r = rows[i]!;
        const m = results[k]!;
        monteCarlo!.push({ row: i, run: r.run, detector: r.detector, peak: r.peak, quantity, firstOrderValue: part.budget.value, firstOrderUncertainty: part.budget.total, mean: m.mean, standardUncertainty: m.standardUncertainty, lower95: m.lower95, upper95: m.upper95, trials: mc.trials, seed: mc.seed, problem: m.problem });
      });
    }
    monteCarlo.sort((a, b) => a.row - b.row || (a.quantity < b.quantity ? -1 : 1));
  }
  return { budget, covariance, combined, monteCarlo, diagnostics };
}
