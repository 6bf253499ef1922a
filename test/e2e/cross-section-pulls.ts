import type { ArrowRow } from './read-arrow-rows.js';
import { truthKey, type TruthCsvRow } from './read-truth-csv.js';

export interface CrossSectionPulls {
  lab: number[];
  cm: number[];
  ratio: number[];
  /** cross_sections.arrow rows without a truth.csv row (should be none). */
  unmatched: string[];
}

/**
 * Pulls of reduced cross sections against the simulator's declared truth, row by row:
 *
 *   pull = (value − truth) / u,   u = hypot(stat, value · normalization_counting_rel_unc)
 *
 * u holds only the parts the simulator randomizes: Poisson counting of the sample peak and its
 * background, the pulser's binomial live fraction (both in the statistical column), and the
 * reference runs' counting and live time (normalization_counting_rel_unc). The areal-density,
 * angle and beam-energy systematics are left out on purpose: the simulator generates counts
 * from the declared areal densities, angles and energies exactly, so those errors are not in
 * the data.
 * @param filter keep only rows for which this returns true (default: all)
 */
export function crossSectionPulls(rows: readonly ArrowRow[], truth: ReadonlyMap<string, TruthCsvRow>, filter: (r: ArrowRow) => boolean = () => true): CrossSectionPulls {
  const out: CrossSectionPulls = { lab: [], cm: [], ratio: [], unmatched: [] };
  for (const r of rows) {
    if (!filter(r)) continue;
    const key = truthKey(String(r.run), String(r.detector), String(r.peak));
    const t = truth.get(key);
    if (t === undefined) {
      out.unmatched.push(key);
      continue;
    }
    const normRel = Number(r.normalization_counting_rel_unc);
    const lab = Number(r.cross_section_lab_mb_per_sr);
    const cm = Number(r.cross_section_cm_mb_per_sr);
    const ratio = Number(r.ratio_to_rutherford);
    out.lab.push((lab - Number(t.dsigma_domega_lab_mb_per_sr)) / Math.hypot(Number(r.cross_section_lab_stat_mb_per_sr), lab * normRel));
    out.cm.push((cm - Number(t.dsigma_domega_cm_mb_per_sr)) / Math.hypot(Number(r.cross_section_cm_stat_mb_per_sr), cm * normRel));
    out.ratio.push((ratio - Number(t.sigma_over_rutherford)) / Math.hypot(Number(r.ratio_to_rutherford_stat), ratio * normRel));
  }
  return out;
}
