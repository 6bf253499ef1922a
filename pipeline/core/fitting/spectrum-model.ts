// Line shapes: G. Bortels, P. Collaers, Appl. Radiat. Isot. 38, 831 (1987); step: G.W. Phillips, K.W. Marlow, Nucl. Instrum. Methods 137, 525 (1976).
import type { FitModel, FitParameter } from './fit-model.js';
import { addTieGradient, evaluateTie, type LinearTie } from './linear-tie.js';
import { gaussianEdge, gaussianEdgeDifference, newGaussianEdge } from './gaussian-peak.js';
import { newTailEdge, tailEdge } from './tailed-gaussian-peak.js';
import { stepAntiderivative } from './erfc-step.js';
import { polynomialBinBasis, type PolynomialBackground } from './polynomial-background.js';

/**
 * One peak of a region: area parameter A (counts, the integral of the component over all x),
 * centroid c and width σ (channels) as ties of the parameters, an optional low-energy tail
 * (fraction η, length τ in channels) and an optional erfc step of height H (counts/channel).
 */
export interface PeakComponent {
  label: string;
  area: number;
  centroid: LinearTie;
  sigma: LinearTie;
  tail?: { fraction: LinearTie; length: LinearTie };
  step?: LinearTie;
}

/**
 * A fit region: channels firstChannel … firstChannel + channelCount − 1, each the bin
 * [ch − ½, ch + ½] (E(ch) is the energy at the centre of channel ch, DESIGN.md). The model is
 *   μ_ch = Σ_peaks ∫_bin A·[(1 − η)G + ηT] + ∫_bin H·Q + ∫_bin (b₀ + b₁t + b₂t²),
 * every term integrated over the bin exactly (gaussian-peak.ts, tailed-gaussian-peak.ts,
 * erfc-step.ts, polynomial-background.ts), with the analytic Jacobian.
 */
export interface SpectrumModelSpec {
  firstChannel: number;
  channelCount: number;
  parameters: readonly FitParameter[];
  peaks: readonly PeakComponent[];
  background?: PolynomialBackground;
}

export function spectrumModel(spec: SpectrumModelSpec): FitModel {
  const n = spec.channelCount;
  const p = spec.parameters.length;
  const lo = newGaussianEdge();
  const hi = newGaussianEdge();
  const tLo = newTailEdge();
  const tHi = newTailEdge();
  const basis = new Float64Array(3);
  const peaks = spec.peaks;
  const bg = spec.background;

  function evaluate(params: Float64Array, mu: Float64Array, jac: Float64Array): void {
    mu.fill(0, 0, n);
    jac.fill(0, 0, n * p);
    for (const peak of peaks) {
      const area = params[peak.area]!;
      const c = evaluateTie(peak.centroid, params);
      const s = evaluateTie(peak.sigma, params);
      const eta = peak.tail === undefined ? 0 : evaluateTie(peak.tail.fraction, params);
      const tau = peak.tail === undefined ? 1 : evaluateTie(peak.tail.length, params);
      const h = peak.step === undefined ? 0 : evaluateTie(peak.step, params);
      const tailed = peak.tail !== undefined;
      const stepped = peak.step !== undefined;
      gaussianEdge(spec.firstChannel - 0.5, c, s, lo);
      if (tailed) tailEdge(lo.z, lo.density, s, tau, tLo);
      let sLo = stepped ? stepAntiderivative(lo.z, lo.density, lo.upper) : 0;
      for (let i = 0; i < n; i++) {
        gaussianEdge(spec.firstChannel + i + 0.5, c, s, hi);
        const row = i * p;
        let frac = gaussianEdgeDifference(lo, hi);
        // ∂ΔΦ/∂c = −Δφ/σ, ∂ΔΦ/∂σ = −Δ(zφ)/σ (gaussian-peak.ts).
        let dC = -(hi.density - lo.density) / s;
        let dS = -(hi.z * hi.density - lo.z * lo.density) / s;
        if (tailed) {
          tailEdge(hi.z, hi.density, s, tau, tHi);
          const dE = tHi.e - tLo.e;
          frac += eta * dE;
          dC += eta * (tHi.dCentroid - tLo.dCentroid);
          dS += eta * (tHi.dSigma - tLo.dSigma);
          addTieGradient(peak.tail!.fraction, area * dE, jac, row);
          addTieGradient(peak.tail!.length, area * eta * (tHi.dLength - tLo.dLength), jac, row);
          tLo.e = tHi.e; tLo.dCentroid = tHi.dCentroid; tLo.dSigma = tHi.dSigma; tLo.dLength = tHi.dLength;
        }
        mu[i] += area * frac;
        jac[row + peak.area] += frac;
        addTieGradient(peak.centroid, area * dC, jac, row);
        addTieGradient(peak.sigma, area * dS, jac, row);
        if (stepped) {
          const sHi = stepAntiderivative(hi.z, hi.density, hi.upper);
          mu[i] += h * s * (sHi - sLo);
          addTieGradient(peak.step!, s * (sHi - sLo), jac, row);
          addTieGradient(peak.centroid, -h * (hi.upper - lo.upper), jac, row);
          addTieGradient(peak.sigma, -h * (hi.density - lo.density), jac, row);
          sLo = sHi;
        }
        lo.z = hi.z; lo.density = hi.density; lo.lower = hi.lower; lo.upper = hi.upper;
      }
    }
    if (bg !== undefined) {
      const k = bg.params.length;
      for (let i = 0; i < n; i++) {
        polynomialBinBasis(spec.firstChannel + i, bg.referenceChannel, basis);
        const row = i * p;
        for (let d = 0; d < k; d++) {
          mu[i] += params[bg.params[d]!]! * basis[d]!;
          jac[row + bg.params[d]!] += basis[d]!;
        }
      }
    }
  }
  return { parameterCount: p, pointCount: n, evaluate };
}
