import type { QcRow } from '../../../pipeline/core/model/result-rows.js';
import type { DriftQcFields, QcRowWithDrift } from '../fits-columns.js';

export type DriftRow = QcRow & DriftQcFields;

/** The qc rows of reduced runs that carry a tracked drift shift (drift.mode track | correct; finite shift). */
export function driftRows(qc: readonly QcRowWithDrift[]): DriftRow[] {
  return qc.filter((q): q is DriftRow => q.status === 'reduced' && q.driftShiftKeV !== undefined && Number.isFinite(q.driftShiftKeV));
}
