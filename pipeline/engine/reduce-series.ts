import { join, resolve } from 'node:path';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { energyUncertaintyKeV, type EnergyCalibration } from '../core/calibration/energy-calibration.js';
import { liveFraction, type LiveFraction } from '../core/counting/live-fraction.js';
import type { MeasuredPeak, PeakRequest } from '../core/counting/peak-window.js';
import type { QcRow, YieldRow } from '../core/model/result-rows.js';
import type { IngestedSeries, RunRecord } from '../core/model/series-model.js';
import { nuclide } from '../core/physics/nuclides.js';
import { ingest } from '../../stages/ingest/index.js';
import { calibrate } from '../../stages/calibrate/index.js';
import { normalize, normalizingElement, planNormalizingWindows, referenceKey } from '../../stages/normalize/index.js';
import { seriesPeakPlanner } from '../core/kinematics/series-peak-planner.js';
import { extract, measuredKey, pageBudgets, planPeakWindows, seriesUncertaintyTables } from '../../stages/extract/index.js';
import { pickSpectra, report, reportSettings, type ReportChangesInput, type ReportSpectrum } from '../../stages/report/index.js';
import { writeFileAtomic } from './atomic-write.js';
import { buildManifest } from './build-manifest.js';
import { EXIT } from './exit-codes.js';
import { measuredPeaks, reportSpectra, type MeasureResult, type MeasureTask } from './measure-run.js';
import { readSeriesFiles } from './read-series-files.js';
import { runMeasurements } from './run-measurements.js';
import { measurePlan } from './fit/measure-plan.js';
import { fitTables } from './fit/fit-tables.js';

export interface ReduceOptions {
  seriesDir: string;
  outDir: string;
  jobs: number;
  html: boolean;
  commandLine: string[];
  // --- archive operation (pipeline/engine/archive); all optional, absent for `xsred reduce` ---
  /** Write the files into this folder instead of `<outDir>/<series>` (a version being built). */
  outSeriesDir?: string;
  /** Measured results by content: a hit is used instead of reading and parsing the spectrum. */
  measureCache?: MeasureCache;
  /** Runs not reduced this time (spectrum still being written), each set aside with its note. */
  holdBack?: ReadonlyMap<string, Diagnostic>;
  /** Called as spectra are measured: (runs done, runs to do), cache hits counted as done at once. */
  onProgress?: (done: number, total: number) => void;
  /** `--mc N`: Monte Carlo propagation (JCGM 101) of every row with N trials from this seed (monte_carlo.arrow). */
  monteCarlo?: { trials: number; seed: number };
  /** Archive versions: "changes since previous version" for the summary page (see ReportInput.changes). */
  changes?: ReportChangesInput;
}

/** Measured results kept by the archive ledger, keyed by the content of a task and its spectrum. */
export interface MeasureCache {
  lookup(task: MeasureTask): MeasureResult | undefined;
  store(task: MeasureTask, result: MeasureResult): void;
}

/** What the archive ledger records per run (absent when the series could not be reduced). */
export interface ReduceDetail {
  series: IngestedSeries;
  calibrationByRun: ReadonlyMap<string, { version: string; detectors: ReadonlyMap<string, EnergyCalibration> }>;
  /** Sample run → the reference runs its normalization used (any detector), sorted. */
  referenceRuns: ReadonlyMap<string, string[]>;
  setAside: ReadonlyMap<string, Diagnostic[]>;
  /** Run → sha256 of its spectrum bytes (measured now or from the cache). */
  spectrumSha256: ReadonlyMap<string, string>;
  /** Runs whose spectra were read and parsed this time (not from the cache). */
  measuredRuns: string[];
}

export interface ReduceResult {
  exitCode: number;
  series?: string;
  outSeriesDir?: string;
  summaryPath?: string;
  diagnostics: Diagnostic[];
  counts: { runs: number; reduced: number; setAside: number; notReduced: number; rows: number };
  /** Wall time of each phase, ms. */
  phasesMs: Record<string, number>;
  detail?: ReduceDetail;
}

