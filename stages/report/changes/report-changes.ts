import type { ChangeSummary } from '../../../pipeline/core/model/change-summary.js';

/** The archive's change summary as the page shows it (pipeline/core/model/change-summary.ts). */
export type ReportChanges = ChangeSummary;

/**
 * What the report is told about archive versions: absent for a plain `xsred reduce` (the page says it
 * is not an archive version); null for the first version of a series; the summary; or a function of
 * the new cross_sections.arrow bytes that gives it (the engine diffs them against the previous version
 * before the page is written).
 */
export type ReportChangesInput = ReportChanges | null | ((crossSectionsIpc: Uint8Array) => ReportChanges | null);
