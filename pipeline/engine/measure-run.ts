import { createHash } from 'node:crypto';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { channelToEnergyKeV, type EnergyCalibration } from '../core/calibration/energy-calibration.js';
import { netCounts, type NetCounts } from '../core/counting/net-counts.js';
import { planPeakWindow, type MeasuredPeak, type PeakRequest, type PeakWindow, type WindowWidths } from '../core/counting/peak-window.js';
import { measureWindowSums } from '../core/counting/window-sums.js';
import { SpectrumScratch } from '../core/formats/spectrum-csv.js';
// The per-run module only: workers must not load the series-level readers (zod, yaml).
import { ingestSpectrum } from '../../stages/ingest/ingest-spectrum.js';
import { rebinCounts, rebinnedLength } from '../../stages/report/spectra/rebin-counts.js';
import type { ReportSpectrum } from '../../stages/report/spectra/report-spectrum.js';
import { fitGroup } from './fit/fit-group.js';
import { PEAK_VALUES_PER_LINE, type DriftOutcome, type DriftTask, type FitOutcome, type FitSettings, type FitTask } from './fit/fit-plan.js';
import { scaledGainCalibration, trackDrift } from './fit/track-drift.js';

/** What the engine asks of one run's spectrum: plain data, so it can cross a worker boundary. */
export interface MeasureTask {
  run: string;
  /** Absolute path of the spectrum file. */
  path: string;
  /** Path as reported in diagnostics (relative to the series folder). */
  file: string;
  detectorIds: string[];
  calibrations: Record<string, EnergyCalibration>;
  requests: PeakRequest[];
  widths: WindowWidths;
  /** Keep a compact copy of these detectors' spectra for the summary page (absent: keep none). */
  keepSpectra?: { detectors: string[]; maxBins: number };
  /** Peaks measured by a line-shape fit (method: fit), one entry per multiplet; absent: windows only. */
  fits?: FitTask[];
  fitSettings?: FitSettings;
  /** Gain-drift tracking (drift.mode track | correct); absent: off. */
  drift?: DriftTask;
}

/** Compact spectra of a run (detectors in `keepSpectra` order), `bins` values each in one flat array. */
export interface CompactSpectra {
  detectors: string[];
  binWidthChannels: number;
  bins: number;
  counts: Float64Array;
}

export interface MeasureResult {
  run: string;
  sha256: string;
  ok: boolean;
  channelCount: number;
  /** Total counts per detector (task order). */
  totals: number[];
  /**
   * Per request (task order), 4 numbers: gross, Σ ch·counts over the peak window, left and right
   * background sums (NaN when the peak window is outside the spectrum). A flat typed array
   * crosses the worker boundary as one copy; the windows are re-planned from the task.
   */
  sums: Float64Array;
  diagnostics: Diagnostic[];
  spectra?: CompactSpectra;
  /** One per task fit (task order). */
  fits?: FitOutcome[];
  drift?: DriftOutcome;
}

export const SUMS_PER_REQUEST = 4;

/** One per thread: measureRun keeps nothing of a spectrum once it has returned. */
const scratch = new SpectrumScratch();

/**
 * Reads one spectrum's bytes and sums every requested peak window and its background
 * windows (placed from kinematics through the run's calibration). Pure apart from the hash;
 * runs in a worker thread or in-process alike.
 */
export function measureRun(task: MeasureTask, bytes: Uint8Array): MeasureResult {
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const ingested = ingestSpectrum(bytes, task.file, task.run, task.detectorIds, scratch);
  const base = { run: task.run, sha256, diagnostics: ingested.diagnostics };
  if (ingested.spectrum === null) return { ...base, ok: false, channelCount: 0, totals: [], sums: new Float64Array(0) };
  const s = ingested.spectrum;
  const totals = s.counts.map((c) => {
    let t = 0;
    for (let i = 0; i < c.length; i++) t += c[i]!;
    return t;
  });
  // Gain drift first: with drift.mode correct, every window and fit of the run uses the corrected gain.
  const drift = task.drift === undefined ? undefined : trackDrift(s.counts, task.detectorIds, task.calibrations, task.requests, task.widths, task.drift);
  const cals = drift === undefined ? task.calibrations : effectiveCalibrations(task, drift);
  const sums = new Float64Array(task.requests.length * SUMS_PER_REQUEST).fill(Number.NaN);
  task.requests.forEach((request, i) => {
    const window = planPeakWindow(cals[request.detector]!, s.channelCount, request.expectedEnergyKeV, request.fwhmKeV, task.widths);
    if (window.peak === null) return;
    const w = measureWindowSums(s.counts[task.detectorIds.indexOf(request.detector)]!, window.peak, window.left, window.right);
    sums.set([w.gross, w.grossMoment, w.left, w.right], i * SUMS_PER_REQUEST);
  });
  const fits = task.fits === undefined || task.fitSettings === undefined ? undefined
    : task.fits.map((f) => fitGroup(s.counts[task.detectorIds.indexOf(f.detector)]!, cals[f.detector]!, task.requests, f, task.fitSettings!));
  const extra = { ...(fits === undefined ? {} : { fits }), ...(drift === undefined ? {} : { drift }) };
  const keep = task.keepSpectra;
  if (keep === undefined || keep.detectors.length === 0) return { ...base, ok: true, channelCount: s.channelCount, totals, sums, ...extra };
  const bins = rebinnedLength(s.channelCount, keep.maxBins);
  const counts = new Float64Array(bins * keep.detectors.length);
  let binWidthChannels = 1;
  keep.detectors.forEach((d, k) => {
    binWidthChannels = rebinCounts(s.counts[task.detectorIds.indexOf(d)]!, keep.maxBins, counts, k * bins);
  });
  return { ...base, ok: true, channelCount: s.channelCount, totals, sums, spectra: { detectors: keep.detectors, binWidthChannels, bins, counts }, ...extra };
}

