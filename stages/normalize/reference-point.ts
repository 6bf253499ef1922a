import type { DetectorConfig, SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { Nuclide } from '../../pipeline/core/physics/nuclides.js';
import { microCoulombToParticles, MB_TO_CM2 } from '../../pipeline/core/physics/units.js';
import { screenedRutherfordLabIfValid } from '../../pipeline/core/kinematics/screened-rutherford.js';
import type { ReferenceComposition } from './reference-nuclides.js';
import type { ReferencePoint } from '../../pipeline/core/model/result-rows.js';


/**
 * Effective solid angle from a reference run, inverting the thin-target yield equation
 *   Y = N_beam · Σ_i n_i σ_R,i(E, θ) F_i · ΔΩ · f_live,  N_beam = Q / (q e)
 * (the standard yield relation of ion-beam analysis, e.g. Chu, Mayer & Nicolet,
 * Backscattering Spectrometry (1978), eq. 3.4). ΔΩ absorbs any constant scale error of the
 * charge integrator, which therefore cancels for sample runs measured with it.
 */
export function referencePoint(config: SeriesConfig, projectile: Nuclide, ref: ReferenceComposition, run: RunRecord, det: DetectorConfig, peak: MeasuredPeak, live: LiveFraction): ReferencePoint {
  let sumNSigma = 0;
  let sumNSigmaF = 0;
  let dE = 0;
  let dTheta = 0;
  const flags = [...peak.window.flags];
  for (const n of ref.nuclides) {
    const r = screenedRutherfordLabIfValid(projectile, n.nuclide, run.beamEnergyKeV, det.angle_deg, config.normalization.screening);
    if (r === null) {
      flags.push('rutherford-not-valid');
      sumNSigma = Number.NaN;
      break;
    }
    const w = n.atomsPerCm2 * r.sigmaMbPerSr;
    sumNSigma += w;
    sumNSigmaF += w / r.screeningFactor;
    dE += w * r.dLnSigmaDEnergyPerKeV;
    dTheta += w * r.dLnSigmaDThetaPerDeg;
  }
  dE /= sumNSigma;
  dTheta /= sumNSigma;
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
