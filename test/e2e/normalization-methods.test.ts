import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema, type SimulationSpecInput } from '../../pipeline/simulate/simulation-spec.js';
import { isPositiveSemidefinite } from '../../pipeline/core/uncertainty/is-positive-semidefinite.js';
import { crossSectionPulls } from './cross-section-pulls.js';
import { pullStatistics } from './pull-statistics.js';
import { readArrowRows, type ArrowRow } from './read-arrow-rows.js';
import { readTruthCsv, type TruthCsvRow } from './read-truth-csv.js';
import { runCli, type CliResult } from './run-cli.js';
import { separatedPeaksSpec } from './separated-peaks-spec.js';

// Each normalization method on a series simulated with known truth (the simulator's truth.csv,
// which the reduction never sees). Pull criterion of the foundation issue: mean pull within ±0.2,
// pull standard deviation between 0.8 and 1.25.
const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-methods-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

const base = separatedPeaksSpec();
/** The sample target with a thin gold film (role: reference) behind the carbon: its elastic peak lies far above the 12C and 16O peaks (K_Au ≈ 0.92 against ≤ 0.4; Chu, Mayer & Nicolet 1978, eq. 2.5). */
const withGold: SimulationSpecInput['targets'] = [
  base.targets[0]!,
  { ...base.targets[1]!, layers: [...base.targets[1]!.layers, { composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 8, areal_density_unc_rel: 0.02, role: 'reference' }] },
];

interface Reduced {
  cli: CliResult;
  out: string;
  seriesDir: string;
  rows: ArrowRow[];
  truth: Map<string, TruthCsvRow>;
}

async function reduce(name: string, spec: SimulationSpecInput, extraArgs: string[] = []): Promise<Reduced> {
  const parsed = simulationSpecSchema.parse(spec);
  const { seriesDir } = simulateSeries(parsed, join(root, name, 'in'));
  const outDir = join(root, name, 'out');
  const cli = await runCli(['reduce', seriesDir, '--out', outDir, '--no-html', ...extraArgs]);
  const out = join(outDir, parsed.series);
  return { cli, out, seriesDir, rows: readArrowRows(join(out, 'cross_sections.arrow')), truth: readTruthCsv(join(seriesDir, 'truth.csv')) };
}

function expectPulls(r: Reduced, ownLiveTime: boolean) {
  const pulls = crossSectionPulls(r.rows, r.truth, () => true, { ownLiveTime });
  expect(pulls.unmatched).toEqual([]);
  for (const key of ['lab', 'cm', 'ratio'] as const) {
    const s = pullStatistics(pulls[key]);
    expect(s.n).toBe(r.truth.size);
    expect(Math.abs(s.mean), `${key}: mean pull ${s.mean.toFixed(3)}`).toBeLessThanOrEqual(0.2);
    expect(s.sd, `${key}: pull sd ${s.sd.toFixed(3)}`).toBeGreaterThanOrEqual(0.8);
    expect(s.sd, `${key}: pull sd ${s.sd.toFixed(3)}`).toBeLessThanOrEqual(1.25);
  }
}

/** A CSV column scaled in place (the simulated files are plain comma-separated, no quoted fields). */
function scaleColumn(path: string, column: string, factor: number, round: (x: number) => string): void {
  const lines = readFileSync(path, 'utf8').split('\n');
  const header = lines[0]!.split(',');
  const c = header.indexOf(column);
  expect(c).toBeGreaterThanOrEqual(0);
  const out = lines.map((line, i) => {
    if (i === 0 || line === '') return line;
    const cells = line.split(',');
    if (cells[c] !== '') cells[c] = round(Number(cells[c]) * factor);
    return cells.join(',');
  });
  writeFileSync(path, out.join('\n'));
}

