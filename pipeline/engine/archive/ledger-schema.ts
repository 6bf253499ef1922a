/**
 * The ledger's tables (SQLite, WAL). `reductions`: one row per series per nightly/rereduce
 * invocation; `run_results`: one row per run of a reduction that produced a version;
 * `file_hashes`: (path, size, mtime) → sha256, so an unchanged file is not read again;
 * `measure_cache`: a run's measured window sums keyed by the content of its spectrum and plan.
 */
export const LEDGER_SCHEMA_VERSION = 1;

export const LEDGER_DDL = `
CREATE TABLE IF NOT EXISTS meta (key TEXT PRIMARY KEY, value TEXT NOT NULL);
CREATE TABLE IF NOT EXISTS reductions (
  id INTEGER PRIMARY KEY AUTOINCREMENT,
  session TEXT NOT NULL,
  command TEXT NOT NULL,
  series TEXT NOT NULL,
  series_dir TEXT NOT NULL,
  started TEXT NOT NULL,
  finished TEXT,
  pid INTEGER NOT NULL,
  software_version TEXT NOT NULL,
  config_hash TEXT,
  fingerprint TEXT,
  outcome TEXT NOT NULL,
  exit_code INTEGER,
  version TEXT,
  previous_version TEXT,
  runs_total INTEGER NOT NULL DEFAULT 0,
  runs_reduced INTEGER NOT NULL DEFAULT 0,
  runs_reused INTEGER NOT NULL DEFAULT 0,
  runs_measured INTEGER NOT NULL DEFAULT 0,
  runs_set_aside INTEGER NOT NULL DEFAULT 0,
  runs_pending INTEGER NOT NULL DEFAULT 0,
  rows INTEGER NOT NULL DEFAULT 0,
  note TEXT NOT NULL DEFAULT '',
  diagnostics_json TEXT NOT NULL DEFAULT '[]',
  changes_json TEXT
);
CREATE INDEX IF NOT EXISTS reductions_series ON reductions (series, id);
CREATE TABLE IF NOT EXISTS run_results (
  reduction_id INTEGER NOT NULL REFERENCES reductions (id),
  series TEXT NOT NULL,
  run TEXT NOT NULL,
  kind TEXT NOT NULL,
  input_hash TEXT NOT NULL,
  own_hash TEXT NOT NULL,
  calibration_version TEXT NOT NULL,
  reference_runs TEXT NOT NULL,
  outcome TEXT NOT NULL,
  diagnostics_json TEXT NOT NULL,
  PRIMARY KEY (reduction_id, run)
);
CREATE INDEX IF NOT EXISTS run_results_series ON run_results (series, run);
CREATE TABLE IF NOT EXISTS file_hashes (
  path TEXT PRIMARY KEY,
  size INTEGER NOT NULL,
  mtime_ns TEXT NOT NULL,
  ino TEXT NOT NULL,
  sha256 TEXT NOT NULL
);
CREATE TABLE IF NOT EXISTS measure_cache (
  key TEXT PRIMARY KEY,
  series TEXT NOT NULL,
  run TEXT NOT NULL,
  used_by INTEGER NOT NULL,
  result_json TEXT NOT NULL
);
CREATE INDEX IF NOT EXISTS measure_cache_series ON measure_cache (series, used_by);
`;
