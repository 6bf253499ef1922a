/**
 * "Changes since the previous version" of an archive series, small enough for a page or a log
 * record: the archive engine computes it from two versions' cross_sections.arrow (and writes it
 * as changes.json), the summary page shows it. Shifts are (new − old)/√(u_old² + u_new²) with u
 * the total standard uncertainty of each version (README, "Operating guide").
 */
export interface ChangeSummary {
  from: string | null;
  to: string | null;
  rowsFrom: number;
  rowsTo: number;
  matched: number;
  /** Matched rows with a numeric change, and with only text (flags, calibration version) changed. */
  moved: number;
  relabelled: number;
  added: number;
  removed: number;
  /** Moved rows whose largest |shift| exceeds 1σ and 3σ (combined uncertainty). */
  beyond1Sigma: number;
  beyond3Sigma: number;
  /** The quantity is a cross_sections.arrow value column name. */
  largest: { run: string; detector: string; peak: string; quantity: string; shiftSigma: number } | null;
  /** The listed rows with the largest shifts. `change`: moved, relabelled, added or removed. */
  top: readonly { run: string; detector: string; peak: string; change: string; quantity: string | null; from: number | null; to: number | null; shiftSigma: number | null }[];
}
