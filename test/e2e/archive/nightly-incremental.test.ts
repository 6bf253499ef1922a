import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readArrowRows } from '../read-arrow-rows.js';
import { CLI_PATH, runCli } from '../run-cli.js';
import { currentVersion, ledgerRows, makeArchive, readRunlog, type RunlogRow } from './archive-fixture.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-nightly-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

let archive: string;
let out: string;
const alphaDir = () => join(archive, 'lab-a', 'arch-alpha');
const nightly = (...extra: string[]) => runCli(['nightly', archive, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1', ...extra]);

interface Reduction {
  id: number;
  series: string;
  outcome: string;
  version: string | null;
  runs_reduced: number;
  runs_reused: number;
  runs_measured: number;
  runs_pending: number;
}
const lastReductions = () => ledgerRows<Reduction>(out, 'SELECT * FROM reductions WHERE id IN (SELECT MAX(id) FROM reductions GROUP BY series) ORDER BY series');
const runOutcomes = (id: number) => new Map(ledgerRows<{ run: string; outcome: string }>(out, 'SELECT run, outcome FROM run_results WHERE reduction_id = ?', id).map((r) => [r.run, r.outcome]));

/**
 * The runs a change of the calibration covering runs `covered` must re-reduce, from the
 * bracketing rule (DESIGN.md, README "Which reference runs"): the covered reference and
 * sample runs, plus every sample run whose nearest reference at or before it, or at or after
 * it (start time), is a covered one.
 */
function expectedRereduced(runlog: readonly RunlogRow[], covered: ReadonlySet<string>): Set<string> {
  const refs = runlog.filter((r) => r.kind === 'reference');
  const out = new Set(runlog.filter((r) => covered.has(r.run) && (r.kind === 'reference' || r.kind === 'sample')).map((r) => r.run));
  for (const s of runlog.filter((r) => r.kind === 'sample')) {
    const before = refs.filter((r) => r.startedMs <= s.startedMs).at(-1);
    const after = refs.find((r) => r.startedMs >= s.startedMs);
    if ((before && covered.has(before.run)) || (after && covered.has(after.run))) out.add(s.run);
  }
  return out;
}

beforeAll(async () => {
  archive = makeArchive(root);
  out = join(root, 'out');
  const first = await nightly();
  expect(first.code, first.stderr).toBe(0);
});

describe('xsred nightly: incremental reduction by content hash (issue 6)', () => {
  it('a first night reduces and reads every run of every series', () => {
    const r = lastReductions();
    expect(r.map((x) => [x.series, x.outcome, x.version, x.runs_reduced, x.runs_measured])).toEqual([
      ['arch-alpha', 'reduced', 'v000001', 20, 20],
      ['arch-beta', 'reduced', 'v000001', 20, 20],
    ]);
  });

  it('a no-change night does no reduction work: zero runs reduced or read, no new version (ledger)', async () => {
    const r = await nightly();
    expect(r.code, r.stderr).toBe(0);
    const rows = lastReductions();
    expect(rows.map((x) => [x.outcome, x.runs_reduced, x.runs_measured, x.runs_reused])).toEqual([
      ['unchanged', 0, 0, 20],
      ['unchanged', 0, 0, 20],
    ]);
    expect(readdirSync(join(out, 'arch-alpha', 'versions'))).toEqual(['v000001']);
    const summary = r.stderr.trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>).at(-1)!;
    expect(summary).toMatchObject({ series: 2, series_reduced: 0, series_unchanged: 2, runs_reduced: 0, runs_measured: 0 });
  });

  it('changing one calibration file re-reduces only the runs it covers and the sample runs they normalize; the diff lists exactly the moved rows', async () => {
    const calFile = join(alphaDir(), 'calibrations', 'cal-a.yaml');
    const text = readFileSync(calFile, 'utf8');
    // cal-a covers r001–r005; move detector d01's offset by 30 keV (about two channels).
    const edited = text.replace(/(- id: d01\n\s+offset_keV: )20\n/, '$150\n');
    expect(edited).not.toBe(text);
    writeFileSync(calFile, edited);
    const r = await nightly();
    expect([0, 3], r.stderr).toContain(r.code);
    const [alpha, beta] = lastReductions();
    expect(beta!.outcome, 'the other series is untouched').toBe('unchanged');
    expect(alpha!.outcome).toBe('reduced');
    const runlog = readRunlog(alphaDir());
    const covered = new Set(runlog.slice(0, 5).map((x) => x.run));
    const expected = expectedRereduced(runlog, covered);
    const outcomes = runOutcomes(alpha!.id);
    const reduced = new Set([...outcomes].filter(([, o]) => o === 'reduced').map(([run]) => run));
    expect([...reduced].sort()).toEqual([...expected].sort());
    expect(alpha!.runs_reduced).toBe(expected.size);
    expect(alpha!.runs_reused).toBe(20 - expected.size);
    // Only the covered runs' spectra are read again (the calibration moves their windows).
    expect(alpha!.runs_measured).toBe(covered.size);

    // current -> versions/v000002, whose version.json names v000001: the diff's default pair.
    expect(currentVersion(join(out, 'arch-alpha'))).toBe('v000002');
    expect(JSON.parse(readFileSync(join(out, 'arch-alpha', 'current', 'version.json'), 'utf8'))).toMatchObject({ version: 'v000002', previous: 'v000001' });
    const d = await runCli(['diff', join(out, 'arch-alpha')]);
    expect(d.code, d.stderr).toBe(0);
    expect(d.stdout).toMatch(/v000001 → v000002/);
    const diffRows = readArrowRows(join(out, 'arch-alpha', 'diffs', 'v000001-v000002', 'diff.arrow'));
    // Only d01's calibration changed: exactly the d01 rows of the re-reduced sample runs move.
    const samples = [...expected].filter((run) => runlog.find((x) => x.run === run)!.kind === 'sample');
    const xs = readArrowRows(join(out, 'arch-alpha', 'versions', 'v000002', 'cross_sections.arrow'));
    const moved = xs.filter((x) => x.detector === 'd01' && samples.includes(String(x.run))).map((x) => `${x.run} ${x.detector} ${x.peak}`);
    const key = (x: Record<string, unknown>) => `${x.run} ${x.detector} ${x.peak}`;
    const movedRows = diffRows.filter((x) => x.change === 'moved' && moved.includes(key(x)));
    expect(movedRows.map(key).sort()).toEqual(moved.sort());
    expect(movedRows.every((x) => typeof x.cross_section_lab_shift_sigma === 'number' && x.cross_section_lab_shift_sigma !== 0)).toBe(true);
    // The reference spread (issue 5: the scatter of all of a detector's reference runs beyond their
    // own uncertainties, DerSimonian & Laird 1986) uses every reference run of the detector: where it
    // changes, the systematic columns of d01's other rows move too — never a value.
    const sysOnly = new Set(['cross_section_lab_sys_mb_per_sr', 'cross_section_cm_sys_mb_per_sr', 'ratio_to_rutherford_sys', 'flags']);
    for (const x of diffRows.filter((y) => y.change === 'moved' && !moved.includes(key(y)))) {
      expect(x.detector, key(x)).toBe('d01');
      expect(String(x.changed_columns).split(';').every((c) => sysOnly.has(c)), `${key(x)}: ${x.changed_columns}`).toBe(true);
      expect(x.cross_section_lab_shift_sigma).toBe(0);
    }
    // Other rows may only be relabelled: the reference-outlier test and the nominal check use all
    // reference runs of a detector, so a flag can change where no number does.
    for (const x of diffRows.filter((y) => y.change !== 'moved')) {
      expect(x.change).toBe('relabelled');
      expect(x.changed_columns).toBe('flags');
      expect(x.cross_section_lab_shift_sigma).toBe(0);
    }
  });

  it('a spectrum younger than the settle time is skipped with a note and picked up the next night', async () => {
    // Every input file of the archive two hours old, then one spectrum rewritten just now.
    const old = new Date(Date.now() - 7200_000);
    const age = (dir: string): void => {
      for (const e of readdirSync(dir, { withFileTypes: true })) {
        const p = join(dir, e.name);
        if (e.isDirectory()) age(p);
        else utimesSync(p, old, old);
      }
    };
    age(archive);
    const spectrum = join(alphaDir(), 'spectra', 'r012.csv');
    const now = new Date();
    utimesSync(spectrum, now, now);
    const r = await runCli(['nightly', archive, '--out', out, '--settle-s', '3600', '--no-html', '--jobs', '1']);
    expect(r.code, r.stderr).toBe(0);
    const [alpha] = lastReductions();
    expect(alpha!.outcome).toBe('reduced');
    expect(runOutcomes(alpha!.id).get('r012')).toBe('pending');
    expect(r.stderr).toMatch(/spectra\/r012\.csv was modified \d+ s ago, less than the settle time of 3600 s/);
    const st = await runCli(['status', out]);
    expect(st.stdout).toMatch(/pending r012: .*spectra\/r012\.csv was modified \d+ s ago/);
    const next = await nightly();
    expect(next.code, next.stderr).toBe(0);
    const [again] = lastReductions();
    expect(runOutcomes(again!.id).get('r012')).toBe('reduced');
    expect(again!.runs_pending).toBe(0);
  });

  it('rereduce re-reads and re-reduces every run of the chosen series only', async () => {
    const r = await runCli(['rereduce', archive, '--out', out, '--series', 'arch-beta', '--settle-s', '0', '--no-html', '--jobs', '1']);
    expect(r.code, r.stderr).toBe(0);
    const rows = ledgerRows<Reduction>(out, "SELECT * FROM reductions WHERE command = 'rereduce'");
    expect(rows.map((x) => [x.series, x.runs_reduced, x.runs_measured, x.version])).toEqual([['arch-beta', 20, 20, 'v000002']]);
    expect(currentVersion(join(out, 'arch-beta'))).toBe('v000002');
  });

  it('a second concurrent nightly exits with the lock message and exit code 4 while the first completes', async () => {
    // The first run writes summary.html (charts) for both series, which keeps it busy for seconds.
    const first = spawn(process.execPath, [CLI_PATH, 'rereduce', archive, '--out', out, '--settle-s', '0', '--jobs', '1'], { stdio: ['ignore', 'ignore', 'pipe'] });
    const firstDone = new Promise<number | null>((resolve) => first.on('exit', (code) => resolve(code)));
    const lock = join(out, '.xsred.lock');
    while (!existsSync(lock)) await new Promise((r) => setTimeout(r, 10));
    const second = await nightly();
    expect(second.code).toBe(4);
    expect(second.stderr).toMatch(new RegExp(`\\.xsred\\.lock is held by process ${first.pid} on .+ \\(xsred rereduce\\)`));
    expect(await firstDone).toBe(0);
    expect(existsSync(lock), 'the first run releases the lock').toBe(false);
  });
});
