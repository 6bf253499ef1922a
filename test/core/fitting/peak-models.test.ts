import { describe, expect, it } from 'vitest';
import { spectrumModel, type SpectrumModelSpec } from '../../../pipeline/core/fitting/spectrum-model.js';
import { gaussianBinContent, gaussianDensity } from '../../../pipeline/core/fitting/gaussian-peak.js';
import { exponentialTailDensity } from '../../../pipeline/core/fitting/tailed-gaussian-peak.js';
import { erfcx } from '../../../pipeline/core/fitting/erfcx.js';
import { parameterTie } from '../../../pipeline/core/fitting/linear-tie.js';

/** A region with every feature: tied centroids, scaled shared width, free tails, steps, quadratic background. */
function fullSpec(): { spec: SpectrumModelSpec; params: Float64Array } {
  const names = ['c0', 'gain', 'sigma', 'A1', 'A2', 'eta1', 'tau1', 'eta2', 'tau2', 'H1', 'H2', 'b0', 'b1', 'b2'];
  const values = [150.3, 0.52, 4.1, 3000, 1200, 0.3, 6.5, 0.45, 9.0, 4.0, 1.5, 12, -0.03, 2e-4];
  const ix = (n: string) => names.indexOf(n);
  const spec: SpectrumModelSpec = {
    firstChannel: 100,
    channelCount: 120,
    parameters: names.map((name, j) => ({ name, start: values[j]! })),
    peaks: [
      { label: 'p1', area: ix('A1'), centroid: parameterTie(ix('c0')), sigma: parameterTie(ix('sigma')), tail: { fraction: parameterTie(ix('eta1')), length: parameterTie(ix('tau1')) }, step: parameterTie(ix('H1')) },
      {
        label: 'p2', area: ix('A2'), centroid: { terms: [{ param: ix('c0'), coef: 1 }, { param: ix('gain'), coef: 40 }] },
        sigma: { terms: [{ param: ix('sigma'), coef: 1.1 }] }, tail: { fraction: parameterTie(ix('eta2')), length: parameterTie(ix('tau2')) }, step: parameterTie(ix('H2')),
      },
    ],
    background: { params: [ix('b0'), ix('b1'), ix('b2')], referenceChannel: 160 },
  };
  return { spec, params: Float64Array.from(values) };
}

