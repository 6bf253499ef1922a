import { describe, expect, it } from 'vitest';
import { normalCdf } from '../../../pipeline/core/math/normal-cdf.js';
import { dualConstant, div, mul, add, type Dual } from '../../../pipeline/core/uncertainty/dual.js';
import { propagateFirstOrder } from '../../../pipeline/core/uncertainty/propagate-first-order.js';
import { monteCarloValues, propagateMonteCarlo } from '../../../pipeline/core/uncertainty/propagate-monte-carlo.js';
import type { InputDistribution } from '../../../pipeline/core/uncertainty/input-distribution.js';
import { END_GAUGE_INPUTS, endGaugeLengthMm } from './gum-end-gauge.js';

const sum = (x: Float64Array): number => x.reduce((s, v) => s + v, 0);

/** Root of an increasing function on [lo, hi] by bisection (test helper). */
function solve(f: (x: number) => number, target: number, lo: number, hi: number): number {
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    if (f(mid) < target) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

describe('propagateMonteCarlo on JCGM 101:2008 §9.2 (additive model Y = X1 + X2 + X3 + X4)', () => {
  it('§9.2.2, normal inputs N(0, 1): u(y) = 2, 95 % interval ±3.92 (exact: ±1.959964·2)', () => {
    const normal: InputDistribution = { kind: 'normal', mean: 0, standardDeviation: 1 };
    const r = propagateMonteCarlo(sum, [normal, normal, normal, normal], { trials: 1_000_000, seed: 9202 });
    // M = 10⁶: standard error of u ≈ 2/√(2M) = 0.0014, of an endpoint ≈ 0.005; tolerances are ~4 of those.
    expect(Math.abs(r.mean)).toBeLessThan(0.01);
    expect(Math.abs(r.standardUncertainty - 2)).toBeLessThan(0.006);
    expect(Math.abs(r.symmetricInterval[0] + 3.92)).toBeLessThan(0.02);
    expect(Math.abs(r.symmetricInterval[1] - 3.92)).toBeLessThan(0.02);
    expect(Math.abs(r.shortestInterval[1] - r.shortestInterval[0] - 7.84)).toBeLessThan(0.03);
  });

  it('§9.2.3, rectangular inputs with u = 1: u(y) = 2 but the interval is ±3.88 (from memory), narrower than GUF ±3.92; exact from the Irwin–Hall distribution', () => {
    const a = Math.sqrt(3);
    const rect: InputDistribution = { kind: 'rectangular', lower: -a, upper: a };
    const r = propagateMonteCarlo(sum, [rect, rect, rect, rect], { trials: 1_000_000, seed: 9203 });
    // Irwin–Hall: S = Σ of 4 U(0,1), F(s) = (1/4!) Σ_{k<=s} (−1)^k C(4,k) (s − k)⁴ (J.O. Irwin, Biometrika 19, 225 (1927));
    // Y = 2√3 (S − 2).
    const binom = [1, 4, 6, 4, 1];
    const cdf = (s: number): number => {
      let t = 0;
      for (let k = 0; k <= Math.floor(s); k++) t += (-1) ** k * binom[k]! * (s - k) ** 4;
      return t / 24;
    };
    const exactUpper = 2 * a * (solve(cdf, 0.975, 2, 4) - 2);
    expect(exactUpper).toBeCloseTo(3.88, 2);
    expect(Math.abs(r.standardUncertainty - 2)).toBeLessThan(0.006);
    expect(Math.abs(r.symmetricInterval[1] - exactUpper)).toBeLessThan(0.02);
    expect(Math.abs(r.symmetricInterval[0] + exactUpper)).toBeLessThan(0.02);
    expect(r.symmetricInterval[1]).toBeLessThan(3.9);
  });

  it('one dominant rectangular input (analytic: normal ⊗ rectangular): the MC interval is narrower than the GUF ±1.96 u', () => {
    // Y = X1 + X2, X1 ~ N(0, 1), X2 ~ R(−3√3, 3√3) (u = 3). P(Y <= y) = (1/2a)∫_{y−a}^{y+a} Φ(t) dt
    // = [G(y + a) − G(y − a)]/(2a), G(x) = xΦ(x) + φ(x) (common practice).
    const a = 3 * Math.sqrt(3);
    const g = (x: number): number => x * normalCdf(x) + Math.exp(-x * x / 2) / Math.sqrt(2 * Math.PI);
    const cdf = (y: number): number => (g(y + a) - g(y - a)) / (2 * a);
    const exactUpper = solve(cdf, 0.975, 0, 20);
    const r = propagateMonteCarlo(sum, [{ kind: 'normal', mean: 0, standardDeviation: 1 }, { kind: 'rectangular', lower: -a, upper: a }], { trials: 500_000, seed: 9204 });
    expect(Math.abs(r.standardUncertainty - Math.sqrt(10))).toBeLessThan(0.012);
    expect(Math.abs(r.symmetricInterval[1] - exactUpper)).toBeLessThan(0.03);
    expect(exactUpper).toBeLessThan(1.96 * Math.sqrt(10) - 0.4);
  });
});

describe('JCGM 101:2008 §9.3, mass calibration', () => {
  // δm = (m_R,c + δm_R,c)[1 + (ρ_a − ρ_a0)(1/ρ_W − 1/ρ_R)] − m_nom, in mg; ρ in kg/m³; ρ_a0 = 1.2, m_nom = 100 g.
  const massModel = (x: Float64Array): number => (x[0]! + x[1]!) * (1 + (x[2]! - 1.2) * (1 / x[3]! - 1 / x[4]!)) - 100_000;
  const inputs: InputDistribution[] = [
    { kind: 'normal', mean: 100_000, standardDeviation: 0.05 },
    { kind: 'normal', mean: 1.234, standardDeviation: 0.02 },
    { kind: 'rectangular', lower: 1.1, upper: 1.3 },
    { kind: 'rectangular', lower: 7000, upper: 9000 },
    { kind: 'rectangular', lower: 7950, upper: 8050 },
  ];

  it('first order gives δm = 1.2340 mg, u = 0.0539 mg (Table 10, GUF; from memory): the ρ_a term has zero sensitivity', () => {
    const r = propagateFirstOrder((x: readonly Dual[]) => {
      const [m, dm, rhoA, rhoW, rhoR] = x as [Dual, Dual, Dual, Dual, Dual];
      const buoyancy = mul(add(rhoA, -1.2), add(div(1, rhoW), mul(div(1, rhoR), -1)));
      return add(mul(add(m, dm), add(1, buoyancy)), -100_000);
    }, [
      { name: 'm_Rc', value: 100_000, standardUncertainty: 0.05 },
      { name: 'dm_Rc', value: 1.234, standardUncertainty: 0.02 },
      { name: 'rho_a', value: 1.2, standardUncertainty: 0.2 / Math.sqrt(12) },
      { name: 'rho_W', value: 8000, standardUncertainty: 2000 / Math.sqrt(12) },
      { name: 'rho_R', value: 8000, standardUncertainty: 100 / Math.sqrt(12) },
    ]);
    expect(r.value).toBeCloseTo(1.234, 6);
    expect(r.standardUncertainty).toBeCloseTo(0.0539, 4);
    expect(r.sensitivities[2]).toBe(0);
  });

  it('Monte Carlo with M = 10⁶ gives u = 0.0754 mg and a 95 % interval 0.2991 mg wide (Table 10, MCM, [1.0834, 1.3825] mg; from memory), centred on 1.2340 mg', () => {
    const r = propagateMonteCarlo(massModel, inputs, { trials: 1_000_000, seed: 93 });
    // Standard errors at M = 10⁶: mean ≈ 8e-5 mg, u ≈ 6e-5 mg, endpoints ≈ 2e-4 mg; tolerances ≈ 4 of those plus the table's rounding.
    // The remembered endpoints are not centred on the estimate, which the model forbids: δm is exactly symmetric about
    // 1.234 mg (a symmetric zero-mean factor (ρ_a − ρ_a0) times independent terms), so the check is the width and that centre.
    expect(Math.abs(r.mean - 1.234)).toBeLessThan(3e-4);
    expect(Math.abs(r.standardUncertainty - 0.0754)).toBeLessThan(4e-4);
    expect(Math.abs(r.shortestInterval[1] - r.shortestInterval[0] - (1.3825 - 1.0834))).toBeLessThan(1e-3);
    expect(Math.abs((r.shortestInterval[0] + r.shortestInterval[1]) / 2 - 1.234)).toBeLessThan(6e-4);
    // Nonlinearity made visible: MC u is 40 % larger than the first-order 0.0539 mg.
    expect(r.standardUncertainty / 0.0539).toBeGreaterThan(1.35);
  });
});

describe('JCGM 101:2008 §9.4, comparison loss Y = X1² + X2² (strongly nonlinear near x = 0)', () => {
  const u = 0.005;
  const model = (x: Float64Array): number => x[0]! * x[0]! + x[1]! * x[1]!;

  it('x1 = x2 = 0: first order gives u(y) = 0; MC gives the exact exponential law y/u² ~ χ²₂: mean = sd = 2u², shortest interval [0, 2u² ln 20]', () => {
    const fo = propagateFirstOrder(([a, b]) => add(mul(a!, a!), mul(b!, b!)), [
      { name: 'x1', value: 0, standardUncertainty: u },
      { name: 'x2', value: 0, standardUncertainty: u },
    ]);
    expect(fo.value).toBe(0);
    expect(fo.standardUncertainty).toBe(0);
    const r = propagateMonteCarlo(model, [{ kind: 'normal', mean: 0, standardDeviation: u }, { kind: 'normal', mean: 0, standardDeviation: u }], { trials: 400_000, seed: 94 });
    const u2 = u * u;
    expect(Math.abs(r.mean / (2 * u2) - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.standardUncertainty / (2 * u2) - 1)).toBeLessThan(0.015);
    expect(r.shortestInterval[0]).toBeLessThan(1e-3 * u2);
    expect(Math.abs(r.shortestInterval[1] / (2 * u2 * Math.log(20)) - 1)).toBeLessThan(0.015);
    // Probabilistically symmetric: [−2u² ln 0.975, −2u² ln 0.025], longer than the shortest.
    expect(Math.abs(r.symmetricInterval[0] / (-2 * u2 * Math.log(0.975)) - 1)).toBeLessThan(0.05);
    expect(Math.abs(r.symmetricInterval[1] / (-2 * u2 * Math.log(0.025)) - 1)).toBeLessThan(0.015);
  });

  it('x1 = 0.010: first order u = 2 x1 u = 1.0e-4 vs exact (noncentral χ²) E[Y] = x1² + 2u², u(Y) = √(4x1²u² + 4u⁴) = 1.118e-4', () => {
    const x1 = 0.01;
    const fo = propagateFirstOrder(([a, b]) => add(mul(a!, a!), mul(b!, b!)), [
      { name: 'x1', value: x1, standardUncertainty: u },
      { name: 'x2', value: 0, standardUncertainty: u },
    ]);
    expect(fo.standardUncertainty).toBeCloseTo(1e-4, 12);
    const r = propagateMonteCarlo(model, [{ kind: 'normal', mean: x1, standardDeviation: u }, { kind: 'normal', mean: 0, standardDeviation: u }], { trials: 400_000, seed: 941 });
    expect(Math.abs(r.mean / (x1 * x1 + 2 * u * u) - 1)).toBeLessThan(0.005);
    const exact = Math.sqrt(4 * x1 * x1 * u * u + 4 * u ** 4);
    expect(Math.abs(r.standardUncertainty / exact - 1)).toBeLessThan(0.01);
    expect(r.standardUncertainty / fo.standardUncertainty).toBeGreaterThan(1.1);
  });
});

describe('first order against Monte Carlo', () => {
  const ratio = (x: Float64Array): number => x[0]! / x[1]!;

  it('agree within the MC uncertainty for a ratio with 1 % relative uncertainties (analytic case)', () => {
    const fo = propagateFirstOrder(([a, b]) => div(a!, b!), [
      { name: 'a', value: 100, standardUncertainty: 1 },
      { name: 'b', value: 50, standardUncertainty: 0.5 },
    ]);
    expect(fo.standardUncertainty).toBeCloseTo(2 * Math.SQRT2 * 0.01, 12);
    const trials = 200_000;
    const r = propagateMonteCarlo(ratio, [{ kind: 'normal', mean: 100, standardDeviation: 1 }, { kind: 'normal', mean: 50, standardDeviation: 0.5 }], { trials, seed: 11 });
    // MC standard error of u: u/√(2M); of the mean: u/√M. Second-order effects are ~1e-4 relative, far below.
    const seU = fo.standardUncertainty / Math.sqrt(2 * trials);
    expect(Math.abs(r.standardUncertainty - fo.standardUncertainty)).toBeLessThan(4 * seU);
    expect(Math.abs(r.mean - fo.value)).toBeLessThan(4 * fo.standardUncertainty / Math.sqrt(trials) + 2 * 1e-4);
  });

  it('differ for a ratio whose denominator is R(20, 80) (35 % relative): exact E[a/b] = 100 ln 4/60, u = 0.9551 vs first-order 0.6931', () => {
    const fo = propagateFirstOrder(([a, b]) => div(a!, b!), [
      { name: 'a', value: 100, standardUncertainty: 1 },
      { name: 'b', value: 50, standardUncertainty: 60 / Math.sqrt(12) },
    ]);
    expect(fo.standardUncertainty).toBeCloseTo(2 * Math.sqrt(1e-4 + 0.12), 10);
    // b ~ R(20, 80): E[1/b] = ln 4/60, E[1/b²] = (1/20 − 1/80)/60 (elementary integrals);
    // Var(a/b) = E[a²] E[1/b²] − E[a]² E[1/b]².
    const e1 = Math.log(4) / 60;
    const e2 = (1 / 20 - 1 / 80) / 60;
    const exactU = Math.sqrt(10001 * e2 - 10000 * e1 * e1);
    const r = propagateMonteCarlo(ratio, [{ kind: 'normal', mean: 100, standardDeviation: 1 }, { kind: 'rectangular', lower: 20, upper: 80 }], { trials: 400_000, seed: 12 });
    expect(Math.abs(r.mean / (100 * e1) - 1)).toBeLessThan(0.003);
    expect(Math.abs(r.standardUncertainty / exactU - 1)).toBeLessThan(0.01);
    expect(r.standardUncertainty / fo.standardUncertainty).toBeGreaterThan(1.3);
    expect(r.mean - fo.value).toBeGreaterThan(0.25);
  });

  it('GUM (JCGM 100:2008) H.1.7: with the second-order terms the end-gauge u_c is 34 nm, not 32 nm; MC of the full model gives it', () => {
    // Distributions as GUM H.1.3 describes them (rectangular for α_s, δα, δθ); l_s, d and θ normal.
    const dist: InputDistribution[] = [
      { kind: 'normal', mean: 50.000623, standardDeviation: 25e-6 },
      { kind: 'normal', mean: 215e-6, standardDeviation: 9.7e-6 },
      { kind: 'rectangular', lower: 9.5e-6, upper: 13.5e-6 },
      { kind: 'normal', mean: -0.1, standardDeviation: 0.41 },
      { kind: 'rectangular', lower: -1e-6, upper: 1e-6 },
      { kind: 'rectangular', lower: -0.05, upper: 0.05 },
    ];
    const asDual = new Array<Dual>(6);
    const model = (x: Float64Array): number => {
      for (let i = 0; i < 6; i++) asDual[i] = dualConstant(x[i]!, 1);
      return endGaugeLengthMm(asDual).value;
    };
    const r = propagateMonteCarlo(model, dist, { trials: 200_000, seed: 17 });
    // Exact variance of the bilinear terms l_s(δα θ + α_s δθ) for independent inputs (E[δα] = E[δθ] = 0):
    // l_s²[u²(δα)(θ² + u²(θ)) + u²(δθ)(α_s² + u²(α_s))]; its second-order part is what GUM H.1.7 adds by eq. (11).
    const [ls, d, as, th, da, dt] = END_GAUGE_INPUTS.map((x) => x.standardUncertainty) as number[];
    const second = 50 ** 2 * (da! ** 2 * (0.01 + th! ** 2) + dt! ** 2 * (11.5e-6 ** 2 + as! ** 2));
    const expectedNm = Math.sqrt(ls! ** 2 + d! ** 2 + second) * 1e6;
    expect(Math.round(expectedNm)).toBe(34);
    expect(Math.abs(r.standardUncertainty * 1e6 - expectedNm)).toBeLessThan(0.3);
    expect(Math.abs(r.mean - 50.000838)).toBeLessThan(1e-6);
  });
});

describe('propagateMonteCarlo contract', () => {
  it('is reproducible for a seed and differs between seeds and stream keys', () => {
    const d: InputDistribution[] = [{ kind: 'triangular', lower: 0, upper: 2 }, { kind: 'arcsine', lower: -1, upper: 1 }, { kind: 'poisson', mean: 30 }];
    const a = monteCarloValues(sum, d, 1000, 5, []);
    expect(monteCarloValues(sum, d, 1000, 5, [])).toEqual(a);
    expect(monteCarloValues(sum, d, 1000, 6, [])).not.toEqual(a);
    expect(monteCarloValues(sum, d, 1000, 5, [1])).not.toEqual(a);
  });

  it('draws triangular, arcsine and Poisson inputs with the JCGM 101 §6.4.5 / §6.4.6 standard deviations (b − a)/√24, (b − a)/√8 and √λ', () => {
    const m = 400_000;
    const tri = propagateMonteCarlo((x) => x[0]!, [{ kind: 'triangular', lower: 0, upper: 2 }], { trials: m, seed: 1 });
    const arc = propagateMonteCarlo((x) => x[0]!, [{ kind: 'arcsine', lower: -1, upper: 1 }], { trials: m, seed: 2 });
    const poi = propagateMonteCarlo((x) => x[0]!, [{ kind: 'poisson', mean: 30 }], { trials: m, seed: 3 });
    expect(Math.abs(tri.standardUncertainty / (2 / Math.sqrt(24)) - 1)).toBeLessThan(0.005);
    expect(Math.abs(arc.standardUncertainty / (2 / Math.sqrt(8)) - 1)).toBeLessThan(0.005);
    expect(Math.abs(poi.standardUncertainty / Math.sqrt(30) - 1)).toBeLessThan(0.005);
    expect(Math.abs(poi.mean - 30)).toBeLessThan(0.05);
  });

  it('rejects too few trials, bad distribution parameters and a non-finite model value', () => {
    const one: InputDistribution[] = [{ kind: 'normal', mean: 0, standardDeviation: 1 }];
    expect(() => propagateMonteCarlo((x) => x[0]!, one, { trials: 1, seed: 1 })).toThrow(RangeError);
    expect(() => propagateMonteCarlo((x) => x[0]!, [{ kind: 'rectangular', lower: 2, upper: 1 }], { trials: 100, seed: 1 })).toThrow(/lower <= upper/);
    expect(() => propagateMonteCarlo((x) => x[0]!, [{ kind: 'normal', mean: 0, standardDeviation: -1 }], { trials: 100, seed: 1 })).toThrow(RangeError);
    expect(() => propagateMonteCarlo((x) => 1 / x[0]!, [{ kind: 'constant', value: 0 }], { trials: 100, seed: 1 })).toThrow(/trial 1/);
    expect(() => propagateMonteCarlo((x) => x[0]!, one, { trials: 10, seed: 1 })).toThrow(/too few/);
  });
});
