import { describe, expect, it } from 'vitest';
import { seriesSchema } from '../../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../../pipeline/core/counting/live-fraction.js';
import type { CrossSectionRow } from '../../../pipeline/core/model/result-rows.js';
import type { RowNormalization } from '../../../pipeline/core/normalization/row-normalization.js';
import type { ScalarOps } from '../../../pipeline/core/normalization/scalar-ops.js';
import { chargeScale, layerThickness, modelInput } from '../../../pipeline/core/normalization/shared-inputs.js';
import type { RowUncertainty } from '../../../stages/extract/cross-section-row.js';
import { crossSectionLabModel, rowBudget } from '../../../stages/extract/row-budget.js';
import { seriesUncertaintyTables } from '../../../stages/extract/series-uncertainty-tables.js';

const config = (extract: object = {}) =>
  seriesSchema.parse({
    series: 'tables-test',
    beam: { projectile: '4He', charge_state: 1 },
    detectors: [{ id: 'd01', angle_deg: 150, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }],
    targets: [{ id: 'c-foil', layers: [{ composition: { '12C': 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] }],
    peaks: [{ label: '12C elastic', target_nuclide: '12C' }],
    normalization: { method: 'absolute' },
    extract,
  });

/** L = g · 10¹⁴ sr: the charge scale (series class, 2 %) is the only normalization input. */
const norm: RowNormalization = {
  method: 'absolute',
  exposure: { inputs: [chargeScale('tables-test', 0.02), modelInput('solid_angle', 'detector', 'd01', 0, 0)], parts: [], evaluate: <T,>(v: readonly T[], _p: readonly T[], ops: ScalarOps<T>) => ops.scale(v[0]!, 1e14) },
  referenceRuns: [],
  weights: [],
  solidAngleMsr: 2.5,
  flags: [],
};
const live: LiveFraction = { value: 1, unc: 0, source: 'live-time' };
const layers = [{ atomsPerCm2: 1e17, thickness: layerThickness('c-foil', 0, 0.05, false) }];

function rows(counts: number[], energies: number[]): { rows: CrossSectionRow[]; u: RowUncertainty[] } {
  const u = counts.map((g, i): RowUncertainty => {
    const model = crossSectionLabModel({ run: `r${i}`, detector: 'd01', gross: g, background: 0, backgroundVariance: 0, live, sampleLayers: layers, normalization: norm });
    return { lab: { model, budget: rowBudget(model) }, ratio: null };
  });
  const r = counts.map((_, i) => ({ run: `r${i}`, detector: 'd01', peak: '12C elastic', angleLabDeg: 150, beamEnergyKeV: energies[i]! }) as CrossSectionRow);
  return { rows: r, u };
}

describe('seriesUncertaintyTables: the series-level outputs from the row budgets', () => {
  // dσ/dΩ = G/(n · L) / 10⁻²⁷ = G · 10⁻⁴ mb/sr here (n = 10¹⁷/cm², L = 10¹⁴ sr); u_counting = √G · 10⁻⁴, charge 2 %, areal density 5 %
  const { rows: r, u } = rows([10000, 10400, 9000], [2000, 2000.5, 2100]);

  it('budget: every component of every row with the row index (counting 1/√G, areal density and charge −5 %, −2 % of y = 1 mb/sr); no σ/σ_R here', () => {
    const t = seriesUncertaintyTables(config(), r, u);
    const row0 = t.budget.filter((b) => b.row === 0);
    expect(row0.map((b) => b.name)).toEqual(['counting', 'sample_areal_density', 'charge']);
    expect(row0[0]!.labValue).toBeCloseTo(0.01, 12);
    expect(row0[1]!.labValue).toBeCloseTo(-0.05, 12);
    expect(row0[2]!.labValue).toBeCloseTo(-0.02, 12);
    expect(row0.every((b) => Number.isNaN(b.ratioValue))).toBe(true);
  });

  it('covariance: cov(i, j) = v_i v_j (0.05² + 0.02²) between rows, + u_counting² on the diagonal (JCGM 100:2008 §F.1.2.3)', () => {
    const t = seriesUncertaintyTables(config(), r, u);
    const c = new Map(t.covariance!.map((e) => [`${e.i},${e.j}`, e.covariance]));
    expect(c.size).toBe(6);
    const y = [1, 1.04, 0.9];
    expect(c.get('0,1')! / (y[0]! * y[1]! * (0.05 ** 2 + 0.02 ** 2))).toBeCloseTo(1, 10);
    expect(c.get('2,2')! / (y[2]! ** 2 * (1 / 9000 + 0.05 ** 2 + 0.02 ** 2))).toBeCloseTo(1, 10);
  });

  it('covariance.arrow is left out above extract.covariance_max_rows, with an info diagnostic', () => {
    const t = seriesUncertaintyTables(config({ covariance_max_rows: 2 }), r, u);
    expect(t.covariance).toBeNull();
    expect(t.diagnostics.map((d) => [d.severity, d.rule])).toEqual([['info', 'covariance-not-written']]);
  });

  it('combined: rows within 1 keV (default tolerance) form one group, the common charge and areal density are not reduced by averaging', () => {
    const t = seriesUncertaintyTables(config(), r, u);
    expect(t.combined.map((c) => c.rows)).toEqual([[0, 1], [2]]);
    const pair = t.combined[0]!;
    const w = [1 / (1e-4 * Math.sqrt(10000)) ** 2, 1 / (1e-4 * Math.sqrt(10400)) ** 2];
    const mean = (w[0]! * 1 + w[1]! * 1.04) / (w[0]! + w[1]!);
    expect(pair.value).toBeCloseTo(mean, 9);
    expect(pair.uncertaintyCommon / (mean * Math.hypot(0.05, 0.02))).toBeCloseTo(1, 9);
  });

  it('Monte Carlo only when asked; M = 2000 trials reproduce the first-order standard uncertainty of a near-linear model within 4/√(2M) + 1 %', () => {
    expect(seriesUncertaintyTables(config(), r, u).monteCarlo).toBeNull();
    const t = seriesUncertaintyTables(config(), r, u, { trials: 2000, seed: 3 });
    expect(t.monteCarlo!.map((m) => m.row)).toEqual([0, 1, 2]);
    for (const m of t.monteCarlo!) expect(Math.abs(m.standardUncertainty / m.firstOrderUncertainty - 1)).toBeLessThan(4 / Math.sqrt(4000) + 0.01);
  });
});
