import { execFileSync, spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdirSync, mkdtempSync, openSync, readdirSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../run-cli.js';
import { currentVersion, ledgerIntegrity, makeArchive, openTables } from './archive-fixture.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-io-'));
const mnt = join(root, 'mnt');
/** A small tmpfs needs mount rights (root in a container that allows it); otherwise these cases are skipped. */
const canMount = (() => {
  if (process.getuid?.() !== 0) return false;
  mkdirSync(mnt, { recursive: true });
  const r = spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=3m', 'tmpfs', mnt]);
  return r.status === 0;
})();
afterAll(() => {
  if (canMount) spawnSync('umount', [mnt]);
  rmSync(root, { recursive: true, force: true });
});

let archive: string;
const out = join(mnt, 'out');
beforeAll(() => {
  archive = makeArchive(root);
});

/** Fills the file system of `dir` until ENOSPC. */
function fill(dir: string): string {
  const p = join(dir, 'filler');
  const fd = openSync(p, 'w');
  const chunk = Buffer.alloc(64 * 1024, 1);
  try {
    for (;;) writeSync(fd, chunk);
  } catch (e) {
    expect((e as NodeJS.ErrnoException).code).toBe('ENOSPC');
  } finally {
    closeSync(fd);
  }
  return p;
}

describe.skipIf(!canMount)('disk full and read-only out-root: a diagnostic, exit 5, nothing half-written (issue 6)', () => {
  it('ENOSPC during a re-reduction keeps the previous version current and the ledger sound; the next run after freeing space finishes', async () => {
    const first = await runCli(['nightly', archive, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1']);
    expect(first.code, first.stderr).toBe(0);
    const before = currentVersion(join(out, 'arch-alpha'));
    const filler = fill(mnt);
    const r = await runCli(['rereduce', archive, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1']);
    expect(r.code, r.stderr).toBe(5);
    expect(r.stderr).toMatch(/ENOSPC|SQLITE_FULL/);
    expect(r.stderr).toMatch(/free disk space/);
    for (const s of ['arch-alpha', 'arch-beta']) {
      expect(currentVersion(join(out, s))).toBe('v000001');
      openTables(join(out, s, 'versions', 'v000001'));
      expect(readdirSync(join(out, s, 'versions')), `${s}: no partial version visible`).toEqual(['v000001']);
    }
    rmSync(filler);
    expect(ledgerIntegrity(out)).toBe('ok');
    const again = await runCli(['rereduce', archive, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1']);
    expect(again.code, again.stderr).toBe(0);
    expect(currentVersion(join(out, 'arch-alpha'))).not.toBe(before);
  });

  it('EROFS: a read-only out-root is refused with a diagnostic and exit 5', async () => {
    execFileSync('mount', ['-o', 'remount,ro', mnt]);
    try {
      const r = await runCli(['nightly', archive, '--out', out, '--settle-s', '0', '--no-html', '--jobs', '1']);
      expect(r.code, r.stderr).toBe(5);
      expect(r.stderr).toMatch(/EROFS.*read-only file system/s);
      expect(existsSync(join(out, '.xsred.lock'))).toBe(false);
    } finally {
      execFileSync('mount', ['-o', 'remount,rw', mnt]);
    }
  });
});
