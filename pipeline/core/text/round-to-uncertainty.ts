// Rounding rule of the Particle Data Group: R.L. Workman et al. (PDG), Prog. Theor. Exp. Phys. 2022, 083C01, Introduction §5.3 ("Rounding").
/**
 * Value and uncertainty as text, the uncertainty rounded by the PDG rule and the value to the
 * same decimal place: take the three highest-order digits of the uncertainty; 100–354 → two
 * significant digits, 355–949 → one, 950–999 → round up to 1000 and keep two.
 * Examples: 1234.5 ± 23.1 → "1235 ± 23"; 0.8271 ± 0.0449 → "0.83 ± 0.04".
 */
export function roundToUncertainty(value: number, unc: number): { value: string; unc: string } {
  if (!Number.isFinite(value)) return { value: '—', unc: '' };
  if (!(unc > 0) || !Number.isFinite(unc)) return { value: value.toPrecision(4), unc: '' };
  const exp = Math.floor(Math.log10(unc));
  const three = Math.round(unc / 10 ** (exp - 2));
  // 100–354: two significant digits (place exp − 1); 355–949: one (place exp);
  // 950–999: rounds up to 1000, i.e. two digits at place exp.
  const place = three < 355 ? exp - 1 : exp;
  const step = 10 ** place;
  const u = Math.round(unc / step) * step;
  const v = Math.round(value / step) * step;
  const decimals = Math.max(0, -place);
  return { value: v.toFixed(decimals), unc: u.toFixed(decimals) };
}

/** "v ± u" with the PDG rounding; "v" alone when there is no uncertainty. */
export function formatWithUncertainty(value: number, unc: number): string {
  const r = roundToUncertainty(value, unc);
  return r.unc === '' ? r.value : `${r.value} ± ${r.unc}`;
}
