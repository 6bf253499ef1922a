import { microCoulombToParticles, MB_TO_CM2 } from '../core/physics/index.js';
import { addGaussianOverChannels } from './add-gaussian-over-channels.js';
import { sampleBinomial } from '../core/random/sample-binomial.js';
import { samplePoisson } from '../core/random/sample-poisson.js';
import { Xoshiro128StarStar } from '../core/random/xoshiro128-star-star.js';
import type { PlannedRun } from './schedule-runs.js';
import { layerPeakLines } from './layer-peak-lines.js';

/** Depth slices per layer when the series has energy loss (each a Gaussian line; enough for a smooth box, common practice). */
const ENERGY_LOSS_SLICES = 24;
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
  const layerNuclides = ctx.layerNuclides.get(run.target)!;
  const target = spec.targets.find((t) => t.id === run.target)!;
  const expected: Float64Array[] = [];
  const pendingTruth: { row: TruthRow; incident: number; detector: number }[] = [];
  spec.detectors.forEach((det, di) => {
    const cal = calibration.detectors.find((c) => c.id === det.id)!;
    const background = ctx.backgroundPerUC(run.calibration, di);
    const spectrum = new Float64Array(nChannels);
    for (let ch = 0; ch < nChannels; ch++) spectrum[ch] = background[ch]! * run.trueChargeUC;
    const beamTimesSr = beamParticles * MB_TO_CM2 * det.true_solid_angle_msr * 1e-3;
    // A nuclide in several layers gives one truth row per declared peak (counts and atoms summed).
    const truthByPeak = new Map<string, { row: TruthRow; incident: number; detector: number }>();
    for (const ln of layerNuclides) {
      for (const source of ctx.peakSources(ln.nuclide.name)) {
        const peak = layerPeakLines({
          reaction: source.reaction, kinematics: source.kinematics, truth: source.truth, screening: spec.normalization.screening,
          target, layerIndex: ln.layerIndex, atomsPerCm2: ln.atomsPerCm2, detector: det, beamEnergyKeV: run.beamEnergyKeV,
          energyLoss: spec.physics.energy_loss === 'layers', slowing: ctx.slowing, slices: ENERGY_LOSS_SLICES,
        });
        if ('reason' in peak) {
          for (const p of source.declared) warnOnce(ctx, 'simulate-peak-not-generated', `forbidden:${p.label}:${det.id}`, `peak "${p.label}" cannot reach detector ${det.id} at ${run.beamEnergyKeV} keV (first such run): ${peak.reason}; no counts and no truth rows there`, run.run, det.id);
          continue;
        }
        let incident = 0;
        for (const line of peak.lines) {
          const n = beamTimesSr * line.atomsTimesSigma;
          incident += n;
          addGaussianOverChannels(spectrum, n, line.energyKeV, line.fwhmKeV, cal.offset_keV, cal.gain_keV_per_channel);
        }
        if (run.kind !== 'sample') continue;
        const t = peak.truth;
        const peakChannel = (t.detectedEnergyKeV - cal.offset_keV) / cal.gain_keV_per_channel;
        for (const p of source.declared) {
          if (peakChannel < 0 || peakChannel > nChannels - 1) warnOnce(ctx, 'simulate-peak-outside-spectrum', `outside:${p.label}:${det.id}`, `peak "${p.label}" lies outside the spectrum of detector ${det.id} (channel ${peakChannel.toFixed(1)} of 0..${nChannels - 1}) in run ${run.run} (first such run)`, run.run, det.id);
          const seen = truthByPeak.get(p.label);
          if (seen) {
            seen.incident += incident;
            seen.row.nuclideAtomsPerCm2 += ln.atomsPerCm2;
            continue;
          }
          truthByPeak.set(p.label, {
            detector: di,
            incident,
            row: {
              run: run.run, detector: det.id, peak: p.label, target: run.target, targetNuclide: ln.nuclide.name, excitationKeV: source.excitationKeV,
              beamEnergyKeV: run.beamEnergyKeV, reactionEnergyKeV: t.reactionEnergyKeV, thetaLabDeg: det.angle_deg, thetaCmDeg: t.thetaCmDeg, peakEnergyKeV: t.emittedEnergyKeV,
              detectedEnergyKeV: t.detectedEnergyKeV, peakChannel,
              dsigmaLabMbPerSr: t.dsigmaLabMbPerSr, dsigmaCmMbPerSr: t.dsigmaCmMbPerSr, sigmaOverRutherford: t.sigmaOverRutherford,
              rutherfordLabMbPerSr: t.rutherfordLabMbPerSr, screeningFactor: t.screeningFactor, nuclideAtomsPerCm2: ln.atomsPerCm2,
              trueChargeUC: run.trueChargeUC, liveFraction: Number.NaN, trueSolidAngleMsr: det.true_solid_angle_msr, expectedCounts: Number.NaN,
              calibrationVersion: calibration.version, defects,
            },
          });
        }
      }
    }
    pendingTruth.push(...truthByPeak.values());
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
