import type { Logger } from 'pino';
import type { Ledger } from './ledger.js';
import type { Progress } from './progress.js';
import type { ChangeSummary } from './change-summary.js';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';
import type { ReductionOutcome } from './ledger.js';

/** What every series of one nightly/rereduce invocation shares. */
export interface NightContext {
  ledger: Ledger;
  outRoot: string;
  session: string;
  command: 'nightly' | 'rereduce';
  /** Re-measure every run and write a new version even when nothing changed (rereduce). */
  force: boolean;
  /** Files modified less than this long ago are still being written: left for the next run. */
  settleS: number;
  /** Versions to keep per series (older ones pruned); undefined keeps all. */
  keep: number | undefined;
  jobs: number;
  html: boolean;
  commandLine: string[];
  log: Logger;
  progress: Progress;
  now: () => Date;
}

export interface SeriesNightResult {
  series: string;
  seriesDir: string;
  outcome: ReductionOutcome;
  /** Exit code this series contributes (EXIT). */
  exitCode: number;
  version: string | null;
  runs: { total: number; reduced: number; reused: number; measured: number; setAside: number; pending: number };
  rows: number;
  note: string;
  diagnostics: Diagnostic[];
  changes: ChangeSummary | null;
  durationMs: number;
}
