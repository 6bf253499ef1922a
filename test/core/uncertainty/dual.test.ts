import { describe, expect, it } from 'vitest';
import { add, chain, div, dualConstant, dualVariable, dualVariables, mul, neg, sub, type Dual } from '../../../pipeline/core/uncertainty/dual.js';
import { abs, atan, cos, exp, hypot, log, pow, powNumber, sin, sqrt, square, tan } from '../../../pipeline/core/uncertainty/dual-functions.js';
import { rutherfordCmMbPerSr } from '../../../pipeline/core/physics/rutherford-cm.js';

/** Relative agreement to `rel` (or absolute `rel` near zero). */
function close(a: number, b: number, rel = 1e-13): void {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.max(1, Math.abs(b)));
}

describe('Dual arithmetic (chain rule, common practice)', () => {
  it('gives exact partials of a + b, a − b, a·b, a/b and −a at (a, b) = (3, −2)', () => {
    const [a, b] = dualVariables([3, -2]) as [Dual, Dual];
    const checks: [Dual, number, number, number][] = [
      [add(a, b), 1, 1, 1],
      [sub(a, b), 5, 1, -1],
      [mul(a, b), -6, -2, 3],
      [div(a, b), -1.5, -0.5, -3 / 4], // ∂(a/b)/∂b = −a/b² = −3/4
      [neg(a), -3, -1, 0],
    ];
    for (const [y, v, da, db] of checks) {
      close(y.value, v);
      close(y.derivative(0), da);
      close(y.derivative(1), db);
    }
  });

  it('accepts a plain number on either side and treats it as a constant', () => {
    const x = dualVariable(4, 0, 1);
    close(div(1, x).value, 0.25);
    close(div(1, x).derivative(0), -1 / 16);
    close(sub(10, x).derivative(0), -1);
    close(mul(x, 3).derivative(0), 3);
    close(add(2, x).value, 6);
    expect(dualConstant(7, 3).tangent).toEqual(new Float64Array(3));
  });

  it('rejects two numbers, mismatched slot counts and out-of-range input indices', () => {
    expect(() => add(1, 2)).toThrow(TypeError);
    expect(() => add(dualVariable(1, 0, 2), dualVariable(1, 0, 3))).toThrow(RangeError);
    expect(() => dualVariable(1, 2, 2)).toThrow(RangeError);
    expect(() => dualVariable(1, 0, 0)).toThrow(RangeError);
    expect(() => dualVariable(1, 0, 2).derivative(5)).toThrow(RangeError);
  });
});

describe('Dual elementary functions against their analytic derivatives (common practice)', () => {
  it('sqrt, square, exp, log, sin, cos, tan, atan, abs, xⁿ at x = 0.7', () => {
    const x0 = 0.7;
    const x = dualVariable(x0, 0, 1);
    const cases: [Dual, number, number][] = [
      [sqrt(x), Math.sqrt(x0), 0.5 / Math.sqrt(x0)],
      [square(x), x0 * x0, 2 * x0],
      [exp(x), Math.exp(x0), Math.exp(x0)],
      [log(x), Math.log(x0), 1 / x0],
      [sin(x), Math.sin(x0), Math.cos(x0)],
      [cos(x), Math.cos(x0), -Math.sin(x0)],
      [tan(x), Math.tan(x0), 1 / Math.cos(x0) ** 2],
      [atan(x), Math.atan(x0), 1 / (1 + x0 * x0)],
      [abs(neg(x)), x0, 1],
      [powNumber(x, -2.5), x0 ** -2.5, -2.5 * x0 ** -3.5],
      [powNumber(x, 0), 1, 0],
    ];
    for (const [y, v, d] of cases) {
      close(y.value, v);
      close(y.derivative(0), d, 1e-12);
    }
  });

  it('pow(a, b) with both dual: ∂/∂a = b a^(b−1), ∂/∂b = a^b ln a; hypot(a, b) = √(a²+b²) with ∂/∂a = a/h', () => {
    const [a, b] = dualVariables([1.8, 2.3]) as [Dual, Dual];
    const y = pow(a, b);
    close(y.value, 1.8 ** 2.3);
    close(y.derivative(0), 2.3 * 1.8 ** 1.3, 1e-12);
    close(y.derivative(1), 1.8 ** 2.3 * Math.log(1.8), 1e-12);
    const z = pow(2, b);
    close(z.derivative(1), 2 ** 2.3 * Math.LN2, 1e-12);
    expect(z.derivative(0)).toBe(0);
    const h = hypot(a, b);
    close(h.value, Math.hypot(1.8, 2.3));
    close(h.derivative(0), 1.8 / Math.hypot(1.8, 2.3), 1e-12);
    close(h.derivative(1), 2.3 / Math.hypot(1.8, 2.3), 1e-12);
  });

  it('chain(x, f, f′) scales every tangent slot', () => {
    const [a, b] = dualVariables([1, 2]) as [Dual, Dual];
    const y = chain(add(a, mul(b, 3)), 0, 2);
    expect(Array.from(y.tangent)).toEqual([2, 6]);
  });
});

describe('Dual derivatives of the Rutherford form Z²/(E² sin⁴(θ/2))', () => {
  // Analytic partials (calculus, common practice): ∂f/∂Z = 2f/Z, ∂f/∂E = −2f/E, ∂f/∂θ = −2 f cot(θ/2).
  function rutherfordLike(z: Dual, eKeV: Dual, thetaRad: Dual): Dual {
    const s = sin(div(thetaRad, 2));
    return div(square(z), mul(square(eKeV), powNumber(s, 4)));
  }

  it('matches the analytic partials to 1e-13 relative at several angles and energies', () => {
    for (const [z0, e0, thetaDeg] of [[79, 2000, 170], [6, 1500, 30], [14, 3050, 90], [92, 500, 5]] as const) {
      const th0 = (thetaDeg * Math.PI) / 180;
      const [z, e, th] = dualVariables([z0, e0, th0]) as [Dual, Dual, Dual];
      const f = rutherfordLike(z, e, th);
      const f0 = z0 ** 2 / (e0 ** 2 * Math.sin(th0 / 2) ** 4);
      close(f.value / f0, 1);
      close(f.derivative(0) / ((2 * f0) / z0), 1);
      close(f.derivative(1) / ((-2 * f0) / e0), 1);
      close(f.derivative(2) / (-2 * f0 / Math.tan(th0 / 2)), 1);
    }
  });

  it('has the angular and energy shape of the project\'s CM Rutherford cross section (Rutherford 1911, Phil. Mag. 21, 669)', () => {
    // σ_R,cm ∝ Z₂²/(E² sin⁴(θ/2)): ratios of the project's formula equal ratios of the dual expression.
    const at = (z2: number, e: number, deg: number): number => rutherfordLike(dualConstant(z2, 1), dualConstant(e, 1), dualConstant((deg * Math.PI) / 180, 1)).value;
    const ratioFormula = rutherfordCmMbPerSr(2, 79, 1500, 60) / rutherfordCmMbPerSr(2, 14, 3000, 150);
    close(ratioFormula / (at(79, 1500, 60) / at(14, 3000, 150)), 1, 1e-12);
  });
});
