import { closeSync, fsyncSync, linkSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, statSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';

export interface LockInfo {
  pid: number;
  host: string;
  started: string;
  command: string;
}

export type LockResult =
  | { ok: true; path: string; release: () => void; /** Set when a stale lock was taken over. */ takenOver?: LockInfo }
  | { ok: false; path: string; holder: LockInfo | null; message: string };

export const lockPath = (outRoot: string) => join(outRoot, '.xsred.lock');

function readLock(path: string): LockInfo | null {
  try {
    const v = JSON.parse(readFileSync(path, 'utf8')) as Partial<LockInfo>;
    return typeof v.pid === 'number' && typeof v.host === 'string' ? { pid: v.pid, host: v.host, started: String(v.started ?? ''), command: String(v.command ?? '') } : null;
  } catch {
    return null;
  }
}

const UNREADABLE_STALE_MS = 10_000;

function ageMs(path: string): number {
  try {
    return Date.now() - statSync(path).mtimeMs;
  } catch {
    return 0;
  }
}

/** A process on this host is alive when signal 0 reaches it (EPERM: alive, not ours). */
function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Creates the lock with its content in one step: the content goes to a private temp file, which
 * link(2) then publishes under the lock's name — failing with EEXIST when a lock exists. The lock
 * is therefore never seen empty, even when its taker is killed mid-way (a leftover temp file is
 * only that process's, harmless, and removed by the next taker with the same PID).
 */
function createExclusive(path: string, info: LockInfo): boolean {
  const temp = `${path}.${info.pid}.tmp`;
  const fd = openSync(temp, 'w');
  try {
    writeSync(fd, `${JSON.stringify(info)}\n`);
    fsyncSync(fd);
  } catch (e) {
    closeSync(fd);
    rmSync(temp, { force: true }); // disk full or the like: leave nothing behind
    throw e;
  }
  closeSync(fd);
  try {
    linkSync(temp, path);
    return true;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw e;
  } finally {
    rmSync(temp, { force: true });
  }
}

/**
 * Takes `<out-root>/.xsred.lock`, created atomically (link(2), so never empty) and holding PID, host, start time and
 * command. A lock whose PID is dead on this host is stale: it is moved aside (an atomic
 * rename, so two takers cannot both win) and taken over, and `takenOver` says whose it was.
 * So is an unreadable (empty) lock older than 10 s. A lock held by a live process, or by
 * another host (whose processes cannot be checked), is refused with a message naming the holder.
 */
export function acquireLock(outRoot: string, command: string): LockResult {
  mkdirSync(outRoot, { recursive: true });
  const path = lockPath(outRoot);
  const me: LockInfo = { pid: process.pid, host: hostname(), started: new Date().toISOString(), command };
  let takenOver: LockInfo | undefined;
  for (let attempt = 0; attempt < 3; attempt++) {
    if (createExclusive(path, me)) {
      const release = () => {
        if (readLock(path)?.pid === me.pid) rmSync(path, { force: true });
      };
      return { ok: true, path, release, ...(takenOver ? { takenOver } : {}) };
    }
    const holder = readLock(path);
    // An unreadable lock (a taker killed between creating and writing it) is stale once it is
    // older than a writer could ever take to fill it.
    const stale = holder !== null ? holder.host === me.host && !alive(holder.pid) : ageMs(path) > UNREADABLE_STALE_MS;
    if (!stale) {
      const who = holder ? `process ${holder.pid} on ${holder.host} (${holder.command}), since ${holder.started}` : 'an unreadable lock file';
      const hint = holder && holder.host !== me.host ? `; if no xsred runs on ${holder.host}, delete ${path}` : holder ? '' : `; if no xsred is running, delete ${path}`;
      return { ok: false, path, holder, message: `${path} is held by ${who}: another xsred run is working on this out-root${hint}` };
    }
    // Move the stale lock aside atomically, then check it is still the stale one we judged.
    const aside = `${path}.stale-${me.pid}`;
    try {
      renameSync(path, aside);
    } catch {
      continue; // someone else moved it first: try again
    }
    const moved = readLock(aside);
    if (holder === null ? moved === null : moved !== null && moved.pid === holder.pid && moved.started === holder.started) {
      rmSync(aside, { force: true });
      takenOver = holder ?? { pid: 0, host: '', started: '', command: 'unreadable lock file' };
      continue;
    }
    // We moved a fresh lock of another taker: put it back (link fails if a lock exists again).
    try {
      linkSync(aside, path);
    } catch {
      /* a newer lock is in place; ours goes */
    }
    rmSync(aside, { force: true });
  }
  const holder = readLock(path);
  return { ok: false, path, holder, message: `${path}: could not take the lock (it changed hands while being taken over); try again` };
}
