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
 *   pull = (value − truth) / u,   u = hypot(stat, value · normalization_counting_rel_unc, value · u(f)/f)
 *
 * u holds only the parts the simulator randomizes: Poisson counting of the sample peak and its
 * background (the statistical column), the normalizing peaks' counting and the live fractions
 * of other spectra (normalization_counting_rel_unc: reference runs, reference layer or monitor),
 * and the pulser's binomial live fraction of the row's own spectrum, u(f)/f = live_fraction_unc /
 * live_fraction (a run-class systematic in the budget since issue 5; leave it out with
 * `ownLiveTime: false` where it cancels, as under internal-reference). The areal-density,
 * angle and beam-energy systematics are left out on purpose: the simulator generates counts
 * from the declared areal densities, angles and energies exactly, so those errors are not in
 * the data.
 * @param filter keep only rows for which this returns true (default: all)
 */
export function crossSectionPulls(rows: readonly ArrowRow[], truth: ReadonlyMap<string, TruthCsvRow>, filter: (r: ArrowRow) => boolean = () => true, options: { ownLiveTime?: boolean } = {}): CrossSectionPulls {
  const out: CrossSectionPulls = { lab: [], cm: [], ratio: [], unmatched: [] };
  for (const r of rows) {
    if (!filter(r)) continue;
    const key = truthKey(String(r.run), String(r.detector), String(r.peak));
    const t = truth.get(key);
    if (t === undefined) {
      out.unmatched.push(key);
      continue;
    }
    const normRel = Math.hypot(Number(r.normalization_counting_rel_unc), options.ownLiveTime === false ? 0 : Number(r.live_fraction_unc) / Number(r.live_fraction));
    const lab = Number(r.cross_section_lab_mb_per_sr);
    const cm = Number(r.cross_section_cm_mb_per_sr);
    const ratio = Number(r.ratio_to_rutherford);
    out.lab.push((lab - Number(t.dsigma_domega_lab_mb_per_sr)) / Math.hypot(Number(r.cross_section_lab_stat_mb_per_sr), lab * normRel));
    out.cm.push((cm - Number(t.dsigma_domega_cm_mb_per_sr)) / Math.hypot(Number(r.cross_section_cm_stat_mb_per_sr), cm * normRel));
    out.ratio.push((ratio - Number(t.sigma_over_rutherford)) / Math.hypot(Number(r.ratio_to_rutherford_stat), ratio * normRel));
  }
  return out;
}
