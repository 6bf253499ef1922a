import { energyToChannel, type EnergyCalibration } from '../../core/calibration/energy-calibration.js';
import type { PeakRequest } from '../../core/counting/peak-window.js';
import { fitPeaks } from '../../core/fitting/fit-peaks.js';
import { multipletSpec, type MultipletOptions } from '../../core/fitting/multiplet-spec.js';
import { spectrumModel, type SpectrumModelSpec } from '../../core/fitting/spectrum-model.js';
import { PEAK_VALUES_PER_LINE, type FitOutcome, type FitSettings, type FitTask } from './fit-plan.js';

/** FWHM = 2√(2 ln 2)·σ for a Gaussian (common practice). */
const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/**
 * Fits one group of peaks (a multiplet) in one detector spectrum by Poisson maximum likelihood
 * (pipeline/core/fitting/fit-peaks.ts). Everything the fit starts from comes from the plan: each
 * line's expected energy (kinematics, the series peak planner) through the run's calibration gives
 * its expected channel, the predicted FWHM gives σ₀ and the width ratios; the region reaches
 * `regionFwhm` predicted FWHM beyond the outermost lines. Positions `tied`: c_i = c₀ + (E_i − E₀)/b
 * with b = dE/dch of the run's calibration and c₀ fitted; `tied-gain`: g = 1/b fitted too; `free`:
 * one centroid per line (a line alone is always fitted so).
 * Worker-safe: plain data in and out.
 */
