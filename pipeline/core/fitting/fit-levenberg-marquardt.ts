// K. Levenberg, Q. Appl. Math. 2, 164-168 (1944); D.W. Marquardt, J. Soc. Ind. Appl. Math. 11, 431-441 (1963); Poisson scoring as in S. Baker, R.D. Cousins, Nucl. Instrum. Methods 221, 437 (1984).
import type { FitModel } from './fit-model.js';
import { choleskyFactor, choleskyInverse, choleskySolve } from './cholesky.js';
import { poissonDeviance, weightedSumOfSquares } from './poisson-deviance.js';

/**
 * Fits a model's parameters p to data n by Levenberg–Marquardt with the analytic Jacobian J.
 *
 * Objectives F (both written as ½·f so one update serves):
 * - `poisson`: f = D = 2Σ[μ − n + n ln(n/μ)] (Poisson deviance); gradient g = Jᵀ W (μ − n) and
 *   Fisher information H = JᵀWJ with W = diag(1/μ) (scoring);
 * - `least-squares`: f = Σ w (n − μ)² with given weights w = 1/σ² or unit weights; g and H as above
 *   with W = diag(w).
 * Step: (H_aa + λ·diag H_aa) δ = −g_a over the active parameters a (not fixed, not held at a bound
 * by a gradient pointing outwards); p ← clamp(p + δ) onto [lower, upper]; accept if f decreases
 * (λ ← λ/10), else λ ← 10λ.
 * Fisher scoring only approaches a parameter whose optimum lies on its bound geometrically (a
 * background over empty channels, an absent peak: the expected curvature 1/μ grows as μ → 0), so
 * a step that moves an active parameter to within one standard deviation (√(H_aa⁻¹)_jj) of its bound
 * is also tried with that parameter on the bound, and the better of the two trials is taken.
 * Where the Fisher curvature overstates the true one (expected counts μ << 1 over empty channels),
 * scoring steps fall short: when an accepted step decreases f by more than 1.5 times the decrease
 * the quadratic model predicts, the step is doubled while f keeps decreasing.
 * Convergence: the Newton decrement m = g_aᵀ H_aa⁻¹ g_a (the squared Gauss–Newton step in units of
 * the parameter covariance) falls below `tolerance`. Covariance at the optimum: H⁻¹ over the free
 * parameters not at a bound (Fisher information for `poisson`; for unit-weight least squares scaled
 * by s² = f/(N − P_free), the convention of the NIST StRD certified standard deviations).
 */
export interface FitOptions {
  objective: 'poisson' | 'least-squares';
  /** least-squares only: w_i = 1/σ_i² (1/data units²); unit weights when absent. */
  weights?: Float64Array;
  lower?: ArrayLike<number>;
  upper?: ArrayLike<number>;
  fixed?: ArrayLike<boolean>;
  /** Iteration limit (accepted or rejected steps). Default 200. */
  maxIterations?: number;
  /** Newton-decrement threshold, in units of σ² of the parameters (1e-12: steps below 1e-6 σ). Default 1e-12. */
  tolerance?: number;
}

export type StopReason = 'converged' | 'iteration-limit' | 'no-decrease' | 'invalid-start';

export interface FitOutcome {
  params: Float64Array;
  /** P×P row-major; rows and columns of fixed or at-bound parameters are zero; NaN when H is singular. */
  covariance: Float64Array;
  converged: boolean;
  stopReason: StopReason;
  iterations: number;
  /** f at the optimum: Poisson deviance, or weighted residual sum of squares. */
  objective: number;
  /** Free parameters (not fixed); the degrees of freedom are N − freeCount. */
  freeCount: number;
  dof: number;
  atBound: boolean[];
  /** Model at the optimum (length N). */
  mu: Float64Array;
  covarianceValid: boolean;
}

