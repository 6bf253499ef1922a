import type { DetectorConfig, TargetConfig } from '../core/config/series-schema.js';
import { pathCosines } from '../core/kinematics/exit-geometry.js';
import type { KinematicsAt } from '../core/kinematics/peak-path.js';
import type { Reaction } from '../core/kinematics/reaction-of-peak.js';
import { rutherfordForPeak } from '../core/kinematics/rutherford-for-peak.js';
import type { ScreeningModel } from '../core/kinematics/screened-rutherford.js';
import type { Slab, SlowingModel } from '../core/kinematics/slowing-model.js';
import { layerAtomsPerCm2 } from '../core/model/resolve-target.js';
import { degToRad } from '../core/physics/units.js';
import { energyCurveValue, type PeakTruth } from './truth-model.js';

/** One Gaussian line of a simulated spectrum: the signal of one depth slice of a layer. */
export interface PeakLine {
  energyKeV: number;
  fwhmKeV: number;
  /** atoms/cm² of the slice × dσ/dΩ_lab there, in mb/sr · atoms/cm² (× beam particles × sr × 1e-27 = counts). */
  atomsTimesSigma: number;
}

/** The true cross section and kinematics of a peak at one reaction energy. */
export interface PeakTruthAt {
  reactionEnergyKeV: number;
  emittedEnergyKeV: number;
  detectedEnergyKeV: number;
  thetaCmDeg: number;
  jacobianLabPerCm: number;
  dsigmaLabMbPerSr: number;
  dsigmaCmMbPerSr: number;
  rutherfordLabMbPerSr: number;
  screeningFactor: number;
  sigmaOverRutherford: number;
}

export interface LayerPeakInput {
  reaction: Reaction;
  kinematics: KinematicsAt;
  truth: PeakTruth | undefined;
  screening: ScreeningModel;
  target: TargetConfig;
  layerIndex: number;
  /** Atoms/cm² of the nuclide in this layer. */
  atomsPerCm2: number;
  detector: DetectorConfig;
  beamEnergyKeV: number;
  energyLoss: boolean;
  slowing: SlowingModel | null;
  /** Depth slices the layer is cut into when energy loss is on. */
  slices: number;
}

const SIGMA_TO_FWHM = 2.3548200450309493;
const slab = (l: Parameters<typeof layerAtomsPerCm2>[0] & { stopping_material?: string | undefined }): Slab => ({ composition: l.composition, atomsPerCm2: layerAtomsPerCm2(l), material: l.stopping_material });

/**
 * The simulated signal of a peak from one layer, slice by slice — written for the simulator on
 * its own (it does not call the reduction's peak planner): per slice at depth fraction
 * f = (j + ½)/S the beam is slowed to f of the layer (path 1/cos α), the true cross section is
 * taken at that energy, the detected particle slowed out (1/cos β) and through the foils, and
 * its line broadened by resolution ⊕ straggling ⊕ aperture. The truth row is taken at f = ½.
 * Returns a reason where nothing reaches the detector or the case is not simulated (two
 * kinematic branches, a particle that stops).
 */
