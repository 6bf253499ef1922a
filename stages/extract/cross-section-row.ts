import type { DetectorConfig, PeakConfig, SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { PlannedPeakGeometry } from '../../pipeline/core/kinematics/plan-target-peaks.js';
import { rutherfordForPeak } from '../../pipeline/core/kinematics/rutherford-for-peak.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { AppliedNormalization, CrossSectionRow } from '../../pipeline/core/model/result-rows.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';
import { MB_TO_CM2, microCoulombToParticles } from '../../pipeline/core/physics/units.js';

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
  normalization: AppliedNormalization | null;
  calibrationVersion: string;
  extraFlags: string[];
}

const NaN_ = Number.NaN;

/**
 * The cross section of one sample run × detector × peak:
 *
 *   dσ/dΩ_lab = N_net / (N_beam · n · ΔΩ_eff · f_live),   N_beam = Q/(q e)
 *   dσ/dΩ_cm  = dσ/dΩ_lab · dΩ_lab/dΩ_cm   (relativistic Jacobian of the detected particle)
 *   σ/σ_R     = dσ/dΩ_lab / (σ_R,lab(E, θ) · F_screen)   (elastic peaks, rutherford-for-peak.ts)
 *
 * quoted at the reaction energy E: the beam energy (thin target) or the beam energy at mid-depth
 * of the nuclide's layer (physics.energy_loss: layers), with n the nuclide's atoms/cm² there.
 *
 * Uncertainties, first order for a product of powers (JCGM 100:2008, GUM §5.1.6):
 *   stat: Poisson counting of the peak and its background, and the run's live-fraction
 *         uncertainty (pulser statistics) — independent between runs;
 *   sys:  sample areal density; the normalization (reference counting, live time, beam
 *         energy, reference areal density); the detector angle through ∂lnσ_R,ref/∂θ;
 *         for σ/σ_R also the run's beam energy through ∂lnσ_R/∂E and the angle through
 *         ∂ln(σ_R,ref/σ_R)/∂θ. The beam energy and angle are quoted with their own
 *         uncertainties as coordinates of the point.
 */
export function crossSectionRow(x: RowInput): CrossSectionRow {
  const { config, projectile, run, detector, peak, measured, live, normalization } = x;
  const flags = x.extraFlags.slice();
  if (measured !== null) for (const f of measured.window.flags) flags.push(f);
  if (normalization !== null) for (const f of normalization.flags) flags.push(f);
  const k = x.planned;
  if (k === null) flags.push('kinematically-forbidden');
  if (k !== null && k.branch !== 'single') flags.push(`kinematic-branch-${k.branch}`);
  const reactionEnergy = k?.reactionEnergyKeV ?? run.beamEnergyKeV;
  let rutherford = NaN_;
  let screening = NaN_;
  let dLnRDE = 0;
  let dLnRDTheta = 0;
  if (k !== null && k.reaction.elastic) {
    const r = rutherfordForPeak(k.reaction, x.planner.kinematicsFor(k.reaction), k.branch, reactionEnergy, detector.angle_deg, config.normalization.screening);
    if (!r.ok) flags.push(r.flag);
    else {
      rutherford = r.value.sigmaMbPerSr;
      screening = r.value.screeningFactor;
      dLnRDE = r.value.dLnSigmaDEnergyPerKeV;
      dLnRDTheta = r.value.dLnSigmaDThetaPerDeg;
    }
  }
  const nuclideAtoms = k?.atomsPerCm2 ?? NaN_;
  const nuclideRelUnc = k?.relUnc ?? 0;
  const net = measured?.net ?? null;
  if (measured !== null && net === null) flags.push('peak-not-measured');
  if (net !== null && !(net.net > 0)) flags.push('net-not-positive');
  if (normalization === null) flags.push('no-normalization');
  const beam = microCoulombToParticles(run.chargeUC, config.beam.charge_state);
  let lab = NaN_;
  let labStat = NaN_;
  let labSys = NaN_;
  let ratio = NaN_;
  let ratioStat = NaN_;
  let ratioSys = NaN_;
  if (net !== null && normalization !== null) {
    const perCount = 1 / (beam * nuclideAtoms * (normalization.solidAngleMsr / 1000) * live.value) / MB_TO_CM2;
    lab = net.net * perCount;
    const relLive = live.unc / live.value;
    labStat = Math.hypot(Math.sqrt(net.netVariance) * perCount, lab * relLive);
    const n = normalization;
    const angleRef = n.dLnSigmaDThetaPerDeg * detector.angle_unc_deg;
    const normRel = Math.hypot(n.relCounting, n.relLive, n.relEnergy, n.relAreal);
    labSys = Math.abs(lab) * Math.hypot(nuclideRelUnc, normRel, angleRef);
    if (Number.isFinite(rutherford)) {
      ratio = lab / rutherford;
      ratioStat = labStat / rutherford;
      const angleRatio = (n.dLnSigmaDThetaPerDeg - dLnRDTheta) * detector.angle_unc_deg;
      const energyRatio = dLnRDE * run.beamEnergyUncKeV;
      ratioSys = Math.abs(ratio) * Math.hypot(nuclideRelUnc, normRel, angleRatio, energyRatio);
    }
  }
  const j = k?.jacobianLabPerCm ?? NaN_;
  return {
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
    normalizationCountingRelUnc: normalization ? Math.hypot(normalization.relCounting, normalization.relLive) : NaN_,
    referenceRuns: normalization ? normalization.referenceRuns.join('+') : '',
    crossSectionLabMbPerSr: lab,
    crossSectionLabStatMbPerSr: labStat,
    crossSectionLabSysMbPerSr: labSys,
    jacobianLabPerCm: j,
    crossSectionCmMbPerSr: lab * j,
    crossSectionCmStatMbPerSr: labStat * j,
    crossSectionCmSysMbPerSr: labSys * j,
    rutherfordLabMbPerSr: rutherford,
    screeningFactor: screening,
    screeningModel: Number.isFinite(screening) ? config.normalization.screening : '',
    ratioToRutherford: ratio,
    ratioToRutherfordStat: ratioStat,
    ratioToRutherfordSys: ratioSys,
    calibrationVersion: x.calibrationVersion,
    flags: flags.length === 0 ? flags : [...new Set(flags)].sort(),
  };
}