export function fitLevenbergMarquardt(model: FitModel, data: ArrayLike<number>, start: ArrayLike<number>, options: FitOptions): FitOutcome {
  const P = model.parameterCount;
  const N = model.pointCount;
  const poisson = options.objective === 'poisson';
  const w = options.weights;
  const lower = Float64Array.from({ length: P }, (_, j) => options.lower?.[j] ?? Number.NEGATIVE_INFINITY);
  const upper = Float64Array.from({ length: P }, (_, j) => options.upper?.[j] ?? Number.POSITIVE_INFINITY);
  const fixed = Array.from({ length: P }, (_, j) => options.fixed?.[j] ?? false);
  const maxIterations = options.maxIterations ?? 200;
  const tolerance = options.tolerance ?? 1e-12;

  let p = Float64Array.from({ length: P }, (_, j) => clamp(start[j]!, lower[j]!, upper[j]!));
  let pTrial = new Float64Array(P);
  let mu = new Float64Array(N);
  let jac = new Float64Array(N * P);
  let muTrial = new Float64Array(N);
  let jacTrial = new Float64Array(N * P);
  const h = new Float64Array(P * P);
  const g = new Float64Array(P);
  const a = new Float64Array(P * P);
  const delta = new Float64Array(P);
  const active = new Int32Array(P);
  const sdActive = new Float64Array(P);
  const column = new Float64Array(P);
  let pSnap = new Float64Array(P);
  let muSnap = new Float64Array(N);
  let jacSnap = new Float64Array(N * P);
  const freeCount = fixed.filter((f) => !f).length;
  const dof = N - freeCount;
  const objective = (m: Float64Array) => (poisson ? poissonDeviance(data, m, N) : weightedSumOfSquares(data, m, w, N));

  model.evaluate(p, mu, jac);
  let f = objective(mu);
  const outcome = (stopReason: StopReason, iterations: number): FitOutcome => {
    const cov = covarianceAt(p, mu, jac);
    return {
      params: p, covariance: cov.matrix, covarianceValid: cov.valid, converged: stopReason === 'converged', stopReason, iterations,
      objective: f, freeCount, dof, atBound: cov.atBound, mu,
    };
  };
  if (!Number.isFinite(f)) return outcome('invalid-start', 0);

  let lambda = 1e-3;
  for (let it = 1; it <= maxIterations; it++) {
    normalEquations(mu, jac);
    let na = 0;
    for (let j = 0; j < P; j++) {
      if (fixed[j]) continue;
      if (p[j]! <= lower[j]! && g[j]! > 0) continue;
      if (p[j]! >= upper[j]! && g[j]! < 0) continue;
      active[na++] = j;
    }
    if (na === 0) return outcome('converged', it - 1);
    const scale = !poisson && w === undefined && dof > 0 ? f / dof : 1;
    const decrement = newtonDecrement(na);
    if (decrement <= tolerance * scale) return outcome('converged', it - 1);
    for (;;) {
      if (!dampedStep(na, lambda)) {
        lambda *= 10;
      } else {
        model.evaluate(pTrial, muTrial, jacTrial);
        let fTrial = objective(muTrial);
        if (snapToBounds(na)) {
          model.evaluate(pSnap, muSnap, jacSnap);
          const fSnap = objective(muSnap);
          if (fSnap <= fTrial) {
            [pTrial, pSnap] = [pSnap, pTrial];
            [muTrial, muSnap] = [muSnap, muTrial];
            [jacTrial, jacSnap] = [jacSnap, jacTrial];
            fTrial = fSnap;
          }
        }
        if (fTrial < f) {
          const predicted = predictedDecrease(na);
          [p, pTrial] = [pTrial, p];
          [mu, muTrial] = [muTrial, mu];
          [jac, jacTrial] = [jacTrial, jac];
          const actual = f - fTrial;
          f = fTrial;
          lambda = Math.max(lambda / 10, 1e-15);
          if (actual > 1.5 * predicted) extrapolate(na);
          break;
        }
        lambda *= 10;
      }
      // No step lowers the objective any more: at high counts the deviance's rounding error
      // (≈ 1e-16 × Σ n ln n) exceeds the requested decrement. Within 1e-3 standard deviations
      // of the optimum (Newton decrement ≈ Δχ² ≤ 1e-6) that is convergence, statistically exact.
      if (lambda > 1e16) return outcome(decrement <= 1e-6 * scale ? 'converged' : 'no-decrease', it);
    }
  }
  return outcome('iteration-limit', maxIterations);

  function weightOf(i: number, m: Float64Array): number {
    if (poisson) return m[i]! > 1e-300 ? 1 / m[i]! : 0;
    return w === undefined ? 1 : w[i]!;
  }

  function normalEquations(m: Float64Array, jm: Float64Array): void {
    h.fill(0);
    g.fill(0);
    for (let i = 0; i < N; i++) {
      const wi = weightOf(i, m);
      const r = wi * (m[i]! - data[i]!);
      const row = i * P;
      for (let j = 0; j < P; j++) {
        const jij = jm[row + j]!;
        if (jij === 0) continue;
        g[j] += jij * r;
        const wj = wi * jij;
        for (let k = 0; k <= j; k++) h[j * P + k] += wj * jm[row + k]!;
      }
    }
    for (let j = 0; j < P; j++) for (let k = 0; k < j; k++) h[k * P + j] = h[j * P + k]!;
  }

  /** g_aᵀ H_aa⁻¹ g_a, or +∞ when H_aa is not positive definite. */
  function newtonDecrement(na: number): number {
    for (let r = 0; r < na; r++) for (let c = 0; c < na; c++) a[r * na + c] = h[active[r]! * P + active[c]!]!;
    if (!choleskyFactor(a, na)) {
      sdActive.fill(0);
      return Number.POSITIVE_INFINITY;
    }
    for (let r = 0; r < na; r++) delta[r] = g[active[r]!]!;
    choleskySolve(a, na, delta);
    let m = 0;
    for (let r = 0; r < na; r++) m += g[active[r]!]! * delta[r]!;
    // Standard deviations of the active parameters: (H_aa⁻¹)_jj = ‖L⁻¹e_j‖².
    for (let r = 0; r < na; r++) {
      column.fill(0, 0, na);
      column[r] = 1;
      let ss = 0;
      for (let i = r; i < na; i++) {
        let x = column[i]!;
        for (let k = r; k < i; k++) x -= a[i * na + k]! * column[k]!;
        column[i] = x / a[i * na + i]!;
        ss += column[i]! * column[i]!;
      }
      sdActive[r] = Math.sqrt(ss);
    }
    return m;
  }

  /** −2gᵀδ − δᵀHδ for δ = pTrial − p over the active set: the decrease of f the quadratic model predicts. */
  function predictedDecrease(na: number): number {
    let lin = 0;
    let quad = 0;
    for (let r = 0; r < na; r++) {
      const j = active[r]!;
      const dj = pTrial[j]! - p[j]!;
      lin += g[j]! * dj;
      for (let c = 0; c < na; c++) quad += dj * h[j * P + active[c]!]! * (pTrial[active[c]!]! - p[active[c]!]!);
    }
    return -2 * lin - quad;
  }

  /** After an accepted step p_old → p: tries p_old + k·(p − p_old) for k = 2, 4, 8, … while f decreases (pTrial holds p_old). */
  function extrapolate(na: number): void {
    for (let k = 0; k < 30; k++) {
      pSnap.set(p);
      let moved = false;
      for (let r = 0; r < na; r++) {
        const j = active[r]!;
        const next = clamp(p[j]! + (p[j]! - pTrial[j]!), lower[j]!, upper[j]!);
        if (next !== p[j]!) moved = true;
        pSnap[j] = next;
      }
      if (!moved) return;
      model.evaluate(pSnap, muSnap, jacSnap);
      const fNext = objective(muSnap);
      if (!(fNext < f)) return;
      // pTrial keeps p_old, so the displacement from it doubles each time.
      [p, pSnap] = [pSnap, p];
      [muSnap, mu] = [mu, muSnap];
      [jacSnap, jac] = [jac, jacSnap];
      f = fNext;
    }
  }

  /** pSnap = pTrial with every active parameter that the step brought within 1 sd of a bound put on it; false when none. */
  function snapToBounds(na: number): boolean {
    let any = false;
    pSnap.set(pTrial);
    for (let r = 0; r < na; r++) {
      const j = active[r]!;
      const sd = sdActive[r]!;
      if (pTrial[j]! < p[j]! && pTrial[j]! > lower[j]! && pTrial[j]! - lower[j]! < sd) {
        pSnap[j] = lower[j]!;
        any = true;
      } else if (pTrial[j]! > p[j]! && pTrial[j]! < upper[j]! && upper[j]! - pTrial[j]! < sd) {
        pSnap[j] = upper[j]!;
        any = true;
      }
    }
    return any;
  }

  /** Solves the damped system and fills pTrial; false when the damped matrix is not positive definite. */
  function dampedStep(na: number, lam: number): boolean {
    for (let r = 0; r < na; r++) {
      for (let c = 0; c < na; c++) a[r * na + c] = h[active[r]! * P + active[c]!]!;
      const d = h[active[r]! * (P + 1)]!;
      a[r * na + r] = d + lam * (d > 0 ? d : 1);
    }
    if (!choleskyFactor(a, na)) return false;
    for (let r = 0; r < na; r++) delta[r] = -g[active[r]!]!;
    choleskySolve(a, na, delta);
    pTrial.set(p);
    for (let r = 0; r < na; r++) {
      const j = active[r]!;
      pTrial[j] = clamp(p[j]! + delta[r]!, lower[j]!, upper[j]!);
    }
    return true;
  }

  function covarianceAt(pAt: Float64Array, m: Float64Array, jm: Float64Array): { matrix: Float64Array; valid: boolean; atBound: boolean[] } {
    const atBound = Array.from({ length: P }, (_, j) => !fixed[j] && (pAt[j]! <= lower[j]! || pAt[j]! >= upper[j]!));
    const matrix = new Float64Array(P * P);
    normalEquations(m, jm);
    let nf = 0;
    for (let j = 0; j < P; j++) if (!fixed[j] && !atBound[j]) active[nf++] = j;
    for (let r = 0; r < nf; r++) for (let c = 0; c < nf; c++) a[r * nf + c] = h[active[r]! * P + active[c]!]!;
    if (!choleskyFactor(a, nf)) {
      for (let r = 0; r < nf; r++) for (let c = 0; c < nf; c++) matrix[active[r]! * P + active[c]!] = Number.NaN;
      return { matrix, valid: false, atBound };
    }
    const inv = new Float64Array(nf * nf);
    choleskyInverse(a, nf, inv, new Float64Array(nf));
    const s2 = !poisson && w === undefined && dof > 0 ? weightedSumOfSquares(data, m, undefined, N) / dof : 1;
    for (let r = 0; r < nf; r++) for (let c = 0; c < nf; c++) matrix[active[r]! * P + active[c]!] = s2 * inv[r * nf + c]!;
    return { matrix, valid: true, atBound };
  }
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
