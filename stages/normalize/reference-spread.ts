// Between-measurement variance by the method of moments: R. DerSimonian, N. Laird, "Meta-analysis in clinical trials", Controlled Clinical Trials 7, 177-188 (1986).
/**
 * The scatter of k measurements x_i ± u_i beyond their own uncertainties, τ (in x's unit):
 *   w_i = 1/u_i²,  x̄ = Σ w_i x_i / Σ w_i,  Q = Σ w_i (x_i − x̄)²,
 *   τ² = max(0, (Q − (k − 1)) / (Σ w_i − Σ w_i² / Σ w_i)).
 * For equal u_i this is τ² = max(0, s² − u²) with s² the sample variance. k < 2 gives τ = 0.
 * Used for the reference runs of one detector: τ/x̄ is the relative standard uncertainty each
 * reference run's effective solid angle gets on top of its counting, live time and energy.
 */
export interface ReferenceSpread {
  tau: number;
  /** τ / x̄ (0 when τ = 0). */
  tauRel: number;
  mean: number;
  q: number;
  ndf: number;
}

export function referenceSpread(values: readonly number[], uncertainties: readonly number[]): ReferenceSpread {
  const k = values.length;
  if (uncertainties.length !== k) throw new RangeError(`${k} values but ${uncertainties.length} uncertainties`);
  if (k === 0) return { tau: 0, tauRel: 0, mean: Number.NaN, q: 0, ndf: 0 };
  let s1 = 0;
  let s2 = 0;
  let sx = 0;
  for (let i = 0; i < k; i++) {
    const u = uncertainties[i]!;
    if (!(u > 0) || !Number.isFinite(u) || !Number.isFinite(values[i]!)) throw new RangeError(`measurement ${i} is ${values[i]} ± ${u}; expected finite values with u > 0`);
    const w = 1 / (u * u);
    s1 += w;
    s2 += w * w;
    sx += w * values[i]!;
  }
  const mean = sx / s1;
  let q = 0;
  for (let i = 0; i < k; i++) q += ((values[i]! - mean) / uncertainties[i]!) ** 2;
  const tau2 = k < 2 ? 0 : Math.max(0, (q - (k - 1)) / (s1 - s2 / s1));
  const tau = Math.sqrt(tau2);
  return { tau, tauRel: tau === 0 ? 0 : tau / Math.abs(mean), mean, q, ndf: Math.max(k - 1, 0) };
}
