import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulateSeries } from '../../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema } from '../../../pipeline/simulate/simulation-spec.js';
import { pullStatistics } from '../pull-statistics.js';
import { readArrowRows, type ArrowRow } from '../read-arrow-rows.js';
import { readTruthCsv, type TruthCsvRow } from '../read-truth-csv.js';
import { runCli, type CliResult } from '../run-cli.js';
import { separatedPeaksSpec } from '../separated-peaks-spec.js';
import { carbonDoubletSpec } from './carbon-doublet-spec.js';

// Reference: the simulator's truth.csv (expected counts of each peak), which the reduction never sees.
const spec = simulationSpecSchema.parse(carbonDoubletSpec());
const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-doublet-'));
let cli: CliResult;
let fits: ArrowRow[];
let residuals: ArrowRow[];
let rows: ArrowRow[];
let truth: Map<string, TruthCsvRow>;
let windowOut: string;
let windowCli: CliResult;

beforeAll(async () => {
  const { seriesDir } = simulateSeries(spec, join(root, 'in'));
  truth = readTruthCsv(join(seriesDir, 'truth.csv'));
  cli = await runCli(['reduce', seriesDir, '--out', join(root, 'out'), '--no-html', '--jobs', '2']);
  const out = join(root, 'out', spec.series);
  fits = readArrowRows(join(out, 'fits.arrow'));
  residuals = readArrowRows(join(out, 'fit_residuals.arrow'));
  rows = readArrowRows(join(out, 'cross_sections.arrow'));
  const plain = simulateSeries(separatedPeaksSpec(), join(root, 'in-window'));
  windowCli = await runCli(['reduce', plain.seriesDir, '--out', join(root, 'out-window'), '--no-html']);
  windowOut = join(root, 'out-window', 'bkw-2026-c12-o16');
}, 120_000);
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('method: fit on a simulated 12C/13C doublet (fit_group carbon), truth from truth.csv', () => {
  it('writes one fits.arrow row per sample run × detector × fitted peak, every fit converged, and the residuals of each region', () => {
    expect(cli.code).toBe(0);
    expect(fits.length).toBe(truth.size);
    expect(fits.filter((f) => f.converged !== 1).map((f) => `${f.run} ${f.detector} ${f.peak}: ${f.stop_reason}`)).toEqual([]);
    expect(new Set(fits.map((f) => f.fit_group))).toEqual(new Set(['carbon']));
    expect(new Set(fits.map((f) => f.group_size))).toEqual(new Set([2]));
    const regionChannels = fits.filter((f) => f.peak === 'C-12 elastic').reduce((s, f) => s + Number(f.fit_last_channel) - Number(f.fit_first_channel) + 1, 0);
    expect(residuals.length).toBe(regionChannels);
  });

  it('recovers the true peak areas: area pulls (area − expected counts)/u have |mean| < 0.35 and sd in [0.75, 1.3] per isotope (common practice for pulls; 63 fits each, standard error of the mean 0.13)', () => {
    for (const peak of ['C-12 elastic', 'C-13 elastic']) {
      const pulls = fits.filter((f) => f.peak === peak).map((f) => (Number(f.area_counts) - Number(truth.get(`${f.run}|${f.detector}|${f.peak}`)!.expected_counts)) / Number(f.area_unc_counts));
      const s = pullStatistics(pulls);
      expect(s.n).toBe(63);
      expect(Math.abs(s.mean)).toBeLessThan(0.35);
      expect(s.sd).toBeGreaterThan(0.75);
      expect(s.sd).toBeLessThan(1.3);
    }
  });

  it('feeds the fitted area to extract unchanged (net_counts = area_counts, net_counts_unc = area_unc_counts)', () => {
    const byKey = new Map(fits.map((f) => [`${f.run}|${f.detector}|${f.peak}`, f]));
    const mismatched = rows.filter((r) => {
      const f = byKey.get(`${r.run}|${r.detector}|${r.peak}`)!;
      return r.net_counts !== f.area_counts || r.net_counts_unc !== f.area_unc_counts;
    });
    expect(mismatched).toEqual([]);
  });

  it('reports the area correlation within each doublet fit, the same seen from either peak and weak (|rho| < 0.5) at 1.9–4.4 FWHM apart (the calibrated check of the correlation against simulation is test/core/fitting/doublet.test.ts)', () => {
    const rho = (f: ArrowRow) => Number(String(f.area_correlations).split('=')[1]);
    const close: number[] = [];
    const byRun = new Map<string, ArrowRow[]>();
    for (const f of fits) byRun.set(`${f.run}|${f.detector}`, [...(byRun.get(`${f.run}|${f.detector}`) ?? []), f]);
    for (const pair of byRun.values()) {
      expect(pair.length).toBe(2);
      expect(rho(pair[0]!)).toBeCloseTo(rho(pair[1]!), 4);
      const separationFwhm = Math.abs(Number(pair[1]!.centroid_channel) - Number(pair[0]!.centroid_channel)) / (2.3548 * Number(pair[0]!.sigma_channel));
      expect(Math.abs(rho(pair[0]!))).toBeLessThan(0.5);
      if (separationFwhm < 3) close.push(rho(pair[0]!));
    }
    expect(close.length).toBeGreaterThan(5);
  });

  it('with the default method: window, writes no fits.arrow and qc.arrow without drift columns', () => {
    expect(windowCli.code).toBe(0);
    expect(existsSync(join(windowOut, 'fits.arrow'))).toBe(false);
    expect(Object.keys(readArrowRows(join(windowOut, 'qc.arrow'))[0]!).some((k) => k.startsWith('drift_'))).toBe(false);
  });
});
