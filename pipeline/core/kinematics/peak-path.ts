import type { Nuclide } from '../physics/nuclides.js';
import { degToRad } from '../physics/units.js';
import { pathCosines } from './exit-geometry.js';
import type { Slab, SlowingModel } from './slowing-model.js';

/** One kinematic solution of the detected particle at a lab angle (two in inverse kinematics). */
export interface KinematicSolution {
  branch: 'single' | 'high' | 'low';
  energyKeV: number;
  thetaCmDeg: number;
  /** dΩ_lab/dΩ_cm of the detected particle on this branch. */
  jacobianLabPerCm: number;
}

export type KinematicsAt = (beamEnergyKeV: number, thetaLabDeg: number) => { ok: true; solutions: KinematicSolution[] } | { ok: false; reason: string };

export interface PeakPathInput {
  detected: Nuclide;
  projectile: Nuclide;
  kinematics: KinematicsAt;
  /** Target layers, beam side first, and the one the reaction happens in. */
  layers: readonly Slab[];
  layerIndex: number;
  tiltDeg: number;
  exitMode: 'reflection' | 'transmission';
  /** Slow the beam and the detected particle in the target layers (false: thin target). */
  targetEnergyLoss: boolean;
  thetaLabDeg: number;
  halfApertureDeg: number;
  resolutionFwhmKeV: number;
  /** Absorber foils, target side first, then the detector dead layer (crossed at normal incidence). */
  foils: readonly Slab[];
  beamEnergyKeV: number;
  /** Needed when targetEnergyLoss is true or foils are given. */
  slowing: SlowingModel | null;
}

export interface PeakPathBranch {
  branch: KinematicSolution['branch'];
  /** Beam energy at mid-depth of the layer: where the cross section is quoted, keV. */
  reactionEnergyKeV: number;
  /** Standard deviation of the reaction energy over the layer (uniform depth ⊕ beam straggling), keV. */
  reactionEnergySpreadKeV: number;
  thetaCmDeg: number;
  jacobianLabPerCm: number;
  /** Energy of the detected particle where it is made (mid-depth), keV. */
  emittedEnergyKeV: number;
  /** Energy it deposits in the detector after the exit path, foils and dead layer, keV: the peak position. */
  detectedEnergyKeV: number;
  /** Predicted peak FWHM and its parts (added in quadrature), keV. */
  fwhmKeV: number;
  widthKeV: { resolution: number; straggling: number; kinematic: number; layer: number };
}

export type PeakPathResult = { ok: true; branches: PeakPathBranch[] } | { ok: false; reason: string };

const SIGMA_TO_FWHM = 2 * Math.sqrt(2 * Math.LN2);
const D_THETA_DEG = 0.05;

/**
 * The forward model of a peak: beam slowed through the layers in front (path factor 1/cos α) to
 * the front, middle and back of its layer; two-body kinematics there; the detected particle
 * slowed on its way out (1/cos β, see exit-geometry.ts) and through the foils. Reaction energy =
 * beam energy at mid-depth (the usual mean-energy approximation: exact for a cross section
 * linear in energy across the layer). Peak FWHM = resolution ⊕ straggling ⊕ kinematic ⊕ layer:
 *   straggling: beam straggling to mid-depth carried to the detector by ∂E_det/∂E_beam, plus the
 *               straggling on the exit path (Bohr, from the slowing model);
 *   kinematic:  |∂E_det/∂θ| × a/2 × 2.355 — a/2 is the standard deviation, projected on the
 *               scattering plane, of directions uniform over a cone of half-angle a (common practice);
 *   layer:      |E_det(front) − E_det(back)|, the width of the layer's signal, added as if it
 *               were a FWHM (generous: the window then holds the whole layer).
 */