/** The calibrations a run was measured with: the task's, each detector's gain rescaled where drift correction applied. */
export function effectiveCalibrations(task: MeasureTask, drift: DriftOutcome | undefined): Record<string, EnergyCalibration> {
  if (drift === undefined) return task.calibrations;
  const out: Record<string, EnergyCalibration> = { ...task.calibrations };
  drift.detectors.forEach((d, di) => {
    if (out[d] !== undefined) out[d] = scaledGainCalibration(out[d]!, drift.values[3 * di + 2]!);
  });
  return out;
}

/** The measured peaks of a run from its task and the sums: windows re-planned, net counts above background, centroid shift. */
export function measuredPeaks(task: MeasureTask, result: MeasureResult): MeasuredPeak[] {
  const cals = effectiveCalibrations(task, result.drift);
  const driftFlags = driftFlagsByDetector(task, result.drift);
  const fitOf = new Map<number, { fit: FitOutcome; line: number }>();
  for (const fit of result.fits ?? []) fit.requestIndices.forEach((ri, line) => fitOf.set(ri, { fit, line }));
  return task.requests.map((request, i) => {
    const cal = cals[request.detector]!;
    const window = planPeakWindow(cal, result.channelCount, request.expectedEnergyKeV, request.fwhmKeV, task.widths);
    const extraFlags = driftFlags.get(request.detector) ?? [];
    if (extraFlags.length) window.flags.push(...extraFlags);
    const fitted = fitOf.get(i);
    if (fitted !== undefined) return fittedPeak(task, request, window, cal, fitted.fit, fitted.line);
    if (window.peak === null) return { request, window, net: null, shiftKeV: Number.NaN };
    const o = i * SUMS_PER_REQUEST;
    const net = netCounts({ gross: result.sums[o]!, grossMoment: result.sums[o + 1]!, left: result.sums[o + 2]!, right: result.sums[o + 3]! }, window.peak, window.left, window.right);
    const shiftKeV = Number.isFinite(net.centroidChannel) ? channelToEnergyKeV(cal, net.centroidChannel) - request.expectedEnergyKeV : Number.NaN;
    return { request, window, net, shiftKeV };
  });
}

/**
 * A fitted peak as extract takes it: net = fitted area, netVariance = its variance (from the
 * Fisher information); gross = the counts in the fit region, background = gross − area (the
 * background and the neighbours' counts). Fit flags join the window's flags.
 */
function fittedPeak(task: MeasureTask, request: PeakRequest, window: PeakWindow, cal: EnergyCalibration, fit: FitOutcome, line: number): MeasuredPeak {
  const k = fit.requestIndices.length;
  const correlations = fit.requestIndices.flatMap((ri, j) => (j === line || fit.areaCorrelation.length === 0 ? [] : [{ key: task.requests[ri]!.key, rho: fit.areaCorrelation[line * k + j]! }]));
  const info = { groupKey: fit.groupKey, converged: fit.converged, deviancePerDof: fit.quality[2]!, flags: fit.flags, correlations };
  window.flags.push(...fit.flags);
  if (fit.problem !== '') return { request, window, net: null, shiftKeV: Number.NaN, fit: info };
  const o = line * PEAK_VALUES_PER_LINE;
  const area = fit.peaks[o]!;
  let gross = 0;
  for (let i = 0; i < fit.observed.length; i++) gross += fit.observed[i]!;
  const centroidChannel = fit.peaks[o + 2]!;
  const net: NetCounts = { gross, background: gross - area, backgroundVariance: Number.NaN, net: area, netVariance: fit.peaks[o + 1]! ** 2, centroidChannel };
  return { request, window, net, shiftKeV: channelToEnergyKeV(cal, centroidChannel) - request.expectedEnergyKeV, fit: info };
}

/** Flags every peak of a run × detector gets from drift tracking: gain-drift beyond tolerance, gain-corrected, drift-not-tracked. */
function driftFlagsByDetector(task: MeasureTask, drift: DriftOutcome | undefined): Map<string, string[]> {
  const out = new Map<string, string[]>();
  if (drift === undefined || task.drift === undefined) return out;
  drift.detectors.forEach((d, di) => {
    const flags: string[] = [];
    const shift = drift.values[3 * di]!;
    if (drift.requestIndex[di]! < 0) flags.push('drift-not-tracked');
    else if (Math.abs(shift) > task.drift!.toleranceKeV) flags.push('gain-drift');
    if (drift.values[3 * di + 2] !== 1 && drift.requestIndex[di]! >= 0) flags.push('gain-corrected');
    out.set(d, flags);
  });
  return out;
}

/** The compact spectra of a measured run as the report takes them, with the run's calibrations for the energy axis. */
export function reportSpectra(task: MeasureTask, result: MeasureResult): ReportSpectrum[] {
  const s = result.spectra;
  if (!result.ok || s === undefined) return [];
  return s.detectors.map((detector, k) => ({
    run: task.run,
    detector,
    channelCount: result.channelCount,
    binWidthChannels: s.binWidthChannels,
    counts: s.counts.subarray(k * s.bins, (k + 1) * s.bins),
    calibration: task.calibrations[detector],
  }));
}
