// Cross section from the thin-target yield equation Y = N_beam n (dσ/dΩ) ΔΩ f: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 3.4; uncertainties by JCGM 100:2008 §5.1.2.
import type { DetectorConfig, PeakConfig, SeriesConfig, TargetConfig } from '../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { PlannedPeakGeometry } from '../../pipeline/core/kinematics/plan-target-peaks.js';
import { rutherfordForPeak } from '../../pipeline/core/kinematics/rutherford-for-peak.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { CrossSectionRow } from '../../pipeline/core/model/result-rows.js';
import { resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { EstimateCache, MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import { layerThickness, type LayerAtoms } from '../../pipeline/core/normalization/shared-inputs.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';
import type { UncertaintyComponent } from '../../pipeline/core/uncertainty/uncertainty-component.js';
import { crossSectionLabModel, ratioToRutherfordModel, rowBudget, type RowBudget } from './row-budget.js';

export interface RowInput {
  config: SeriesConfig;
  projectile: Nuclide;
  run: RunRecord;
  detector: DetectorConfig;
  peak: PeakConfig;
  /** Where the planner put the peak; null when it cannot be seen (the row then has no value). */
  planned: PlannedPeakGeometry | null;
  /** Row key: the peak label, with the kinematic branch where there are two. */
  key: string;
  planner: SeriesPeakPlanner;
  measured: MeasuredPeak | null;
  live: LiveFraction;
  /** The exposure model of this run × detector (normalize stage), null when it cannot be normalized. */
  normalization: RowNormalization | null;
  calibrationVersion: string;
  extraFlags: string[];
  /** Shared by every row of a series, so each normalization part is differentiated once. */
  cache?: EstimateCache;
  /** Keep the row's models (for Monte Carlo); default true. */
  keepModels?: boolean;
}

/** A row's models (null unless kept) and first-order budgets (the whole entry null where the row has no value). */
export interface RowUncertainty {
  lab: { model: MeasurementModel | null; budget: RowBudget } | null;
  ratio: { model: MeasurementModel | null; budget: RowBudget } | null;
}

const NaN_ = Number.NaN;

/**
 * The cross section of one sample run × detector × peak, for every normalization method:
 *
 *   dσ/dΩ_lab = (G − B) / (f · Σ_l n_l t_l · L)   (L the method's exposure, sr)
 *   dσ/dΩ_cm  = dσ/dΩ_lab · dΩ_lab/dΩ_cm   (relativistic Jacobian of the detected particle)
 *   σ/σ_R     = dσ/dΩ_lab / (σ_R,lab(E, θ) · F_screen)   (elastic peaks, rutherford-for-peak.ts)
 *
 * quoted at the reaction energy E (beam energy, or mid-depth of the nuclide's layer with energy
 * loss). Value and budget come from one model (row-budget.ts) evaluated on dual numbers: every
 * input's contribution is c·u(x) with exact c, paths of one quantity added (so the charge cancels
 * under reference-run, charge and live time under internal-reference). Columns: stat = √Σ of the
 * uncorrelated components (counting, background), sys = √Σ of the shared ones (run, detector and
 * series classes: normalization, live time, areal densities, angle, energy, screening); CM values
 * scale by the Jacobian. G counts with u = √G; B with u² = var(N) − G (the side-window
 * background variance, or what a fit adds beyond the counts).
 */
export function crossSectionRowModels(x: RowInput): { row: CrossSectionRow; uncertainty: RowUncertainty } {
  const { config, run, detector, peak, measured, live, normalization } = x;
  const flags = x.extraFlags.slice();
  if (measured !== null) for (const f of measured.window.flags) flags.push(f);
  if (normalization !== null) for (const f of normalization.flags) flags.push(f);
  const k = x.planned;
  if (k === null) flags.push('kinematically-forbidden');
  if (k !== null && k.branch !== 'single') flags.push(`kinematic-branch-${k.branch}`);
  const reactionEnergy = k?.reactionEnergyKeV ?? run.beamEnergyKeV;
  let rutherford: { sigmaMbPerSr: number; screeningFactor: number; dLnSigmaDEnergyPerKeV: number; dLnSigmaDThetaPerDeg: number } | null = null;
  if (k !== null && k.reaction.elastic) {
    const r = rutherfordForPeak(k.reaction, x.planner.kinematicsFor(k.reaction), k.branch, reactionEnergy, detector.angle_deg, config.normalization.screening);
    if (!r.ok) flags.push(r.flag);
    else rutherford = r.value;
  }
  const nuclideAtoms = k?.atomsPerCm2 ?? NaN_;
  const net = measured?.net ?? null;
  if (measured !== null && net === null) flags.push('peak-not-measured');
  if (net !== null && !(net.net > 0)) flags.push('net-not-positive');
  if (normalization === null) flags.push('no-normalization');
  const uncertainty: RowUncertainty = { lab: null, ratio: null };
  if (net !== null && normalization !== null && k !== null) {
    const target = config.targets.find((t) => t.id === run.target)!;
    const sampleLayers = nuclideLayers(target, peak.target_nuclide);
    const model = crossSectionLabModel({
      run: run.run,
      detector: detector.id,
      gross: net.gross,
      background: net.gross - net.net,
      backgroundVariance: Math.max(net.netVariance - net.gross, 0),
      live,
      sampleLayers,
      normalization,
    });
    const keep = x.keepModels !== false;
    uncertainty.lab = { model: keep ? model : null, budget: rowBudget(model, x.cache) };
    if (rutherford !== null) {
      const ratio = ratioToRutherfordModel(model, {
        run: run.run,
        beamEnergyUncKeV: run.beamEnergyUncKeV,
        detector: detector.id,
        angleUncDeg: detector.angle_unc_deg,
        series: config.series,
        screeningUncFrac: config.normalization.screening_unc_frac,
        rutherford,
      });
      uncertainty.ratio = { model: keep ? ratio : null, budget: rowBudget(ratio, x.cache) };
      x.cache?.delete(ratio);
    }
    // A row's own models are no part of another row: their derivative terms need not be kept.
    x.cache?.delete(model);
  }
  const lab = uncertainty.lab?.budget;
  const ratio = uncertainty.ratio?.budget;
  const j = k?.jacobianLabPerCm ?? NaN_;
  const labValue = lab?.value ?? NaN_;
  const row: CrossSectionRow = {
    run: run.run,
    detector: detector.id,
    peak: x.key,
    target: run.target,
    targetNuclide: peak.target_nuclide,
    beamEnergyKeV: run.beamEnergyKeV,
    beamEnergyUncKeV: run.beamEnergyUncKeV,
    reactionEnergyKeV: k?.reactionEnergyKeV ?? NaN_,
    reactionEnergySpreadKeV: k?.reactionEnergySpreadKeV ?? NaN_,
    detectedNuclide: k?.reaction.detected.name ?? '',
    angleLabDeg: detector.angle_deg,
    angleLabUncDeg: detector.angle_unc_deg,
    angleCmDeg: k?.thetaCmDeg ?? NaN_,
    peakEnergyKeV: k?.emittedEnergyKeV ?? NaN_,
    detectedEnergyKeV: k?.detectedEnergyKeV ?? NaN_,
    qValueKeV: k?.reaction.qValueKeV ?? NaN_,
    grossCounts: net?.gross ?? NaN_,
    backgroundCounts: net?.background ?? NaN_,
    netCounts: net?.net ?? NaN_,
    netCountsUnc: net ? Math.sqrt(net.netVariance) : NaN_,
    liveFraction: live.value,
    liveFractionUnc: live.unc,
    chargeUC: run.chargeUC,
    nuclideArealDensity1e15PerCm2: nuclideAtoms / 1e15,
    solidAngleMsr: normalization?.solidAngleMsr ?? NaN_,
    normalizationCountingRelUnc: lab ? normalizationCountingRel(lab.components, `${run.run}/${detector.id}`, labValue) : NaN_,
    referenceRuns: normalization ? normalization.referenceRuns.join('+') : '',
    crossSectionLabMbPerSr: labValue,
    crossSectionLabStatMbPerSr: lab?.stat ?? NaN_,
    crossSectionLabSysMbPerSr: lab?.sys ?? NaN_,
    jacobianLabPerCm: j,
    crossSectionCmMbPerSr: labValue * j,
    crossSectionCmStatMbPerSr: (lab?.stat ?? NaN_) * j,
    crossSectionCmSysMbPerSr: (lab?.sys ?? NaN_) * j,
    rutherfordLabMbPerSr: rutherford?.sigmaMbPerSr ?? NaN_,
    screeningFactor: rutherford?.screeningFactor ?? NaN_,
    screeningModel: rutherford !== null ? config.normalization.screening : '',
    ratioToRutherford: ratio?.value ?? (rutherford !== null ? labValue / rutherford.sigmaMbPerSr : NaN_),
    ratioToRutherfordStat: ratio?.stat ?? NaN_,
    ratioToRutherfordSys: ratio?.sys ?? NaN_,
    calibrationVersion: x.calibrationVersion,
    flags: flags.length === 0 ? flags : [...new Set(flags)].sort(),
  };
  return { row, uncertainty };
}

const layersByTarget = new WeakMap<TargetConfig, Map<string, LayerAtoms[]>>();

/** The layers of a target that hold a nuclide: atoms/cm² and the layer's thickness input (resolved once per target and nuclide). */
function nuclideLayers(target: TargetConfig, nuclideName: string): LayerAtoms[] {
  let byNuclide = layersByTarget.get(target);
  if (byNuclide === undefined) layersByTarget.set(target, (byNuclide = new Map()));
  let layers = byNuclide.get(nuclideName);
  if (layers === undefined) {
    layers = resolveTarget(target)
      .filter((r) => r.nuclide === nuclideName)
      .map((r) => ({ atomsPerCm2: r.atomsPerCm2, thickness: layerThickness(target.id, r.layer, r.relUnc, target.layers[r.layer]!.role === 'reference') }));
    byNuclide.set(nuclideName, layers);
  }
  return layers;
}

/** The row alone (see crossSectionRowModels). */
export function crossSectionRow(x: RowInput): CrossSectionRow {
  return crossSectionRowModels(x).row;
}

/**
 * The normalization's counting part, relative: the normalizing peaks' counting (reference runs,
 * reference layer or monitor) and the live fractions of spectra other than this row's own,
 * √Σ value² / |y| (the normalization_counting_rel_unc column; part of sys).
 */
export function normalizationCountingRel(components: readonly UncertaintyComponent[], ownSpectrum: string, value: number): number {
  let s = 0;
  for (const c of components) if (c.name === 'reference_counting' || (c.name === 'live_time' && c.key !== ownSpectrum)) s += c.value * c.value;
  return Math.sqrt(s) / Math.abs(value);
}
