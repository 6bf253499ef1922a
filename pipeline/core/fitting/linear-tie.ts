/**
 * A derived model quantity as a linear function of fitted parameters:
 *   q = constant + Σ_k coef_k · p[param_k].
 * It expresses ties: centroid_i = c_ref + g·(E_i − E_ref) (positions fixed by kinematics through
 * a calibration), σ_i = s_i·σ₀ (widths shared or scaled), or a fixed value (no terms).
 * ∂q/∂p[param_k] = coef_k, which is how gradients pass through a tie.
 */
export interface LinearTie {
  constant?: number;
  terms?: readonly TieTerm[];
}

export interface TieTerm {
  param: number;
  coef: number;
}

export function evaluateTie(tie: LinearTie, params: Float64Array): number {
  let q = tie.constant ?? 0;
  const terms = tie.terms;
  if (terms !== undefined) for (let k = 0; k < terms.length; k++) q += terms[k]!.coef * params[terms[k]!.param]!;
  return q;
}

/** A tie on one parameter with coefficient 1 (the parameter itself). */
export function parameterTie(param: number): LinearTie {
  return { terms: [{ param, coef: 1 }] };
}

/** A fixed value, depending on no parameter. */
export function fixedTie(value: number): LinearTie {
  return { constant: value };
}

/** Adds g·∂q/∂p to the Jacobian row `row` (offset into a row-major buffer) for every term of the tie. */
export function addTieGradient(tie: LinearTie, g: number, jacobian: Float64Array, row: number): void {
  const terms = tie.terms;
  if (terms === undefined) return;
  for (let k = 0; k < terms.length; k++) jacobian[row + terms[k]!.param]! += g * terms[k]!.coef;
}
