import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { nuclide } from '../../pipeline/core/physics/nuclides.js';
import { prepareBracketing } from './apply-bracketing.js';
import type { AppliedNormalization, DetectorNormalization, ReferencePoint } from '../../pipeline/core/model/result-rows.js';
import { referenceComposition } from './reference-nuclides.js';
import { NON_RUTHERFORD_FLAG, referencePoint, runRelUnc } from './reference-point.js';
import { seriesPeakPlanner, type SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import { onsetEnergyKeV } from '../../pipeline/core/physics/non-rutherford-onset.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import { sampleNormalizations } from './sample-normalizations.js';
import { normalizingElement } from './normalizing-element.js';

export { planReferenceWindow, referenceKey, type ReferenceWindowPlan } from './plan-reference-window.js';
export { referenceComposition, type ReferenceComposition } from './reference-nuclides.js';
export { normalizingElement } from './normalizing-element.js';
export { planNormalizingWindows, type NormalizingWindows } from './plan-normalizing-windows.js';

export interface NormalizeInput {
  config: SeriesConfig;
  /** Usable reference runs, runlog order. */
  referenceRuns: readonly RunRecord[];
  /** Usable sample runs. */
  sampleRuns: readonly RunRecord[];
  /** Reference run → detector → the measured reference peak and the live fraction. */
  measured: ReadonlyMap<string, ReadonlyMap<string, { peak: MeasuredPeak; live: LiveFraction }>>;
  /**
   * Sample run → detector → the normalizing element's peak measured in the sample spectrum and
   * the live fraction (internal-reference: every detector; monitor: the monitor detector).
   */
  sampleMeasured?: ReadonlyMap<string, ReadonlyMap<string, { peak: MeasuredPeak; live: LiveFraction }>>;
  /** The series' peak planner (shared with measuring); default: a new one for the config. */
  planner?: SeriesPeakPlanner;
}

export interface NormalizeOutput {
  /** The normalizing element ('' for absolute). */
  element: string;
  points: ReferencePoint[];
  detectors: DetectorNormalization[];
  /** Sample run → detector → the bracketing summary (reference-run method with rule bracketing; empty otherwise). */
  applied: Map<string, Map<string, AppliedNormalization | null>>;
  /** Sample run → detector → the exposure model of the configured method (null: that row cannot be normalized). */
  rows: Map<string, Map<string, RowNormalization | null>>;
  diagnostics: Diagnostic[];
}

/**
 * normalize: with reference runs (methods reference-run and monitor) each reference run ×
 * detector gives an effective solid angle from the Rutherford yield of the reference element;
 * reference runs of a detector that disagree beyond their uncertainties, or an effective solid
 * angle far from the nominal one, are flagged. Each sample run × detector then gets the
 * exposure model of the configured method (sample-normalizations.ts; README, "Normalization methods and uncertainties").
 */
export function normalize(input: NormalizeInput): NormalizeOutput {
  const { config } = input;
  const planner = input.planner ?? seriesPeakPlanner(config);
  const method = config.normalization.method;
  if (method === 'internal-reference' || method === 'absolute') {
    const element = normalizingElement(config) ?? '';
    const detectors = config.detectors.map((d) => ({ detector: d.id, nominalMsr: d.solid_angle_msr, meanMsr: null, chi2: 0, ndf: 0 }));
    const s = sampleNormalizations({ config, planner, element, sampleRuns: input.sampleRuns, sampleMeasured: input.sampleMeasured, points: new Map() });
    return { element, points: [], detectors, applied: new Map(), rows: s.rows, diagnostics: s.diagnostics };
  }
  const projectile = nuclide(config.beam.projectile);
  const ref = referenceComposition(config);
  const diagnostics: Diagnostic[] = [];
  const points: ReferencePoint[] = [];
  const detectors: DetectorNormalization[] = [];
  const byDetector = new Map<string, ReferencePoint[]>();
  const refTarget = config.targets.find((t) => t.id === config.normalization.reference_target)!;
  const aboveOnset: ReferencePoint[] = [];
  for (const det of config.detectors) {
    const list: ReferencePoint[] = [];
    for (const run of input.referenceRuns) {
      const m = input.measured.get(run.run)?.get(det.id);
      if (m === undefined) continue;
      const plan = planner.referencePeaks(refTarget, ref.element, det, run.beamEnergyKeV);
      const p = referencePoint(config, projectile, ref, planner, plan, run, det, m.peak, m.live);
      if (p.flags.includes(NON_RUTHERFORD_FLAG)) aboveOnset.push(p);
      if (p.solidAngleMsr === null) {
        diagnostics.push({ severity: 'warning', rule: 'reference-unusable', stage: 'normalize', run: run.run, detector: det.id, message: `reference peak of ${ref.element} could not be used (${p.flags.join(', ')}); this run does not normalize detector ${det.id}` });
      }
      list.push(p);
    }
    const usable = list.filter((p) => p.solidAngleMsr !== null);
    let meanMsr: number | null = null;
    let chi2 = 0;
    if (usable.length > 0) {
      const w = usable.map((p) => 1 / (runRelUnc(p) * p.solidAngleMsr!) ** 2);
      const finite = w.every((x) => Number.isFinite(x));
      const weights = finite ? w : usable.map(() => 1);
      const sw = weights.reduce((a, b) => a + b, 0);
      meanMsr = usable.reduce((s, p, i) => s + weights[i]! * p.solidAngleMsr!, 0) / sw;
      for (const p of usable) {
        const sigma = runRelUnc(p) * p.solidAngleMsr!;
        const pull = sigma > 0 ? (p.solidAngleMsr! - meanMsr) / sigma : 0;
        chi2 += pull * pull;
        if (usable.length > 1 && Math.abs(pull) > config.normalization.outlier_pull) {
          p.flags.push('reference-outlier');
          diagnostics.push({ severity: 'warning', rule: 'reference-outlier', stage: 'normalize', run: p.run, detector: det.id, message: `effective solid angle ${p.solidAngleMsr!.toPrecision(4)} msr is ${pull.toFixed(1)} standard deviations from the detector's mean ${meanMsr.toPrecision(4)} msr`, hint: 'check this run\'s charge, live time and beam energy' });
        }
      }
      // Geometry is a property of the detector: compare its mean, not each noisy run, with the nominal value.
      const dev = meanMsr / det.solid_angle_msr - 1;
      if (Math.abs(dev) > config.normalization.nominal_tolerance_rel) {
        for (const p of usable) p.flags.push('solid-angle-off-nominal');
        diagnostics.push({ severity: 'warning', rule: 'solid-angle-off-nominal', stage: 'normalize', detector: det.id, message: `effective solid angle of detector ${det.id}, ${meanMsr.toPrecision(4)} msr (mean of ${usable.length} reference run${usable.length === 1 ? '' : 's'}), differs from the nominal ${det.solid_angle_msr} msr by ${(dev * 100).toFixed(1)} %`, expected: `within ±${config.normalization.nominal_tolerance_rel * 100} % of nominal`, hint: 'check the detector geometry in series.yaml, the charge integration and the reference film' });
      }
    } else {
      diagnostics.push({ severity: 'error', rule: 'normalization-missing', stage: 'normalize', detector: det.id, message: `no usable reference run for detector ${det.id}: its sample rows cannot be normalized` });
    }
    detectors.push({ detector: det.id, nominalMsr: det.solid_angle_msr, meanMsr, chi2, ndf: Math.max(usable.length - 1, 0) });
    byDetector.set(det.id, list);
    points.push(...list);
  }
  if (aboveOnset.length > 0) {
    const first = aboveOnset[0]!;
    const onsets = ref.nuclides.map((n) => onsetEnergyKeV(projectile, n.nuclide)).filter((o) => o.ok);
    const onset = onsets.length > 0 ? Math.min(...onsets.map((o) => o.energyKeV)) : Number.NaN;
    diagnostics.push({
      severity: 'warning',
      rule: NON_RUTHERFORD_FLAG,
      stage: 'normalize',
      run: first.run,
      detector: first.detector,
      message: `reference run energy ${first.reactionEnergyKeV.toFixed(0)} keV is above the onset of non-Rutherford elastic scattering of ${projectile.name} on ${ref.element} (${onset.toFixed(0)} keV, ${onsets[0]?.ok ? onsets[0].formula : ''}; ${onsets[0]?.ok ? onsets[0].source : ''}) in ${aboveOnset.length} reference point${aboveOnset.length === 1 ? '' : 's'}: the normalization assumes a Rutherford yield and would be wrong`,
      hint: 'use a heavier reference element or a lower reference beam energy; the rows it normalizes carry the flag',
    });
  }
  const applied = new Map<string, Map<string, AppliedNormalization | null>>();
  if (method === 'reference-run' && config.normalization.reference_rule === 'bracketing') {
    const rules = new Map(config.detectors.map((d) => [d.id, prepareBracketing(byDetector.get(d.id) ?? [])]));
    for (const s of input.sampleRuns) {
      const per = new Map<string, AppliedNormalization | null>();
      for (const det of config.detectors) per.set(det.id, rules.get(det.id)!(s));
      applied.set(s.run, per);
    }
  }
  const s = sampleNormalizations({ config, planner, element: ref.element, sampleRuns: input.sampleRuns, sampleMeasured: input.sampleMeasured, points: byDetector, referenceRuns: input.referenceRuns });
  diagnostics.push(...s.diagnostics);
  return { element: ref.element, points, detectors, applied, rows: s.rows, diagnostics };
}
