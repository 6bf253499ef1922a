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
} as const;
