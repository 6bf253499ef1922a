import type { FitParameter } from './fit-model.js';
import { choleskyFactor, choleskySolve } from './cholesky.js';
import { spectrumModel, type SpectrumModelSpec } from './spectrum-model.js';

/**
 * Start values of the parameters that enter the model linearly — peak areas, step heights and
 * background coefficients — given the start values of the others (centroids, widths, tails from
 * kinematics and resolution): the unweighted linear least-squares solution of n ≈ Σ_k a_k·∂μ/∂a_k,
 * whose columns are the Jacobian columns at the start point (common practice, "variable
 * projection" in the sense of G.H. Golub, V. Pereyra, SIAM J. Numer. Anal. 10, 413 (1973)).
 * Results are projected onto the parameters' bounds. If the model is then not positive in every
 * channel, the constant background (or, without one, each area) is raised until it is, so the
 * Poisson deviance is finite at the start. Returns a new spec; the input is not changed.
 */
export function startAmplitudes(counts: ArrayLike<number>, spec: SpectrumModelSpec): SpectrumModelSpec {
  const linear = new Set<number>();
  for (const pk of spec.peaks) {
    linear.add(pk.area);
    for (const t of pk.step?.terms ?? []) linear.add(t.param);
  }
  for (const b of spec.background?.params ?? []) linear.add(b);
  const lin = [...linear].filter((j) => !spec.parameters[j]!.fixed);
  const P = spec.parameters.length;
  const N = spec.channelCount;
  const model = spectrumModel(spec);
  const p = Float64Array.from(spec.parameters, (q) => q.start);
  for (const j of lin) p[j] = 0;
  const mu = new Float64Array(N);
  const jac = new Float64Array(N * P);
  model.evaluate(p, mu, jac);
  const K = lin.length;
  const a = new Float64Array(K * K);
  const b = new Float64Array(K);
  for (let i = 0; i < N; i++) {
    const r = counts[spec.firstChannel + i]! - mu[i]!;
    for (let x = 0; x < K; x++) {
      const jx = jac[i * P + lin[x]!]!;
      b[x] += jx * r;
      for (let y = 0; y < K; y++) a[x * K + y] += jx * jac[i * P + lin[y]!]!;
    }
  }
  // A ridge of 1e-12 of the diagonal keeps a column that is zero over the region (a peak outside it) solvable.
  for (let x = 0; x < K; x++) a[x * K + x] = a[x * K + x]! * (1 + 1e-12) + 1e-300;
  if (K > 0 && choleskyFactor(a, K)) {
    choleskySolve(a, K, b);
    lin.forEach((j, x) => {
      const q = spec.parameters[j]!;
      p[j] = Math.min(Math.max(b[x]!, q.lower ?? Number.NEGATIVE_INFINITY), q.upper ?? Number.POSITIVE_INFINITY);
    });
  }
  model.evaluate(p, mu, jac);
  let minMu = Number.POSITIVE_INFINITY;
  let total = 0;
  for (let i = 0; i < N; i++) {
    minMu = Math.min(minMu, mu[i]!);
    total += counts[spec.firstChannel + i]!;
  }
  const floor = Math.max(total, 1) / N / 100;
  if (minMu < floor) {
    const b0 = spec.background?.params[0];
    if (b0 !== undefined && !spec.parameters[b0]!.fixed) p[b0] += floor - minMu;
    else for (const pk of spec.peaks) if (!spec.parameters[pk.area]!.fixed) p[pk.area] = Math.max(p[pk.area]!, Math.max(total, 1) / spec.peaks.length);
  }
  const parameters: FitParameter[] = spec.parameters.map((q, j) => ({ ...q, start: p[j]! }));
  return { ...spec, parameters };
}
