// Forward-mode automatic differentiation: R.E. Wengert, "A simple automatic derivative evaluation program", Commun. ACM 7(8), 463-464 (1964).
/**
 * A value with its exact first partial derivatives with respect to N inputs.
 *
 *   x = (v, ∂v/∂x_1, …, ∂v/∂x_N)
 *
 * Inputs are numbered 0…N−1 (index-based: no maps, one Float64Array per result), so the same
 * formula code evaluates a value and its gradient. Units: `value` in the quantity's unit,
 * `tangent[k]` in that unit per unit of input k.
 *
 * Arithmetic (chain rule):
 *   (a ± b)' = a' ± b',  (a·b)' = a'b + ab',  (a/b)' = (a' − (a/b)·b')/b.
 */
export class Dual {
  constructor(
    readonly value: number,
    readonly tangent: Float64Array,
  ) {}

  /** Number of inputs the tangent has a slot for. */
  get slots(): number {
    return this.tangent.length;
  }

  /** ∂value/∂(input k). */
  derivative(k: number): number {
    if (!(k >= 0 && k < this.tangent.length)) throw new RangeError(`input index ${k} outside 0…${this.tangent.length - 1}`);
    return this.tangent[k]!;
  }
}

/** Input number `index` of `slots` inputs, with value `value`: its tangent is the unit vector e_index. */
export function dualVariable(value: number, index: number, slots: number): Dual {
  if (!Number.isInteger(slots) || slots < 1) throw new RangeError(`slots must be a positive integer, got ${slots}`);
  if (!Number.isInteger(index) || index < 0 || index >= slots) throw new RangeError(`input index ${index} outside 0…${slots - 1}`);
  const t = new Float64Array(slots);
  t[index] = 1;
  return new Dual(value, t);
}

/** The inputs x_0…x_{N−1} as duals, one slot each. */
export function dualVariables(values: ArrayLike<number>): Dual[] {
  const out: Dual[] = [];
  for (let i = 0; i < values.length; i++) out.push(dualVariable(values[i]!, i, values.length));
  return out;
}

/** A constant (zero tangent). */
export function dualConstant(value: number, slots: number): Dual {
  return new Dual(value, new Float64Array(slots));
}

export type DualLike = Dual | number;

function slotsOf(a: DualLike, b: DualLike): number {
  if (a instanceof Dual) {
    if (b instanceof Dual && b.tangent.length !== a.tangent.length) throw new RangeError(`dual sizes differ: ${a.tangent.length} and ${b.tangent.length} slots`);
    return a.tangent.length;
  }
  if (b instanceof Dual) return b.tangent.length;
  throw new TypeError('a dual operation needs at least one Dual operand');
}

const val = (a: DualLike): number => (typeof a === 'number' ? a : a.value);

/** y = f(a) with f'(a) = `slope`: tangent scaled by the slope. */
export function chain(a: Dual, value: number, slope: number): Dual {
  const t = new Float64Array(a.tangent.length);
  const at = a.tangent;
  for (let k = 0; k < t.length; k++) t[k] = slope * at[k]!;
  return new Dual(value, t);
}

/** α·a' + β·b' into a new tangent (a number operand contributes nothing). */
function combine(a: DualLike, alpha: number, b: DualLike, beta: number, value: number): Dual {
  const t = new Float64Array(slotsOf(a, b));
  if (a instanceof Dual) for (let k = 0; k < t.length; k++) t[k] = alpha * a.tangent[k]!;
  if (b instanceof Dual) for (let k = 0; k < t.length; k++) t[k] += beta * b.tangent[k]!;
  return new Dual(value, t);
}

export function add(a: DualLike, b: DualLike): Dual {
  return combine(a, 1, b, 1, val(a) + val(b));
}

export function sub(a: DualLike, b: DualLike): Dual {
  return combine(a, 1, b, -1, val(a) - val(b));
}

export function mul(a: DualLike, b: DualLike): Dual {
  const av = val(a);
  const bv = val(b);
  return combine(a, bv, b, av, av * bv);
}

export function div(a: DualLike, b: DualLike): Dual {
  const bv = val(b);
  const q = val(a) / bv;
  return combine(a, 1 / bv, b, -q / bv, q);
}

export function neg(a: Dual): Dual {
  return chain(a, -a.value, -1);
}
