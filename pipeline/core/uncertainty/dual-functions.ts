// Elementary functions for forward-mode differentiation (R.E. Wengert, Commun. ACM 7(8), 463-464 (1964)); the derivative rules are common practice.
import { add, chain, Dual, div, mul, type DualLike, dualConstant } from './dual.js';

/**
 * Elementary functions of a dual number: f(x) with tangent f'(x)·x'. Arguments are
 * dimensionless except where the function allows units (sqrt, square, powNumber, abs).
 *
 *   sqrt' = 1/(2√x)    exp' = eˣ      log' = 1/x      sin' = cos      cos' = −sin
 *   tan'  = 1 + tan²   atan' = 1/(1 + x²)    (xⁿ)' = n xⁿ⁻¹    (aᵇ)' = aᵇ (b' ln a + b a'/a)
 */
export function sqrt(x: Dual): Dual {
  const s = Math.sqrt(x.value);
  return chain(x, s, 0.5 / s);
}

export function square(x: Dual): Dual {
  return chain(x, x.value * x.value, 2 * x.value);
}

export function exp(x: Dual): Dual {
  const e = Math.exp(x.value);
  return chain(x, e, e);
}

export function log(x: Dual): Dual {
  return chain(x, Math.log(x.value), 1 / x.value);
}

export function sin(x: Dual): Dual {
  return chain(x, Math.sin(x.value), Math.cos(x.value));
}

export function cos(x: Dual): Dual {
  return chain(x, Math.cos(x.value), -Math.sin(x.value));
}

export function tan(x: Dual): Dual {
  const t = Math.tan(x.value);
  return chain(x, t, 1 + t * t);
}

export function atan(x: Dual): Dual {
  return chain(x, Math.atan(x.value), 1 / (1 + x.value * x.value));
}

/** |x|, with derivative sign(x) (0 at x = 0). */
export function abs(x: Dual): Dual {
  return chain(x, Math.abs(x.value), Math.sign(x.value));
}

/** xⁿ for a constant exponent n. */
export function powNumber(x: Dual, n: number): Dual {
  if (n === 0) return dualConstant(1, x.slots);
  return chain(x, x.value ** n, n * x.value ** (n - 1));
}

/** aᵇ with both operands possibly dual; a > 0 where b carries a derivative. */
export function pow(a: DualLike, b: DualLike): Dual {
  if (typeof b === 'number') {
    if (!(a instanceof Dual)) throw new TypeError('a dual operation needs at least one Dual operand');
    return powNumber(a, b);
  }
  const av = typeof a === 'number' ? a : a.value;
  const y = av ** b.value;
  const t = new Float64Array(b.slots);
  const lnA = Math.log(av);
  for (let k = 0; k < t.length; k++) t[k] = y * lnA * b.tangent[k]!;
  if (a instanceof Dual) {
    const s = b.value * av ** (b.value - 1);
    for (let k = 0; k < t.length; k++) t[k] += s * a.tangent[k]!;
  }
  return new Dual(y, t);
}

/** √(a² + b²), the form of a magnitude from two components. */
export function hypot(a: Dual, b: Dual): Dual {
  const h = Math.hypot(a.value, b.value);
  return div(add(mul(a, a.value), mul(b, b.value)), h);
}
