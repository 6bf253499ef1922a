import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { acquireLock, lockPath } from '../../../pipeline/engine/archive/lock.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-lock-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));
let n = 0;
const fresh = () => join(root, `out-${n++}`);

/** A PID that surely belongs to no process: a child that has already exited (common practice). */
function deadPid(): number {
  const r = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
  return Number(r.stdout);
}

describe('out-root lock (.xsred.lock, O_EXCL)', () => {
  it('records PID, host, start time and command, and refuses a second taker while the holder lives', () => {
    const out = fresh();
    const a = acquireLock(out, 'xsred nightly');
    expect(a.ok).toBe(true);
    const info = JSON.parse(readFileSync(lockPath(out), 'utf8')) as Record<string, unknown>;
    expect(info).toMatchObject({ pid: process.pid, host: hostname(), command: 'xsred nightly' });
    expect(Number.isNaN(Date.parse(String(info.started)))).toBe(false);
    const b = acquireLock(out, 'xsred nightly');
    expect(b.ok).toBe(false);
    if (!b.ok) expect(b.message).toMatch(new RegExp(`is held by process ${process.pid} on ${hostname()} \\(xsred nightly\\)`));
    if (a.ok) a.release();
    expect(existsSync(lockPath(out))).toBe(false);
  });

  it('takes over a stale lock whose PID is dead on this host, and says whose it was', () => {
    const out = fresh();
    const pid = deadPid();
    mkdirSync(out, { recursive: true });
    writeFileSync(lockPath(out), JSON.stringify({ pid, host: hostname(), started: '2026-01-01T03:00:00Z', command: 'xsred nightly' }));
    const r = acquireLock(out, 'xsred nightly');
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.takenOver?.pid).toBe(pid);
      expect((JSON.parse(readFileSync(lockPath(out), 'utf8')) as { pid: number }).pid).toBe(process.pid);
      r.release();
    }
  });

  it('does not judge a lock of another host (its PIDs cannot be checked): refused with a hint', () => {
    const out = fresh();
    mkdirSync(out, { recursive: true });
    writeFileSync(lockPath(out), JSON.stringify({ pid: deadPid(), host: 'elsewhere.invalid', started: '2026-01-01T03:00:00Z', command: 'xsred nightly' }));
    const r = acquireLock(out, 'xsred nightly');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/on elsewhere\.invalid .*if no xsred runs on elsewhere\.invalid, delete/);
  });

  it('an empty lock file (a taker killed between creating and writing it) is stale after 10 s, not before', () => {
    const out = fresh();
    mkdirSync(out, { recursive: true });
    writeFileSync(lockPath(out), '');
    expect(acquireLock(out, 'xsred nightly').ok, 'fresh empty lock: someone is writing it').toBe(false);
    const old = new Date(Date.now() - 60_000);
    utimesSync(lockPath(out), old, old);
    const r = acquireLock(out, 'xsred nightly');
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.takenOver?.command).toBe('unreadable lock file');
  });

  it('release leaves a lock that is not its own alone', () => {
    const out = fresh();
    const r = acquireLock(out, 'xsred nightly');
    expect(r.ok).toBe(true);
    const other = JSON.stringify({ pid: process.pid + 1, host: hostname(), started: 'x', command: 'other' });
    writeFileSync(lockPath(out), other);
    if (r.ok) r.release();
    expect(readFileSync(lockPath(out), 'utf8')).toBe(other);
  });
});