export function peakPath(x: PeakPathInput): PeakPathResult {
  const geo = pathCosines(x.thetaLabDeg, x.tiltDeg, x.exitMode);
  if (x.targetEnergyLoss && !geo.ok) return geo;
  if ((x.targetEnergyLoss || x.foils.length > 0) && x.slowing === null) throw new Error('peakPath: a slowing model is needed for energy loss');
  const slowing = x.slowing!;
  const layer = x.layers[x.layerIndex];
  if (layer === undefined) throw new RangeError(`layer ${x.layerIndex} does not exist`);
  const cosIn = geo.ok ? geo.cosIn : 1;
  const cosOut = geo.ok ? geo.cosOut : 1;

  // Beam: to the front of the layer, its middle and its back.
  let e = x.beamEnergyKeV;
  let inVar = 0;
  const slow = (p: Nuclide, s: Slab, fraction: number, cos: number, eIn: number) => slowing.slowDown(p, s.composition, (s.atomsPerCm2 * fraction) / cos, eIn, s.material);
  if (x.targetEnergyLoss) {
    for (let i = 0; i < x.layerIndex; i++) {
      const r = slow(x.projectile, x.layers[i]!, 1, cosIn, e);
      if (!r.ok) return { ok: false, reason: `beam in layer ${i + 1}: ${r.reason}` };
      e = r.energyOutKeV;
      inVar += r.stragglingKeV2;
    }
  }
  const eFront = e;
  let eMid = e;
  let eBack = e;
  if (x.targetEnergyLoss) {
    const mid = slow(x.projectile, layer, 0.5, cosIn, eFront);
    if (!mid.ok) return { ok: false, reason: `beam in layer ${x.layerIndex + 1}: ${mid.reason}` };
    const back = slow(x.projectile, layer, 1, cosIn, eFront);
    if (!back.ok) return { ok: false, reason: `beam stops in layer ${x.layerIndex + 1}: ${back.reason}` };
    eMid = mid.energyOutKeV;
    eBack = back.energyOutKeV;
    inVar += mid.stragglingKeV2;
  }

  // The detected particle's way out from a depth in the layer (0 front, 0.5 middle, 1 back).
  const exitSlabs = (depth: number): [Slab, number][] => {
    const out: [Slab, number][] = [];
    if (x.targetEnergyLoss) {
      if (x.exitMode === 'reflection') {
        out.push([layer, depth]);
        for (let i = x.layerIndex - 1; i >= 0; i--) out.push([x.layers[i]!, 1]);
      } else {
        out.push([layer, 1 - depth]);
        for (let i = x.layerIndex + 1; i < x.layers.length; i++) out.push([x.layers[i]!, 1]);
      }
    }
    return out;
  };
  const detect = (eEmit: number, depth: number): { ok: true; e: number; v: number } | { ok: false; reason: string } => {
    let en = eEmit;
    let v = 0;
    for (const [s, f] of exitSlabs(depth)) {
      if (f === 0) continue;
      const r = slow(x.detected, s, f, cosOut, en);
      if (!r.ok) return { ok: false, reason: `${x.detected.name} on its way out of the target: ${r.reason}` };
      en = r.energyOutKeV;
      v += r.stragglingKeV2;
    }
    for (const [i, foil] of x.foils.entries()) {
      const r = slow(x.detected, foil, 1, 1, en);
      if (!r.ok) return { ok: false, reason: `${x.detected.name} in detector foil ${i + 1}: ${r.reason}` };
      en = r.energyOutKeV;
      v += r.stragglingKeV2;
    }
    return { ok: true, e: en, v };
  };

  const atMid = x.kinematics(eMid, x.thetaLabDeg);
  if (!atMid.ok) return atMid;
  const branches: PeakPathBranch[] = [];
  for (const sol of atMid.solutions) {
    const sameBranch = (eBeam: number, theta: number) => {
      const k = x.kinematics(eBeam, theta);
      return k.ok ? (k.solutions.find((s) => s.branch === sol.branch) ?? null) : null;
    };
    const mid = detect(sol.energyKeV, 0.5);
    if (!mid.ok) return mid;
    let layerWidth = 0;
    let beamToDetector = 1;
    if (x.targetEnergyLoss) {
      const f = sameBranch(eFront, x.thetaLabDeg);
      const b = sameBranch(eBack, x.thetaLabDeg);
      const df = f ? detect(f.energyKeV, 0) : null;
      const db = b ? detect(b.energyKeV, 1) : null;
      if (df?.ok && db?.ok) layerWidth = Math.abs(df.e - db.e);
      const dE = Math.max(1e-3 * eMid, 0.01);
      const up = sameBranch(eMid + dE, x.thetaLabDeg);
      const down = sameBranch(eMid - dE, x.thetaLabDeg);
      const du = up ? detect(up.energyKeV, 0.5) : null;
      const dd = down ? detect(down.energyKeV, 0.5) : null;
      if (du?.ok && dd?.ok) beamToDetector = (du.e - dd.e) / (2 * dE);
    }
    let kinematic = 0;
    if (x.halfApertureDeg > 0) {
      const hi = sameBranch(eMid, Math.min(x.thetaLabDeg + D_THETA_DEG, 180));
      const lo = sameBranch(eMid, Math.max(x.thetaLabDeg - D_THETA_DEG, 0));
      const dh = hi ? detect(hi.energyKeV, 0.5) : null;
      const dl = lo ? detect(lo.energyKeV, 0.5) : null;
      if (dh?.ok && dl?.ok) {
        const perRad = (dh.e - dl.e) / degToRad(2 * D_THETA_DEG);
        kinematic = SIGMA_TO_FWHM * Math.abs(perRad) * (degToRad(x.halfApertureDeg) / 2);
      }
    }
    const straggling = SIGMA_TO_FWHM * Math.sqrt(beamToDetector * beamToDetector * inVar + mid.v);
    const widthKeV = { resolution: x.resolutionFwhmKeV, straggling, kinematic, layer: layerWidth };
    branches.push({
      branch: sol.branch,
      reactionEnergyKeV: eMid,
      reactionEnergySpreadKeV: Math.sqrt(((eFront - eBack) * (eFront - eBack)) / 12 + inVar),
      thetaCmDeg: sol.thetaCmDeg,
      jacobianLabPerCm: sol.jacobianLabPerCm,
      emittedEnergyKeV: sol.energyKeV,
      detectedEnergyKeV: mid.e,
      fwhmKeV: Math.hypot(widthKeV.resolution, straggling, kinematic, layerWidth),
      widthKeV,
    });
  }
  return { ok: true, branches };
}
