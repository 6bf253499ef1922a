import { describe, expect, it } from 'vitest';
import { firstOrderEstimate, flattenModel, valueAtEstimates, type MeasurementModel } from '../../../pipeline/core/normalization/measurement-model.js';
import { rutherfordTerm } from '../../../pipeline/core/normalization/rutherford-term.js';
import { dualOps, numberOps, type ScalarOps } from '../../../pipeline/core/normalization/scalar-ops.js';
import { modelInput } from '../../../pipeline/core/normalization/shared-inputs.js';
import { dualVariables } from '../../../pipeline/core/uncertainty/dual.js';
import { propagateMonteCarlo } from '../../../pipeline/core/uncertainty/propagate-monte-carlo.js';

const product = (a: ReturnType<typeof modelInput>, b: ReturnType<typeof modelInput>): MeasurementModel => ({
  inputs: [a, b],
  parts: [],
  evaluate: <T>(x: readonly T[], _p: readonly T[], ops: ScalarOps<T>) => ops.mul(x[0]!, x[1]!),
});

describe('measurement models: one formula for the value, the first-order budget and Monte Carlo', () => {
  it('Y = X1·X2: first order gives u² = μ2²σ1² + μ1²σ2² (JCGM 100:2008 §5.1.2 eq. 10); Monte Carlo finds the exact variance with the σ1²σ2² term (L.A. Goodman, J. Am. Stat. Assoc. 55, 708 (1960), independent factors)', () => {
    const m = product(modelInput('counting', 'uncorrelated', '', 10, 5), modelInput('live_time', 'run', 'r1/d1', 4, 2));
    const fo = firstOrderEstimate(m);
    const foVar = fo.components.reduce((s, c) => s + c.value ** 2, 0);
    expect(fo.value).toBe(40);
    expect(foVar).toBeCloseTo(4 * 4 * 25 + 100 * 4, 10); // 800
    const exactVar = 800 + 25 * 4; // + σ1²σ2² = 900
    const flat = flattenModel(m);
    const mc = propagateMonteCarlo(flat.evaluate, flat.distributions, { trials: 200_000, seed: 11 });
    // The sd of a variance estimate from M normal draws is var·√(2/M); a product has heavier tails: allow 10 of those (28.5, against a 100 gap).
    const tol = 10 * exactVar * Math.sqrt(2 / 200_000);
    expect(Math.abs(mc.standardUncertainty ** 2 - exactVar)).toBeLessThan(tol);
    expect(Math.abs(mc.standardUncertainty ** 2 - foVar)).toBeGreaterThan(tol);
  });

  it('a shared input reached along two paths adds its terms (chain rule), and cancels when y does not depend on it — common practice (JCGM 100:2008 §5.1.3)', () => {
    const g = modelInput('charge', 'series', 's', 1, 0.02);
    const part: MeasurementModel = { inputs: [g, modelInput('reference_counting', 'run', 'r1/d1', 400, 20)], parts: [], evaluate: <T>(x: readonly T[], _p: readonly T[], ops: ScalarOps<T>) => ops.div(x[1]!, x[0]!) };
    const outer: MeasurementModel = { inputs: [g], parts: [part], evaluate: <T>(x: readonly T[], p: readonly T[], ops: ScalarOps<T>) => ops.mul(x[0]!, p[0]!) };
    const e = firstOrderEstimate(outer);
    expect(e.value).toBe(400);
    expect(e.components.map((c) => c.name)).toEqual(['reference_counting']);
    expect(e.components[0]!.value).toBeCloseTo(20, 12);
    const doubled: MeasurementModel = { inputs: [g], parts: [part], evaluate: <T>(x: readonly T[], p: readonly T[], ops: ScalarOps<T>) => ops.mul(ops.mul(x[0]!, x[0]!), p[0]!) };
    const d = firstOrderEstimate(doubled);
    // y = g·Y: ∂y/∂g = Y = 400, u = 0.02 → 8 (2 paths: +16 direct, −8 through the part).
    expect(d.components.find((c) => c.name === 'charge')!.value).toBeCloseTo(8, 10);
  });

  it('one shared quantity with two different estimates is refused', () => {
    const a: MeasurementModel = { inputs: [modelInput('charge', 'series', 's', 1, 0.02)], parts: [], evaluate: <T>(x: readonly T[]) => x[0]! };
    const b: MeasurementModel = { inputs: [modelInput('charge', 'series', 's', 1, 0.03)], parts: [a], evaluate: <T>(x: readonly T[], p: readonly T[], ops: ScalarOps<T>) => ops.mul(x[0]!, p[0]!) };
    expect(() => firstOrderEstimate(b)).toThrow(/two estimates/);
  });

  it('flattenModel draws a shared input once for all its paths: y = g/g is exactly 1 in every trial (common practice)', () => {
    const g = modelInput('charge', 'series', 's', 1, 0.1);
    const part: MeasurementModel = { inputs: [g], parts: [], evaluate: <T>(x: readonly T[]) => x[0]! };
    const outer: MeasurementModel = { inputs: [g, modelInput('counting', 'uncorrelated', '', 100, 10, 'poisson')], parts: [part], evaluate: <T>(x: readonly T[], p: readonly T[], ops: ScalarOps<T>) => ops.mul(ops.div(x[0]!, p[0]!), x[1]!) };
    const flat = flattenModel(outer);
    expect(flat.inputs.map((i) => i.name)).toEqual(['charge', 'counting']);
    expect(flat.distributions[1]).toEqual({ kind: 'poisson', mean: 100 });
    const mc = propagateMonteCarlo(flat.evaluate, flat.distributions, { trials: 50_000, seed: 3 });
    // Poisson(100): sd 10; the sd of the sample sd ≈ 10/√(2M) = 0.032.
    expect(Math.abs(mc.standardUncertainty - 10)).toBeLessThan(0.2);
    expect(valueAtEstimates(outer)).toBe(100);
  });

  it('rutherfordTerm: value σ at δ = 0, ∂lnσ/∂E and ∂lnσ/∂θ as given, ∂lnσ/∂δs = −(1 − F)/F (definition of the linearized model)', () => {
    const r = { sigmaMbPerSr: 250, screeningFactor: 0.96, dLnSigmaDEnergyPerKeV: -0.001, dLnSigmaDThetaPerDeg: 0.02 };
    expect(rutherfordTerm(numberOps, r, 0, 0, 0)).toBe(250);
    const [dE, dT, dS] = dualVariables([0, 0, 0]);
    const y = rutherfordTerm(dualOps(3), r, dE!, dT!, dS!);
    expect(y.tangent[0]! / y.value).toBeCloseTo(-0.001, 15);
    expect(y.tangent[1]! / y.value).toBeCloseTo(0.02, 15);
    expect(y.tangent[2]! / y.value).toBeCloseTo(-0.04 / 0.96, 15);
  });
});
