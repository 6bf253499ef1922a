import type { ColumnSpec } from '../../pipeline/core/tables/arrow-table.js';

/** Columns several tables share, described once so the data dictionary says the same thing everywhere. */
export const runColumn = <R extends { run: string }>(): ColumnSpec<R> => ({ name: 'run', type: 'utf8', description: 'run id from runlog.csv', value: (r) => r.run });
export const kindColumn = <R extends { kind: string }>(): ColumnSpec<R> => ({ name: 'kind', type: 'utf8', description: 'run kind: reference | sample | calibration | background', value: (r) => r.kind });
export const detectorColumn = <R extends { detector: string }>(): ColumnSpec<R> => ({ name: 'detector', type: 'utf8', description: 'detector id from series.yaml', value: (r) => r.detector });
export const flagsColumn = <R extends { flags: readonly string[] }>(): ColumnSpec<R> => ({
  name: 'flags',
  type: 'utf8',
  description: 'anomalies, sorted and joined by ";" (README, "Flags"); empty when none',
  value: (r) => (r.flags.length < 2 ? r.flags.join(';') : [...r.flags].sort().join(';')),
});
