import type { DetectorConfig, SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';
import { onsetEnergyKeV } from '../../pipeline/core/physics/non-rutherford-onset.js';
import { microCoulombToParticles, MB_TO_CM2 } from '../../pipeline/core/physics/units.js';
import { rutherfordForPeak } from '../../pipeline/core/kinematics/rutherford-for-peak.js';
import type { TargetPeakPlan } from '../../pipeline/core/kinematics/plan-target-peaks.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { ReferenceComposition } from './reference-nuclides.js';
import type { ReferencePoint } from '../../pipeline/core/model/result-rows.js';

/** Flag of a reference point whose energy is above the onset of non-Rutherford scattering for one of its isotopes. */
export const NON_RUTHERFORD_FLAG = 'reference-above-non-rutherford-onset';

/** Reference-point flags a sample row normalized by that point carries, prefixed `uses-`. */
export const PROPAGATED_REFERENCE_FLAGS: ReadonlySet<string> = new Set(['reference-outlier', 'solid-angle-off-nominal', NON_RUTHERFORD_FLAG]);

/**
 * Effective solid angle from a reference run, inverting the yield equation
 *   Y = N_beam · Σ_i n_i σ_R,i(E_i, θ) F_i · ΔΩ · f_live,  N_beam = Q / (q e)
 * with E_i the reaction energy of isotope i (the beam energy, or mid-depth of its layer when
 * energy loss is on), and a flag where E_i is above Bozoian's onset of non-Rutherford scattering
 * (the standard yield relation of ion-beam analysis, e.g. Chu, Mayer & Nicolet,
 * Backscattering Spectrometry (1978), eq. 3.4). ΔΩ absorbs any constant scale error of the
 * charge integrator, which therefore cancels for sample runs measured with it.
 */
export function referencePoint(config: SeriesConfig, projectile: Nuclide, ref: ReferenceComposition, planner: SeriesPeakPlanner, plan: TargetPeakPlan, run: RunRecord, det: DetectorConfig, peak: MeasuredPeak, live: LiveFraction): ReferencePoint {
  let sumNSigma = 0;
  let sumNSigmaF = 0;
  let dE = 0;
  let dTheta = 0;
  let reactionEnergy = 0;
  const flags = [...peak.window.flags];
  if (plan.peaks.length === 0) {
    flags.push('reference-not-planned');
    sumNSigma = Number.NaN;
  }
  for (const p of plan.peaks) {
    const rr = rutherfordForPeak(p.reaction, planner.kinematicsFor(p.reaction), p.branch, p.reactionEnergyKeV, det.angle_deg, config.normalization.screening);
    if (!rr.ok) {
      flags.push(rr.flag);
      sumNSigma = Number.NaN;
      break;
    }
    const onset = onsetEnergyKeV(projectile, p.reaction.target);
    if (onset.ok && p.reactionEnergyKeV > onset.energyKeV) flags.push(NON_RUTHERFORD_FLAG);
    const r = rr.value;
    const w = p.atomsPerCm2 * r.sigmaMbPerSr;
    reactionEnergy += w * p.reactionEnergyKeV;
    sumNSigma += w;
    sumNSigmaF += w / r.screeningFactor;
    dE += w * r.dLnSigmaDEnergyPerKeV;
    dTheta += w * r.dLnSigmaDThetaPerDeg;
  }
  dE /= sumNSigma;
  dTheta /= sumNSigma;
  reactionEnergy /= sumNSigma;
  const net = peak.net;
  const beam = microCoulombToParticles(run.chargeUC, config.beam.charge_state);
  let solidAngleMsr: number | null = null;
  let relCounting = 0;
  if (Number.isFinite(sumNSigma)) {
    if (net === null) flags.push('reference-not-measured');
    else if (!(net.net > 0)) flags.push('reference-net-not-positive');
    else {
      const sr = net.net / (beam * sumNSigma * MB_TO_CM2 * live.value);
      solidAngleMsr = sr * 1000;
      relCounting = Math.sqrt(net.netVariance) / net.net;
    }
  }
  return {
    run: run.run,
    detector: det.id,
    startedAtMs: run.startedAtMs,
    beamEnergyKeV: run.beamEnergyKeV,
    reactionEnergyKeV: reactionEnergy,
    chargeUC: run.chargeUC,
    netCounts: net?.net ?? Number.NaN,
    netCountsUnc: net ? Math.sqrt(net.netVariance) : Number.NaN,
    liveFraction: live.value,
    liveFractionUnc: live.unc,
    rutherfordMbPerSr: sumNSigma / ref.atomsPerCm2,
    screeningFactor: sumNSigma / sumNSigmaF,
    solidAngleMsr,
    relCounting,
    relLive: live.unc / live.value,
    relEnergy: Math.abs(dE) * run.beamEnergyUncKeV,
    dLnSigmaDThetaPerDeg: dTheta,
    relAreal: ref.relUnc,
    flags,
  };
}

/** The part of a reference point's relative uncertainty that is independent from run to run. */
export function runRelUnc(p: ReferencePoint): number {
  return Math.hypot(p.relCounting, p.relLive, p.relEnergy);
}
