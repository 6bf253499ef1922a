import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { DetectorConfig, SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { ReferencePoint } from '../../pipeline/core/model/result-rows.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import { resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import { absoluteExposure } from './absolute.js';
import { internalReferenceExposure } from './internal-reference.js';
import { monitorExposure } from './monitor.js';
import { plannedNormalizingNuclides } from './planned-normalizing-nuclides.js';
import { runRelUnc } from './reference-point.js';
import { prepareReferenceRule, referenceRunExposure, type RuleChoice } from './reference-rule.js';
import { referenceSolidAngleModel, type SharedUncertainties } from './reference-solid-angle-model.js';
import { referenceSpread } from './reference-spread.js';

export interface SampleNormalizationsInput {
  config: SeriesConfig;
  planner: SeriesPeakPlanner;
  /** The normalizing element ('' for absolute). */
  element: string;
  sampleRuns: readonly RunRecord[];
  /** Sample run → detector → the normalizing element's peak in the sample spectrum (internal-reference, monitor). */
  sampleMeasured?: ReadonlyMap<string, ReadonlyMap<string, { peak: MeasuredPeak; live: LiveFraction }>> | undefined;
  /** Detector → its reference points (reference-run, monitor). */
  points: ReadonlyMap<string, readonly ReferencePoint[]>;
  referenceRuns?: readonly RunRecord[];
}

export interface SampleNormalizations {
  rows: Map<string, Map<string, RowNormalization | null>>;
  /** Detector → reference run → ΔΩ_k model (reference-run, monitor). */
  solidAngles: Map<string, Map<string, MeasurementModel>>;
  /** Detector → relative spread of its reference runs beyond their own uncertainties (DerSimonian & Laird 1986). */
  spreadRel: Map<string, number>;
  diagnostics: Diagnostic[];
}

/**
 * The exposure model L of every sample run × detector for the configured method
 * (README, "Normalization methods and uncertainties"): reference-run (the reference rule over each
 * detector's ΔΩ_k models), monitor (the monitor's reference-element yield in the run × the
 * detector's solid angle relative to the monitor from the reference runs), internal-reference
 * (the role: reference layer's yield in the same spectrum) or absolute (charge × nominal solid
 * angle). A row that cannot be normalized gets null, and one warning per detector and cause says why.
 */
export function sampleNormalizations(x: SampleNormalizationsInput): SampleNormalizations {
  const { config, planner } = x;
  const n = config.normalization;
  const shared: SharedUncertainties = { series: config.series, chargeUncRel: n.charge_unc_rel, screeningUncFrac: n.screening_unc_frac };
  const problems = new Map<string, { d: Diagnostic; count: number }>();
  const problem = (rule: string, run: RunRecord, det: string, message: string, hint?: string) => {
    const key = `${rule}\u0000${det}`;
    const seen = problems.get(key);
    if (seen) seen.count++;
    else problems.set(key, { d: { severity: 'warning', rule, stage: 'normalize', run: run.run, detector: det, message, ...(hint ? { hint } : {}) }, count: 1 });
    return null;
  };
  const solidAngles = new Map<string, Map<string, MeasurementModel>>();
  const spreadRel = new Map<string, number>();
  const rules = new Map<string, (s: RunRecord) => RuleChoice | null>();
  if (n.method === 'reference-run' || n.method === 'monitor') {
    const refTarget = config.targets.find((t) => t.id === n.reference_target)!;
    const runs = new Map((x.referenceRuns ?? []).map((r) => [r.run, r]));
    for (const det of config.detectors) {
      const usable = (x.points.get(det.id) ?? []).filter((p) => p.solidAngleMsr !== null);
      const spread = usable.length > 1 ? referenceSpread(usable.map((p) => p.solidAngleMsr!), usable.map((p) => Math.max(runRelUnc(p), 1e-12) * p.solidAngleMsr!)).tauRel : 0;
      spreadRel.set(det.id, spread);
      const models = new Map<string, MeasurementModel>();
      for (const p of usable) {
        const run = runs.get(p.run)!;
        const plan = planner.referencePeaks(refTarget, x.element, det, run.beamEnergyKeV);
        const planned = plannedNormalizingNuclides(config, planner, refTarget, plan, det, true);
        if (!planned.ok) continue;
        const live: LiveFraction = { value: p.liveFraction, unc: p.liveFractionUnc, source: 'live-time' };
        const m = { run: p.run, detector: det.id, startedAtMs: p.startedAtMs, chargeUC: run.chargeUC, chargeState: config.beam.charge_state, netCounts: p.netCounts, netCountsUnc: p.netCountsUnc, live, beamEnergyUncKeV: run.beamEnergyUncKeV, angleUncDeg: det.angle_unc_deg, nuclides: planned.nuclides };
        models.set(p.run, referenceSolidAngleModel(m, shared, spread));
      }
      solidAngles.set(det.id, models);
    }
    const monitorRuns = n.method === 'monitor' ? new Set(solidAngles.get(n.monitor_detector!)?.keys() ?? []) : null;
    for (const det of config.detectors) {
      const models = solidAngles.get(det.id)!;
      // A point normalizes only where its model exists (and, for monitor, where the monitor's does too).
      const points = (x.points.get(det.id) ?? []).filter((p) => models.has(p.run) && (monitorRuns === null || monitorRuns.has(p.run)));
      rules.set(det.id, prepareReferenceRule(n.reference_rule, points));
    }
  }
  const detById = new Map(config.detectors.map((d) => [d.id, d]));
  const targets = new Map(config.targets.map((t) => [t.id, t]));
  const rows = new Map<string, Map<string, RowNormalization | null>>();
  for (const run of x.sampleRuns) {
    const per = new Map<string, RowNormalization | null>();
    const target = targets.get(run.target)!;
    const measuredHere = x.sampleMeasured?.get(run.run);
    const inSample = (det: DetectorConfig, what: string) => {
      const m = measuredHere?.get(det.id);
      if (m === undefined || m.peak.net === null) return problem(`${what}-not-measured`, run, det.id, `the ${x.element} peak could not be measured in sample run ${run.run}, detector ${det.id}: its rows have no normalization`);
      if (!(m.peak.net.net > 0)) return problem(`${what}-net-not-positive`, run, det.id, `the ${x.element} peak of sample run ${run.run}, detector ${det.id} has ${m.peak.net.net.toFixed(1)} net counts: its rows have no normalization`, 'check the reference layer and the peak window');
      const plan = planner.referencePeaks(target, x.element, det, run.beamEnergyKeV);
      const planned = plannedNormalizingNuclides(config, planner, target, plan, det, false);
      if (!planned.ok) return problem(`${what}-not-planned`, run, det.id, `the ${x.element} peak of target ${target.id} in detector ${det.id}: ${planned.reason}`);
      return { peak: m.peak.net, live: m.live, nuclides: planned.nuclides };
    };
    for (const det of config.detectors) {
      let row: RowNormalization | null = null;
      if (n.method === 'absolute') {
        row = absoluteExposure({ run, chargeState: config.beam.charge_state, detector: det.id, solidAngleMsr: det.solid_angle_msr, solidAngleUncRel: n.solid_angle_unc_rel, shared });
      } else if (n.method === 'internal-reference') {
        const layers = resolveTarget(target).filter((r) => r.element === x.element);
        if (layers.length === 0 || layers.some((r) => target.layers[r.layer]!.role !== 'reference')) {
          row = problem('internal-reference-layer', run, det.id, layers.length === 0 ? `sample target ${target.id} holds no ${x.element}: its rows have no normalization` : `sample target ${target.id} holds ${x.element} outside its role: reference layer, so the reference peak would count both`, 'mark the thin reference layer role: reference and keep its element out of the other layers');
        } else {
          const m = inSample(det, 'internal-reference');
          if (m !== null) row = internalReferenceExposure({ run, detector: det.id, angleUncDeg: det.angle_unc_deg, referencePeak: m.peak, live: m.live, nuclides: m.nuclides, shared });
        }
      } else {
        const choice = rules.get(det.id)!(run);
        // reference-run: a detector without usable reference runs is reported once by normalize (normalization-missing).
        if (choice === null) {
          if (n.method === 'monitor') row = problem('monitor-reference-missing', run, det.id, `no reference run with usable peaks in both detector ${det.id} and monitor ${n.monitor_detector}: the relative solid angle, and so the rows of ${det.id}, cannot be normalized`);
        } else if (n.method === 'reference-run') {
          row = referenceRunExposure(run, config.beam.charge_state, choice, solidAngles.get(det.id)!, shared);
        } else {
          const monDet = detById.get(n.monitor_detector!)!;
          const m = inSample(monDet, 'monitor-peak');
          if (m !== null) {
            row = monitorExposure({
              run,
              detector: det.id,
              monitor: { detector: monDet.id, angleUncDeg: monDet.angle_unc_deg, peak: m.peak, live: m.live, nuclides: m.nuclides },
              choice,
              detectorSolidAngles: solidAngles.get(det.id)!,
              monitorSolidAngles: solidAngles.get(monDet.id)!,
              shared,
            });
          }
        }
      }
      per.set(det.id, row);
    }
    rows.set(run.run, per);
  }
  const diagnostics = [...problems.values()].map(({ d, count }) => (count === 1 ? d : { ...d, message: `${d.message}; the same in ${count - 1} more sample run${count === 2 ? '' : 's'}` }));
  return { rows, solidAngles, spreadRel, diagnostics };
}
