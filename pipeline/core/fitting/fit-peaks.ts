// Poisson maximum likelihood: S. Baker, R.D. Cousins, Nucl. Instrum. Methods 221, 437 (1984); runs test: A. Wald, J. Wolfowitz, Ann. Math. Statist. 11, 147 (1940).
import type { Diagnostic } from '../diagnostics/diagnostic.js';
import { fitLevenbergMarquardt, type StopReason } from './fit-levenberg-marquardt.js';
import { evaluateTie, type LinearTie } from './linear-tie.js';
import { runsTest, type RunsTestResult } from './runs-test.js';
import { chiSquareUpperTail } from './chi-square-upper-tail.js';
import { spectrumModel, type SpectrumModelSpec } from './spectrum-model.js';

/**
 * Fits one region of a spectrum and reports what the extract and calibrate stages need.
 *
 * Methods: `poisson` (default) minimises the Poisson deviance D = 2Σ[μ − n + n ln(n/μ)];
 * `neyman` is least squares with σ_i² = max(n_i, 1) (Neyman's χ², biased low at low counts, kept
 * for comparison); `least-squares` uses unit weights (covariance scaled by s², as NIST StRD).
 * Goodness of fit: D (or χ²) per degree of freedom with its upper-tail probability
 * (Wilson–Hilferty), and the Wald–Wolfowitz runs test on residual signs; either below
 * `flagProbability` (default 0.001, common practice) is a warning diagnostic, as are
 * non-convergence and a parameter stopped at a bound.
 * Peak areas are the area parameters A (the integral of each component over all x, counts), with
 * the covariance and correlation between the areas of the region's peaks.
 */
export interface PeakFitOptions {
  method?: 'poisson' | 'neyman' | 'least-squares';
  flagProbability?: number;
  maxIterations?: number;
}

export interface FittedParameter {
  name: string;
  value: number;
  /** Standard uncertainty (0 when fixed or at a bound). */
  unc: number;
  fixed: boolean;
  atBound: boolean;
}

export interface FittedPeak {
  label: string;
  area: number;
  areaUnc: number;
  centroidChannel: number;
  centroidUncChannel: number;
  sigmaChannel: number;
  sigmaUncChannel: number;
}

export interface PeakFitResult {
  converged: boolean;
  stopReason: StopReason;
  iterations: number;
  method: 'poisson' | 'neyman' | 'least-squares';
  /** Poisson deviance, or χ² for the least-squares methods. */
  deviance: number;
  dof: number;
  deviancePerDof: number;
  devianceUpperTailP: number;
  runs: RunsTestResult;
  parameters: FittedParameter[];
  /** P×P row-major parameter covariance. */
  covariance: Float64Array;
  peaks: FittedPeak[];
  /** Area covariance and correlation between the region's peaks (K×K). */
  areaCovariance: number[][];
  areaCorrelation: number[][];
  /** Fitted model and Pearson residuals (n − μ)/√μ per channel of the region. */
  model: Float64Array;
  residuals: Float64Array;
  diagnostics: Diagnostic[];
}

/**
 * @param counts the whole spectrum (counts per channel); the region is spec.firstChannel …
 *   spec.firstChannel + spec.channelCount − 1 and must lie inside it.
 */
