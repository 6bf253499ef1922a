/**
 * A diagnostic is data, not a thrown string: every problem found in an input or
 * during a reduction is one of these, so it can be printed (`file:line:col: ...`),
 * stored in qc tables and counted.
 */
export type Severity = 'error' | 'warning' | 'info';

export type StageName = 'ingest' | 'calibrate' | 'normalize' | 'extract' | 'report' | 'engine' | 'simulate';

export interface Diagnostic {
  severity: Severity;
  /** What is wrong, quoting the offending value. */
  message: string;
  /** Path of the file the problem is in (as given to the reader, usually relative to the series folder). */
  file?: string;
  /** 1-based line. */
  line?: number;
  /** 1-based column (characters, not bytes, for text formats). */
  column?: number;
  run?: string;
  detector?: string;
  stage?: StageName;
  /** Stable machine-readable rule id, kebab-case, e.g. `spectrum-negative-count`. */
  rule: string;
  expected?: string;
  actual?: string;
  /** What to do about it. */
  hint?: string;
}