const byRunOrder = (index: Map<string, number>) => (a: Diagnostic, b: Diagnostic) =>
  (a.run === undefined ? -1 : (index.get(a.run) ?? 1e9)) - (b.run === undefined ? -1 : (index.get(b.run) ?? 1e9));

/** The whole reduction of one series: ingest → calibrate → measure → normalize → extract → report. */
export async function reduceSeries(opts: ReduceOptions): Promise<ReduceResult> {
  const startedAt = new Date();
  const phasesMs: Record<string, number> = {};
  let mark = performance.now();
  const phase = (name: string) => {
    const now = performance.now();
    phasesMs[name] = Math.round(now - mark);
    mark = now;
  };
  const seriesDir = resolve(opts.seriesDir);
  const files = readSeriesFiles(seriesDir);
  const ing = ingest(files.input);
  const emptyCounts = { runs: 0, reduced: 0, setAside: 0, notReduced: 0, rows: 0 };
  if (!ing.ok) return { exitCode: EXIT.usage, diagnostics: [...files.diagnostics, ...ing.diagnostics], counts: emptyCounts, phasesMs };
  const series: IngestedSeries = ing.series;
  const config = series.config;
  const setAside = new Map(series.setAside);
  const aside = (run: string, ds: Diagnostic[]) => setAside.set(run, [...(setAside.get(run) ?? []), ...ds]);
  for (const [run, note] of opts.holdBack ?? []) if (series.runs.some((r) => r.run === run)) aside(run, [note]);
  const diagnostics: Diagnostic[] = [...files.diagnostics, ...series.diagnostics];

  const reducible = (r: RunRecord) => (r.kind === 'reference' || r.kind === 'sample') && !setAside.has(r.run);
  const cal = calibrate({ runs: series.runs.filter(reducible), versions: series.calibrations, detectorIds: config.detectors.map((d) => d.id), runlogFile: 'runlog.csv' });
  for (const [run, ds] of cal.setAside) aside(run, ds);

  phase('ingest_calibrate');
  // Plan what to measure in every usable run.
  const element = normalizingElement(config);
  const planner = seriesPeakPlanner(config, series.stoppingTables);
  // The normalizing peak: in reference runs, and in sample runs for internal-reference and monitor.
  const normalizingWindows = (run: RunRecord) => {
    const w = planNormalizingWindows(config, planner, element, run);
    for (const p of w.problems) {
      if (!referenceProblems.has(p.detector)) referenceProblems.set(p.detector, { severity: 'warning', rule: 'reference-peak-not-planned', stage: 'normalize', run: run.run, detector: p.detector, message: `the reference peak of ${element} cannot be placed in detector ${p.detector}: ${p.problem} (first such run)` });
    }
    return w.requests;
  };
  const referenceProblems = new Map<string, Diagnostic>();
  const planProblems = new Map<string, Map<string, string>>();
  const tasks: MeasureTask[] = [];
  // The summary page embeds compact spectra of at most report.max_spectra run × detector pairs.
  const pageSettings = reportSettings(config);
  const kept = opts.html ? pickSpectra(series.runs.filter(reducible).map((r) => r.run), config.detectors.map((d) => d.id), pageSettings.max_spectra) : new Map<string, string[]>();
  for (const run of series.runs) {
    if (!reducible(run)) continue;
    const rc = cal.byRun.get(run.run)!;
    let requests: PeakRequest[];
    let labels: string[] | undefined;
    if (run.kind === 'reference') {
      requests = normalizingWindows(run);
    } else {
      const planned = planPeakWindows(config, planner, run);
      requests = planned.filter((p) => p.problem === undefined).map((p) => p.request!);
      labels = planned.filter((p) => p.problem === undefined).map((p) => p.peakLabel);
      const problems = new Map<string, string>();
      for (const p of planned) if (p.problem !== undefined) problems.set(measuredKey(p.request!.detector, p.peakLabel), p.problem);
      if (problems.size) planProblems.set(run.run, problems);
      const extra = normalizingWindows(run);
      requests.push(...extra);
      labels.push(...extra.map((r) => r.key));
    }
    tasks.push({
      run: run.run,
      path: join(seriesDir, series.spectrumFiles.get(run.run)!),
      file: series.spectrumFiles.get(run.run)!,
      detectorIds: config.detectors.map((d) => d.id),
      calibrations: Object.fromEntries(rc.detectors),
      requests,
      widths: config.extract,
      ...(kept.has(run.run) ? { keepSpectra: { detectors: kept.get(run.run)!, maxBins: pageSettings.spectrum_bins } } : {}),
      ...measurePlan(config, run.kind === 'reference' ? 'reference' : 'sample', requests, labels ?? requests.map((r) => r.key)),
    });
  }

  phase('plan');
  // Measure: spectra streamed through runMeasurements (worker threads when --jobs > 1).
  const results = new Map<string, MeasureResult>();
  const peaksByRun = new Map<string, Map<string, MeasuredPeak>>();
  const taskOf = new Map(tasks.map((t) => [t.run, t]));
  const spectraByRun = new Map<string, ReportSpectrum[]>();
  const onResult = (r: MeasureResult) => {
    if (r.ok && r.spectra) spectraByRun.set(r.run, reportSpectra(taskOf.get(r.run)!, r));
    if (!r.ok) aside(r.run, r.diagnostics.filter((d) => d.severity === 'error'));
    diagnostics.push(...r.diagnostics.filter((d) => d.severity !== 'error'));
    results.set(r.run, r);
    if (r.ok) peaksByRun.set(r.run, new Map(measuredPeaks(taskOf.get(r.run)!, r).map((p) => [measuredKey(p.request.detector, p.request.key), p])));
  };
  // Archive operation: cached results of unchanged runs first, then only the rest is read.
  const measuredRuns: string[] = [];
  const toMeasure = opts.measureCache ? tasks.filter((t) => {
    const hit = opts.measureCache!.lookup(t);
    if (hit !== undefined) onResult(hit);
    return hit === undefined;
  }) : tasks;
  let measuredCount = tasks.length - toMeasure.length;
  opts.onProgress?.(measuredCount, tasks.length);
  await runMeasurements(toMeasure, opts.jobs, (r) => {
    opts.measureCache?.store(taskOf.get(r.run)!, r);
    measuredRuns.push(r.run);
    onResult(r);
    opts.onProgress?.(++measuredCount, tasks.length);
  });

  phase('measure');
  const live = new Map<string, Map<string, LiveFraction>>();
  const usable = (kind: RunRecord['kind']) => series.runs.filter((r) => r.kind === kind && !setAside.has(r.run) && results.get(r.run)?.ok === true);
  const referenceRuns = usable('reference');
  const sampleRuns = usable('sample');
  const needsReferenceRuns = config.normalization.method === 'reference-run' || config.normalization.method === 'monitor';
  if (referenceRuns.length === 0 && needsReferenceRuns) {
    // Every reference spectrum was unusable: nothing can be normalized, so nothing is written.
    for (const ds of setAside.values()) diagnostics.push(...ds);
    diagnostics.push({ severity: 'error', rule: 'series-no-reference-run', stage: 'engine', file: 'runlog.csv', message: 'no reference run has a usable spectrum: the series cannot be normalized' });
    return { exitCode: EXIT.usage, diagnostics, counts: emptyCounts, phasesMs };
  }
  for (const r of [...referenceRuns, ...sampleRuns]) {
    live.set(r.run, new Map(config.detectors.map((d) => [d.id, liveFraction(series.scalers?.get(r.run)?.get(d.id), r.realTimeS)])));
  }

  // run → detector → the normalizing peak measured in that spectrum, with its live fraction
  const normalizingPeaks = (runs: readonly RunRecord[]) =>
    new Map(
      runs.map((r) => [
        r.run,
        new Map(config.detectors.flatMap((d) => {
          const peak = element === null ? undefined : peaksByRun.get(r.run)!.get(measuredKey(d.id, referenceKey(element)));
          return peak === undefined ? [] : [[d.id, { peak, live: live.get(r.run)!.get(d.id)! }] as const];
        })),
      ]),
    );
  const norm = normalize({
    config,
    referenceRuns: needsReferenceRuns ? referenceRuns : [],
    sampleRuns,
    measured: normalizingPeaks(needsReferenceRuns ? referenceRuns : []),
    sampleMeasured: normalizingPeaks(sampleRuns),
    planner,
  });
  diagnostics.push(...referenceProblems.values(), ...norm.diagnostics);

  phase('normalize');
  const ext = extract({
    config,
    sampleRuns,
    measured: peaksByRun,
    live,
    normalization: norm.rows,
    keepModels: opts.monteCarlo !== undefined,
    calibrationVersion: new Map([...cal.byRun].map(([run, c]) => [run, c.version])),
    planProblems,
    planner,
  });
  diagnostics.push(...ext.diagnostics);
  const uncertainty = seriesUncertaintyTables(config, ext.rows, ext.uncertainties, opts.monteCarlo);
  diagnostics.push(...uncertainty.diagnostics);

  phase('extract');
  const { yields, qc } = auditRows(series, setAside, results, peaksByRun, live, cal.byRun);
  const fitOut = fitTables(tasks, results, qc);
  diagnostics.push(...fitOut.diagnostics);
  for (const ds of setAside.values()) diagnostics.push(...ds);
  const runIndex = new Map(series.runs.map((r) => [r.run, r.index]));
  diagnostics.sort(byRunOrder(runIndex));

  const counts = {
    runs: series.runs.length,
    reduced: referenceRuns.length + sampleRuns.length,
    setAside: setAside.size,
    notReduced: series.runs.filter((r) => r.kind === 'calibration' || r.kind === 'background').length,
    rows: ext.rows.length,
  };
  const exitCode = setAside.size > 0 ? EXIT.someSetAside : EXIT.ok;
  const outSeriesDir = opts.outSeriesDir ?? join(resolve(opts.outDir), config.series);
  const manifest = buildManifest({
    config,
    seriesDir,
    commandLine: opts.commandLine,
    startedAt,
    metadataHashes: files.hashes,
    spectrumHashes: [...results.values()].filter((r) => r.sha256 !== '').map((r) => [series.spectrumFiles.get(r.run)!, r.sha256] as const),
    calibrationVersions: [...new Set([...cal.byRun.values()].map((c) => c.version))].sort(),
    counts,
    exitCode,
  });
  phase('audit');
  const rep = await report({
    config,
    rows: ext.rows,
    referenceElement: norm.element,
    points: norm.points,
    detectors: norm.detectors,
    yields,
    qc,
    diagnostics,
    manifest,
    html: opts.html,
    runs: series.runs,
    spectra: tasks.flatMap((t) => spectraByRun.get(t.run) ?? []),
    ...(opts.html ? { budgets: pageBudgets(ext.rows, ext.uncertainties) } : {}),
    uncertainty,
    ...(tasks.some((t) => t.fits !== undefined) ? { fits: fitOut.fits, fitResiduals: fitOut.residuals } : {}),
    ...(opts.changes !== undefined ? { changes: opts.changes } : {}),
  });
  phase('report');
  for (const f of rep.files) writeFileAtomic(join(outSeriesDir, f.name), f.bytes);
  phase('write');
  return {
    exitCode,
    series: config.series,
    outSeriesDir,
    summaryPath: opts.html ? join(outSeriesDir, 'summary.html') : undefined,
    diagnostics,
    counts,
    phasesMs,
    detail: {
      series,
      calibrationByRun: cal.byRun,
      referenceRuns: new Map([...norm.rows].map(([run, byDet]) => [run, [...new Set([...byDet.values()].flatMap((a) => a?.referenceRuns ?? []))].sort()])),
      setAside,
      spectrumSha256: new Map([...results.values()].map((r) => [r.run, r.sha256])),
      measuredRuns,
    },
  };
}

