import { channelToEnergyKeV, energyToChannel } from '../../core/calibration/energy-calibration.js';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';
import type { QcRow } from '../../core/model/result-rows.js';
import type { FitResidualRow, FitRow, QcRowWithDrift } from '../../../stages/report/fits-columns.js';
import { effectiveCalibrations, type MeasureResult, type MeasureTask } from '../measure-run.js';
import { PEAK_VALUES_PER_LINE } from './fit-plan.js';

const FIT_FLAG_TEXT: Record<string, string> = {
  'fit-not-converged': 'did not converge',
  'fit-poor-deviance': 'have a deviance per degree of freedom beyond its tolerance',
  'fit-residual-runs': 'show too few runs of residual signs (the model misses structure)',
  'fit-area-at-bound': 'put an area at its bound (zero)',
  'fit-parameter-at-bound': 'stopped a parameter at a bound',
  'fit-singular-covariance': 'have a singular Fisher information (no uncertainties)',
  'fit-not-done': 'could not be done (peak outside the spectrum or region too short)',
};

/**
 * The fit and drift results of a reduction as table rows: fits.arrow (one row per run ×
 * detector × fitted peak), fit_residuals.arrow (one row per channel of each fit region), and the
 * drift columns and flags of qc.arrow (rows changed in place). Fit problems become one summary
 * warning per flag (with its first case), not one per run.
 */
export function fitTables(tasks: readonly MeasureTask[], results: ReadonlyMap<string, MeasureResult>, qc: QcRow[]): { fits: FitRow[]; residuals: FitResidualRow[]; diagnostics: Diagnostic[] } {
  const fits: FitRow[] = [];
  const residuals: FitResidualRow[] = [];
  const flagCount = new Map<string, { count: number; run: string; detector: string; group: string }>();
  const qcIndex = new Map(qc.map((q, i) => [`${q.run}\t${q.detector}`, i]));
  for (const task of tasks) {
    const result = results.get(task.run);
    if (result === undefined || !result.ok) continue;
    const cals = effectiveCalibrations(task, result.drift);
    for (const fit of result.fits ?? []) {
      const cal = cals[fit.detector]!;
      const k = fit.requestIndices.length;
      const names = fit.requestIndices.map((ri) => task.requests[ri]!.key);
      const parameters = fit.parameterNames.map((n, j) => `${n}=${fmt(fit.parameters[2 * j]!)}±${fmt(fit.parameters[2 * j + 1]!)}`).join(';');
      for (const f of fit.flags) {
        const seen = flagCount.get(f);
        if (seen) seen.count++;
        else flagCount.set(f, { count: 1, run: task.run, detector: fit.detector, group: fit.groupKey });
      }
      fit.requestIndices.forEach((ri, line) => {
        const request = task.requests[ri]!;
        const v = (j: number) => fit.peaks[line * PEAK_VALUES_PER_LINE + j]!;
        fits.push({
          run: task.run, detector: fit.detector, group: fit.groupKey, peak: request.key, groupSize: k,
          firstChannel: fit.channelCount > 0 ? fit.firstChannel : Number.NaN, lastChannel: fit.channelCount > 0 ? fit.firstChannel + fit.channelCount - 1 : Number.NaN,
          expectedEnergyKeV: request.expectedEnergyKeV, expectedChannel: energyToChannel(cal, request.expectedEnergyKeV),
          areaCounts: v(0), areaUncCounts: v(1), centroidChannel: v(2), centroidUncChannel: v(3),
          centroidEnergyKeV: Number.isFinite(v(2)) ? channelToEnergyKeV(cal, v(2)) : Number.NaN, sigmaChannel: v(4), sigmaUncChannel: v(5),
          areaCorrelations: fit.areaCorrelation.length === 0 ? '' : names.flatMap((n, j) => (j === line ? [] : [`${n}=${fit.areaCorrelation[line * k + j]!.toFixed(4)}`])).join(';'),
          converged: fit.converged ? 1 : 0, stopReason: fit.stopReason, iterations: fit.iterations,
          deviance: fit.quality[0]!, dof: fit.quality[1]!, deviancePerDof: fit.quality[2]!, devianceP: fit.quality[3]!,
          residualRuns: fit.quality[4]!, expectedRuns: fit.quality[5]!, runsP: fit.quality[7]!, parameters, problem: fit.problem, flags: fit.flags,
        });
      });
      for (let i = 0; i < fit.observed.length; i++) {
        const channel = fit.firstChannel + i;
        residuals.push({ run: task.run, detector: fit.detector, group: fit.groupKey, channel, energyKeV: channelToEnergyKeV(cal, channel), observed: fit.observed[i]!, model: fit.model[i]!, residual: fit.residuals[i]!, background: fit.background?.[i] ?? Number.NaN });
      }
    }
    const drift = result.drift;
    if (drift === undefined || task.drift === undefined) continue;
    drift.detectors.forEach((d, di) => {
      const qi = qcIndex.get(`${task.run}\t${d}`);
      if (qi === undefined) return;
      const row = qc[qi] as QcRowWithDrift;
      const ri = drift.requestIndex[di]!;
      row.driftTrackingPeak = ri >= 0 ? task.requests[ri]!.key : '';
      row.driftShiftKeV = drift.values[3 * di]!;
      row.driftShiftUncKeV = drift.values[3 * di + 1]!;
      row.gainCorrection = drift.values[3 * di + 2]!;
      if (ri < 0) row.flags.push('drift-not-tracked');
      else {
        if (Math.abs(row.driftShiftKeV) > task.drift!.toleranceKeV) row.flags.push('gain-drift');
        if (row.gainCorrection !== 1) row.flags.push('gain-corrected');
      }
    });
  }
  const diagnostics: Diagnostic[] = [...flagCount].sort(([a], [b]) => (a < b ? -1 : 1)).map(([flag, c]) => ({
    severity: flag === 'fit-parameter-at-bound' ? 'info' : 'warning',
    rule: flag,
    stage: 'extract',
    run: c.run,
    detector: c.detector,
    message: `${c.count} peak fit${c.count === 1 ? '' : 's'} ${FIT_FLAG_TEXT[flag] ?? flag} (first: run ${c.run}, detector ${c.detector}, group "${c.group}"); rows carry the flag ${flag}, details in fits.arrow`,
    hint: flag === 'fit-not-done' ? 'check the peak lies inside the spectrum and extract.fit_region_fwhm' : 'inspect fit_residuals.arrow; consider a tail (extract.fit_tail), a step (extract.fit_step) or another background',
  }));
  return { fits, residuals, diagnostics };
}

const fmt = (v: number) => (Number.isFinite(v) ? Number(v.toPrecision(7)).toString() : 'NaN');
