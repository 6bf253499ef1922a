/**
 * What the optimiser needs from a model: for a parameter vector p (length P), the expected
 * value μ_i of each of N data points and the Jacobian J_ij = ∂μ_i/∂p_j, written into buffers
 * the caller owns (row-major, J[i·P + j]) so an iteration allocates nothing.
 *
 * Spectrum models (spectrum-model.ts) give μ_i in counts per channel; the NIST StRD problems
 * give y at a point. The optimiser does not care which.
 */
export interface FitModel {
  readonly parameterCount: number;
  readonly pointCount: number;
  evaluate(params: Float64Array, mu: Float64Array, jacobian: Float64Array): void;
}

/**
 * One fitted parameter: its name (for reports), start value, bounds and whether it is held fixed.
 * Bounds are enforced by projection onto the box [lower, upper] (fit-levenberg-marquardt.ts).
 */
export interface FitParameter {
  name: string;
  start: number;
  lower?: number;
  upper?: number;
  fixed?: boolean;
}
