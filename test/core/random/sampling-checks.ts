/** Shared helpers for the statistical tests of the samplers (test code, not product code). */

export function sampleMoments(n: number, draw: () => number): { mean: number; variance: number; min: number; max: number } {
  let sum = 0;
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = draw();
    values[i] = v;
    sum += v;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (values[i]! - mean) ** 2;
  return { mean, variance: ss / (n - 1), min, max };
}

/**
 * Pearson's chi-square statistic of observed integer outcomes against a probability mass
 * function, with outcomes pooled into bins of expected count >= 20 (tails pooled into the
 * first and last bins), and the upper critical value at tail probability `alpha` from the
 * Wilson–Hilferty approximation χ²_q ≈ k (1 − 2/(9k) + z_q √(2/(9k)))³
 * (E.B. Wilson, M.M. Hilferty, Proc. Natl. Acad. Sci. 17, 684 (1931)); z for 1e-4 is 3.7190.
 */
export function chiSquareUpper(
  observed: Map<number, number>, pmf: (k: number) => number, n: number, alpha: 1e-4,
): { statistic: number; critical: number; bins: number } {
  const z = alpha === 1e-4 ? 3.719016485 : Number.NaN;
  const ks = [...observed.keys()];
  const lo = Math.min(...ks);
  const hi = Math.max(...ks);
  // Probability mass below lo and above hi goes into the end bins.
  let below = 0;
  for (let k = 0; k < lo; k++) below += pmf(k);
  let inRange = 0;
  for (let k = lo; k <= hi; k++) inRange += pmf(k);
  const above = Math.max(0, 1 - below - inRange);
  const bins: { expected: number; observed: number }[] = [];
  let cur = { expected: below * n, observed: 0 };
  for (let k = lo; k <= hi; k++) {
    cur.expected += pmf(k) * n;
    cur.observed += observed.get(k) ?? 0;
    if (cur.expected >= 20) {
      bins.push(cur);
      cur = { expected: 0, observed: 0 };
    }
  }
  cur.expected += above * n;
  if (bins.length > 0) {
    const last = bins[bins.length - 1]!;
    last.expected += cur.expected;
    last.observed += cur.observed;
  } else bins.push(cur);
  const statistic = bins.reduce((s, b) => s + (b.observed - b.expected) ** 2 / b.expected, 0);
  const dof = bins.length - 1;
  const critical = dof * (1 - 2 / (9 * dof) + z * Math.sqrt(2 / (9 * dof))) ** 3;
  return { statistic, critical, bins: bins.length };
}
