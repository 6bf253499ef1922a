import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { LEDGER_DDL, LEDGER_SCHEMA_VERSION } from './ledger-schema.js';

export type ReductionOutcome = 'running' | 'reduced' | 'unchanged' | 'pending' | 'series-error' | 'io-error' | 'failed' | 'interrupted';

/** One row of `reductions` (snake_case as stored). */
export interface ReductionRow {
  id: number;
  session: string;
  command: string;
  series: string;
  series_dir: string;
  started: string;
  finished: string | null;
  pid: number;
  software_version: string;
  config_hash: string | null;
  fingerprint: string | null;
  outcome: ReductionOutcome;
  exit_code: number | null;
  version: string | null;
  previous_version: string | null;
  runs_total: number;
  runs_reduced: number;
  runs_reused: number;
  runs_measured: number;
  runs_set_aside: number;
  runs_pending: number;
  rows: number;
  note: string;
  diagnostics_json: string;
  changes_json: string | null;
}

export interface RunResultRow {
  reduction_id: number;
  series: string;
  run: string;
  kind: string;
  input_hash: string;
  own_hash: string;
  calibration_version: string;
  reference_runs: string;
  outcome: 'reduced' | 'reused' | 'set-aside' | 'pending' | 'not-reduced';
  diagnostics_json: string;
}

export type ReductionUpdate = Partial<Omit<ReductionRow, 'id'>>;

/** `<out-root>/ledger.sqlite`: its path, for status and backups. */
export const ledgerPath = (outRoot: string) => join(outRoot, 'ledger.sqlite');

/**
 * The archive ledger: SQLite in WAL mode (readers never block the writer; a killed process
 * leaves the last committed state), synchronous=NORMAL (a crash of the process loses nothing
 * committed; a power cut may lose the last commits but never corrupts). Every write is one
 * transaction.
 */
export class Ledger {
  readonly db: Database.Database;

  constructor(outRoot: string, options: { readonly?: boolean } = {}) {
    if (!options.readonly) mkdirSync(outRoot, { recursive: true });
    this.db = new Database(ledgerPath(outRoot), { readonly: options.readonly ?? false, fileMustExist: options.readonly ?? false });
    this.db.pragma('busy_timeout = 5000');
    if (options.readonly) return;
    this.db.pragma('journal_mode = WAL');
    this.db.pragma('synchronous = NORMAL');
    this.db.transaction(() => {
      this.db.exec(LEDGER_DDL);
      this.db.prepare('INSERT OR IGNORE INTO meta (key, value) VALUES (?, ?)').run('schema_version', String(LEDGER_SCHEMA_VERSION));
    })();
  }

  /** Reductions still marked running belong to a process that died (the caller holds the lock). */
  markInterrupted(nowIso: string): number {
    return this.db.prepare("UPDATE reductions SET outcome = 'interrupted', finished = ? WHERE outcome = 'running'").run(nowIso).changes;
  }

  startReduction(row: Pick<ReductionRow, 'session' | 'command' | 'series' | 'series_dir' | 'started' | 'pid' | 'software_version'>): number {
    const r = this.db
      .prepare("INSERT INTO reductions (session, command, series, series_dir, started, pid, software_version, outcome) VALUES (@session, @command, @series, @series_dir, @started, @pid, @software_version, 'running')")
      .run(row);
    return Number(r.lastInsertRowid);
  }

  /** Updates a reduction and inserts its run results, in one transaction. */
  finishReduction(id: number, update: ReductionUpdate, runs: readonly Omit<RunResultRow, 'reduction_id'>[] = []): void {
    const keys = Object.keys(update);
    const set = this.db.prepare(`UPDATE reductions SET ${keys.map((k) => `${k} = @${k}`).join(', ')} WHERE id = @id`);
    const insert = this.db.prepare(
      'INSERT INTO run_results (reduction_id, series, run, kind, input_hash, own_hash, calibration_version, reference_runs, outcome, diagnostics_json) VALUES (@reduction_id, @series, @run, @kind, @input_hash, @own_hash, @calibration_version, @reference_runs, @outcome, @diagnostics_json)',
    );
    this.db.transaction(() => {
      if (keys.length > 0) set.run({ ...update, id });
      for (const r of runs) insert.run({ ...r, reduction_id: id });
    })();
  }

  /** The latest reduction of a series whose result still stands (reduced, unchanged or a series error). */
  lastSettled(series: string): ReductionRow | undefined {
    return this.db.prepare("SELECT * FROM reductions WHERE series = ? AND outcome IN ('reduced', 'unchanged', 'series-error') ORDER BY id DESC LIMIT 1").get(series) as ReductionRow | undefined;
  }

  /** The latest reduction of a series that wrote a version. */
  lastReduced(series: string): ReductionRow | undefined {
    return this.db.prepare("SELECT * FROM reductions WHERE series = ? AND outcome = 'reduced' ORDER BY id DESC LIMIT 1").get(series) as ReductionRow | undefined;
  }

  latest(series: string): ReductionRow | undefined {
    return this.db.prepare('SELECT * FROM reductions WHERE series = ? ORDER BY id DESC LIMIT 1').get(series) as ReductionRow | undefined;
  }

  runResults(reductionId: number): RunResultRow[] {
    return this.db.prepare('SELECT * FROM run_results WHERE reduction_id = ? ORDER BY rowid').all(reductionId) as RunResultRow[];
  }

  seriesNames(): string[] {
    return (this.db.prepare('SELECT DISTINCT series FROM reductions ORDER BY series').all() as { series: string }[]).map((r) => r.series);
  }

  close(): void {
    this.db.close();
  }
}
