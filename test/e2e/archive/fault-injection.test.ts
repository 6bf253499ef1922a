import { spawn } from 'node:child_process';
import { existsSync, lstatSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { CLI_PATH, runCli } from '../run-cli.js';
import { copyArchive, currentVersion, ledgerIntegrity, ledgerRows, makeArchive, openTables, TABLES } from './archive-fixture.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-fault-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));
const SERIES = ['arch-alpha', 'arch-beta'];
const KILLS = 22;
const SEED = 20261202;

let archive: string;
beforeAll(() => {
  archive = makeArchive(root);
});

/** Spawns the CLI and SIGKILLs it after `delayMs` (if still running); resolves with the exit code or the signal. */
function runAndKill(args: string[], delayMs: number): Promise<{ code: number | null; signal: NodeJS.Signals | null }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [CLI_PATH, ...args], { stdio: 'ignore' });
    const timer = setTimeout(() => child.kill('SIGKILL'), delayMs);
    child.on('exit', (code, signal) => {
      clearTimeout(timer);
      resolve({ code, signal });
    });
  });
}

/**
 * What a crash must never break (issue 6): `current` of every series is a link to a version
 * (DESIGN.md: a symbolic link swapped by rename) whose tables open, every
 * visible version folder is complete (partial work lives only in hidden folders), and the
 * ledger passes SQLite's integrity_check.
 */
function checkInvariants(out: string, label: string): void {
  for (const s of SERIES) {
    const seriesOut = join(out, s);
    if (lstatSync(join(seriesOut, 'current'), { throwIfNoEntry: false }) === undefined) continue; // killed before its first version
    const v = currentVersion(seriesOut); // throws unless current is a link to versions/<V>
    expect(existsSync(join(seriesOut, 'current', 'cross_sections.arrow')), `${label}: ${s}/current resolves to a complete version`).toBe(true);
    const counts = openTables(join(seriesOut, 'versions', v));
    expect(counts['cross_sections.arrow'], `${label}: ${s} ${v} has its rows`).toBeGreaterThan(0);
    for (const name of readdirSync(join(seriesOut, 'versions')).filter((n) => !n.startsWith('.'))) {
      const files = readdirSync(join(seriesOut, 'versions', name));
      expect(files.filter((f) => f.startsWith('.')), `${label}: no temporary file visible in ${s}/${name}`).toEqual([]);
      openTables(join(seriesOut, 'versions', name));
    }
  }
  if (existsSync(join(out, 'ledger.sqlite'))) expect(ledgerIntegrity(out), `${label}: ledger integrity_check`).toBe('ok');
}

describe('crash safety: SIGKILL at seeded random moments (issue 6, fault injection)', () => {
  it(`after ${KILLS} kills the archive stays readable and a final nightly gives tables byte-identical to an uninterrupted run`, async () => {
    const reference = join(root, 'out-reference');
    const t0 = performance.now();
    const ref = await runCli(['nightly', archive, '--out', reference, '--settle-s', '0', '--no-html', '--jobs', '1']);
    const fullMs = performance.now() - t0;
    expect(ref.code, ref.stderr).toBe(0);

    const out = join(root, 'out-faults');
    const faulted = copyArchive(archive, join(root, 'archive-copy'));
    const rng = Xoshiro128StarStar.fromSeed(SEED);
    let killed = 0;
    // Seeded delays until KILLS of them have landed inside a run (a nightly that finds nothing to do
    // ends before most delays; a busy machine stretches runs): at most 3 × KILLS attempts.
    for (let i = 0; killed < KILLS && i < 3 * KILLS; i++) {
      // Alternate a forced re-reduction (all phases write) and a nightly (which finishes what the last kill left).
      const command = i % 2 === 0 ? 'rereduce' : 'nightly';
      const delayMs = 30 + rng.nextFloat64() * fullMs * 1.1;
      const r = await runAndKill([command, faulted, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1', '--keep', '3'], delayMs);
      if (r.signal === 'SIGKILL') killed++;
      else expect([0, 3], `${command} #${i} exited on its own`).toContain(r.code);
      checkInvariants(out, `after ${command} #${i} (${delayMs.toFixed(0)} ms)`);
    }
    // The delays must land inside a run, or the test tests nothing.
    expect(killed).toBeGreaterThanOrEqual(20);

    const last = await runCli(['nightly', faulted, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1']);
    expect(last.code, last.stderr).toBe(0);
    checkInvariants(out, 'final');
    for (const s of SERIES) {
      const a = join(reference, s, 'versions', currentVersion(join(reference, s)));
      const b = join(out, s, 'versions', currentVersion(join(out, s)));
      for (const t of TABLES) expect(Buffer.compare(readFileSync(join(a, t)), readFileSync(join(b, t))), `${s}/${t} byte-identical`).toBe(0);
    }
    const running = ledgerRows<{ n: number }>(out, "SELECT COUNT(*) AS n FROM reductions WHERE outcome = 'running'");
    expect(running[0]!.n, 'no reduction left marked running after the final run').toBe(0);
    const leftovers = SERIES.flatMap((s) => readdirSync(join(out, s, 'versions')).filter((n) => n.startsWith('.')));
    expect(leftovers, 'build and trash folders cleaned up').toEqual([]);
  });
});
