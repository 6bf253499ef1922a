// Effective variance: J. Orear, "Least squares when both variables have uncertainties", Am. J. Phys. 50, 912-916 (1982).
import type { EnergyCalibration } from '../calibration/energy-calibration.js';
import { choleskyFactor, choleskyInverse, choleskySolve } from '../fitting/cholesky.js';

/**
 * Weighted least-squares calibration E(ch) = a + b·ch (+ c·ch²) (keV; ch the channel whose centre
 * has energy E, as in energy-calibration.ts) from points with uncertainties in both channel and
 * energy. Orear's effective variance
 *   σ_i² = u(E_i)² + (dE/dch|_i)²·u(ch_i)²,   dE/dch = b + 2c·ch,
 * is iterated with the current coefficients until they change by < 1e-12 relative (at most 50 passes).
 * Covariance of (a, b, c): (XᵀWX)⁻¹ with W = diag(1/σ_i²), not rescaled by χ²/ν (reported apart
 * so a poor calibration shows rather than inflating silently). Residuals E_i − E(ch_i), keV, and
 * normalized residuals (E_i − E(ch_i))/σ_i.
 */
export interface CalibrationPoint {
  label?: string;
  channel: number;
  channelUnc: number;
  energyKeV: number;
  energyUncKeV: number;
}

export interface CalibrationFit {
  degree: 1 | 2;
  offsetKeV: number;
  gainKeVPerChannel: number;
  quadraticKeVPerChannel2: number;
  /** Order [offset, gain(, quadratic)]. */
  covariance: number[][];
  chiSquare: number;
  dof: number;
  residualsKeV: number[];
  normalizedResiduals: number[];
  iterations: number;
}

export function fitCalibration(points: readonly CalibrationPoint[], degree: 1 | 2 = 1): CalibrationFit {
  const k = degree + 1;
  if (points.length < k) throw new RangeError(`a degree-${degree} calibration needs at least ${k} points, got ${points.length}`);
  for (const p of points) {
    if (!(p.energyUncKeV >= 0 && p.channelUnc >= 0) || !(p.energyUncKeV > 0 || p.channelUnc > 0)) {
      throw new RangeError(`calibration point ${p.label ?? p.channel} needs a positive uncertainty in channel or energy`);
    }
  }
  let coef = new Float64Array(3);
  const a = new Float64Array(k * k);
  const rhs = new Float64Array(k);
  const sigma2 = new Float64Array(points.length);
  let iterations = 0;
  // First pass: slope from the extreme points (for the effective variance only).
  const lo = points.reduce((m, p) => (p.channel < m.channel ? p : m));
  const hi = points.reduce((m, p) => (p.channel > m.channel ? p : m));
  coef[1] = hi.channel > lo.channel ? (hi.energyKeV - lo.energyKeV) / (hi.channel - lo.channel) : 0;
  for (iterations = 1; iterations <= 50; iterations++) {
    a.fill(0);
    rhs.fill(0);
    points.forEach((p, i) => {
      const slope = coef[1]! + 2 * coef[2]! * p.channel;
      sigma2[i] = p.energyUncKeV ** 2 + slope * slope * p.channelUnc ** 2;
      const x = [1, p.channel, p.channel * p.channel];
      for (let r = 0; r < k; r++) {
        rhs[r] += (x[r]! * p.energyKeV) / sigma2[i]!;
        for (let c = 0; c < k; c++) a[r * k + c] += (x[r]! * x[c]!) / sigma2[i]!;
      }
    });
    if (!choleskyFactor(a, k)) throw new RangeError('calibration points do not determine the coefficients (channels coincide)');
    choleskySolve(a, k, rhs);
    const next = new Float64Array(3);
    next.set(rhs);
    const change = Math.max(...[0, 1, 2].map((j) => Math.abs(next[j]! - coef[j]!) / Math.max(Math.abs(next[j]!), 1e-300)));
    coef = next;
    if (change < 1e-12) break;
  }
  const inv = new Float64Array(k * k);
  choleskyInverse(a, k, inv, new Float64Array(k));
  const covariance = Array.from({ length: k }, (_, r) => Array.from({ length: k }, (_, c) => inv[r * k + c]!));
  const residualsKeV = points.map((p) => p.energyKeV - (coef[0]! + p.channel * (coef[1]! + p.channel * coef[2]!)));
  const normalizedResiduals = residualsKeV.map((r, i) => r / Math.sqrt(sigma2[i]!));
  return {
    degree, offsetKeV: coef[0]!, gainKeVPerChannel: coef[1]!, quadraticKeVPerChannel2: coef[2]!, covariance,
    chiSquare: normalizedResiduals.reduce((s, r) => s + r * r, 0), dof: points.length - k, residualsKeV, normalizedResiduals,
    iterations: Math.min(iterations, 50),
  };
}

/** The fit as the EnergyCalibration the calibrate stage uses (covariance order [offset, gain(, quadratic)]). */
export function toEnergyCalibration(fit: CalibrationFit, version: string): EnergyCalibration {
  return {
    version,
    offsetKeV: fit.offsetKeV,
    gainKeVPerChannel: fit.gainKeVPerChannel,
    quadraticKeVPerChannel2: fit.quadraticKeVPerChannel2,
    covariance: fit.covariance.map((row) => [...row]),
  };
}
