import { closeSync, existsSync, fsyncSync, mkdirSync, openSync, readdirSync, readFileSync, renameSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { writeFileAtomic } from '../atomic-write.js';

/**
 * Versioned outputs of one series: `<out-root>/<series>/versions/<V>/` (V = `v` + a 6-digit
 * counter), built in a hidden folder, renamed into place when complete, and a pointer file
 * `<out-root>/<series>/current` (JSON: version and the one it replaced) replaced atomically.
 */
export interface CurrentPointer {
  version: string;
  previous: string | null;
  switched_at: string;
}

const VERSION = /^v(\d{6})$/;
export const versionsDir = (seriesOut: string) => join(seriesOut, 'versions');
export const versionDir = (seriesOut: string, version: string) => join(seriesOut, 'versions', version);

/** fsync of a folder, so a rename or new entry in it survives a crash of the machine. */
export function fsyncDir(dir: string): void {
  const fd = openSync(dir, 'r');
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** Complete versions, oldest first (hidden build and trash folders are not versions). */
export function listVersions(seriesOut: string): string[] {
  const dir = versionsDir(seriesOut);
  if (!existsSync(dir)) return [];
  return readdirSync(dir).filter((n) => VERSION.test(n)).sort();
}

export function nextVersionName(seriesOut: string): string {
  const last = listVersions(seriesOut).at(-1);
  const n = last === undefined ? 1 : Number(VERSION.exec(last)![1]) + 1;
  return `v${String(n).padStart(6, '0')}`;
}

export function readCurrent(seriesOut: string): CurrentPointer | null {
  try {
    const v = JSON.parse(readFileSync(join(seriesOut, 'current'), 'utf8')) as Partial<CurrentPointer>;
    return typeof v.version === 'string' && VERSION.test(v.version) ? { version: v.version, previous: v.previous ?? null, switched_at: String(v.switched_at ?? '') } : null;
  } catch {
    return null;
  }
}

/** Replaces the pointer: temp file + fsync + rename, then fsync of the folder. */
export function writeCurrent(seriesOut: string, pointer: CurrentPointer): void {
  writeFileAtomic(join(seriesOut, 'current'), new TextEncoder().encode(`${JSON.stringify(pointer, null, 2)}\n`));
  fsyncDir(seriesOut);
}

/** A hidden folder to build a version in (removed by `removeLeftovers` if the process dies). */
export function buildDir(seriesOut: string, version: string): string {
  const dir = join(versionsDir(seriesOut), `.building-${version}-${process.pid}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  return dir;
}

/** Renames a finished build folder to its version name (atomic) and makes that durable. */
export function publishVersion(seriesOut: string, built: string, version: string): string {
  fsyncDir(built);
  const target = versionDir(seriesOut, version);
  renameSync(built, target);
  fsyncDir(versionsDir(seriesOut));
  return target;
}

/** Temporary files of atomic writes (`.<name>.<pid>.tmp`) left in a folder by a killed run. */
export function removeTempFiles(dir: string): string[] {
  if (!existsSync(dir)) return [];
  const left = readdirSync(dir).filter((n) => /^\..+\.\d+\.tmp$/.test(n));
  for (const n of left) rmSync(join(dir, n), { force: true });
  return left;
}

/** Build and trash folders and temporary files left by a killed run (call while holding the lock). */
export function removeLeftovers(seriesOut: string): string[] {
  const dir = versionsDir(seriesOut);
  const left = existsSync(dir) ? readdirSync(dir).filter((n) => n.startsWith('.building-') || n.startsWith('.trash-')) : [];
  for (const n of left) rmSync(join(dir, n), { recursive: true, force: true });
  return [...left, ...removeTempFiles(seriesOut)];
}

/**
 * Keeps the newest `keep` versions and always the current one and the one before it; the
 * others are renamed to a hidden trash name first (so no half-deleted version is visible) and
 * then deleted. Returns the versions removed.
 */
export function pruneVersions(seriesOut: string, keep: number, protect: readonly (string | null)[]): string[] {
  const all = listVersions(seriesOut);
  const kept = new Set([...all.slice(Math.max(0, all.length - keep)), ...protect.filter((v): v is string => v !== null)]);
  const removed: string[] = [];
  for (const v of all) {
    if (kept.has(v)) continue;
    const trash = join(versionsDir(seriesOut), `.trash-${v}-${process.pid}`);
    renameSync(versionDir(seriesOut, v), trash);
    rmSync(trash, { recursive: true, force: true });
    removed.push(v);
  }
  return removed;
}
