// Law of propagation of uncertainty: JCGM 100:2008 (GUM) §5.1.2 eq. (10), sensitivities by forward-mode differentiation (R.E. Wengert, Commun. ACM 7(8), 463-464 (1964)) through the formula that gives the value.
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import { firstOrderEstimate, type EstimateCache, type MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import { rutherfordTerm, type RutherfordAt } from '../../pipeline/core/normalization/rutherford-term.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import { angleOffset, beamEnergyOffset, liveFractionInput, modelInput, screeningOffset, type LayerAtoms } from '../../pipeline/core/normalization/shared-inputs.js';
import { MB_TO_CM2 } from '../../pipeline/core/physics/units.js';
import { splitStatSys } from '../../pipeline/core/uncertainty/split-stat-sys.js';
import type { UncertaintyComponent } from '../../pipeline/core/uncertainty/uncertainty-component.js';

export interface LabModelInput {
  run: string;
  detector: string;
  /** Gross counts in the peak window and the background under it (counts), with var(background). */
  gross: number;
  background: number;
  backgroundVariance: number;
  live: LiveFraction;
  /** The peak's target nuclide, atoms/cm² per layer with each layer's thickness input. */
  sampleLayers: readonly LayerAtoms[];
  normalization: RowNormalization;
}

/**
 * dσ/dΩ_lab (mb/sr) of one sample run × detector × peak, for every normalization method:
 *
 *   dσ/dΩ_lab = (G − B) / (f · Σ_l n_l t_l · L) / 10⁻²⁷
 *
 * G gross counts (counting, uncorrelated, Poisson), B background (background, uncorrelated,
 * u² = var B), f the live fraction (live_time, run class, key `<run>/<detector>`), n_l the
 * nuclide's atoms/cm² in layer l with thickness scale t_l (sample_areal_density), L the
 * exposure in sr (the normalization model: its inputs join the budget by the chain rule).
 */
export function crossSectionLabModel(x: LabModelInput): MeasurementModel {
  const inputs = [
    modelInput('counting', 'uncorrelated', '', x.gross, Math.sqrt(Math.max(x.gross, 0)), 'poisson'),
    modelInput('background', 'uncorrelated', '', x.background, Math.sqrt(x.backgroundVariance)),
    liveFractionInput(x.run, x.detector, x.live),
    ...x.sampleLayers.map((l) => l.thickness),
  ];
  const atoms = x.sampleLayers.map((l) => l.atomsPerCm2);
  return {
    inputs,
    parts: [x.normalization.exposure],
    evaluate<T>(v: readonly T[], p: readonly T[], ops: ScalarOps<T>): T {
      let n = ops.scale(v[3]!, atoms[0]!);
      for (let l = 1; l < atoms.length; l++) n = ops.add(n, ops.scale(v[3 + l]!, atoms[l]!));
      const denom = ops.scale(ops.mul(ops.mul(v[2]!, n), p[0]!), MB_TO_CM2);
      return ops.div(ops.sub(v[0]!, v[1]!), denom);
    },
  };
}

export interface RatioModelInput {
  run: string;
  beamEnergyUncKeV: number;
  detector: string;
  angleUncDeg: number;
  series: string;
  screeningUncFrac: number;
  /** Screened lab Rutherford cross section of the peak's nuclide at the run's energy and the detector's angle. */
  rutherford: RutherfordAt;
}

/**
 * σ/σ_R = dσ/dΩ_lab / σ_R(E + δE, θ + δθ; δs) (dimensionless), with the lab model as its part:
 * the run's beam energy, the detector's angle and the screening enter here and — being the
 * same quantities — combine with their part in the normalization (e.g. ∂ln(σ_R,ref/σ_R)/∂θ).
 */
export function ratioToRutherfordModel(lab: MeasurementModel, x: RatioModelInput): MeasurementModel {
  const r = x.rutherford;
  return {
    inputs: [beamEnergyOffset(x.run, x.beamEnergyUncKeV), angleOffset(x.detector, x.angleUncDeg), screeningOffset(x.series, x.screeningUncFrac)],
    parts: [lab],
    evaluate<T>(v: readonly T[], p: readonly T[], ops: ScalarOps<T>): T {
      return ops.div(p[0]!, rutherfordTerm(ops, r, v[0]!, v[1]!, v[2]!));
    },
  };
}

export interface RowBudget {
  value: number;
  components: UncertaintyComponent[];
  /** √Σ of uncorrelated components² (the stat column). */
  stat: number;
  /** √Σ of run-, detector- and series-class components² (the sys column). */
  sys: number;
  total: number;
}

/** Value and budget of a row model, first order (shared parts differentiated once per cache). */
export function rowBudget(model: MeasurementModel, cache?: EstimateCache): RowBudget {
  const e = firstOrderEstimate(model, cache);
  return { value: e.value, components: e.components, ...splitStatSys(e.components) };
}