export function layerPeakLines(x: LayerPeakInput): { lines: PeakLine[]; truth: PeakTruthAt } | { reason: string } {
  const det = x.detector;
  const geo = pathCosines(det.angle_deg, x.target.tilt_deg, x.target.exit_angle_mode);
  if (x.energyLoss && !geo.ok) return { reason: geo.reason };
  const cosIn = geo.ok ? geo.cosIn : 1;
  const cosOut = geo.ok ? geo.cosOut : 1;
  const layers = x.target.layers.map(slab);
  const foils = [...det.absorber, ...(det.dead_layer ? [det.dead_layer] : [])].map(slab);
  const slow = (who: Reaction['projectile'], s: Slab, fraction: number, cos: number, e: number) => {
    if (fraction <= 0) return { ok: true as const, energyOutKeV: e, stragglingKeV2: 0 };
    return x.slowing!.slowDown(who, s.composition, (s.atomsPerCm2 * fraction) / cos, e, s.material);
  };
  // Beam at the front of the layer.
  let eFront = x.beamEnergyKeV;
  let varFront = 0;
  if (x.energyLoss) {
    for (let i = 0; i < x.layerIndex; i++) {
      const r = slow(x.reaction.projectile, layers[i]!, 1, cosIn, eFront);
      if (!r.ok) return { reason: r.reason };
      eFront = r.energyOutKeV;
      varFront += r.stragglingKeV2;
    }
  }
  const at = (f: number): { line: PeakLine; truth: PeakTruthAt } | { reason: string } => {
    let e = eFront;
    let v = varFront;
    if (x.energyLoss) {
      const r = slow(x.reaction.projectile, layers[x.layerIndex]!, f, cosIn, eFront);
      if (!r.ok) return { reason: r.reason };
      e = r.energyOutKeV;
      v += r.stragglingKeV2;
    }
    const k = x.kinematics(e, det.angle_deg);
    if (!k.ok) return { reason: k.reason };
    if (k.solutions.length !== 1) return { reason: 'two kinematic solutions at this angle (not simulated)' };
    const s = k.solutions[0]!;
    // Out of the target and through the foils.
    const out: [Slab, number, number][] = [];
    if (x.energyLoss) {
      if (x.target.exit_angle_mode === 'reflection') {
        out.push([layers[x.layerIndex]!, f, cosOut]);
        for (let i = x.layerIndex - 1; i >= 0; i--) out.push([layers[i]!, 1, cosOut]);
      } else {
        out.push([layers[x.layerIndex]!, 1 - f, cosOut]);
        for (let i = x.layerIndex + 1; i < layers.length; i++) out.push([layers[i]!, 1, cosOut]);
      }
    }
    for (const foil of foils) out.push([foil, 1, 1]);
    let eDet = s.energyKeV;
    let vOut = 0;
    for (const [sl, fr, c] of out) {
      const r = slow(x.reaction.detected, sl, fr, c, eDet);
      if (!r.ok) return { reason: r.reason };
      eDet = r.energyOutKeV;
      vOut += r.stragglingKeV2;
    }
    // Beam straggling carried to the emitted energy by ∂E_b/∂E_a; aperture broadening by ∂E_b/∂θ.
    const slope = (dE: number, dTheta: number) => {
      const a = x.kinematics(e + dE, det.angle_deg + dTheta);
      const b = x.kinematics(e - dE, det.angle_deg - dTheta);
      return a.ok && b.ok && a.solutions.length === 1 && b.solutions.length === 1 ? (a.solutions[0]!.energyKeV - b.solutions[0]!.energyKeV) / 2 : 0;
    };
    const dEbdEa = slope(1, 0);
    const dEbdTheta = det.half_aperture_deg > 0 ? slope(0, 0.05) / degToRad(0.05) : 0;
    const straggle = SIGMA_TO_FWHM * Math.sqrt(dEbdEa * dEbdEa * (x.energyLoss ? v : 0) + vOut);
    const aperture = SIGMA_TO_FWHM * Math.abs(dEbdTheta) * (degToRad(det.half_aperture_deg) / 2);
    const fwhm = Math.hypot(det.resolution_fwhm_keV, straggle, aperture);
    // The true cross section at this energy.
    let sigmaR = Number.NaN;
    let screening = Number.NaN;
    let sigmaRScreened = Number.NaN;
    if (x.reaction.elastic) {
      const r = rutherfordForPeak(x.reaction, x.kinematics, s.branch, e, det.angle_deg, x.screening);
      if (!r.ok) return { reason: `no Rutherford cross section (${r.flag})` };
      sigmaRScreened = r.value.sigmaMbPerSr;
      screening = r.value.screeningFactor;
      sigmaR = sigmaRScreened / screening;
    }
    let lab: number;
    if (x.truth !== undefined && 'cm_mb_per_sr' in x.truth) lab = energyCurveValue(x.truth.cm_mb_per_sr, e) / s.jacobianLabPerCm;
    else if (x.reaction.elastic) lab = (x.truth === undefined ? 1 : energyCurveValue(x.truth.ratio_to_rutherford, e)) * sigmaRScreened;
    else return { reason: 'a non-elastic peak needs a cm_mb_per_sr truth' };
    return {
      line: { energyKeV: eDet, fwhmKeV: fwhm, atomsTimesSigma: lab },
      truth: {
        reactionEnergyKeV: e, emittedEnergyKeV: s.energyKeV, detectedEnergyKeV: eDet, thetaCmDeg: s.thetaCmDeg, jacobianLabPerCm: s.jacobianLabPerCm,
        dsigmaLabMbPerSr: lab, dsigmaCmMbPerSr: lab * s.jacobianLabPerCm, rutherfordLabMbPerSr: sigmaR, screeningFactor: screening, sigmaOverRutherford: lab / sigmaRScreened,
      },
    };
  };
  const slices = x.energyLoss ? x.slices : 1;
  const lines: PeakLine[] = [];
  for (let j = 0; j < slices; j++) {
    const r = at((j + 0.5) / slices);
    if ('reason' in r) return r;
    lines.push({ ...r.line, atomsTimesSigma: (r.line.atomsTimesSigma * x.atomsPerCm2) / slices });
  }
  const mid = at(0.5);
  if ('reason' in mid) return mid;
  return { lines, truth: mid.truth };
}