describe('internal-reference: a role: reference gold layer in the sample target (truth: simulator truth.csv)', () => {
  let r: Reduced;
  let corrupted: ArrowRow[];
  let mc: ArrowRow[];
  beforeAll(async () => {
    r = await reduce('internal', { ...base, series: 'bkw-internal', targets: withGold, normalization: { method: 'internal-reference', reference_target: 'au-on-c', screening: 'lecuyer' } }, ['--mc', '4000', '--mc-seed', '11']);
    mc = readArrowRows(join(r.out, 'monte_carlo.arrow'));
    // The same series with the run log's charge and the scalers' live times and pulser counts made wrong.
    scaleColumn(join(r.seriesDir, 'runlog.csv'), 'charge_uC', 1.37, (x) => x.toFixed(3));
    scaleColumn(join(r.seriesDir, 'scalers.csv'), 'live_time_s', 0.83, (x) => x.toFixed(3));
    scaleColumn(join(r.seriesDir, 'scalers.csv'), 'pulser_counted', 0.91, (x) => String(Math.round(x)));
    const outDir = join(root, 'internal', 'out-corrupted');
    const cli = await runCli(['reduce', r.seriesDir, '--out', outDir, '--no-html']);
    expect(cli.code).toBe(0);
    corrupted = readArrowRows(join(outDir, 'bkw-internal', 'cross_sections.arrow'));
  }, 120_000);

  it('exits 0 and recovers dσ/dΩ lab, CM and σ/σ_R: pulls without the own live time, which cancels', () => {
    expect(r.cli.stderr).not.toMatch(/internal error/);
    expect(r.cli.code).toBe(0);
    expect(r.rows.length).toBe(r.truth.size);
    expectPulls(r, false);
  });

  it('does not depend on the run log\'s charge or the scalers\' live time (both corrupted by 37 %, 17 % and 9 %): values and uncertainties the same to 1e-12', () => {
    expect(corrupted.length).toBe(r.rows.length);
    const columns = ['cross_section_lab_mb_per_sr', 'cross_section_lab_stat_mb_per_sr', 'cross_section_lab_sys_mb_per_sr', 'ratio_to_rutherford', 'ratio_to_rutherford_sys'];
    corrupted.forEach((c, i) => {
      const o = r.rows[i]!;
      expect(`${c.run} ${c.detector} ${c.peak}`).toBe(`${o.run} ${o.detector} ${o.peak}`);
      expect(c.charge_uC).not.toBe(o.charge_uC);
      for (const k of columns) expect(Math.abs(Number(c[k]) / Number(o[k]) - 1), `${o.run} ${o.detector} ${o.peak} ${k}`).toBeLessThan(1e-12);
    });
    expect(corrupted.some((c, i) => c.live_fraction !== r.rows[i]!.live_fraction)).toBe(true);
  });

  it('has no charge and no live-time component in any budget (they cancel; uncertainty_budget.arrow)', () => {
    const budget = readArrowRows(join(r.out, 'uncertainty_budget.arrow'));
    expect(budget.length).toBeGreaterThan(0);
    expect(budget.filter((b) => b.component === 'charge' || b.component === 'live_time')).toEqual([]);
    expect(new Set(budget.map((b) => b.component))).toContain('reference_counting');
  });

  it('first order and Monte Carlo (JCGM 101, M = 4000) agree where relative uncertainties are small: mean within 4 standard errors plus the second-order term y·(u/y)², standard deviation within 4/√(2M) + 2(u/y)', () => {
    const first = mc.filter((m) => m.quantity === 'dsigma_domega_lab');
    expect(first.length).toBe(r.rows.length);
    for (const m of mc) {
      expect(m.mc_problem).toBe('');
      const y = Number(m.first_order_value);
      const u = Number(m.first_order_unc);
      const rel = u / Math.abs(y);
      expect(rel).toBeLessThan(0.1);
      const se = Number(m.mc_std) / Math.sqrt(4000);
      expect(Math.abs(Number(m.mc_mean) - y), `${m.run} ${m.detector} ${m.peak} ${m.quantity}`).toBeLessThanOrEqual(4 * se + Math.abs(y) * rel * rel);
      expect(Math.abs(Number(m.mc_std) / u - 1), `${m.run} ${m.detector} ${m.peak} ${m.quantity}`).toBeLessThanOrEqual(4 / Math.sqrt(8000) + 2 * rel);
      expect(Number(m.mc_lower_95)).toBeLessThan(y);
      expect(Number(m.mc_upper_95)).toBeGreaterThan(y);
    }
  });
});

describe('xsred reduce --mc: arguments', () => {
  it('fewer than 40 trials is a usage error (exit 2): a 95 % interval needs M >> 1/(1 − p) = 20 (JCGM 101:2008 §7.2.2)', async () => {
    const c = await runCli(['reduce', join(root, 'nowhere'), '--out', join(root, 'mc-out'), '--mc', '10']);
    expect(c.code).toBe(2);
    const seriesDir = simulateSeries(simulationSpecSchema.parse({ ...base, series: 'bkw-mc-args' }), join(root, 'mc-args')).seriesDir;
    const d = await runCli(['reduce', seriesDir, '--out', join(root, 'mc-out'), '--no-html', '--mc', '10']);
    expect(d.code).toBe(2);
    expect(d.stderr).toMatch(/--mc 10: a 95 % coverage interval needs at least 40 trials/);
  }, 60_000);
});

