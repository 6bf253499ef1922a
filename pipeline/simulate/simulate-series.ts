import { existsSync, mkdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { calibrationYamlText } from './calibration-yaml-text.js';
import { damageSpectrumCsv, SPECTRUM_DEFECTS, type SpectrumDefectKind } from './damage-spectrum-csv.js';
import { encodeSpectrumCsv } from './encode-spectrum-csv.js';
import { RUNLOG_HEADER, runlogLine } from './runlog-csv-text.js';
import { scalersCsvText } from './scalers-csv-text.js';
import { scheduleRuns } from './schedule-runs.js';
import { seriesYamlText } from './series-yaml-text.js';
import { simulateRun, type ScalerReading } from './simulate-run.js';
import { simulationContext } from './simulation-context.js';
import { simulationSpecSchema, type SimulationSpecInput } from './simulation-spec.js';
import { truthCsvText, type TruthRow } from './truth-table.js';
import { insertCalibrationRuns } from './insert-calibration-runs.js';
import { calibrationRunlogLine, simulateCalibrationRun } from './simulate-calibration-run.js';
import { withGainDrift } from './with-gain-drift.js';

export interface SimulationResult {
  /** `<outDir>/<series>`. */
  seriesDir: string;
  truth: TruthRow[];
  /** Warnings about peaks that could not be generated or fall outside a spectrum. */
  diagnostics: Diagnostic[];
}

/**
 * Writes a run series in the DESIGN.md layout from a simulation spec, plus truth.csv beside
 * series.yaml. The spec is validated (and defaulted) first; an invalid one throws the ZodError
 * (use runSimulateCommand for diagnostics with file positions). Files are built in a hidden
 * sibling folder and renamed into place at the end; an existing `<outDir>/<series>` is replaced
 * only if it holds a truth.csv (an earlier simulation), else this throws and leaves it alone.
 * Same spec and seed give byte-identical files.
 */
export function simulateSeries(specInput: SimulationSpecInput, outDir: string): SimulationResult {
  const spec = simulationSpecSchema.parse(specInput);
  const seriesDir = join(outDir, spec.series);
  if (existsSync(seriesDir) && !existsSync(join(seriesDir, 'truth.csv'))) {
    throw new Error(`${seriesDir} exists and is not a simulated series (no truth.csv); not overwriting it`);
  }
  const partial = join(outDir, `.${spec.series}.partial-${process.pid}`);
  rmSync(partial, { recursive: true, force: true });
  mkdirSync(join(partial, 'spectra'), { recursive: true });
  mkdirSync(join(partial, 'calibrations'), { recursive: true });
  try {
    const scheduled = insertCalibrationRuns(spec, scheduleRuns(spec));
    writeFileSync(join(partial, 'series.yaml'), seriesYamlText(spec));
    // Each version holds from the first run generated with it to the last (calibration runs included).
    spec.calibrations.forEach((c, i) => {
      const own = scheduled.filter((s) => s.run.calibration === i);
      const next = spec.calibrations[i + 1];
      const text = calibrationYamlText(c, own[0]!.run.run, next === undefined ? undefined : own[own.length - 1]!.run.run);
      writeFileSync(join(partial, 'calibrations', `${c.version}.yaml`), text);
    });
    const drifted = withGainDrift(spec, scheduled);
    const ctx = simulationContext(drifted.spec);
    const detectorIds = spec.detectors.map((d) => d.id);
    const targetIds = new Set(spec.targets.map((t) => t.id));
    let unlistedTarget = 'unlisted-target';
    while (targetIds.has(unlistedTarget)) unlistedTarget += '-x';
    const runlog = [RUNLOG_HEADER];
    const scalerRows: { run: string; detector: string; reading: ScalerReading }[] = [];
    const truth: TruthRow[] = [];
    for (const { run, planIndex } of drifted.runs) {
      if (run.kind === 'calibration') {
        runlog.push(calibrationRunlogLine(run));
        writeFileSync(join(partial, 'spectra', `${run.run}.csv`), encodeSpectrumCsv(detectorIds, simulateCalibrationRun(drifted.spec, run)));
        continue;
      }
      const defects = spec.defects.filter((d) => d.run_index === planIndex);
      const kinds = new Set(defects.map((d) => d.kind));
      const simulated = simulateRun(ctx, run, [...kinds].join(';'));
      truth.push(...simulated.truth);
      runlog.push(runlogLine(run, kinds.has('unknown-target') ? unlistedTarget : run.target, spec.beam_energy_unc_keV, spec.charge.charge_reading_factor));
      if (!kinds.has('missing-scalers')) {
        detectorIds.forEach((detector, di) => scalerRows.push({ run: run.run, detector, reading: simulated.scalers[di]! }));
      }
      if (kinds.has('missing-spectrum')) continue;
      const bytes = encodeSpectrumCsv(detectorIds, simulated.counts);
      const damage = defects.filter((d): d is typeof d & { kind: SpectrumDefectKind } => (SPECTRUM_DEFECTS as readonly string[]).includes(d.kind));
      if (damage.length === 0) {
        writeFileSync(join(partial, 'spectra', `${run.run}.csv`), bytes);
      } else {
        let text = bytes.toString('ascii');
        for (const d of damage) text = damageSpectrumCsv(text, d.kind, 1 + Math.max(0, detectorIds.indexOf(d.detector ?? detectorIds[0]!)));
        writeFileSync(join(partial, 'spectra', `${run.run}.csv`), text, 'ascii');
      }
    }
    writeFileSync(join(partial, 'runlog.csv'), `${runlog.join('\n')}\n`);
    writeFileSync(join(partial, 'scalers.csv'), scalersCsvText(scalerRows));
    writeFileSync(join(partial, 'truth.csv'), truthCsvText(truth));
    rmSync(seriesDir, { recursive: true, force: true });
    renameSync(partial, seriesDir);
    return { seriesDir, truth, diagnostics: ctx.diagnostics };
  } finally {
    rmSync(partial, { recursive: true, force: true });
  }
}
