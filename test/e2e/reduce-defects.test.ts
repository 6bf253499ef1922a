import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { scheduleRuns } from '../../pipeline/simulate/schedule-runs.js';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';
import { DEFECT_KINDS, simulationSpecSchema, type DefectKind } from '../../pipeline/simulate/simulation-spec.js';
import { readArrowRows, type ArrowRow } from './read-arrow-rows.js';
import { runCli, type CliResult } from './run-cli.js';
import { separatedPeaksSpec } from './separated-peaks-spec.js';

// A clean series and the same series (same seed: every run's data come from its own random
// streams, README of pipeline/simulate) with one defect per damaged SAMPLE run. Where each defect
// sits follows from the simulator's damage rules (pipeline/simulate/damage-spectrum-csv.ts) and
// the input contract (README, "Input layout": channel c of a spectrum is on line c + 2).
const defects: { run_index: number; kind: DefectKind; detector?: string }[] = [
  { run_index: 2, kind: 'truncated-spectrum' },
  { run_index: 4, kind: 'negative-count', detector: 'd03' },
  { run_index: 7, kind: 'non-integer-count', detector: 'd02' },
  { run_index: 9, kind: 'ragged-row', detector: 'd04' },
  { run_index: 12, kind: 'missing-spectrum' },
  { run_index: 14, kind: 'unknown-target' },
  { run_index: 18, kind: 'unknown-detector-column', detector: 'd05' },
  { run_index: 23, kind: 'missing-scalers' },
];
const cleanSpec = simulationSpecSchema.parse(separatedPeaksSpec());
const damagedSpec = simulationSpecSchema.parse(separatedPeaksSpec({ defects }));
const plan = scheduleRuns(cleanSpec);
const runOf = (index: number) => plan[index - 1]!.run;
const damagedRuns = new Set(defects.map((d) => runOf(d.run_index)));
const channels = cleanSpec.channels;

const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-defects-'));
let damagedSeriesDir: string;
let clean: CliResult;
let damaged: CliResult;
let cleanRows: ArrowRow[];
let damagedRows: ArrowRow[];
let qc: ArrowRow[];
let diagnostics: Diagnostic[];

