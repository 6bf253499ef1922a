// Thin-target yield equation Y = N_beam Σ_i n_i σ_i ΔΩ f: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 3.4.
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { MeasurementModel, ModelInput } from '../../pipeline/core/normalization/measurement-model.js';
import { rutherfordTerm, type RutherfordAt } from '../../pipeline/core/normalization/rutherford-term.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import { angleOffset, beamEnergyOffset, chargeScale, liveFractionInput, modelInput, screeningOffset, type LayerAtoms } from '../../pipeline/core/normalization/shared-inputs.js';
import { MB_TO_CM2, microCoulombToParticles } from '../../pipeline/core/physics/units.js';

/** One nuclide of the normalizing element: its atoms per layer and its screened Rutherford cross section. */
export interface NormalizingNuclide {
  layers: LayerAtoms[];
  rutherford: RutherfordAt;
}

/** Series-wide settings the normalization models share. */
export interface SharedUncertainties {
  series: string;
  /** Relative standard uncertainty of the charge integrator's scale. */
  chargeUncRel: number;
  /** Relative standard uncertainty of the screening correction 1 − F. */
  screeningUncFrac: number;
}

/** A reference run × detector: what the yield equation needs. */
export interface ReferenceMeasurement {
  run: string;
  detector: string;
  startedAtMs: number;
  /** Charge read from the run log, µC, and the beam's charge state. */
  chargeUC: number;
  chargeState: number;
  /** Net counts of the normalizing element's elastic peak and their standard uncertainty. */
  netCounts: number;
  netCountsUnc: number;
  live: LiveFraction;
  beamEnergyUncKeV: number;
  angleUncDeg: number;
  nuclides: NormalizingNuclide[];
}

/** Σ_i (Σ_l n_il t_l) σ_i(δE, δθ, δs), atoms/cm² × mb/sr; `t` gives each layer's thickness scale. */
export function sumNSigma<T>(ops: ScalarOps<T>, nuclides: readonly NormalizingNuclide[], t: (layer: LayerAtoms) => T, dE: T, dTheta: T, dS: T): T {
  let sum: T | null = null;
  for (const n of nuclides) {
    let atoms: T | null = null;
    for (const l of n.layers) {
      const a = ops.scale(t(l), l.atomsPerCm2);
      atoms = atoms === null ? a : ops.add(atoms, a);
    }
    const term = ops.mul(atoms!, rutherfordTerm(ops, n.rutherford, dE, dTheta, dS));
    sum = sum === null ? term : ops.add(sum, term);
  }
  if (sum === null) throw new RangeError('the normalizing element has no nuclide');
  return sum;
}

/**
 * The effective solid angle from one reference run, msr:
 *   ΔΩ = 10³ · Y (1 + ε) / (g N_beam · Σ_i n_i σ_i(E + δE, θ + δθ; δs) · f),  N_beam = Q/(q e)
 * with σ in cm²/sr. Inputs: Y (reference_counting), f (live_time), δE (beam_energy of the
 * run), δθ (angle of the detector), δs (screening), g (charge), ε (the reference runs' scatter
 * beyond their own uncertainties, `spreadRel`: reference_spread, run class, key
 * `<run>/<detector>`), t_l (reference_areal_density of each layer).
 */
export function referenceSolidAngleModel(m: ReferenceMeasurement, shared: SharedUncertainties, spreadRel: number): MeasurementModel {
  const thick = new Map<string, number>();
  const inputs: ModelInput[] = [
    modelInput('reference_counting', 'run', `${m.run}/${m.detector}`, m.netCounts, m.netCountsUnc),
    liveFractionInput(m.run, m.detector, m.live),
    beamEnergyOffset(m.run, m.beamEnergyUncKeV),
    angleOffset(m.detector, m.angleUncDeg),
    screeningOffset(shared.series, shared.screeningUncFrac),
    chargeScale(shared.series, shared.chargeUncRel),
    modelInput('reference_spread', 'run', `${m.run}/${m.detector}`, 0, spreadRel),
  ];
  for (const n of m.nuclides) {
    for (const l of n.layers) {
      if (!thick.has(l.thickness.key)) thick.set(l.thickness.key, inputs.push(l.thickness) - 1);
    }
  }
  const beam = microCoulombToParticles(m.chargeUC, m.chargeState);
  return {
    inputs,
    parts: [],
    evaluate<T>(x: readonly T[], _parts: readonly T[], ops: ScalarOps<T>): T {
      const [y, f, dE, dTheta, dS, g, eps] = x as [T, T, T, T, T, T, T];
      const counts = ops.mul(y, ops.add(ops.k(1), eps));
      const nSigma = sumNSigma(ops, m.nuclides, (l) => x[thick.get(l.thickness.key)!]!, dE, dTheta, dS);
      const denom = ops.mul(ops.mul(ops.scale(g, beam * MB_TO_CM2), nSigma), f);
      return ops.scale(ops.div(counts, denom), 1000);
    },
  };
}