describe('monitor: detector d01 normalizes every run on the gold in the sample target; relative solid angles from the reference runs', () => {
  let r: Reduced;
  beforeAll(async () => {
    r = await reduce('monitor', { ...base, series: 'bkw-monitor', targets: withGold, normalization: { method: 'monitor', reference_target: 'au-on-c', monitor_detector: 'd01', screening: 'lecuyer' } });
  }, 120_000);

  it('exits 0 and recovers the truth (pulls; the charge integrator reads 4 % high and cancels)', () => {
    expect(r.cli.stderr).not.toMatch(/internal error/);
    expect(r.cli.code).toBe(0);
    expect(r.rows.length).toBe(r.truth.size);
    expectPulls(r, true);
  });

  it('carries no charge component (it cancels in the run and in the reference runs)', () => {
    const budget = readArrowRows(join(r.out, 'uncertainty_budget.arrow'));
    expect(budget.filter((b) => b.component === 'charge')).toEqual([]);
    expect(budget.some((b) => b.component === 'reference_counting' && String(b.key).endsWith('/d01'))).toBe(true);
  });
});

describe('absolute: charge × nominal solid angle, on a series whose charge reading and solid angles are true', () => {
  let r: Reduced;
  beforeAll(async () => {
    r = await reduce('absolute', {
      ...base,
      series: 'bkw-absolute',
      detectors: base.detectors.map((d) => ({ ...d, solid_angle_msr: d.true_solid_angle_msr })),
      charge: { ...base.charge, charge_reading_factor: 1 },
      normalization: { method: 'absolute', reference_target: 'au-on-c', screening: 'lecuyer', charge_unc_rel: 0.02, solid_angle_unc_rel: 0.03 },
    });
  }, 120_000);

  it('exits 0 and recovers the truth (pulls)', () => {
    expect(r.cli.code).toBe(0);
    expect(r.rows.length).toBe(r.truth.size);
    expectPulls(r, true);
  });

  it('needs no reference run: with every reference run relabelled kind background (not reduced) the rows are the same', async () => {
    const path = join(r.seriesDir, 'runlog.csv');
    const lines = readFileSync(path, 'utf8').split('\n');
    const kind = lines[0]!.split(',').indexOf('kind');
    const relabel = (l: string) => {
      const cells = l.split(',');
      if (cells[kind] === 'reference') cells[kind] = 'background';
      return cells.join(',');
    };
    writeFileSync(path, lines.map((l, i) => (i === 0 ? l : relabel(l))).join('\n'));
    const outDir = join(root, 'absolute', 'out-no-reference');
    const cli = await runCli(['reduce', r.seriesDir, '--out', outDir, '--no-html']);
    expect(cli.code, cli.stderr).toBe(0);
    const again = readArrowRows(join(outDir, 'bkw-absolute', 'cross_sections.arrow'));
    expect(again.map((x) => x.cross_section_lab_mb_per_sr)).toEqual(r.rows.map((x) => x.cross_section_lab_mb_per_sr));
  }, 60_000);

  it('the charge (2 %, series class) and the nominal solid angle (3 %, detector class) are in every row\'s budget', () => {
    const budget = readArrowRows(join(r.out, 'uncertainty_budget.arrow'));
    const rel = (b: ArrowRow) => Number(b.dsigma_domega_lab_mb_per_sr) / Number(r.rows[Number(b.row)]!.cross_section_lab_mb_per_sr);
    const charge = budget.filter((b) => b.component === 'charge');
    const omega = budget.filter((b) => b.component === 'solid_angle');
    expect(charge.length).toBe(r.rows.length);
    expect(omega.length).toBe(r.rows.length);
    for (const b of charge) expect(Math.abs(rel(b))).toBeCloseTo(0.02, 12);
    for (const b of omega) {
      expect(b.correlation_class).toBe('detector');
      expect(b.key).toBe(r.rows[Number(b.row)]!.detector);
      expect(Math.abs(rel(b))).toBeCloseTo(0.03, 12);
    }
  });
});

