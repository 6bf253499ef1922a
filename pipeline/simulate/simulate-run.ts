import { microCoulombToParticles, MB_TO_CM2 } from '../core/physics/index.js';
import { addGaussianOverChannels } from './add-gaussian-over-channels.js';
import { sampleBinomial } from '../core/random/sample-binomial.js';
import { samplePoisson } from '../core/random/sample-poisson.js';
import { Xoshiro128StarStar } from '../core/random/xoshiro128-star-star.js';
import type { PlannedRun } from './schedule-runs.js';
import { scatteringPeak } from './scattering-peak.js';
import type { SimulationContext } from './simulation-context.js';
import type { TruthRow } from './truth-table.js';

export type ScalerReading = { liveTimeS: number } | { pulserSent: number; pulserCounted: number };

export interface SimulatedRun {
  /** Counts per detector (spec order), channels 0…N−1. */
  counts: Int32Array[];
  /** True live fraction per detector. */
  liveFractions: number[];
  scalers: ScalerReading[];
  /** Sample runs only: one row per detector × declared peak present in the target. */
  truth: TruthRow[];
}

/**
 * Generates one run. Per detector, the expected spectrum is the sum over every nuclide of the
 * target and every peak of it of
 *
 *   Y = N_beam · n · dσ/dΩ_lab · ΔΩ_true,   N_beam = Q_true / (q e),  n in atoms/cm², σ in cm²/sr, ΔΩ in sr,
 *
 * spread over channels as a Gaussian of the detector's FWHM (thin target: no energy loss), plus
 * the background continuum; all of it times the live fraction f, then Poisson-sampled per
 * channel. f is drawn (uniform model) or follows f = 1/(1 + n τ) from the true event rate
 * n = ΣY / t_real (non-paralyzable model, common practice). Random streams: (seed, run, 0) for
 * live fractions and pulser, (seed, run, 1 + detector) for each spectrum — a run's data do not
 * depend on any other run.
 */