export function fitPeaks(counts: ArrayLike<number>, spec: SpectrumModelSpec, options: PeakFitOptions = {}): PeakFitResult {
  const method = options.method ?? 'poisson';
  const flagP = options.flagProbability ?? 0.001;
  if (spec.firstChannel < 0 || spec.firstChannel + spec.channelCount > counts.length || spec.channelCount < 1) {
    throw new RangeError(`fit region ${spec.firstChannel}…${spec.firstChannel + spec.channelCount - 1} lies outside the spectrum 0…${counts.length - 1}`);
  }
  const n = spec.channelCount;
  const data = new Float64Array(n);
  for (let i = 0; i < n; i++) data[i] = counts[spec.firstChannel + i]!;
  const P = spec.parameters.length;
  const weights = method === 'neyman' ? data.map((v) => 1 / Math.max(v, 1)) : undefined;
  const fit = fitLevenbergMarquardt(spectrumModel(spec), data, spec.parameters.map((q) => q.start), {
    objective: method === 'poisson' ? 'poisson' : 'least-squares',
    weights,
    lower: spec.parameters.map((q) => q.lower ?? Number.NEGATIVE_INFINITY),
    upper: spec.parameters.map((q) => q.upper ?? Number.POSITIVE_INFINITY),
    fixed: spec.parameters.map((q) => q.fixed ?? false),
    maxIterations: options.maxIterations,
  });
  const cov = fit.covariance;
  const tieValue = (t: LinearTie) => evaluateTie(t, fit.params);
  const tieUnc = (t: LinearTie) => {
    let v = 0;
    for (const a of t.terms ?? []) for (const b of t.terms ?? []) v += a.coef * b.coef * cov[a.param * P + b.param]!;
    return Math.sqrt(Math.max(v, 0));
  };
  const parameters = spec.parameters.map((q, j) => ({
    name: q.name, value: fit.params[j]!, unc: Math.sqrt(Math.max(cov[j * P + j]!, 0)), fixed: q.fixed ?? false, atBound: fit.atBound[j]!,
  }));
  const peaks = spec.peaks.map((pk) => ({
    label: pk.label,
    area: fit.params[pk.area]!,
    areaUnc: parameters[pk.area]!.unc,
    centroidChannel: tieValue(pk.centroid),
    centroidUncChannel: tieUnc(pk.centroid),
    sigmaChannel: tieValue(pk.sigma),
    sigmaUncChannel: tieUnc(pk.sigma),
  }));
  const areaCovariance = spec.peaks.map((a) => spec.peaks.map((b) => cov[a.area * P + b.area]!));
  const areaCorrelation = areaCovariance.map((row, i) => row.map((v, k) => {
    const d = Math.sqrt(areaCovariance[i]![i]! * areaCovariance[k]![k]!);
    return i === k ? 1 : d > 0 ? v / d : 0;
  }));
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = fit.mu[i]! > 0 ? (data[i]! - fit.mu[i]!) / Math.sqrt(fit.mu[i]!) : 0;
  const runs = runsTest(data, fit.mu, n);
  const devianceUpperTailP = chiSquareUpperTail(fit.objective, fit.dof);
  const diagnostics: Diagnostic[] = [];
  const where = `channels ${spec.firstChannel}…${spec.firstChannel + n - 1}`;
  if (!fit.converged) {
    diagnostics.push({ severity: 'warning', rule: 'fit-not-converged', message: `peak fit over ${where} did not converge (${fit.stopReason} after ${fit.iterations} iterations)`, hint: 'check the expected centroids and width passed as start values, or narrow the region' });
  }
  if (devianceUpperTailP < flagP) {
    diagnostics.push({ severity: 'warning', rule: 'fit-poor-deviance', message: `peak fit over ${where}: deviance/ν = ${(fit.objective / fit.dof).toPrecision(4)} (ν = ${fit.dof}), P = ${devianceUpperTailP.toExponential(2)}`, expected: `P >= ${flagP}`, actual: `${devianceUpperTailP.toExponential(2)}`, hint: 'the line shape or background model misses structure: add a tail, a step or a background term' });
  }
  if (runs.pTooFew < flagP) {
    diagnostics.push({ severity: 'warning', rule: 'fit-residual-runs', message: `peak fit over ${where}: ${runs.runs} runs of residual signs where ${runs.expectedRuns.toFixed(1)} are expected (z = ${runs.z.toFixed(2)})`, expected: `P >= ${flagP}`, actual: `${runs.pTooFew.toExponential(2)}`, hint: 'systematic residuals: the model misses a component' });
  }
  parameters.forEach((q) => {
    if (q.atBound) diagnostics.push({ severity: 'info', rule: 'fit-parameter-at-bound', message: `peak fit over ${where}: parameter ${q.name} = ${q.value} stopped at a bound; its uncertainty is reported as 0`, hint: 'a zero area is an upper-limit case; report a limit rather than a value' });
  });
  if (!fit.covarianceValid) {
    diagnostics.push({ severity: 'warning', rule: 'fit-singular-covariance', message: `peak fit over ${where}: the Fisher information is singular, no uncertainties`, hint: 'two parameters are not separable by the data: tie or fix one' });
  }
  return {
    converged: fit.converged, stopReason: fit.stopReason, iterations: fit.iterations, method, deviance: fit.objective, dof: fit.dof,
    deviancePerDof: fit.objective / fit.dof, devianceUpperTailP, runs, parameters, covariance: cov, peaks, areaCovariance, areaCorrelation,
    model: fit.mu, residuals, diagnostics,
  };
}
