import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema } from '../../pipeline/simulate/simulation-spec.js';
import { crossSectionPulls, type CrossSectionPulls } from './cross-section-pulls.js';
import { pullStatistics } from './pull-statistics.js';
import { readArrowRows, type ArrowRow } from './read-arrow-rows.js';
import { readTruthCsv, type TruthCsvRow } from './read-truth-csv.js';
import { runCli, type CliResult } from './run-cli.js';
import { thickTargetReactionSpec } from './thick-target-reaction-spec.js';

// A thick, tilted target and a reaction product behind a detector foil (issue 3, "End to end").
// The simulator builds each spectrum slice by slice through the layer (pipeline/simulate/
// layer-peak-lines.ts); the reduction quotes each cross section at the mid-depth energy its own
// planner computes (pipeline/core/kinematics/peak-path.ts). Reference: the simulator's truth.csv.
// Pull criterion of the foundation issue: mean within ±0.2 (here ±0.4: 27 rows, 2σ of a mean of
// 27 unit pulls is 0.38), standard deviation 0.7–1.35 (the 27-row sample's 2σ band).
const spec = simulationSpecSchema.parse(thickTargetReactionSpec());
const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-thick-'));
let cli: CliResult;
let rows: ArrowRow[];
let truth: Map<string, TruthCsvRow>;
let pulls: CrossSectionPulls;

beforeAll(async () => {
  const { seriesDir } = simulateSeries(spec, join(root, 'in'));
  truth = readTruthCsv(join(seriesDir, 'truth.csv'));
  cli = await runCli(['reduce', seriesDir, '--out', join(root, 'out'), '--no-html']);
  rows = readArrowRows(join(root, 'out', spec.series, 'cross_sections.arrow'));
  pulls = crossSectionPulls(rows, truth);
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('thick tilted carbon, 12C(d,p0) protons behind a foil: quoted at the effective energy, truth recovered', () => {
  it('exits 0 with one row per sample run × detector of the reaction peak', () => {
    expect(cli.stderr).not.toMatch(/internal error/);
    expect(cli.code).toBe(0);
    expect(pulls.unmatched).toEqual([]);
    expect(rows.length).toBe(27);
    expect(rows.every((r) => r.detected_nuclide === '1H')).toBe(true);
  });

  it('the reaction energy is the mid-depth energy: tens of keV below the beam energy, within 0.5 keV of the simulator\'s', () => {
    for (const r of rows) {
      const t = truth.get(`${r.run}|${r.detector}|${r.peak}`)!;
      const below = Number(r.beam_energy_keV) - Number(r.reaction_energy_keV);
      expect(below).toBeGreaterThan(10);
      expect(below).toBeLessThan(60);
      expect(Math.abs(Number(r.reaction_energy_keV) - Number(t.reaction_energy_keV))).toBeLessThan(0.5);
      expect(Number(r.reaction_energy_spread_keV)).toBeGreaterThan(below / 2 / Math.sqrt(3) * 0.9);
      // The window sits where the simulator put the protons after the exit path and the foil.
      expect(Math.abs(Number(r.detected_energy_keV) - Number(t.detected_energy_keV))).toBeLessThan(2);
      expect(Number(r.detected_energy_keV)).toBeLessThan(Number(r.peak_energy_keV));
    }
  });

  it('recovers dσ/dΩ lab and CM of truth.csv at those energies (pulls)', () => {
    for (const [name, p] of Object.entries({ lab: pulls.lab, cm: pulls.cm })) {
      const s = pullStatistics(p);
      expect(Math.abs(s.mean), `${name}: mean pull ${s.mean.toFixed(3)}`).toBeLessThanOrEqual(0.4);
      expect(s.sd, `${name}: pull sd ${s.sd.toFixed(3)}`).toBeGreaterThanOrEqual(0.7);
      expect(s.sd, `${name}: pull sd ${s.sd.toFixed(3)}`).toBeLessThanOrEqual(1.35);
    }
  });
});
