import type { LiveFraction } from '../counting/live-fraction.js';
import type { ComponentName, CorrelationClass } from '../uncertainty/uncertainty-component.js';
import type { ModelInput } from './measurement-model.js';

/**
 * The input quantities that several rows share, built in one place so that every model names
 * a shared quantity with the same (name, class, key) and the same estimate — which is what
 * makes it one quantity for the chain rule, the covariance and Monte Carlo (common practice).
 * Offsets (δ, value 0) stand for the error of a quantity the formulas use through a
 * sensitivity: a beam energy E + δE, an angle θ + δθ, a screening correction scaled by 1 + δs.
 */
export function modelInput(name: ComponentName, cls: CorrelationClass, key: string, value: number, standardUncertainty: number, distribution: 'normal' | 'poisson' = 'normal'): ModelInput {
  return { name, class: cls, key, value, standardUncertainty, distribution };
}

/** δθ of a detector's lab angle, deg (shared by every row and reference run of the detector). */
export const angleOffset = (detector: string, angleUncDeg: number) => modelInput('angle', 'detector', detector, 0, angleUncDeg);

/** δE of a run's beam energy, keV (shared by every row of the run). */
export const beamEnergyOffset = (run: string, beamEnergyUncKeV: number) => modelInput('beam_energy', 'run', run, 0, beamEnergyUncKeV);

/** δs: relative error of the screening correction 1 − F (dimensionless, one screening model for the series). */
export const screeningOffset = (series: string, screeningUncFrac: number) => modelInput('screening', 'series', series, 0, screeningUncFrac);

/** g: scale of the charge integrator (value 1, dimensionless; one integrator for the series). */
export const chargeScale = (series: string, chargeUncRel: number) => modelInput('charge', 'series', series, 1, chargeUncRel);

/** Live fraction f of one run × detector (dimensionless; shared by every peak of that spectrum). */
export const liveFractionInput = (run: string, detector: string, live: LiveFraction) => modelInput('live_time', 'run', `${run}/${detector}`, live.value, live.unc);

/**
 * t: thickness scale of one target layer (value 1, u = the layer's relative uncertainty),
 * shared by every nuclide of the layer. `reference` names it reference_areal_density (a
 * reference film or a layer with role: reference), otherwise sample_areal_density.
 * Key `<target>/layer <n>`, n from 1 on the beam side.
 */
export const layerThickness = (target: string, layerIndex: number, relUnc: number, reference: boolean) =>
  modelInput(reference ? 'reference_areal_density' : 'sample_areal_density', 'series', `${target}/layer ${layerIndex + 1}`, 1, relUnc);

/** Atoms/cm² of one nuclide or element in one layer, with that layer's thickness scale. */
export interface LayerAtoms {
  atomsPerCm2: number;
  thickness: ModelInput;
}
