import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { elasticKinematicFactor, nuclide } from '../../pipeline/core/physics/index.js';
import { loadSimulationSpec } from '../../pipeline/simulate/load-simulation-spec.js';
import { scheduleRuns } from '../../pipeline/simulate/schedule-runs.js';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';

const repo = fileURLToPath(new URL('../../', import.meta.url));
const specPath = join(repo, 'pipeline', 'simulate', 'specs', 'demo.yaml');
const committed = join(repo, 'sample-runs', 'fval-2026-c12-alpha');
const spec = loadSimulationSpec(readFileSync(specPath, 'utf8'), specPath).spec!;
const root = mkdtempSync(join(tmpdir(), 'xsred-demo-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

function hashes(dir: string, prefix = ''): [string, string][] {
  return readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name)).flatMap((e) =>
    e.isDirectory() ? hashes(join(dir, e.name), `${prefix}${e.name}/`) : [[`${prefix}${e.name}`, createHash('sha256').update(readFileSync(join(dir, e.name))).digest('hex')] as [string, string]]);
}

describe('the demo series (sample-runs/fval-2026-c12-alpha)', () => {
  it('is exactly what pipeline/simulate/specs/demo.yaml generates (regenerate with pipeline/tools/make-demo-series.ts)', () => {
    const fresh = simulateSeries(spec, root).seriesDir;
    expect(hashes(fresh)).toEqual(hashes(committed));
  });

  it('stays small: at most 25 runs and 1 MB', () => {
    expect(scheduleRuns(spec).length).toBeLessThanOrEqual(25);
    const bytes = hashes(committed).reduce((s, [f]) => s + readFileSync(join(committed, f)).length, 0);
    expect(bytes).toBeLessThan(1_000_000);
  });

  it('keeps the 12C, 13C and Au elastic peaks inside every spectrum and at least 3 FWHM apart (kinematic factor K, Chu, Mayer & Nicolet 1978)', () => {
    const m1 = nuclide('4He').massU;
    const runs = scheduleRuns(spec);
    for (const run of runs) {
      const cal = spec.calibrations[run.calibration]!;
      for (const det of spec.detectors) {
        const c = cal.detectors.find((d) => d.id === det.id)!;
        const energy = (name: string) => elasticKinematicFactor(m1, nuclide(name).massU, det.angle_deg) * run.beamEnergyKeV;
        const [e12, e13, eAu] = [energy('12C'), energy('13C'), energy('197Au')];
        expect(e13 - e12).toBeGreaterThan(3 * det.resolution_fwhm_keV);
        expect(eAu - e13).toBeGreaterThan(3 * det.resolution_fwhm_keV);
        const lastChannelKeV = c.offset_keV + c.gain_keV_per_channel * (spec.channels - 1);
        expect(e12).toBeGreaterThan(c.offset_keV + 10 * c.gain_keV_per_channel);
        expect(eAu + 3 * det.resolution_fwhm_keV).toBeLessThan(lastChannelKeV);
      }
    }
  });

  it('has no 12C(α,α′) 4.44 MeV peak: every beam energy is below its threshold −Q (M1 + M2)/M2 ≈ 5.92 MeV', () => {
    const threshold = (4438.9 * (nuclide('4He').massU + nuclide('12C').massU)) / nuclide('12C').massU;
    expect(Math.max(...scheduleRuns(spec).map((r) => r.beamEnergyKeV))).toBeLessThan(threshold);
    expect(spec.peaks.every((p) => p.excitation_keV === 0)).toBe(true);
  });
});
