import { appendFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulateSeries } from '../../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema } from '../../../pipeline/simulate/simulation-spec.js';
import { crossSectionPulls } from '../cross-section-pulls.js';
import { readArrowRows, type ArrowRow } from '../read-arrow-rows.js';
import { readTruthCsv, type TruthCsvRow } from '../read-truth-csv.js';
import { runCli, type CliResult } from '../run-cli.js';
import { separatedPeaksSpec } from '../separated-peaks-spec.js';

// Injected truth: plan run 7 (a sample run, r007) has detector d02's gain 1.2 % above its calibration file.
// A peak at E then reads E' = off + (E − off)/1.012 through the file, a shift of −(E − off)·(1 − 1/1.012).
const GAIN_FACTOR = 1.012;
const spec = simulationSpecSchema.parse(separatedPeaksSpec({ series: 'bkw-2026-drift', gain_drift: [{ run_index: 7, gain_factor: GAIN_FACTOR, detector: 'd02' }] }));
const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-drift-'));
const out: Record<'track' | 'correct', { cli: CliResult; qc: ArrowRow[]; rows: ArrowRow[] }> = {} as never;
let truth: Map<string, TruthCsvRow>;

beforeAll(async () => {
  for (const mode of ['track', 'correct'] as const) {
    const { seriesDir } = simulateSeries({ ...spec, series: `bkw-2026-drift-${mode}` }, join(root, 'in'));
    appendFileSync(join(seriesDir, 'series.yaml'), `drift: { mode: ${mode}, tolerance_keV: 3 }\n`);
    truth = readTruthCsv(join(seriesDir, 'truth.csv'));
    const cli = await runCli(['reduce', seriesDir, '--out', join(root, 'out'), '--no-html']);
    const dir = join(root, 'out', `bkw-2026-drift-${mode}`);
    out[mode] = { cli, qc: readArrowRows(join(dir, 'qc.arrow')), rows: readArrowRows(join(dir, 'cross_sections.arrow')) };
  }
}, 120_000);
afterAll(() => rmSync(root, { recursive: true, force: true }));

const drifted = (r: ArrowRow) => r.run === 'r007' && r.detector === 'd02';

describe('gain-drift tracking on a simulated series with an injected gain shift (truth: the simulator spec)', () => {
  it('drift.mode track: finds the injected shift of the tracked (strongest elastic) peak within 3σ + 0.3 keV, and flags only that run × detector', () => {
    const { cli, qc } = out.track;
    expect(cli.code).toBe(0);
    const row = qc.find(drifted)!;
    const cal = spec.calibrations[0]!.detectors.find((d) => d.id === 'd02')!;
    const tracked = truth.get(`r007|d02|${String(row.drift_tracking_peak)}`)!;
    const expected = -(Number(tracked.detected_energy_keV) - cal.offset_keV) * (1 - 1 / GAIN_FACTOR);
    expect(expected).toBeLessThan(-3);
    expect(Math.abs(Number(row.drift_shift_keV) - expected)).toBeLessThan(3 * Number(row.drift_shift_unc_keV) + 0.3);
    expect(String(row.flags)).toContain('gain-drift');
    expect(qc.filter((q) => !drifted(q) && String(q.flags).includes('gain-drift')).map((q) => `${q.run} ${q.detector} ${q.drift_shift_keV}`)).toEqual([]);
    expect(new Set(qc.map((q) => q.gain_correction))).toEqual(new Set([1]));
    expect(qc.filter((q) => String(q.flags).includes('drift-not-tracked')).map((q) => `${q.run} ${q.detector}`)).toEqual([]);
  });

  it('drift.mode correct: applies gain factor ≈ 1.012 to that run × detector only (within 0.1 %), records gain-corrected, and its cross sections match the truth (|pull| < 3)', () => {
    const { cli, qc, rows } = out.correct;
    expect(cli.code).toBe(0);
    const row = qc.find(drifted)!;
    expect(Math.abs(Number(row.gain_correction) / GAIN_FACTOR - 1)).toBeLessThan(1e-3);
    expect(String(row.flags)).toContain('gain-corrected');
    expect(qc.filter((q) => !drifted(q) && q.gain_correction !== 1).map((q) => `${q.run} ${q.detector}`)).toEqual([]);
    const own = rows.filter(drifted);
    expect(own.length).toBe(2);
    for (const r of own) expect(String(r.flags)).toContain('gain-corrected');
    const pulls = crossSectionPulls(own, truth);
    for (const p of pulls.lab) expect(Math.abs(p)).toBeLessThan(3);
  });
});
