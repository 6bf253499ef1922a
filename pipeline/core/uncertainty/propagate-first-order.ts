// Law of propagation of uncertainty: JCGM 100:2008 (GUM) §5.1.2 eq. (10) and §5.2.2 eq. (13); output covariance U_y = C U_x Cᵀ as in JCGM 102:2011 §6.2.1.3.
import { dualVariables, type Dual } from './dual.js';

/** One input quantity X_i: its estimate x_i and standard uncertainty u(x_i), both in X_i's unit. */
export interface FirstOrderInput {
  name: string;
  value: number;
  standardUncertainty: number;
}

export interface FirstOrderOptions {
  /** Correlation coefficients r(x_i, x_j) (N × N, symmetric, unit diagonal); independent inputs when absent. */
  correlation?: ArrayLike<ArrayLike<number>>;
}

export interface FirstOrderResult {
  /** y = f(x_1, …, x_N), in the output's unit. */
  value: number;
  /** Combined standard uncertainty u_c(y). */
  standardUncertainty: number;
  /** Sensitivity coefficients c_i = ∂f/∂x_i (exact, by forward-mode differentiation), output unit per input unit. */
  sensitivities: Float64Array;
  /** c_i · u(x_i), signed, in the output's unit (GUM §5.1.3 u_i(y)). */
  contributions: Float64Array;
  names: string[];
}

/**
 * First-order (GUM) propagation through a model written with dual numbers:
 *
 *   u_c²(y) = Σ_i Σ_j c_i c_j u(x_i) u(x_j) r(x_i, x_j),   c_i = ∂f/∂x_i at the estimates.
 *
 * `model` receives the inputs as duals in the order given (input i has tangent slot i).
 */
export function propagateFirstOrder(model: (x: readonly Dual[]) => Dual, inputs: readonly FirstOrderInput[], options: FirstOrderOptions = {}): FirstOrderResult {
  const multi = propagateFirstOrderMulti((x) => [model(x)], inputs, options);
  return {
    value: multi.values[0]!,
    standardUncertainty: Math.sqrt(multi.covariance[0]![0]!),
    sensitivities: multi.sensitivities[0]!,
    contributions: multi.contributions[0]!,
    names: multi.names,
  };
}

export interface FirstOrderMultiResult {
  values: Float64Array;
  /** u(y_l, y_m), M × M. */
  covariance: Float64Array[];
  /** sensitivities[l][i] = ∂y_l/∂x_i. */
  sensitivities: Float64Array[];
  contributions: Float64Array[];
  names: string[];
}

/** The same for a model with several outputs Y_1…Y_M: u(y_l, y_m) = Σ_i Σ_j c_li c_mj u(x_i) u(x_j) r_ij. */
export function propagateFirstOrderMulti(model: (x: readonly Dual[]) => readonly Dual[], inputs: readonly FirstOrderInput[], options: FirstOrderOptions = {}): FirstOrderMultiResult {
  const n = inputs.length;
  if (n === 0) throw new RangeError('first-order propagation needs at least one input');
  const u = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ui = inputs[i]!.standardUncertainty;
    if (!(ui >= 0) || !Number.isFinite(ui)) throw new RangeError(`input "${inputs[i]!.name}" has standard uncertainty ${ui}; expected a finite value >= 0`);
    u[i] = ui;
  }
  const r = options.correlation;
  if (r !== undefined) checkCorrelation(r, n);
  const outputs = model(dualVariables(inputs.map((x) => x.value)));
  const m = outputs.length;
  const sensitivities = outputs.map((y) => {
    if (y.slots !== n) throw new RangeError(`model output has ${y.slots} tangent slots, expected ${n}`);
    return Float64Array.from(y.tangent);
  });
  const contributions = sensitivities.map((c) => c.map((ci, i) => ci * u[i]!));
  const covariance: Float64Array[] = [];
  for (let l = 0; l < m; l++) covariance.push(new Float64Array(m));
  for (let l = 0; l < m; l++) {
    for (let k = l; k < m; k++) {
      const a = contributions[l]!;
      const b = contributions[k]!;
      let s = 0;
      if (r === undefined) for (let i = 0; i < n; i++) s += a[i]! * b[i]!;
      else for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) s += a[i]! * b[j]! * r[i]![j]!;
      covariance[l]![k] = s;
      covariance[k]![l] = s;
    }
  }
  return { values: Float64Array.from(outputs, (y) => y.value), covariance, sensitivities, contributions, names: inputs.map((x) => x.name) };
}

function checkCorrelation(r: ArrayLike<ArrayLike<number>>, n: number): void {
  if (r.length !== n) throw new RangeError(`correlation matrix has ${r.length} rows, expected ${n}`);
  for (let i = 0; i < n; i++) {
    if (r[i]!.length !== n) throw new RangeError(`correlation row ${i} has ${r[i]!.length} entries, expected ${n}`);
    if (r[i]![i] !== 1) throw new RangeError(`correlation r(${i},${i}) = ${r[i]![i]}; the diagonal must be 1`);
    for (let j = 0; j < i; j++) {
      const v = r[i]![j]!;
      if (v !== r[j]![i] || !(v >= -1 && v <= 1)) throw new RangeError(`correlation r(${i},${j}) = ${v}, r(${j},${i}) = ${r[j]![i]}; expected equal values within [-1, 1]`);
    }
  }
}