beforeAll(async () => {
  const cleanDir = simulateSeries(cleanSpec, join(root, 'clean')).seriesDir;
  damagedSeriesDir = simulateSeries(damagedSpec, join(root, 'damaged')).seriesDir;
  [clean, damaged] = await Promise.all([
    runCli(['reduce', cleanDir, '--out', join(root, 'out-clean')]),
    runCli(['reduce', damagedSeriesDir, '--out', join(root, 'out-damaged')]),
  ]);
  const out = (which: string) => join(root, which, cleanSpec.series);
  cleanRows = readArrowRows(join(out('out-clean'), 'cross_sections.arrow'));
  damagedRows = readArrowRows(join(out('out-damaged'), 'cross_sections.arrow'));
  qc = readArrowRows(join(out('out-damaged'), 'qc.arrow'));
  diagnostics = JSON.parse(readFileSync(join(out('out-damaged'), 'diagnostics.json'), 'utf8')) as Diagnostic[];
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

/** 1-based character column where field `field` (0 = channel) of a line of a comma-separated file starts. */
function fieldColumn(line: string, field: number): number {
  let col = 1;
  for (let f = 0; f < field; f++) col = line.indexOf(',', col - 1) + 2;
  return col;
}
const lineOf = (file: string, line: number) => readFileSync(join(damagedSeriesDir, file), 'utf8').split(/\r?\n/)[line - 1]!;
const detectorField = (id: string | undefined) => 1 + cleanSpec.detectors.findIndex((d) => d.id === (id ?? cleanSpec.detectors[0]!.id));

/** Where each defect must be reported: file, line and column (undefined: not checked), or the run alone. */
function expectedPosition(d: (typeof defects)[number]): { file?: string; files?: string[]; line?: number; column?: number; mentions?: string } {
  const run = runOf(d.run_index);
  const spectrum = `spectra/${run}.csv`;
  switch (d.kind) {
    case 'truncated-spectrum':
      return { file: spectrum, line: Math.floor(0.6 * channels) + 2 };
    case 'negative-count':
    case 'non-integer-count': {
      const line = Math.floor(channels / 2) + 2;
      return { file: spectrum, line, column: fieldColumn(lineOf(spectrum, line), detectorField(d.detector)) };
    }
    case 'ragged-row':
      return { file: spectrum, line: Math.floor(channels / 3) + 2 };
    case 'unknown-detector-column': {
      const header = lineOf(spectrum, 1);
      return { file: spectrum, line: 1, column: header.indexOf(',aux1') + 2 };
    }
    case 'unknown-target': {
      const line = d.run_index + 1;
      const header = lineOf('runlog.csv', 1).split(',');
      return { file: 'runlog.csv', line, column: fieldColumn(lineOf('runlog.csv', line), header.indexOf('target')) };
    }
    case 'missing-spectrum':
      // The file is absent: the runlog line that lists the run (or the missing path itself) is the place.
      return { files: ['runlog.csv', spectrum], mentions: spectrum };
    case 'missing-scalers':
      return { files: ['scalers.csv', 'runlog.csv'] };
  }
}

describe('xsred reduce with one defect in each of eight sample runs (DEFECT_KINDS of the simulator)', () => {
  it('damages sample runs only, one kind each, every kind once', () => {
    expect(defects.map((d) => d.kind).sort()).toEqual([...DEFECT_KINDS].sort());
    for (const d of defects) expect(plan[d.run_index - 1]!.kind).toBe('sample');
  });

  it('exits 3 for the damaged series (README "Exit codes": some runs set aside) and 0 for the clean one', () => {
    expect(clean.code).toBe(0);
    expect(damaged.stderr).not.toMatch(/internal error/);
    expect(damaged.code).toBe(3);
  });

  for (const d of defects) {
    const run = runOf(d.run_index);
    it(`diagnoses ${d.kind} in run ${run} with its run, file, line (and column) in diagnostics.json and the stderr log`, () => {
      const pos = expectedPosition(d);
      const mine = diagnostics.filter((x) => x.severity === 'error' && x.run === run);
      expect(mine.length, `error diagnostics for ${run}`).toBeGreaterThan(0);
      const at = mine.filter((x) => (pos.file !== undefined ? x.file === pos.file : pos.files!.includes(x.file ?? '')));
      expect(at.map((x) => `${x.file}:${x.line}:${x.column} ${x.message}`), `diagnostics of ${run}: ${JSON.stringify(mine)}`).not.toEqual([]);
      if (pos.line !== undefined) {
        const onLine = at.filter((x) => x.line === pos.line);
        expect(onLine.length, `a diagnostic at ${pos.file}:${pos.line}; got ${at.map((x) => `${x.file}:${x.line}:${x.column}`).join(', ')}`).toBeGreaterThan(0);
        if (pos.column !== undefined) {
          expect(onLine.map((x) => x.column), `column of ${d.kind} at ${pos.file}:${pos.line}`).toContain(pos.column);
        }
        const shown = pos.column !== undefined ? `${pos.file}:${pos.line}:${pos.column}:` : `${pos.file}:${pos.line}:`;
        expect(damaged.stderr).toContain(shown);
      }
      if (pos.mentions !== undefined) expect(at.some((x) => x.file === pos.mentions || x.message.includes(pos.mentions!))).toBe(true);
      for (const x of mine) {
        expect(x.rule).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
        // Every positioned diagnostic is logged in the compiler form (README, "Command line").
        if (x.file !== undefined && x.line !== undefined) expect(damaged.stderr).toContain(`${x.file}:${x.line}${x.column !== undefined ? `:${x.column}` : ''}: error: `);
      }
    });

    it(`sets run ${run} (${d.kind}) aside in qc.arrow: every detector row set-aside, with a reason and the rule of its diagnostic`, () => {
      const rows = qc.filter((q) => q.run === run);
      expect(rows.map((q) => q.detector).sort()).toEqual(cleanSpec.detectors.map((x) => x.id).sort());
      const rules = new Set(diagnostics.filter((x) => x.run === run && x.severity === 'error').map((x) => x.rule));
      for (const q of rows) {
        expect(q.status).toBe('set-aside');
        expect(String(q.reason).length).toBeGreaterThan(0);
        expect(rules.has(String(q.rule)), `qc rule ${q.rule} among ${[...rules].join(', ')}`).toBe(true);
      }
      const pos = expectedPosition(d);
      if (pos.line !== undefined) expect(String(rows[0]!.reason)).toContain(`${pos.file}:${pos.line}`);
    });
  }

  it('writes no cross-section row for a damaged run', () => {
    expect(damagedRows.filter((r) => damagedRuns.has(String(r.run))).map((r) => r.run)).toEqual([]);
  });

  it('reduces every other run exactly as in the clean series: same rows, every column equal', () => {
    const expected = cleanRows.filter((r) => !damagedRuns.has(String(r.run)));
    expect(expected.length).toBeGreaterThan(0);
    expect(damagedRows.length).toBe(expected.length);
    expect(damagedRows).toStrictEqual(expected);
  });

  it('marks every other run reduced in qc.arrow', () => {
    const others = qc.filter((q) => !damagedRuns.has(String(q.run)));
    expect(others.filter((q) => q.status !== 'reduced').map((q) => `${q.run} ${q.detector}: ${q.status} ${q.reason}`)).toEqual([]);
  });
});
