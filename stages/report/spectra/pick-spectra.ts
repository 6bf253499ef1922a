/**
 * Which run × detector spectra a summary page embeds when not all fit under the cap: every
 * detector of runs spread evenly over the series (first and last included), so a long series
 * is sampled end to end; with fewer slots than detectors, the first detectors of the first run.
 * Returns run → detector ids to keep, in run order.
 */
export function pickSpectra(runs: readonly string[], detectorIds: readonly string[], maxSpectra: number): Map<string, string[]> {
  const picked = new Map<string, string[]>();
  const cap = Math.max(0, Math.floor(maxSpectra));
  if (cap === 0 || runs.length === 0 || detectorIds.length === 0) return picked;
  if (runs.length * detectorIds.length <= cap) {
    for (const r of runs) picked.set(r, [...detectorIds]);
    return picked;
  }
  const perRun = Math.floor(cap / detectorIds.length);
  if (perRun === 0) {
    picked.set(runs[0]!, detectorIds.slice(0, cap));
    return picked;
  }
  const k = Math.min(runs.length, perRun);
  for (let i = 0; i < k; i++) {
    const at = k === 1 ? 0 : Math.round((i * (runs.length - 1)) / (k - 1));
    picked.set(runs[at]!, [...detectorIds]);
  }
  return picked;
}