function auditRows(
  series: IngestedSeries,
  setAside: ReadonlyMap<string, Diagnostic[]>,
  results: ReadonlyMap<string, MeasureResult>,
  peaksByRun: ReadonlyMap<string, ReadonlyMap<string, MeasuredPeak>>,
  live: ReadonlyMap<string, ReadonlyMap<string, LiveFraction>>,
  calByRun: ReadonlyMap<string, { version: string; detectors: ReadonlyMap<string, EnergyCalibration> }>,
): { yields: YieldRow[]; qc: QcRow[] } {
  const yields: YieldRow[] = [];
  const qc: QcRow[] = [];
  const dets = series.config.detectors;
  for (const run of series.runs) {
    const res = results.get(run.run);
    const reasons = setAside.get(run.run);
    const calVersion = calByRun.get(run.run)?.version ?? '';
    const byDetector = new Map<string, MeasuredPeak[]>(dets.map((d) => [d.id, []]));
    if (res?.ok) for (const p of peaksByRun.get(run.run)!.values()) byDetector.get(p.request.detector)!.push(p);
    dets.forEach((d, di) => {
      const lf = live.get(run.run)?.get(d.id);
      const peaks = byDetector.get(d.id)!;
      let strongest: MeasuredPeak | undefined;
      for (const p of peaks) if (p.net !== null && (strongest === undefined || p.net.net > strongest.net!.net)) strongest = p;
      const first = reasons?.[0];
      const status: QcRow['status'] = reasons ? 'set-aside' : run.kind === 'calibration' || run.kind === 'background' ? 'not-reduced' : 'reduced';
      const where = first ? `${first.file ?? ''}${first.line !== undefined ? `:${first.line}` : ''}${first.column !== undefined ? `:${first.column}` : ''}` : '';
      qc.push({
        run: run.run,
        kind: run.kind,
        detector: d.id,
        status,
        reason: first ? `${where ? `${where}: ` : ''}${first.message}${reasons!.length > 1 ? ` (+${reasons!.length - 1} more)` : ''}` : status === 'not-reduced' ? `kind ${run.kind} is not reduced by xsred reduce` : '',
        rule: first?.rule ?? '',
        calibrationVersion: calVersion,
        liveFraction: lf?.value ?? Number.NaN,
        liveFractionUnc: lf?.unc ?? Number.NaN,
        liveSource: lf?.source ?? '',
        totalCounts: res?.ok ? res.totals[di]! : Number.NaN,
        channelCount: res?.ok ? res.channelCount : Number.NaN,
        peakShiftKeV: strongest?.shiftKeV ?? Number.NaN,
        flags: [],
      });
      if (reasons) return;
      for (const p of peaks) {
        const w = p.window;
        yields.push({
          run: run.run,
          kind: run.kind,
          detector: d.id,
          peak: p.request.key,
          expectedEnergyKeV: w.expectedEnergyKeV,
          expectedChannel: w.expectedChannel,
          calibrationEnergyUncKeV: energyUncertaintyKeV(calByRun.get(run.run)!.detectors.get(d.id)!, w.expectedChannel),
          fwhmKeV: w.fwhmKeV,
          peakLo: w.peak?.lo ?? Number.NaN,
          peakHi: w.peak?.hi ?? Number.NaN,
          leftLo: w.left?.lo ?? Number.NaN,
          leftHi: w.left?.hi ?? Number.NaN,
          rightLo: w.right?.lo ?? Number.NaN,
          rightHi: w.right?.hi ?? Number.NaN,
          grossCounts: p.net?.gross ?? Number.NaN,
          backgroundCounts: p.net?.background ?? Number.NaN,
          backgroundUnc: p.net ? Math.sqrt(p.net.backgroundVariance) : Number.NaN,
          netCounts: p.net?.net ?? Number.NaN,
          netCountsUnc: p.net ? Math.sqrt(p.net.netVariance) : Number.NaN,
          centroidShiftKeV: p.shiftKeV,
          flags: w.flags,
        });
      }
    });
  }
  return { yields, qc };
}

