// Log-log interpolation between tabulated stopping powers: common practice (no single published source).
/**
 * y(x) = y_i (x/x_i)^p with p = ln(y_{i+1}/y_i) / ln(x_{i+1}/x_i), for x_i <= x <= x_{i+1}:
 * linear interpolation of ln y against ln x. Exact for a power law between two points.
 * Returns NaN outside [x_0, x_last] (the caller decides what that means) and the table value at a grid point.
 * @param xs strictly rising, positive abscissae (any unit; keV for stopping tables)
 * @param ys positive ordinates, same length
 * @param x the abscissa, same unit as xs
 */
export function interpolateLogLog(xs: ArrayLike<number>, ys: ArrayLike<number>, x: number): number {
  const n = xs.length;
  if (!(x >= xs[0]!) || !(x <= xs[n - 1]!)) return Number.NaN;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const x0 = xs[lo]!;
  if (x === x0) return ys[lo]!;
  const x1 = xs[hi]!;
  if (x === x1) return ys[hi]!;
  const y0 = ys[lo]!;
  const y1 = ys[hi]!;
  return y0 * Math.exp((Math.log(y1 / y0) * Math.log(x / x0)) / Math.log(x1 / x0));
}
