// Forward-mode automatic differentiation: R.E. Wengert, Commun. ACM 7(8), 463-464 (1964) — one formula evaluated on plain numbers or on dual numbers.
import { add, div, dualConstant, mul, sub, type Dual } from '../uncertainty/dual.js';
import { exp } from '../uncertainty/dual-functions.js';

/**
 * The arithmetic a measurement model is written in, so that the same code gives the value
 * (plain numbers, also for every Monte Carlo trial) and its exact first derivatives (duals).
 * `k(c)` lifts a constant into the scalar type. Units: whatever the model's operands carry.
 */
export interface ScalarOps<T> {
  add(a: T, b: T): T;
  sub(a: T, b: T): T;
  mul(a: T, b: T): T;
  div(a: T, b: T): T;
  /** a · c for a constant c. */
  scale(a: T, c: number): T;
  exp(a: T): T;
  k(c: number): T;
}

export const numberOps: ScalarOps<number> = {
  add: (a, b) => a + b,
  sub: (a, b) => a - b,
  mul: (a, b) => a * b,
  div: (a, b) => a / b,
  scale: (a, c) => a * c,
  exp: (a) => Math.exp(a),
  k: (c) => c,
};

/** Dual arithmetic with `slots` tangent slots (constants get a zero tangent). */
export function dualOps(slots: number): ScalarOps<Dual> {
  return {
    add: (a, b) => add(a, b),
    sub: (a, b) => sub(a, b),
    mul: (a, b) => mul(a, b),
    div: (a, b) => div(a, b),
    scale: (a, c) => mul(a, c),
    exp: (a) => exp(a),
    k: (c) => dualConstant(c, slots),
  };
}
