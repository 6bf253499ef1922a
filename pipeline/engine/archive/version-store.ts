import { closeSync, existsSync, fsyncSync, lstatSync, mkdirSync, openSync, readdirSync, readFileSync, readlinkSync, renameSync, rmSync, symlinkSync } from 'node:fs';
import { join } from 'node:path';
import { writeFileAtomic } from '../atomic-write.js';

/**
 * Versioned outputs of one series: `<out-root>/<series>/versions/<V>/` (V = `v` + a 6-digit
 * counter), built in a hidden folder, renamed into place when complete, and a relative symbolic
 * link `<out-root>/<series>/current -> versions/<V>` made under a temporary name and renamed
 * over the old link (atomic on POSIX). Which version a version replaced is kept in its own
 * `version.json`, written before the folder is published.
 */
export interface CurrentPointer {
  version: string;
  /** The version that was current when this one was published (from its version.json). */
  previous: string | null;
}

/** `versions/<V>/version.json`: the version's name, the one it replaced, when it was published. */
export interface VersionRecord {
  version: string;
  previous: string | null;
  published_at: string;
}

export const VERSION_RECORD = 'version.json';
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

/** The version named by a link target `versions/<V>` (null for anything else). */
export function versionOfLink(target: string): string | null {
  const m = /^versions\/(v\d{6})\/?$/.exec(target);
  return m ? m[1]! : null;
}

/** The version record of a published version (null when missing or unreadable). */
export function readVersionRecord(seriesOut: string, version: string): VersionRecord | null {
  try {
    const v = JSON.parse(readFileSync(join(versionDir(seriesOut, version), VERSION_RECORD), 'utf8')) as Partial<VersionRecord>;
    const previous = typeof v.previous === 'string' && VERSION.test(v.previous) ? v.previous : null;
    return v.version === version ? { version, previous, published_at: String(v.published_at ?? '') } : null;
  } catch {
    return null;
  }
}

/**
 * The current version: `current` must be a symbolic link to `versions/<V>` (relative) whose
 * folder exists; anything else (no link, a plain file, a link elsewhere) reads as none.
 */
export function readCurrent(seriesOut: string): CurrentPointer | null {
  const link = join(seriesOut, 'current');
  try {
    if (!lstatSync(link).isSymbolicLink()) return null;
    const version = versionOfLink(readlinkSync(link));
    if (version === null || !existsSync(versionDir(seriesOut, version))) return null;
    return { version, previous: readVersionRecord(seriesOut, version)?.previous ?? null };
  } catch {
    return null;
  }
}

/**
 * Makes `version` current: a new relative link `versions/<V>` under a temporary name
 * (`.current.<pid>.tmp`), renamed over `current` (atomic on POSIX: a reader sees the old link or
 * the new one), then fsync of the folder so the swap survives a crash of the machine.
 */
export function switchCurrent(seriesOut: string, version: string): void {
  if (!VERSION.test(version) || !existsSync(versionDir(seriesOut, version))) throw new Error(`${versionDir(seriesOut, version)}: no such version to make current`);
  const tmp = join(seriesOut, `.current.${process.pid}.tmp`);
  rmSync(tmp, { force: true });
  symlinkSync(`versions/${version}`, tmp);
  try {
    renameSync(tmp, join(seriesOut, 'current'));
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
  fsyncDir(seriesOut);
}

/** A hidden folder to build a version in (removed by `removeLeftovers` if the process dies). */
export function buildDir(seriesOut: string, version: string): string {
  const dir = join(versionsDir(seriesOut), `.building-${version}-${process.pid}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  return dir;
}

/**
 * Writes the version record (version.json: the version and the one it replaces) into a finished
 * build folder, renames the folder to its version name (atomic) and makes that durable.
 */
export function publishVersion(seriesOut: string, built: string, version: string, previous: string | null, publishedAt: Date = new Date()): string {
  const record: VersionRecord = { version, previous, published_at: publishedAt.toISOString() };
  writeFileAtomic(join(built, VERSION_RECORD), new TextEncoder().encode(`${JSON.stringify(record, null, 2)}\n`));
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
