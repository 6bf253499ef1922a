import { describe, expect, it } from 'vitest';
import { div, mul, type Dual } from '../../../pipeline/core/uncertainty/dual.js';
import { cos, sin } from '../../../pipeline/core/uncertainty/dual-functions.js';
import { propagateFirstOrder, propagateFirstOrderMulti } from '../../../pipeline/core/uncertainty/propagate-first-order.js';
import { END_GAUGE_INPUTS, endGaugeLengthMm } from './gum-end-gauge.js';

// Table H.2 (from memory): five sets of simultaneous observations of V (V), I (mA), φ (rad).
const obs = [
  [5.007, 4.994, 5.005, 4.99, 4.999],
  [19.663, 19.639, 19.64, 19.685, 19.678],
  [1.0456, 1.0438, 1.0468, 1.0428, 1.0433],
];
const n = 5;
const mean = (a: number[]): number => a.reduce((s, v) => s + v, 0) / n;
// s(q̄, r̄) = Σ (q_k − q̄)(r_k − r̄) / (n(n − 1)), GUM eq. (17); r = s(q̄, r̄)/(s(q̄) s(r̄)), eq. (14).
const cov = (a: number[], b: number[]): number => a.reduce((s, v, k) => s + (v - mean(a)) * (b[k]! - mean(b)), 0) / (n * (n - 1));
const u = obs.map((a) => Math.sqrt(cov(a, a)));
const corr = obs.map((a, i) => obs.map((b, j) => (i === j ? 1 : cov(a, b) / (u[i]! * u[j]!))));
const inputs = [
  { name: 'V', value: mean(obs[0]!), standardUncertainty: u[0]! },
  { name: 'I', value: mean(obs[1]!) / 1000, standardUncertainty: u[1]! / 1000 }, // A
  { name: 'phi', value: mean(obs[2]!), standardUncertainty: u[2]! },
];

describe('propagateFirstOrder', () => {
  it('reproduces GUM (JCGM 100:2008) H.1 end-gauge calibration: l = 50.000838 mm, u_c = 32 nm, contributions of Table H.1', () => {
    const r = propagateFirstOrder(endGaugeLengthMm, END_GAUGE_INPUTS);
    expect(r.value).toBeCloseTo(50.000838, 6);
    // Table H.1 quotes u_c(l) = 32 nm (two digits) from u² = 1002 nm².
    expect(Math.abs(r.standardUncertainty * 1e6 - 32)).toBeLessThan(0.5);
    const nm = Array.from(r.contributions, (c) => Math.abs(c) * 1e6);
    // Table H.1 |c_i| u(x_i): 25, 9.7, 0, 0, 2.9, 16.6 nm (the sensitivities to α_s and θ vanish at δθ = δα = 0).
    const table = [25, 9.7, 0, 0, 2.9, 16.6];
    for (let i = 0; i < 6; i++) expect(Math.abs(nm[i]! - table[i]!)).toBeLessThan(0.06);
    // The sensitivity coefficients of H.1.3 (GUM's linearised forms): c_δα ≈ −l_s θ = 5 mm·°C, c_δθ ≈ −l_s α_s = −575 nm/°C.
    expect(r.sensitivities[4]).toBeCloseTo(5, 3);
    expect(r.sensitivities[5]! * 1e6).toBeCloseTo(-575.0, 1);
    expect(r.names[5]).toBe('delta_theta');
  });

  it('reproduces GUM (JCGM 100:2008) H.2 simultaneous resistance and reactance: values, uncertainties and correlations of Table H.3 (from memory)', () => {
    // Table H.2: s(V̄) = 0.0032 V, s(Ī) = 0.0095 mA, s(φ̄) = 0.00075 rad; r(V,I) = −0.36, r(V,φ) = 0.86, r(I,φ) = −0.65.
    expect(u[0]).toBeCloseTo(0.0032, 4);
    expect(u[1]).toBeCloseTo(0.0095, 4);
    expect(u[2]).toBeCloseTo(0.00075, 5);
    expect(corr[0]![1]).toBeCloseTo(-0.36, 2);
    expect(corr[0]![2]).toBeCloseTo(0.86, 2);
    expect(corr[1]![2]).toBeCloseTo(-0.65, 2);
    const r = propagateFirstOrderMulti(([v, i, phi]) => {
      const z = div(v!, i!);
      return [mul(z, cos(phi!)), mul(z, sin(phi!)), z];
    }, inputs, { correlation: corr });
    // Table H.3 (from memory): R = 127.732(71) Ω, X = 219.847(295) Ω, Z = 254.260(236) Ω;
    // r(R, X) = −0.588, r(R, Z) = −0.485, r(X, Z) = 0.993.
    const expected = [[127.732, 0.071], [219.847, 0.295], [254.26, 0.236]];
    // Tolerance: one unit in the last printed digit (the table's rounding).
    for (let l = 0; l < 3; l++) {
      expect(Math.abs(r.values[l]! - expected[l]![0]!)).toBeLessThan(1e-3);
      expect(Math.abs(Math.sqrt(r.covariance[l]![l]!) - expected[l]![1]!)).toBeLessThan(1e-3);
    }
    const rho = (a: number, b: number): number => r.covariance[a]![b]! / Math.sqrt(r.covariance[a]![a]! * r.covariance[b]![b]!);
    expect(rho(0, 1)).toBeCloseTo(-0.588, 3);
    expect(rho(0, 2)).toBeCloseTo(-0.485, 3);
    expect(rho(1, 2)).toBeCloseTo(0.993, 3);
    expect(r.covariance[0]![1]).toBe(r.covariance[1]![0]);
  });

  it('ignoring the H.2 correlations changes u(R) (the correlations matter, GUM H.2.4)', () => {
    const model = ([v, i, phi]: readonly Dual[]): Dual => mul(div(v!, i!), cos(phi!));
    const independent = propagateFirstOrder(model, inputs);
    const correlated = propagateFirstOrder(model, inputs, { correlation: corr });
    expect(Math.abs(correlated.standardUncertainty - 0.071)).toBeLessThan(1e-3);
    expect(independent.standardUncertainty).toBeGreaterThan(1.5 * correlated.standardUncertainty);
  });

  it('rejects a negative uncertainty, a correlation matrix that is not symmetric or out of range, and no inputs', () => {
    const model = ([a]: readonly Dual[]): Dual => mul(a!, 2);
    expect(() => propagateFirstOrder(model, [{ name: 'a', value: 1, standardUncertainty: -1 }])).toThrow(/standard uncertainty -1/);
    const two = [{ name: 'a', value: 1, standardUncertainty: 1 }, { name: 'b', value: 1, standardUncertainty: 1 }];
    expect(() => propagateFirstOrder(model, two, { correlation: [[1, 0.2], [0.3, 1]] })).toThrow(RangeError);
    expect(() => propagateFirstOrder(model, two, { correlation: [[1, 1.2], [1.2, 1]] })).toThrow(RangeError);
    expect(() => propagateFirstOrder(model, two, { correlation: [[1, 0]] })).toThrow(RangeError);
    expect(() => propagateFirstOrder(model, [])).toThrow(RangeError);
  });
});
