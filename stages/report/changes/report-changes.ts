/**
 * "Changes since the previous version" as the summary page shows it: the shape of the archive's
 * change summary (pipeline/engine/archive/change-summary.ts writes it, also as changes.json), restated
 * here so the report stage imports nothing from the engine. Shifts are (new − old)/√(u_old² + u_new²)
 * with u the total standard uncertainty of each version (README, "Operating guide").
 */
export interface ReportChanges {
  from: string | null;
  to: string | null;
  rowsFrom: number;
  rowsTo: number;
  matched: number;
  moved: number;
  relabelled: number;
  added: number;
  removed: number;
  beyond1Sigma: number;
  beyond3Sigma: number;
  largest: { run: string; detector: string; peak: string; quantity: string; shiftSigma: number } | null;
  top: readonly { run: string; detector: string; peak: string; change: string; quantity: string | null; from: number | null; to: number | null; shiftSigma: number | null }[];
}

/**
 * What the report is told about archive versions: absent for a plain `xsred reduce` (the page says it
 * is not an archive version); null for the first version of a series; the summary; or a function of
 * the new cross_sections.arrow bytes that gives it (the engine diffs them against the previous version
 * before the page is written).
 */
export type ReportChangesInput = ReportChanges | null | ((crossSectionsIpc: Uint8Array) => ReportChanges | null);
