import { cpSync, lstatSync, mkdirSync, readFileSync, readlinkSync } from 'node:fs';
import { join } from 'node:path';
import * as arrow from 'apache-arrow';
import Database from 'better-sqlite3';
import { simulateSeries } from '../../../pipeline/simulate/simulate-series.js';
import { smallSpec } from '../../simulate/small-spec.js';

export const TABLES = ['cross_sections.arrow', 'normalization.arrow', 'yields.arrow', 'qc.arrow'] as const;

/**
 * A small simulated archive: two series of 20 runs each (2 detectors, 256 channels, seven
 * energies, a reference run after every third sample run), calibration cal-a covering runs
 * r001–r005 and cal-b the rest.
 */
export function makeArchive(root: string): string {
  const archive = join(root, 'archive');
  mkdirSync(archive, { recursive: true });
  const energies = { from: 2000, to: 3500, step: 250 };
  simulateSeries(smallSpec({ series: 'arch-alpha', energies_keV: energies }), join(archive, 'lab-a'));
  simulateSeries(smallSpec({ series: 'arch-beta', seed: 7, energies_keV: energies }), join(archive, 'lab-b'));
  return archive;
}

export function copyArchive(from: string, to: string): string {
  cpSync(from, to, { recursive: true });
  return to;
}

export interface RunlogRow {
  run: string;
  startedMs: number;
  kind: string;
}

/** runlog.csv rows (run, start time, kind), read independently of the reduction's reader. */
export function readRunlog(seriesDir: string): RunlogRow[] {
  const [header, ...lines] = readFileSync(join(seriesDir, 'runlog.csv'), 'utf8').trim().split('\n');
  const cols = header!.split(',');
  return lines.map((l) => {
    const f = l.split(',');
    return { run: f[cols.indexOf('run')]!, startedMs: Date.parse(f[cols.indexOf('started_at')]!), kind: f[cols.indexOf('kind')]! };
  });
}

/**
 * The version `<series-out>/current` links to, read independently of the version store:
 * DESIGN.md fixes it as a relative symbolic link `current -> versions/<V>`; anything else throws.
 */
export function currentVersion(seriesOut: string): string {
  const link = join(seriesOut, 'current');
  if (!lstatSync(link).isSymbolicLink()) throw new Error(`${link} is not a symbolic link`);
  const m = /^versions\/(v\d{6})$/.exec(readlinkSync(link));
  if (!m) throw new Error(`${link} -> ${readlinkSync(link)}: not versions/<V>`);
  return m[1]!;
}

/** Opens every table of a version folder (throws if one does not parse); returns the row counts. */
export function openTables(versionDir: string): Record<string, number> {
  return Object.fromEntries(TABLES.map((t) => [t, arrow.tableFromIPC(readFileSync(join(versionDir, t))).numRows]));
}

/** SQLite's own integrity check of the ledger ("ok" when sound). */
export function ledgerIntegrity(outRoot: string): string {
  const db = new Database(join(outRoot, 'ledger.sqlite'));
  try {
    return String(db.pragma('integrity_check', { simple: true }));
  } finally {
    db.close();
  }
}

export function ledgerRows<T>(outRoot: string, sql: string, ...params: unknown[]): T[] {
  const db = new Database(join(outRoot, 'ledger.sqlite'), { readonly: true });
  try {
    return db.prepare(sql).all(...params) as T[];
  } finally {
    db.close();
  }
}
