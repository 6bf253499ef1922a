import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { crossSectionPulls, type CrossSectionPulls } from './cross-section-pulls.js';
import { pullStatistics } from './pull-statistics.js';
import { readArrowRows, type ArrowRow } from './read-arrow-rows.js';
import { readTruthCsv } from './read-truth-csv.js';
import { REPO_ROOT, runCli, type CliResult } from './run-cli.js';

// The shipped demo (sample-runs/fval-2026-c12-alpha, simulated from pipeline/simulate/specs/demo.yaml)
// against the truth.csv the simulator wrote beside it. Pull criterion of the foundation issue:
// mean within ±0.2, standard deviation 0.8–1.25.
const demoDir = join(REPO_ROOT, 'sample-runs', 'fval-2026-c12-alpha');
const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-demo-'));
let cli: CliResult;
let rows: ArrowRow[];
let pulls: CrossSectionPulls;

beforeAll(async () => {
  cli = await runCli(['reduce', demoDir, '--out', root]);
  rows = readArrowRows(join(root, 'fval-2026-c12-alpha', 'cross_sections.arrow'));
  pulls = crossSectionPulls(rows, readTruthCsv(join(demoDir, 'truth.csv')), (r) => r.peak === '12C elastic');
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('the shipped demo series reduces and agrees with its truth.csv', () => {
  it('exits 0 and prints the output folder and the summary path', () => {
    expect(cli.code).toBe(0);
    expect(cli.stdout).toBe(`${join(root, 'fval-2026-c12-alpha')}\n${join(root, 'fval-2026-c12-alpha', 'summary.html')}\n`);
  });

  it('recovers the 12C elastic dσ/dΩ lab, CM and σ/σ_R of truth.csv: pull mean within ±0.2, sd 0.8–1.25 (foundation issue criterion)', () => {
    expect(pulls.unmatched).toEqual([]);
    // 17 energies × 4 detectors of 12C elastic rows (pipeline/simulate/specs/demo.yaml).
    expect(pulls.lab.length).toBe(68);
    for (const [name, p] of Object.entries({ lab: pulls.lab, cm: pulls.cm, ratio: pulls.ratio })) {
      const s = pullStatistics(p);
      expect(Math.abs(s.mean), `${name}: mean pull ${s.mean.toFixed(3)}`).toBeLessThanOrEqual(0.2);
      expect(s.sd, `${name}: pull sd ${s.sd.toFixed(3)}`).toBeGreaterThanOrEqual(0.8);
      expect(s.sd, `${name}: pull sd ${s.sd.toFixed(3)}`).toBeLessThanOrEqual(1.25);
    }
  });
});
