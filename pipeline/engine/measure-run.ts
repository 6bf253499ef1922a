import { createHash } from 'node:crypto';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { channelToEnergyKeV, type EnergyCalibration } from '../core/calibration/energy-calibration.js';
import { netCounts } from '../core/counting/net-counts.js';
import { planPeakWindow, type MeasuredPeak, type PeakRequest, type WindowWidths } from '../core/counting/peak-window.js';
import { measureWindowSums } from '../core/counting/window-sums.js';
import { SpectrumScratch } from '../core/formats/spectrum-csv.js';
// The per-run module only: workers must not load the series-level readers (zod, yaml).
import { ingestSpectrum } from '../../stages/ingest/ingest-spectrum.js';

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
}

export interface MeasureResult {
  run: string;
  sha256: string;
  ok: boolean;
  channelCount: number;
  /** Total counts per detector (task order). */
  totals: number[];
  peaks: MeasuredPeak[];
  diagnostics: Diagnostic[];
}

/**
 * Reads one spectrum's bytes and measures every requested peak: windows from kinematics
 * through the run's calibration, sums, net counts above the linear background, centroid
 * shift. Pure apart from the hash; runs in a worker thread or in-process alike.
 */
/** One per thread: measureRun keeps nothing of a spectrum once it has returned. */
const scratch = new SpectrumScratch();

export function measureRun(task: MeasureTask, bytes: Uint8Array): MeasureResult {
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const ingested = ingestSpectrum(bytes, task.file, task.run, task.detectorIds, scratch);
  const base = { run: task.run, sha256, diagnostics: ingested.diagnostics };
  if (ingested.spectrum === null) return { ...base, ok: false, channelCount: 0, totals: [], peaks: [] };
  const s = ingested.spectrum;
  const totals = s.counts.map((c) => {
    let t = 0;
    for (let i = 0; i < c.length; i++) t += c[i]!;
    return t;
  });
  const peaks: MeasuredPeak[] = [];
  for (const request of task.requests) {
    const di = task.detectorIds.indexOf(request.detector);
    const cal = task.calibrations[request.detector]!;
    const counts = s.counts[di]!;
    const window = planPeakWindow(cal, s.channelCount, request.expectedEnergyKeV, request.fwhmKeV, task.widths);
    if (window.peak === null) {
      peaks.push({ request, window, net: null, shiftKeV: Number.NaN });
      continue;
    }
    const sums = measureWindowSums(counts, window.peak, window.left, window.right);
    const net = netCounts(sums, window.peak, window.left, window.right);
    const shiftKeV = Number.isFinite(net.centroidChannel) ? channelToEnergyKeV(cal, net.centroidChannel) - request.expectedEnergyKeV : Number.NaN;
    peaks.push({ request, window, net, shiftKeV });
  }
  return { ...base, ok: true, channelCount: s.channelCount, totals, peaks };
}
