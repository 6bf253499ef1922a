// Poisson likelihood ratio: S. Baker, R.D. Cousins, "Clarification of the use of chi-square and likelihood functions in fits to histograms", Nucl. Instrum. Methods 221, 437-442 (1984), eq. (8).
/**
 * Poisson deviance (likelihood-ratio χ² of Baker & Cousins) of counts n against expectations μ:
 *   D = 2 Σ_i [μ_i − n_i + n_i ln(n_i/μ_i)],   the term being 2μ_i where n_i = 0.
 * Minimising D is Poisson maximum likelihood; at the optimum D is asymptotically χ² with
 * N − P degrees of freedom. Returns +∞ when some μ_i <= 0 with n_i > 0, or μ_i < 0 (no valid model).
 * n and μ in counts per channel.
 */
export function poissonDeviance(counts: ArrayLike<number>, mu: ArrayLike<number>, count = counts.length): number {
  let d = 0;
  for (let i = 0; i < count; i++) {
    const n = counts[i]!;
    const m = mu[i]!;
    if (!(m >= 0)) return Number.POSITIVE_INFINITY;
    if (n > 0) {
      if (m === 0) return Number.POSITIVE_INFINITY;
      d += m - n + n * Math.log(n / m);
    } else d += m;
  }
  return 2 * d;
}

/** Weighted residual sum of squares Σ w_i (n_i − μ_i)², w_i = 1 when `weights` is absent. */
export function weightedSumOfSquares(data: ArrayLike<number>, mu: ArrayLike<number>, weights: ArrayLike<number> | undefined, count = data.length): number {
  let s = 0;
  for (let i = 0; i < count; i++) {
    const r = data[i]! - mu[i]!;
    s += (weights === undefined ? 1 : weights[i]!) * r * r;
  }
  return Number.isFinite(s) ? s : Number.POSITIVE_INFINITY;
}
