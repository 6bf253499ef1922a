// Weighted average with the scale factor S: R.L. Workman et al. (Particle Data Group), Prog. Theor. Exp. Phys. 2022, 083C01, Introduction §5.2 ("Averages and fits"), unconstrained averaging.
/**
 * Weighted mean of N independent values x_i ± δx_i (all in one unit):
 *   x̄ = Σ w_i x_i / Σ w_i,  δx̄ = (Σ w_i)^{−1/2},  w_i = 1/δx_i²,
 *   χ² = Σ w_i (x̄ − x_i)²  over all N, ν = N − 1.
 * Scale factor (the Review's rule): S is computed only from the N' values with
 * δx_i <= δ₀ = 3 √N δx̄ (values far less precise than the mean hardly affect it and should not
 * inflate it), S = [χ'²/(N' − 1)]^{1/2} with χ'² = Σ_{those} w_i (x̄ − x_i)²; when S > 1 the
 * quoted uncertainty is S·δx̄, otherwise δx̄ unchanged. With N' < 2, S = 1.
 */
export interface WeightedMean {
  mean: number;
  /** δx̄ before scaling. */
  uncertainty: number;
  chi2: number;
  ndf: number;
  /** χ²/ν over all values (NaN for N = 1). */
  chi2PerNdf: number;
  /** S as computed (may be < 1). */
  scaleFactorRaw: number;
  /** max(1, S): the factor applied. */
  scaleFactor: number;
  /** S applied: max(1, S) · δx̄. */
  scaledUncertainty: number;
  /** Which values entered S (δx_i <= 3 √N δx̄). */
  usedForScaleFactor: boolean[];
}

export function weightedMean(values: ArrayLike<number>, uncertainties: ArrayLike<number>): WeightedMean {
  const n = values.length;
  if (n === 0) throw new RangeError('a weighted mean needs at least one value');
  if (uncertainties.length !== n) throw new RangeError(`${n} values but ${uncertainties.length} uncertainties`);
  let sw = 0;
  let swx = 0;
  for (let i = 0; i < n; i++) {
    const x = values[i]!;
    const u = uncertainties[i]!;
    if (!Number.isFinite(x)) throw new RangeError(`value ${i} is ${x}; expected a finite number`);
    if (!(u > 0) || !Number.isFinite(u)) throw new RangeError(`uncertainty ${i} is ${u}; expected a finite value > 0`);
    const w = 1 / (u * u);
    sw += w;
    swx += w * x;
  }
  const mean = swx / sw;
  const uncertainty = 1 / Math.sqrt(sw);
  const cutoff = 3 * Math.sqrt(n) * uncertainty;
  let chi2 = 0;
  let chi2Used = 0;
  let used = 0;
  const usedForScaleFactor: boolean[] = [];
  for (let i = 0; i < n; i++) {
    const u = uncertainties[i]!;
    const term = ((values[i]! - mean) / u) ** 2;
    chi2 += term;
    const inS = u <= cutoff;
    usedForScaleFactor.push(inS);
    if (inS) {
      chi2Used += term;
      used += 1;
    }
  }
  const scaleFactorRaw = used >= 2 ? Math.sqrt(chi2Used / (used - 1)) : 1;
  const scaleFactor = Math.max(1, scaleFactorRaw);
  return {
    mean,
    uncertainty,
    chi2,
    ndf: n - 1,
    chi2PerNdf: n > 1 ? chi2 / (n - 1) : Number.NaN,
    scaleFactorRaw,
    scaleFactor,
    scaledUncertainty: scaleFactor * uncertainty,
    usedForScaleFactor,
  };
}
