// Rounding rule of the Particle Data Group: R.L. Workman et al. (PDG), Prog. Theor. Exp. Phys. 2022, 083C01, Introduction §5.3.
import { roundToUncertainty } from '../../../pipeline/core/text/round-to-uncertainty.js';

/**
 * Text for a measured value with a statistical and a systematic standard uncertainty,
 * "v ± stat ± sys" (same unit for all three). The PDG rule fixes the decimal place from one
 * uncertainty; with two, this project applies the rule to the smaller non-zero one and rounds
 * the value and both uncertainties to that place, so neither uncertainty loses a digit the
 * rule would give it (project convention). A missing uncertainty (NaN, 0) is left out.
 * Example: 207.14 ± 3.12 ± 12.2 → "207.1 ± 3.1 ± 12.2".
 */
export function formatStatSys(value: number, stat: number, sys: number): string {
  if (!Number.isFinite(value)) return '—';
  const ok = (u: number) => Number.isFinite(u) && u > 0;
  if (!ok(stat) && !ok(sys)) return roundToUncertainty(value, 0).value;
  if (!ok(stat) || !ok(sys)) {
    const u = ok(stat) ? stat : sys;
    const r = roundToUncertainty(value, u);
    return ok(stat) ? `${r.value} ± ${r.unc} (stat)` : `${r.value} ± ${r.unc} (sys)`;
  }
  const place = pdgPlace(Math.min(stat, sys));
  const step = 10 ** place;
  const decimals = Math.max(0, -place);
  const at = (x: number) => (Math.round(x / step) * step).toFixed(decimals);
  return `${at(value)} ± ${at(stat)} ± ${at(sys)}`;
}

/**
 * The power of ten the PDG rule rounds an uncertainty to: from its three highest digits,
 * 100–354 → two significant digits, 355–949 → one, 950–999 → up to 1000 and two digits.
 */
export function pdgPlace(unc: number): number {
  const exp = Math.floor(Math.log10(unc));
  const three = Math.round(unc / 10 ** (exp - 2));
  return three < 355 ? exp - 1 : exp;
}

/**
 * A number whose uncertainty is known but not printed beside it (an energy with its beam
 * uncertainty, an angle with its angle uncertainty): rounded to the place the PDG rule gives
 * that uncertainty. Without an uncertainty: `digits` significant digits (default 4).
 */
export function formatToUncertainty(value: number, unc: number, digits = 4): string {
  if (!Number.isFinite(value)) return '—';
  if (!(Number.isFinite(unc) && unc > 0)) return Number(value.toPrecision(digits)).toString();
  return roundToUncertainty(value, unc).value;
}

/** A relative uncertainty in percent, two significant digits (a figure with no uncertainty of its own; project convention). */
export function formatPercent(rel: number): string {
  if (!Number.isFinite(rel)) return '—';
  const p = rel * 100;
  return p === 0 ? '0' : Number(p.toPrecision(2)).toString();
}
