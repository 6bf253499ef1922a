// Coverage intervals from Monte Carlo model values: JCGM 101:2008 §7.7.1 (probabilistically symmetric) and §7.7.2 (shortest).
/**
 * From the M model values sorted ascending, y_(1) <= … <= y_(M), and a coverage probability p:
 *   q = pM if pM is an integer, else ⌊pM + ½⌋;  any [y_(r), y_(r+q)], r = 1 … M − q, is a 100p % interval;
 *   probabilistically symmetric: r = (M − q)/2 if that is an integer, else ⌊(M − q + 1)/2⌋;
 *   shortest: the r* with the least y_(r*+q) − y_(r*).
 * Values in the output quantity's unit; order statistics 1-based as in the clause.
 */
export interface CoverageIntervals {
  symmetric: [number, number];
  shortest: [number, number];
}

export function coverageIntervals(sorted: ArrayLike<number>, p: number): CoverageIntervals {
  const m = sorted.length;
  if (!(p > 0 && p < 1)) throw new RangeError(`coverage probability must be within (0, 1), got ${p}`);
  const pm = p * m;
  const q = Number.isInteger(pm) ? pm : Math.floor(pm + 0.5);
  if (q < 1 || q >= m) throw new RangeError(`${m} model values are too few for a ${100 * p} % coverage interval (need M > 1/(1 − p))`);
  const half = (m - q) / 2;
  const r = Number.isInteger(half) ? half : Math.floor((m - q + 1) / 2);
  const at = (k: number): number => sorted[k - 1]!;
  let best = 1;
  let bestWidth = Infinity;
  for (let k = 1; k <= m - q; k++) {
    const w = at(k + q) - at(k);
    if (w < bestWidth) {
      bestWidth = w;
      best = k;
    }
  }
  return { symmetric: [at(r), at(r + q)], shortest: [at(best), at(best + q)] };
}
