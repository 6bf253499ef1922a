/** Exit codes of the xsred command (README, "Exit codes"). */
export const EXIT = {
  /** Every run reduced. */
  ok: 0,
  /** An unexpected internal error (a bug: please report it with the log). */
  internal: 1,
  /** Unusable arguments, or a series-level error (nothing reduced). */
  usage: 2,
  /** Reduced, but some runs were set aside (see qc.arrow and the diagnostics). */
  someSetAside: 3,
  /** nightly/rereduce: another run holds the out-root's lock (.xsred.lock); nothing done. */
  locked: 4,
  /** nightly/rereduce: an output could not be written (disk full, permissions, read-only file system); the previous version and the ledger stand. */
  outputFailed: 5,
} as const;