export function simulateRun(ctx: SimulationContext, run: PlannedRun, defects: string): SimulatedRun {
  const { spec, projectile } = ctx;
  const nChannels = spec.channels;
  const beamParticles = microCoulombToParticles(run.trueChargeUC, spec.beam.charge_state);
  const calibration = spec.calibrations[run.calibration]!;
  const nuclides = ctx.targets.get(run.target)!;
  const expected: Float64Array[] = [];
  const pendingTruth: { row: TruthRow; incident: number; detector: number }[] = [];
  spec.detectors.forEach((det, di) => {
    const cal = calibration.detectors.find((c) => c.id === det.id)!;
    const background = ctx.backgroundPerUC(run.calibration, di);
    const spectrum = new Float64Array(nChannels);
    for (let ch = 0; ch < nChannels; ch++) spectrum[ch] = background[ch]! * run.trueChargeUC;
    for (const tn of nuclides) {
      for (const source of ctx.peakSources(tn.nuclide.name)) {
        const peak = scatteringPeak(projectile, tn.nuclide, source.qValueKeV, run.beamEnergyKeV, det.angle_deg, source.truth, spec.normalization.screening);
        if (peak === null) {
          for (const p of source.declared) warnOnce(ctx, 'simulate-peak-not-generated', `forbidden:${p.label}:${det.id}`, `peak "${p.label}" cannot reach detector ${det.id} at ${run.beamEnergyKeV} keV (first such run; kinematically forbidden or not simulated: target not heavier than the projectile, below threshold, or two lab energies); no counts and no truth rows there`, run.run, det.id);
          continue;
        }
        const incident = beamParticles * tn.atomsPerCm2 * peak.dsigmaLabMbPerSr * MB_TO_CM2 * det.true_solid_angle_msr * 1e-3;
        addGaussianOverChannels(spectrum, incident, peak.peakEnergyKeV, det.resolution_fwhm_keV, cal.offset_keV, cal.gain_keV_per_channel);
        if (run.kind !== 'sample') continue;
        const peakChannel = (peak.peakEnergyKeV - cal.offset_keV) / cal.gain_keV_per_channel;
        for (const p of source.declared) {
          if (peakChannel < 0 || peakChannel > nChannels - 1) warnOnce(ctx, 'simulate-peak-outside-spectrum', `outside:${p.label}:${det.id}`, `peak "${p.label}" lies outside the spectrum of detector ${det.id} (channel ${peakChannel.toFixed(1)} of 0..${nChannels - 1}) in run ${run.run} (first such run)`, run.run, det.id);
          pendingTruth.push({
            detector: di,
            incident,
            row: {
              run: run.run, detector: det.id, peak: p.label, target: run.target, targetNuclide: tn.nuclide.name, excitationKeV: source.excitationKeV,
              beamEnergyKeV: run.beamEnergyKeV, thetaLabDeg: det.angle_deg, thetaCmDeg: peak.thetaCmDeg, peakEnergyKeV: peak.peakEnergyKeV, peakChannel,
              dsigmaLabMbPerSr: peak.dsigmaLabMbPerSr, dsigmaCmMbPerSr: peak.dsigmaCmMbPerSr, sigmaOverRutherford: peak.sigmaOverRutherford,
              rutherfordLabMbPerSr: peak.rutherfordLabMbPerSr, screeningFactor: peak.screeningFactor, nuclideAtomsPerCm2: tn.atomsPerCm2,
              trueChargeUC: run.trueChargeUC, liveFraction: Number.NaN, trueSolidAngleMsr: det.true_solid_angle_msr, expectedCounts: Number.NaN,
              calibrationVersion: calibration.version, defects,
            },
          });
        }
      }
    }
    expected.push(spectrum);
  });

  const scalerRng = Xoshiro128StarStar.fromSeed(spec.seed, run.index, 0);
  const liveFractions = expected.map((spectrum) => {
    let f: number;
    if (spec.dead_time.model === 'uniform') {
      f = spec.dead_time.live_fraction_min + (spec.dead_time.live_fraction_max - spec.dead_time.live_fraction_min) * scalerRng.nextFloat64();
    } else {
      let total = 0;
      for (let ch = 0; ch < spectrum.length; ch++) total += spectrum[ch]!;
      f = 1 / (1 + (total / run.realTimeS) * spec.dead_time.dead_time_us * 1e-6);
    }
    // A live-time clock reads to 1 ms: make the true fraction the one the written live time states.
    return run.scalerMode === 'live_time' ? Math.round(run.realTimeS * f * 1000) / 1000 / run.realTimeS : f;
  });
  const scalers: ScalerReading[] = liveFractions.map((f) => {
    if (run.scalerMode === 'live_time') return { liveTimeS: Math.round(run.realTimeS * f * 1000) / 1000 };
    const sent = Math.round(spec.scalers.pulser_rate_hz * run.realTimeS);
    return { pulserSent: sent, pulserCounted: sampleBinomial(scalerRng, sent, f) };
  });

  const counts = expected.map((spectrum, di) => {
    const rng = Xoshiro128StarStar.fromSeed(spec.seed, run.index, 1 + di);
    const f = liveFractions[di]!;
    const out = new Int32Array(nChannels);
    for (let ch = 0; ch < nChannels; ch++) out[ch] = samplePoisson(rng, spectrum[ch]! * f);
    return out;
  });
  const truth = pendingTruth.map(({ row, incident, detector }) => ({ ...row, liveFraction: liveFractions[detector]!, expectedCounts: incident * liveFractions[detector]! }));
  return { counts, liveFractions, scalers, truth };
}

function warnOnce(ctx: SimulationContext, rule: string, key: string, message: string, run: string, detector: string): void {
  if (ctx.warned.has(key)) return;
  ctx.warned.add(key);
  ctx.diagnostics.push({ severity: 'warning', rule, stage: 'simulate', message, run, detector });
}