describe('spectrum model', () => {
  it('has an analytic Jacobian that agrees with central finite differences (every parameter, relative 1e-6 of the column scale)', () => {
    const { spec, params } = fullSpec();
    const m = spectrumModel(spec);
    const N = m.pointCount;
    const P = m.parameterCount;
    const mu = new Float64Array(N);
    const jac = new Float64Array(N * P);
    m.evaluate(params, mu, jac);
    const muPlus = new Float64Array(N);
    const muMinus = new Float64Array(N);
    const scratch = new Float64Array(N * P);
    for (let j = 0; j < P; j++) {
      const h = 1e-6 * Math.max(Math.abs(params[j]!), 1e-2);
      const pp = params.slice();
      pp[j] += h;
      m.evaluate(pp, muPlus, scratch);
      pp[j] -= 2 * h;
      m.evaluate(pp, muMinus, scratch);
      let scale = 0;
      for (let i = 0; i < N; i++) scale = Math.max(scale, Math.abs(jac[i * P + j]!));
      expect(scale).toBeGreaterThan(0);
      for (let i = 0; i < N; i++) {
        const fd = (muPlus[i]! - muMinus[i]!) / (2 * h);
        expect(Math.abs(fd - jac[i * P + j]!)).toBeLessThan(1e-6 * scale);
      }
    }
  });

  it('integrates each peak component to its area parameter (unit-area shapes, Bortels & Collaers 1987 form)', () => {
    for (const tail of [undefined, { eta: 1, tau: 3 }, { eta: 0.4, tau: 12 }]) {
      const spec: SpectrumModelSpec = {
        firstChannel: 0,
        channelCount: 2000,
        parameters: [{ name: 'A', start: 5000 }, { name: 'c', start: 1500.2 }, { name: 's', start: 5 }, { name: 'eta', start: tail?.eta ?? 0 }, { name: 'tau', start: tail?.tau ?? 1 }],
        peaks: [{ label: 'p', area: 0, centroid: parameterTie(1), sigma: parameterTie(2), ...(tail ? { tail: { fraction: parameterTie(3), length: parameterTie(4) } } : {}) }],
      };
      const m = spectrumModel(spec);
      const mu = new Float64Array(2000);
      m.evaluate(Float64Array.from([5000, 1500.2, 5, tail?.eta ?? 0, tail?.tau ?? 1]), mu, new Float64Array(2000 * 5));
      let sum = 0;
      let moment = 0;
      for (let i = 0; i < 2000; i++) {
        sum += mu[i]!;
        moment += i * mu[i]!;
      }
      expect(Math.abs(sum - 5000)).toBeLessThan(1e-8);
      // The convolution with (1/τ)e^{t/τ}, t < 0, moves the mean by −τ: mean = c − ητ (property of a convolution).
      expect(moment / sum).toBeCloseTo(1500.2 - (tail ? tail.eta * tail.tau : 0), 6);
    }
  });

  it('gives tail bin contents equal to a numerical convolution of the Gaussian with the exponential (quadrature, independent of the closed form)', () => {
    const c = 50;
    const s = 2.5;
    const tau = 4;
    // T(x) = ∫_0^∞ (1/τ) e^{−t/τ} G(x + t) dt by the trapezoid rule on a fine grid.
    const conv = (x: number) => {
      let acc = 0;
      const dt = 0.002;
      for (let t = 0; t < 40 * tau; t += dt) acc += (Math.exp(-t / tau) / tau) * gaussianDensity(1, c, s, x + t) * (t === 0 ? 0.5 : 1);
      return acc * dt;
    };
    for (const x of [30, 42, 48, 50, 53, 60]) expect(exponentialTailDensity(c, s, tau, x)).toBeCloseTo(conv(x), 6);
    // Far above the centroid the closed form uses erfcx and must not overflow.
    expect(Number.isFinite(exponentialTailDensity(c, s, 0.05, c + 200))).toBe(true);
  });

  it('bins a Gaussian without losing the far upper tail (Q used above the centroid)', () => {
    // Content of [c + 9σ, c + 10σ] = Q(9) − Q(10); Q(9) = 1.128588e-19, Q(10) = 7.619853e-24 (A&S Table 26.1 tail values, from memory).
    const v = gaussianBinContent(1, 0, 1, 9, 10);
    expect(v / (1.128588e-19 - 7.619853e-24)).toBeCloseTo(1, 5);
  });

  it('puts a step of height H on the low side and nothing above (Phillips & Marlow 1976 erfc step)', () => {
    const spec: SpectrumModelSpec = {
      firstChannel: 0,
      channelCount: 201,
      parameters: [{ name: 'A', start: 0 }, { name: 'c', start: 100 }, { name: 's', start: 3 }, { name: 'H', start: 7 }],
      peaks: [{ label: 'p', area: 0, centroid: parameterTie(1), sigma: parameterTie(2), step: parameterTie(3) }],
    };
    const mu = new Float64Array(201);
    spectrumModel(spec).evaluate(Float64Array.from([0, 100, 3, 7]), mu, new Float64Array(201 * 4));
    expect(mu[0]).toBeCloseTo(7, 12);
    expect(mu[200]).toBeCloseTo(0, 12);
    expect(mu[100]).toBeCloseTo(3.5, 12); // Q(0) = ½ at the centroid, by symmetry
    // Q(z) − 1[z < 0] is odd in z, so the channels c ± 50 hold H·50.5 counts (channel 100 holds half of H).
    let sum = 0;
    for (let i = 50; i <= 150; i++) sum += mu[i]!;
    expect(sum).toBeCloseTo(7 * 50.5, 9);
  });
});

describe('erfcx', () => {
  it('matches e^{x²}erfc(x) at x = 0 and 1 (erf(1) = 0.8427007929, A&S Table 7.1) and the asymptotic series A&S 7.1.23 at x = 30', () => {
    expect(erfcx(0)).toBe(1);
    expect(erfcx(1)).toBeCloseTo(Math.E * 0.157299207, 9);
    const x = 30;
    const asym = (1 / (x * Math.sqrt(Math.PI))) * (1 - 1 / (2 * x * x) + 3 / (4 * x ** 4) - 15 / (8 * x ** 6) + 105 / (16 * x ** 8));
    // Next term 945/(32x¹⁰) ≈ 5e-14 bounds the truncation.
    expect(Math.abs(erfcx(x) / asym - 1)).toBeLessThan(2e-13);
    // Continuity where the continued fraction takes over (x = 2).
    expect(Math.abs(erfcx(2 - 1e-9) / erfcx(2) - 1)).toBeLessThan(1e-8);
  });
});
