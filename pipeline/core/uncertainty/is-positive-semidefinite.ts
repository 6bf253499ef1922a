// Cholesky factorization with a semidefinite tolerance: G.H. Golub, C.F. Van Loan, Matrix Computations, 4th ed. (Johns Hopkins, 2013), §4.2 (Cholesky factorization).
/**
 * Whether a symmetric matrix A is positive semi-definite, by the outer-product Cholesky
 * A = L Lᵀ: at step k the pivot d_k = a_kk − Σ_{m<k} l_km². With τ = tol · max_i |a_ii|:
 * d_k < −τ → not PSD; |d_k| <= τ → a zero pivot, allowed only if the rest of column k is
 * within τ of zero (then that column of L is zero); otherwise l_kk = √d_k.
 * Also checks symmetry to the same relative tolerance. Units: any (A's entries share one unit).
 */
export function isPositiveSemidefinite(a: readonly ArrayLike<number>[], tol = 1e-10): { psd: boolean; reason: string } {
  const n = a.length;
  let scale = 0;
  for (let i = 0; i < n; i++) {
    if (a[i]!.length !== n) return { psd: false, reason: `row ${i} has ${a[i]!.length} entries, expected ${n}` };
    scale = Math.max(scale, Math.abs(a[i]![i]!));
  }
  const tau = tol * scale;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      if (Math.abs(a[i]![j]! - a[j]![i]!) > tau) return { psd: false, reason: `not symmetric at (${i}, ${j}): ${a[i]![j]} vs ${a[j]![i]}` };
    }
  }
  const l: Float64Array[] = [];
  for (let i = 0; i < n; i++) l.push(new Float64Array(n));
  for (let k = 0; k < n; k++) {
    let d = a[k]![k]!;
    for (let m = 0; m < k; m++) d -= l[k]![m]! * l[k]![m]!;
    if (d < -tau) return { psd: false, reason: `negative pivot ${d} at ${k}` };
    const zero = d <= tau;
    const lkk = zero ? 0 : Math.sqrt(d);
    l[k]![k] = lkk;
    for (let i = k + 1; i < n; i++) {
      let s = a[i]![k]!;
      for (let m = 0; m < k; m++) s -= l[i]![m]! * l[k]![m]!;
      if (zero) {
        if (Math.abs(s) > Math.sqrt(tau * scale)) return { psd: false, reason: `zero pivot at ${k} with off-diagonal remainder ${s} at row ${i}` };
        l[i]![k] = 0;
      } else l[i]![k] = s / lkk;
    }
  }
  return { psd: true, reason: '' };
}