export function fitGroup(counts: ArrayLike<number>, cal: EnergyCalibration, requests: readonly PeakRequest[], task: FitTask, s: FitSettings): FitOutcome {
  const lines = task.requestIndices.map((i) => requests[i]!);
  const n = counts.length;
  const empty = (problem: string, first = 0, count = 0): FitOutcome => ({
    groupKey: task.groupKey, detector: task.detector, requestIndices: task.requestIndices, problem, firstChannel: first, channelCount: count,
    converged: false, stopReason: 'not-run', iterations: 0, quality: new Float64Array(8).fill(Number.NaN), parameterNames: [], parameters: new Float64Array(0),
    atBound: [], peaks: new Float64Array(lines.length * PEAK_VALUES_PER_LINE).fill(Number.NaN), areaCorrelation: new Float64Array(0),
    observed: new Float64Array(0), model: new Float64Array(0), background: new Float64Array(0), residuals: new Float64Array(0), flags: ['fit-not-done'],
  });
  const expected = lines.map((r) => energyToChannel(cal, r.expectedEnergyKeV));
  if (expected.some((c) => !(c >= 0 && c <= n - 1))) return empty('an expected peak lies outside the spectrum');
  const eLo = Math.min(...lines.map((r) => r.expectedEnergyKeV - s.regionFwhm * r.fwhmKeV));
  const eHi = Math.max(...lines.map((r) => r.expectedEnergyKeV + s.regionFwhm * r.fwhmKeV));
  const lo = Math.max(0, Math.ceil(energyToChannel(cal, eLo) - 1e-9));
  const hiRaw = energyToChannel(cal, eHi);
  const hi = Math.min(n - 1, Number.isFinite(hiRaw) ? Math.floor(hiRaw + 1e-9) : n - 1);
  const ref = lines[0]!;
  const gainAt = cal.gainKeVPerChannel + 2 * cal.quadraticKeVPerChannel2 * expected[0]!;
  const sigmaChannels = ref.fwhmKeV / FWHM_PER_SIGMA / gainAt;
  const positions = lines.length === 1 || s.positions === 'free' ? 'free' : s.positions === 'tied' ? 'tied-fixed-gain' : 'tied';
  const options: MultipletOptions = {
    firstChannel: lo,
    channelCount: hi - lo + 1,
    lines: lines.map((r, k) => ({ label: r.key, expectedChannel: expected[k]!, energyKeV: r.expectedEnergyKeV, widthScale: r.fwhmKeV / ref.fwhmKeV })),
    sigmaChannels,
    positions,
    channelsPerKeV: 1 / gainAt,
    widths: s.widths,
    ...(s.tail === 'none' ? {} : { tail: { mode: s.tail, fraction: s.tailFraction, lengthChannels: (s.tailLengthFwhm * ref.fwhmKeV) / gainAt } }),
    step: s.step === 'erfc',
    background: s.background,
  };
  let spec;
  try {
    spec = multipletSpec(counts, options);
  } catch (e) {
    return empty(`the fit model could not be set up: ${(e as Error).message}`, lo, hi - lo + 1);
  }
  const free = spec.parameters.filter((q) => !q.fixed).length;
  if (spec.channelCount < free + 2) return empty(`the fit region (${spec.channelCount} channels) is too short for ${free} parameters`, lo, spec.channelCount);
  const r = fitPeaks(counts, spec, { method: 'poisson', flagProbability: s.flagProbability });
  // At high counts the deviance's rounding error can exceed the optimiser's decrement threshold, so it
  // stops (no-decrease, iteration-limit) at an optimum it cannot certify; with an acceptable deviance and
  // finite uncertainties the fit is taken as converged (stop_reason in fits.arrow keeps what happened).
  const converged = r.converged || (r.stopReason !== 'invalid-start' && r.devianceUpperTailP >= s.flagProbability && r.peaks.every((p) => Number.isFinite(p.areaUnc)));
  const flags = new Set<string>();
  for (const d of r.diagnostics) {
    if (d.rule === 'fit-not-converged' && converged) continue;
    if (d.rule === 'fit-parameter-at-bound') {
      if (r.parameters.some((q) => q.atBound && q.name.startsWith('area '))) flags.add('fit-area-at-bound');
      else flags.add('fit-parameter-at-bound');
    } else flags.add(d.rule);
  }
  const peaks = new Float64Array(lines.length * PEAK_VALUES_PER_LINE);
  r.peaks.forEach((p, k) => peaks.set([p.area, p.areaUnc, p.centroidChannel, p.centroidUncChannel, p.sigmaChannel, p.sigmaUncChannel], k * PEAK_VALUES_PER_LINE));
  const parameters = new Float64Array(r.parameters.length * 2);
  r.parameters.forEach((q, j) => parameters.set([q.value, q.unc], 2 * j));
  const observed = new Float64Array(spec.channelCount);
  for (let i = 0; i < spec.channelCount; i++) observed[i] = counts[lo + i]!;
  return {
    groupKey: task.groupKey, detector: task.detector, requestIndices: task.requestIndices, problem: '', firstChannel: lo, channelCount: spec.channelCount,
    converged, stopReason: r.stopReason, iterations: r.iterations,
    quality: Float64Array.from([r.deviance, r.dof, r.deviancePerDof, r.devianceUpperTailP, r.runs.runs, r.runs.expectedRuns, r.runs.z, r.runs.pTooFew]),
    parameterNames: r.parameters.map((q) => q.name), parameters, atBound: r.parameters.map((q) => q.atBound), peaks,
    areaCorrelation: Float64Array.from(r.areaCorrelation.flat()), observed, model: Float64Array.from(r.model), background: backgroundOf(spec, parameters), residuals: Float64Array.from(r.residuals),
    flags: [...flags].sort(),
  };
}

/**
 * The background under the fitted peaks per channel of the region: the spectrum model at the fitted
 * parameters with every peak area set to zero (the polynomial and, with a step, the erfc step; a
 * tail scales with its area and goes too).
 */
function backgroundOf(spec: SpectrumModelSpec, valuesAndUnc: Float64Array): Float64Array {
  const p = spec.parameters.length;
  const params = new Float64Array(p);
  for (let j = 0; j < p; j++) params[j] = valuesAndUnc[2 * j]!;
  for (const peak of spec.peaks) params[peak.area] = 0;
  const mu = new Float64Array(spec.channelCount);
  spectrumModel(spec).evaluate(params, mu, new Float64Array(spec.channelCount * p));
  return mu;
}
