import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { calibrateSeries, type CalibrateResult } from '../../../pipeline/engine/calibrate-command.js';
import { reduceSeries } from '../../../pipeline/engine/reduce-series.js';
import { simulateSeries } from '../../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema } from '../../../pipeline/simulate/simulation-spec.js';
import { readArrowRows } from '../../e2e/read-arrow-rows.js';
import { separatedPeaksSpec } from '../../e2e/separated-peaks-spec.js';

// Truth: the calibrations the simulator generated every spectrum with (spec.calibrations), which
// the calibration runs (a 239Pu/241Am/244Cm source, DDEP line energies) are fitted to recover.
const spec = simulationSpecSchema.parse(separatedPeaksSpec({
  series: 'bkw-2026-calibrate',
  channels: 2048,
  calibration_runs: { source_id: 'mixed-alpha', lines_from: ['239Pu', '241Am', '244Cm'], counts_per_nuclide: 40000 },
}));
const root = mkdtempSync(join(tmpdir(), 'xsred-calibrate-'));
let seriesDir: string;
let first: CalibrateResult;
const filesBefore = new Map<string, string>();

beforeAll(() => {
  seriesDir = simulateSeries(spec, root).seriesDir;
  for (const f of readdirSync(join(seriesDir, 'calibrations'))) filesBefore.set(f, readFileSync(join(seriesDir, 'calibrations', f), 'utf8'));
  first = calibrateSeries({ seriesDir });
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

/** Mahalanobis distance² of (offset, gain) from the truth under the fitted covariance. */
function distance2(fit: { offsetKeV: number; gainKeVPerChannel: number; covariance: number[][] }, offset: number, gain: number): number {
  const [[a, b], [, d]] = fit.covariance as [[number, number], [number, number]];
  const x = fit.offsetKeV - offset;
  const y = fit.gainKeVPerChannel - gain;
  const det = a * d - b * b;
  return (d * x * x - 2 * b * x * y + a * y * y) / det;
}

describe('xsred calibrate on a simulated series with mixed-alpha calibration runs', () => {
  it('fits one new version per calibration run, valid up to the run before the next one, superseding the versions there', () => {
    expect(first.exitCode).toBe(0);
    expect(first.calibrated.map((c) => [c.version, c.run, c.validToRun, c.supersedes])).toEqual([
      ['cal-r001', 'r001', 'r010', ['cal-bkw-05a']],
      ['cal-r011', 'r011', undefined, ['cal-bkw-05b']],
    ]);
    expect(first.calibrated.every((c) => c.written)).toBe(true);
  });

  it('reproduces the simulated calibration within its covariance: χ²(2 dof) of (offset, gain) below 13.8 (P = 0.001) for every detector, and the sum over all 10 below 60 (χ²(20) at P ≈ 1e-5)', () => {
    let total = 0;
    let n = 0;
    for (const c of first.calibrated) {
      const truth = spec.calibrations.find((v) => v.version === (c.run === 'r001' ? 'cal-bkw-05a' : 'cal-bkw-05b'))!;
      for (const d of c.detectors) {
        const t = truth.detectors.find((x) => x.id === d.id)!;
        const chi2 = distance2(d.fit, t.offset_keV, t.gain_keV_per_channel);
        expect(chi2, `${c.run} ${d.id}`).toBeLessThan(13.8);
        total += chi2;
        n++;
      }
    }
    expect(n).toBe(10);
    expect(total).toBeLessThan(60);
  });

  it('leaves every existing file byte-identical, and a second run writes cal-r001-2 superseding cal-r001 instead of overwriting it', () => {
    for (const [f, text] of filesBefore) expect(readFileSync(join(seriesDir, 'calibrations', f), 'utf8')).toBe(text);
    const firstText = readFileSync(join(seriesDir, 'calibrations', 'cal-r001.yaml'), 'utf8');
    const mtime = statSync(join(seriesDir, 'calibrations', 'cal-r001.yaml')).mtimeMs;
    const second = calibrateSeries({ seriesDir });
    expect(second.calibrated.map((c) => c.version)).toEqual(['cal-r001-2', 'cal-r011-2']);
    expect(second.calibrated[0]!.supersedes).toEqual(['cal-bkw-05a', 'cal-r001']);
    expect(readFileSync(join(seriesDir, 'calibrations', 'cal-r001.yaml'), 'utf8')).toBe(firstText);
    expect(statSync(join(seriesDir, 'calibrations', 'cal-r001.yaml')).mtimeMs).toBe(mtime);
    for (const f of ['cal-r001-2.yaml', 'cal-r011-2.yaml']) rmSync(join(seriesDir, 'calibrations', f));
  });

  it('--dry-run writes nothing', () => {
    const before = readdirSync(join(seriesDir, 'calibrations')).sort();
    const dry = calibrateSeries({ seriesDir, dryRun: true });
    expect(dry.calibrated.length).toBe(2);
    expect(dry.calibrated.every((c) => !c.written)).toBe(true);
    expect(readdirSync(join(seriesDir, 'calibrations')).sort()).toEqual(before);
    expect(dry.report).toMatch(/not written \(--dry-run\)/);
  });

  it('xsred reduce then uses the fitted versions (qc.arrow calibration_version)', async () => {
    const r = await reduceSeries({ seriesDir, outDir: join(root, 'out'), jobs: 1, html: false, commandLine: [] });
    expect(r.exitCode).toBe(0);
    const versions = new Set(readArrowRows(join(root, 'out', spec.series, 'qc.arrow')).filter((q) => q.status === 'reduced').map((q) => q.calibration_version));
    expect(versions).toEqual(new Set(['cal-r001', 'cal-r011']));
  });

  it('xsred calibrate --help names the command, --dry-run and the settings', () => {
    const help = execFileSync(process.execPath, ['--import', 'tsx', 'pipeline/engine/cli.ts', 'calibrate', '--help'], { cwd: join(import.meta.dirname, '../../..'), encoding: 'utf8' });
    expect(help).toMatch(/Usage: xsred calibrate/);
    expect(help).toMatch(/--dry-run/);
    expect(help).toMatch(/calibrate\.degree/);
  });

  it('a folder without series.yaml is a usage error (exit 2) with an error diagnostic', () => {
    const r = calibrateSeries({ seriesDir: join(root, 'does-not-exist') });
    expect(r.exitCode).toBe(2);
    expect(r.diagnostics.some((d) => d.severity === 'error')).toBe(true);
  });
});