describe('reference-run, rule series-mean: every reference run of a detector, weighted (no drift in the simulation)', () => {
  let r: Reduced;
  let covariance: ArrowRow[];
  let budget: ArrowRow[];
  let combined: ArrowRow[];
  beforeAll(async () => {
    // two sample runs per energy, so combined.arrow has pairs to combine
    r = await reduce('series-mean', { ...base, series: 'bkw-series-mean', schedule: { ...base.schedule, samples_per_energy: 2 }, normalization: { method: 'reference-run', reference_target: 'au-on-c', reference_rule: 'series-mean', screening: 'lecuyer' } });
    covariance = readArrowRows(join(r.out, 'covariance.arrow'));
    budget = readArrowRows(join(r.out, 'uncertainty_budget.arrow'));
    combined = readArrowRows(join(r.out, 'combined.arrow'));
  }, 120_000);

  it('exits 0 and recovers the truth (pulls)', () => {
    expect(r.cli.code).toBe(0);
    expectPulls(r, true);
    expect(new Set(r.rows.filter((x) => x.detector === 'd01').map((x) => x.reference_runs)).size).toBe(1);
  });

  it('covariance.arrow: upper triangle only, diagonal = stat² + sys² of cross_sections.arrow, and the full matrix symmetric positive semi-definite (Cholesky, Golub & Van Loan 2013 §4.2)', () => {
    const n = r.rows.length;
    const m = Array.from({ length: n }, () => new Float64Array(n));
    for (const c of covariance) {
      const i = Number(c.i);
      const j = Number(c.j);
      expect(j).toBeGreaterThanOrEqual(i);
      m[i]![j] = Number(c.covariance_mb2_per_sr2);
      m[j]![i] = Number(c.covariance_mb2_per_sr2);
    }
    r.rows.forEach((row, i) => {
      const total2 = Number(row.cross_section_lab_stat_mb_per_sr) ** 2 + Number(row.cross_section_lab_sys_mb_per_sr) ** 2;
      expect(m[i]![i]! / total2).toBeCloseTo(1, 10);
    });
    expect(isPositiveSemidefinite(m, 1e-9)).toEqual({ psd: true, reason: '' });
  });

  it('covariance.arrow equals Σ v_i v_j over the components two rows share in uncertainty_budget.arrow (same name, class, key; JCGM 100:2008 §F.1.2.3), recomputed here', () => {
    const byRow = new Map<number, Map<string, number>>();
    const uncorrelated = new Float64Array(r.rows.length);
    for (const b of budget) {
      if (b.dsigma_domega_lab_mb_per_sr === null) continue;
      const i = Number(b.row);
      if (b.correlation_class === 'uncorrelated') {
        uncorrelated[i] += Number(b.dsigma_domega_lab_mb_per_sr) ** 2;
        continue;
      }
      let own = byRow.get(i);
      if (own === undefined) byRow.set(i, (own = new Map()));
      own.set(`${b.component}|${b.correlation_class}|${b.key}`, Number(b.dsigma_domega_lab_mb_per_sr));
    }
    const cov = (i: number, j: number) => {
      let s = i === j ? uncorrelated[i]! : 0;
      for (const [k, v] of byRow.get(i) ?? []) s += v * (byRow.get(j)?.get(k) ?? 0);
      return s;
    };
    const listed = new Map(covariance.map((c) => [`${c.i},${c.j}`, Number(c.covariance_mb2_per_sr2)]));
    for (const [i, j] of [[0, 0], [0, 1], [0, 100], [5, 6], [17, 150], [200, 209]] as const) {
      const expected = cov(i, j);
      const got = listed.get(`${i},${j}`) ?? 0;
      expect(Math.abs(got - expected)).toBeLessThanOrEqual(1e-12 * Math.abs(expected) + 1e-300);
    }
  });

  it('combined.arrow: the two runs of each energy, peak and angle are one group; the weighted mean lies between them, and χ² (ν = 1) averages 1 within 3·√(2/N) (χ² distribution; Particle Data Group, Workman et al. 2022, §5.2)', () => {
    expect(combined.length).toBe(r.rows.length / 2);
    let chi2 = 0;
    for (const c of combined) {
      expect(c.member_count).toBe(2);
      expect(c.ndf).toBe(1);
      expect(Number(c.scale_factor)).toBe(Math.max(1, Math.sqrt(Number(c.chi2))));
      const [a, b] = String(c.member_rows).split('+').map((k) => Number(r.rows[Number(k)]!.cross_section_lab_mb_per_sr));
      const v = Number(c.dsigma_domega_lab_mb_per_sr);
      expect(v).toBeGreaterThanOrEqual(Math.min(a!, b!));
      expect(v).toBeLessThanOrEqual(Math.max(a!, b!));
      expect(Number(c.unc_common_mb_per_sr)).toBeGreaterThan(0);
      chi2 += Number(c.chi2);
    }
    expect(Math.abs(chi2 / combined.length - 1)).toBeLessThanOrEqual(3 * Math.sqrt(2 / combined.length));
  });
});
