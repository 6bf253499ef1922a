// Wilson–Hilferty cube-root approximation: E.B. Wilson, M.M. Hilferty, Proc. Natl. Acad. Sci. USA 17, 684-688 (1931).
import { normalUpperTail } from '../math/normal-cdf.js';

/**
 * P(χ²_ν > x) for ν degrees of freedom, by the Wilson–Hilferty approximation: (χ²/ν)^{1/3} is
 * nearly normal with mean 1 − 2/(9ν) and variance 2/(9ν), so
 *   P ≈ Q( ((x/ν)^{1/3} − (1 − 2/(9ν))) / √(2/(9ν)) ).
 * Good to a few per cent of P for ν >= 3 in the range used for flagging (P ~ 1e-4 … 0.5).
 * Here x is a deviance or χ² sum and ν the degrees of freedom of a fit.
 */
export function chiSquareUpperTail(x: number, dof: number): number {
  if (!(dof > 0)) return Number.NaN;
  if (x <= 0) return 1;
  const v = 2 / (9 * dof);
  return normalUpperTail((Math.cbrt(x / dof) - (1 - v)) / Math.sqrt(v));
}
