import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import { seriesPeakPlanner, type SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { CrossSectionRow } from '../../pipeline/core/model/result-rows.js';
import type { EstimateCache } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import { nuclideTotals, resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { nuclide } from '../../pipeline/core/physics/nuclides.js';
import { crossSectionRowModels, type RowInput, type RowUncertainty } from './cross-section-row.js';
import { interferenceFlags, type KnownLine } from './interference-flags.js';

export { planPeakWindows, type PlannedPeak } from './plan-peak-windows.js';
export type { RowUncertainty } from './cross-section-row.js';
export { pageBudgets, seriesUncertaintyTables, type PageBudget, type SeriesUncertaintyTables } from './series-uncertainty-tables.js';

export interface ExtractInput {
  config: SeriesConfig;
  /** Usable sample runs, runlog order. */
  sampleRuns: readonly RunRecord[];
  /** Run → `${detector}\t${peak label}` → measured peak. */
  measured: ReadonlyMap<string, ReadonlyMap<string, MeasuredPeak>>;
  live: ReadonlyMap<string, ReadonlyMap<string, LiveFraction>>;
  /** Sample run → detector → the exposure model (normalize stage's `rows`). */
  normalization: ReadonlyMap<string, ReadonlyMap<string, RowNormalization | null>>;
  calibrationVersion: ReadonlyMap<string, string>;
  /** Problems found while planning (kinematically forbidden peaks): run → `${detector}\t${label}` → reason. */
  planProblems: ReadonlyMap<string, ReadonlyMap<string, string>>;
  /** The series' peak planner (shared with measuring); default: a new one for the config. */
  planner?: SeriesPeakPlanner;
  /** Keep every row's value models in `uncertainties` (needed for Monte Carlo); default true. */
  keepModels?: boolean;
}

export interface ExtractOutput {
  rows: CrossSectionRow[];
  /** Per row (same order): its value models and first-order budgets. */
  uncertainties: RowUncertainty[];
  diagnostics: Diagnostic[];
}

export const measuredKey = (detector: string, peak: string) => `${detector}\t${peak}`;

/**
 * extract: for each sample run × detector × configured peak of a nuclide in the run's target,
 * dσ/dΩ (lab, CM), σ/σ_R and their statistical and systematic uncertainties.
 */
export function extract(input: ExtractInput): ExtractOutput {
  const { config } = input;
  const planner = input.planner ?? seriesPeakPlanner(config);
  const projectile = nuclide(config.beam.projectile);
  const rows: CrossSectionRow[] = [];
  const uncertainties: RowUncertainty[] = [];
  const push = (r: { row: CrossSectionRow; uncertainty: RowUncertainty }) => {
    rows.push(r.row);
    uncertainties.push(r.uncertainty);
  };
  // One cache per series: a normalization part shared by many rows is differentiated once.
  const cache: EstimateCache = new WeakMap();
  const diagnostics: Diagnostic[] = [];
  // One warning per peak (with its first case), not one per run × detector.
  const problems = new Map<string, { count: number; first: Diagnostic }>();
  // Per target, once: each nuclide's expected strength, atoms/cm² × Z² (the Rutherford scaling).
  const strengthByTarget = new Map(
    config.targets.map((t) => [t.id, new Map([...nuclideTotals(resolveTarget(t))].map(([n, tot]) => [n, tot.atomsPerCm2 * nuclide(n).z ** 2]))] as const),
  );
  const targets = new Map(config.targets.map((t) => [t.id, t]));
  const linesByPlan = new WeakMap<object, KnownLine[]>();
  const keepModels = input.keepModels !== false;
  for (const run of input.sampleRuns) {
    const target = targets.get(run.target)!;
    const strength = strengthByTarget.get(run.target)!;
    for (const det of config.detectors) {
      const plan = planner.samplePeaks(target, det, run.beamEnergyKeV);
      if (plan.peaks.length === 0 && plan.problems.size === 0) continue;
      // Every peak this spectrum is expected to hold: each nuclide's elastic peak and the configured peaks.
      // The plans are memoized per energy, so the lines are built once per plan, not per run.
      let lines = linesByPlan.get(plan);
      if (lines === undefined) {
        lines = planner.elasticPeaks(target, det, run.beamEnergyKeV).peaks.map((p) => ({ name: p.key, energyKeV: p.detectedEnergyKeV, strength: strength.get(p.reaction.target.name)! }));
        for (const p of plan.peaks) if (!p.reaction.elastic) lines.push({ name: p.key, energyKeV: p.detectedEnergyKeV, strength: Number.POSITIVE_INFINITY });
        linesByPlan.set(plan, lines);
      }
      const runProblems = input.planProblems.get(run.run);
      for (const peak of config.peaks) {
        const planned = plan.peaks.filter((p) => p.label === peak.label);
        const problem = plan.problems.get(peak.label) ?? runProblems?.get(measuredKey(det.id, peak.label));
        if (planned.length === 0 && problem === undefined) continue;
        if (problem !== undefined) {
          const seen = problems.get(peak.label);
          if (seen) seen.count++;
          else problems.set(peak.label, { count: 1, first: { severity: 'warning', rule: 'peak-kinematics', stage: 'extract', run: run.run, detector: det.id, message: `peak "${peak.label}": ${problem}` } });
        }
        const live = input.live.get(run.run)?.get(det.id) ?? { value: 1, unc: 0, source: 'none' as const };
        const normalization = input.normalization.get(run.run)?.get(det.id) ?? null;
        const calibrationVersion = input.calibrationVersion.get(run.run) ?? '';
        // One row input per row, as a literal of fixed shape (a spread of a shared object per row is slow).
        const rowInput = (planned: RowInput['planned'], key: string, measured: RowInput['measured'], extraFlags: string[]): RowInput => ({
          config,
          projectile,
          run,
          detector: det,
          peak,
          live,
          normalization,
          calibrationVersion,
          planner,
          cache,
          keepModels,
          planned,
          key,
          measured,
          extraFlags,
        });
        if (planned.length === 0) {
          push(crossSectionRowModels(rowInput(null, peak.label, null, live.source === 'none' ? ['no-live-time'] : [])));
          continue;
        }
        for (const p of planned) {
          const measured = input.measured.get(run.run)?.get(measuredKey(det.id, p.key)) ?? null;
          const own = p.reaction.elastic && !p.reaction.detectsRecoil && p.branch === 'single' ? `${peak.target_nuclide} elastic` : p.key;
          const extraFlags = measured ? interferenceFlags(measured.window, own, strength.get(peak.target_nuclide)!, lines) : [];
          if (live.source === 'none') extraFlags.push('no-live-time');
          const shiftTol = config.extract.shift_tolerance_fwhm * p.fwhmKeV;
          if (measured && measured.net && Number.isFinite(measured.shiftKeV) && Math.abs(measured.shiftKeV) > shiftTol && measured.net.net > 5 * Math.sqrt(measured.net.netVariance)) {
            extraFlags.push('peak-shifted');
          }
          push(crossSectionRowModels(rowInput(p, p.key, measured, extraFlags)));
        }
      }
    }
  }
  for (const { count, first } of problems.values()) {
    diagnostics.push(count === 1 ? first : { ...first, message: `${first.message}; the same in ${count - 1} more run × detector combination${count === 2 ? '' : 's'} (their rows carry no value and a flag)` });
  }
  return { rows, uncertainties, diagnostics };
}
