import * as arrow from 'apache-arrow';
import type { ChangeSummary } from '../../core/model/change-summary.js';
import { diffCrossSections, type DiffResult, type DiffRow, type QuantityId } from './diff-cross-sections.js';

export type { ChangeSummary };

/** The summary of a diff (see diffCrossSections for the shift scale). */
export function summarizeDiff(diff: DiffResult, from: string | null, to: string | null, top = 10): ChangeSummary {
  const changed = diff.rows.filter((r) => r.change === 'moved');
  const abs = (r: DiffRow) => r.maxAbsShiftSigma ?? -1;
  const ranked = [...diff.rows].sort((x, y) => abs(y) - abs(x));
  const best = ranked.find((r) => r.maxAbsShiftSigma !== null && r.maxQuantity !== null && r.change === 'moved');
  return {
    from,
    to,
    rowsFrom: diff.rowsFrom,
    rowsTo: diff.rowsTo,
    matched: diff.matched,
    moved: changed.length,
    relabelled: diff.rows.filter((r) => r.change === 'relabelled').length,
    added: diff.rows.filter((r) => r.change === 'added').length,
    removed: diff.rows.filter((r) => r.change === 'removed').length,
    beyond1Sigma: changed.filter((r) => abs(r) > 1).length,
    beyond3Sigma: changed.filter((r) => abs(r) > 3).length,
    largest: best ? { run: best.run, detector: best.detector, peak: best.peak, quantity: best.maxQuantity!, shiftSigma: best.quantities[best.maxQuantity!].shiftSigma! } : null,
    top: ranked.slice(0, top).map((r) => {
      const q = r.maxQuantity;
      return { run: r.run, detector: r.detector, peak: r.peak, change: r.change, quantity: q, from: q ? r.quantities[q].from : null, to: q ? r.quantities[q].to : null, shiftSigma: q ? r.quantities[q].shiftSigma : null };
    }),
  };
}

/**
 * For the HTML summary ("changes since previous version"): compares the previous version's
 * cross_sections.arrow bytes with the new table. Null when there is no previous version.
 */
export function changesSincePrevious(previous: { version: string; crossSectionsIpc: Uint8Array } | null, current: { version: string | null; table: arrow.Table }, top = 10): ChangeSummary | null {
  if (previous === null) return null;
  return summarizeDiff(diffCrossSections(arrow.tableFromIPC(previous.crossSectionsIpc), current.table), previous.version, current.version, top);
}
