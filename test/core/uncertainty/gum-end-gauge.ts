/** The GUM H.1 end-gauge model and inputs, shared by the first-order and Monte Carlo tests (test code, not product code). */
import { add, div, mul, sub, type Dual } from '../../../pipeline/core/uncertainty/dual.js';

/**
 * JCGM 100:2008 (GUM) Annex H.1, end-gauge calibration, in mm (inputs and results of Table H.1, from memory):
 *   l = [l_s(1 + α_s θ_s) + d] / (1 + α θ),  θ_s = θ − δθ,  α = α_s + δα.
 */
export function endGaugeLengthMm(x: readonly Dual[]): Dual {
  const [ls, d, alphaS, theta, dAlpha, dTheta] = x as [Dual, Dual, Dual, Dual, Dual, Dual];
  const thetaS = sub(theta, dTheta);
  const alpha = add(alphaS, dAlpha);
  return div(add(mul(ls, add(1, mul(alphaS, thetaS))), d), add(1, mul(alpha, theta)));
}

export const END_GAUGE_INPUTS = [
  { name: 'l_s', value: 50.000623, standardUncertainty: 25e-6 }, // mm; u = 25 nm (H.1.3.1)
  { name: 'd', value: 215e-6, standardUncertainty: 9.7e-6 }, // mm; u = √(5.8² + 3.9² + 6.7²) nm (H.1.3.2)
  { name: 'alpha_s', value: 11.5e-6, standardUncertainty: 1.2e-6 }, // 1/°C; rectangular ±2e-6 (H.1.3.3)
  { name: 'theta', value: -0.1, standardUncertainty: 0.41 }, // °C; deviation from 20 °C (H.1.3.4)
  { name: 'delta_alpha', value: 0, standardUncertainty: 1e-6 / Math.sqrt(3) }, // 1/°C; rectangular ±1e-6 (H.1.3.5)
  { name: 'delta_theta', value: 0, standardUncertainty: 0.05 / Math.sqrt(3) }, // °C; rectangular ±0.05 (H.1.3.6)
];
